// The Diatomic family: valence MO analysis of a diatomic molecule or ion typed as text.
// The science is in chem/diatomic.ts (cached per species and ordering); these entries only read
// arguments and pick a field. Examples are checked through the engine by the catalog test.
import { oneBasedIndex } from '../chem/errors.js';
import { MAX_VALENCE_LEVELS } from '../chem/moDiagram.js';
import {
  analysisOf,
  CORE_STYLES,
  coreStyle,
  ELECTRON_COUNTS,
  electronCount,
  MODEL_SOURCE,
  orderingOf,
  orderingParam,
  speciesFromTable,
  speciesParam,
  speciesText,
  TERM_FORMATS,
  TERM_SOURCE,
  termFormat,
} from './diatomicArgs.js';
import { analyseDiatomic } from '../chem/diatomic.js';
import { KNOWN_GROUND_STATE_FAILURES, knownFailureFor } from '../chem/knownFailures.js';
import { parseSpecies } from '../chem/species.js';
import { ChemError, type CatalogEntry, type Scalar, type Table } from './types.js';

const MOTABLE_COLUMNS = 3;

const KNOWN_FAILURES_LIST = KNOWN_GROUND_STATE_FAILURES.map((f) => f.species).join(', ');

function moTable(species: Table, ordering?: string, row?: number, column?: number): Scalar | Table {
  const analysis = analyseDiatomic(speciesFromTable(species), orderingOf(ordering));
  const rows: Table = analysis.levels.map((l) => [l.label, l.character, l.occupancy]);
  while (rows.length < MAX_VALENCE_LEVELS) rows.push(['', '', '']);
  if (row === undefined) return rows;
  // Out of range stays #REF!, as a spreadsheet's own INDEX answers.
  const picked = rows[oneBasedIndex(row, MAX_VALENCE_LEVELS, { item: 'row', holder: 'the table', kind: 'REF' })];
  if (column === undefined) return [picked];
  return picked[oneBasedIndex(column, MOTABLE_COLUMNS, { item: 'column', holder: 'the table', kind: 'REF' })];
}

export const diatomicFunctions: CatalogEntry[] = [
  {
    name: 'MOCONFIG',
    family: 'Diatomic',
    summary: 'Valence MO configuration in σ/π notation: g/u and * for homonuclear species, numbered 1σ, 2σ, 1π… (with * on antibonding levels) for heteronuclear ones.',
    params: [
      speciesParam,
      orderingParam,
      { name: 'core', type: 'string', optional: true, default: 'abbreviated', choices: [...CORE_STYLES], description: '"abbreviated" writes core shells as K (1s²) and L (2s² 2p⁶) per atom, e.g. KK for N2; "full" writes the core orbitals out.' },
    ],
    returns: { description: 'The ground configuration, lowest level first', kind: 'text' },
    examples: [
      { formula: '=MOCONFIG("N2")', expected: 'KK σg(2s)² σu*(2s)² πu(2p)⁴ σg(2p)²' },
      { formula: '=MOCONFIG("O2")', expected: 'KK σg(2s)² σu*(2s)² σg(2p)² πu(2p)⁴ πg*(2p)²' },
      { formula: '=MOCONFIG("Li2","auto","full")', expected: 'σg(1s)² σu*(1s)² σg(2s)²' },
      { formula: '=MOCONFIG("CO")', expected: 'KK 3σ² 4σ*² 1π⁴ 5σ²' },
      { formula: '=MOCONFIG("OH","auto","full")', expected: '1σ² 2σ² 3σ² 1π³' },
      { formula: '=MOCONFIG("H2+")', expected: 'σg(1s)¹' },
    ],
    source:
      MODEL_SOURCE +
      ' Labels: Mulliken numbering for heteronuclear species as in Huber & Herzberg (1979); KK core notation as in Herzberg (1950). The configuration is the simple Aufbau filling, which differs from experiment for ' +
      KNOWN_FAILURES_LIST +
      ' (see MODELCAVEAT).',
    implementation: (species, ordering, core) => {
      const analysis = analysisOf(species, ordering);
      return coreStyle(core) === 'full' ? analysis.configFull : analysis.configAbbreviated;
    },
  },
  {
    name: 'BONDORDER',
    family: 'Diatomic',
    summary: 'Bond order (bonding − antibonding valence electrons)/2.',
    params: [speciesParam, orderingParam],
    returns: { description: 'Bond order (may be a half-integer)', kind: 'number' },
    examples: [
      { formula: '=BONDORDER("O2")', expected: 2 },
      { formula: '=BONDORDER("N2")', expected: 3 },
      { formula: '=BONDORDER("O2^2-")', expected: 1 },
      { formula: '=BONDORDER("NO")', expected: 2.5 },
      { formula: '=BONDORDER("He2")', expected: 0 },
      { formula: '=BONDORDER("HF")', expected: 1, note: 'hydride diagram: the F 2p π pair is non-bonding' },
    ],
    source: MODEL_SOURCE,
    implementation: (species, ordering) => analysisOf(species, ordering).bondOrder,
  },
  {
    name: 'UNPAIRED',
    family: 'Diatomic',
    summary: 'Unpaired electrons in the ground state (Hund\'s rule over a degenerate π pair).',
    params: [speciesParam, orderingParam],
    returns: { description: 'Number of unpaired electrons, 2S', kind: 'number' },
    examples: [
      { formula: '=UNPAIRED("O2")', expected: 2 },
      { formula: '=UNPAIRED("B2")', expected: 2 },
      { formula: '=UNPAIRED("B2","unmixed")', expected: 0, note: 'without s–p mixing B2 would be diamagnetic, against experiment' },
      { formula: '=UNPAIRED("NO")', expected: 1 },
      { formula: '=UNPAIRED("N2")', expected: 0 },
    ],
    source: MODEL_SOURCE,
    implementation: (species, ordering) => analysisOf(species, ordering).unpairedElectrons,
  },
  {
    name: 'MAGNETISM',
    family: 'Diatomic',
    summary: '"paramagnetic" if the ground state has unpaired electrons, otherwise "diamagnetic".',
    params: [speciesParam, orderingParam],
    returns: { description: '"paramagnetic" or "diamagnetic"', kind: 'text' },
    examples: [
      { formula: '=MAGNETISM("O2")', expected: 'paramagnetic' },
      { formula: '=MAGNETISM("N2")', expected: 'diamagnetic' },
      { formula: '=MAGNETISM("B2")', expected: 'paramagnetic' },
      { formula: '=MAGNETISM("C2")', expected: 'diamagnetic' },
    ],
    source: MODEL_SOURCE + ' Spin only: orbital contributions are not considered.',
    implementation: (species, ordering) => (analysisOf(species, ordering).unpairedElectrons > 0 ? 'paramagnetic' : 'diamagnetic'),
  },
  {
    name: 'SPINMOMENT',
    family: 'Diatomic',
    summary: 'Spin-only magnetic moment √(n(n+2)) for n unpaired electrons.',
    params: [speciesParam, orderingParam],
    returns: { description: 'Spin-only moment', unit: 'Bohr magneton (μB)', kind: 'number' },
    examples: [
      { formula: '=SPINMOMENT("O2")', expected: Math.sqrt(8), tolerance: 1e-9, note: '√8 = 2.828 μB' },
      { formula: '=SPINMOMENT("NO")', expected: Math.sqrt(3), tolerance: 1e-9, note: '√3 = 1.732 μB' },
      { formula: '=SPINMOMENT("N2")', expected: 0 },
    ],
    source: 'Spin-only formula μ = √(n(n+2)) μB (g = 2, orbital angular momentum neglected). ' + MODEL_SOURCE,
    implementation: (species, ordering) => analysisOf(species, ordering).spinMomentBohr,
  },
  {
    name: 'GROUNDTERM',
    family: 'Diatomic',
    summary: 'Ground-state term symbol, e.g. ³Σg⁻ for O2 (spin–orbit components not resolved).',
    params: [
      speciesParam,
      { name: 'format', type: 'string', optional: true, default: 'unicode', choices: [...TERM_FORMATS], description: '"unicode" (³Σg⁻) or "ascii" for export (3Sigma_g-).' },
      orderingParam,
    ],
    returns: { description: 'Term symbol ²ˢ⁺¹Λ with g/u (homonuclear) and ± for Σ', kind: 'text' },
    examples: [
      { formula: '=GROUNDTERM("O2")', expected: '³Σg⁻' },
      { formula: '=GROUNDTERM("O2","ascii")', expected: '3Sigma_g-' },
      { formula: '=GROUNDTERM("N2+")', expected: '²Σg⁺' },
      { formula: '=GROUNDTERM("NO")', expected: '²Π' },
      { formula: '=GROUNDTERM("OH")', expected: '²Π' },
      { formula: '=GROUNDTERM("CO")', expected: '¹Σ⁺' },
    ],
    source: TERM_SOURCE + ' ' + MODEL_SOURCE,
    implementation: (species, format, ordering) => {
      const analysis = analysisOf(species, ordering);
      return termFormat(format) === 'ascii' ? analysis.termAscii : analysis.termUnicode;
    },
  },
  {
    name: 'DEGENERACY',
    family: 'Diatomic',
    summary: 'Electronic degeneracy of the ground term, (2S+1)·(2 if Λ > 0 else 1), for partition functions.',
    params: [speciesParam, orderingParam],
    returns: { description: 'Degeneracy g_el of the ground term (spin–orbit splitting ignored)', kind: 'number' },
    examples: [
      { formula: '=DEGENERACY("O2")', expected: 3 },
      { formula: '=DEGENERACY("NO")', expected: 4 },
      { formula: '=DEGENERACY("OH")', expected: 4 },
      { formula: '=DEGENERACY("N2")', expected: 1 },
    ],
    source:
      'g_el = (2S+1)(2 − δ0,Λ) for a term without resolved spin–orbit structure (McQuarrie, Statistical Mechanics, 1976), of the model\'s ground term: wrong wherever that term is wrong (Si2, C2+, BN, SiC, AlN, P2+, Al2 — see MODELCAVEAT), so check before using it in a partition function. ' +
      TERM_SOURCE,
    implementation: (species, ordering) => analysisOf(species, ordering).degeneracy,
  },
  {
    name: 'MODELCAVEAT',
    family: 'Diatomic',
    summary: 'Where simple MO filling is known to disagree with experiment for this species: the experimental ground term and what the model gets wrong; empty text when no disagreement is known.',
    params: [speciesParam],
    returns: { description: 'caveat text, or "" when none is listed', kind: 'text' },
    examples: [
      { formula: '=MODELCAVEAT("O2")', expected: '' },
      {
        formula: '=MODELCAVEAT("BN")',
        expected: 'experiment X ³Π (Huber & Herzberg 1979, recalled from memory): the model gives ¹Σ⁺ (closed 1π⁴ shell); 1π and 5σ lie close, so the open-shell ³Π is lowest',
      },
    ],
    source:
      'K. P. Huber & G. Herzberg, Constants of Diatomic Molecules (1979), experimental ground terms recalled from memory. Listed: ' +
      KNOWN_FAILURES_LIST +
      '. An empty result means no disagreement is listed, not that the model is confirmed for the species.',
    implementation: (species) => {
      const failure = knownFailureFor(parseSpecies(speciesText(species)));
      return failure ? `experiment ${failure.experimentalTerm} (Huber & Herzberg 1979, recalled from memory): ${failure.note}` : '';
    },
  },
  {
    name: 'HOMO',
    family: 'Diatomic',
    summary: 'Highest occupied level; for an open shell, the partly filled level.',
    params: [speciesParam, orderingParam],
    returns: { description: 'Orbital label as in MOCONFIG', kind: 'text' },
    examples: [
      { formula: '=HOMO("N2")', expected: 'σg(2p)' },
      { formula: '=HOMO("O2")', expected: 'πg*(2p)' },
      { formula: '=HOMO("CO")', expected: '5σ' },
      { formula: '=HOMO("HF")', expected: '1π' },
    ],
    source: MODEL_SOURCE,
    implementation: (species, ordering) => analysisOf(species, ordering).homo.label,
  },
  {
    name: 'LUMO',
    family: 'Diatomic',
    summary: 'Lowest level with a vacancy; for an open shell, the partly filled level (it takes the next electron).',
    params: [speciesParam, orderingParam],
    returns: { description: 'Orbital label as in MOCONFIG; #N/A if every valence level is full', kind: 'text' },
    examples: [
      { formula: '=LUMO("N2")', expected: 'πg*(2p)' },
      { formula: '=LUMO("CO")', expected: '2π*' },
      { formula: '=LUMO("HF")', expected: '4σ*' },
      { formula: '=LUMO("O2")', expected: 'πg*(2p)' },
    ],
    source: MODEL_SOURCE,
    implementation: (species, ordering) => {
      const analysis = analysisOf(species, ordering);
      if (!analysis.lumo) throw new ChemError(`'${analysis.species.text}' fills every valence orbital: no LUMO in the valence set`, 'NA');
      return analysis.lumo.label;
    },
  },
  {
    name: 'ELECTRONS',
    family: 'Diatomic',
    summary: 'Electron count of the species after its charge: valence (outside the atomic cores) or total.',
    params: [
      speciesParam,
      { name: 'count', type: 'string', optional: true, default: 'valence', choices: [...ELECTRON_COUNTS], description: '"valence" (outside [He]/[Ne] cores) or "total".' },
    ],
    returns: { description: 'Number of electrons', kind: 'number' },
    examples: [
      { formula: '=ELECTRONS("O2")', expected: 12 },
      { formula: '=ELECTRONS("O2","total")', expected: 16 },
      { formula: '=ELECTRONS("NO+")', expected: 10 },
      { formula: '=ELECTRONS("Cl2","total")', expected: 34 },
      { formula: '=ELECTRONS("NaCl","total")', expected: 28, note: 'counts work even where the MO model declines the pair' },
    ],
    source: 'Atomic numbers and ground-state configurations: IUPAC Periodic Table (2022), NIST Atomic Spectra Database.',
    // Counting needs only the parsed species, not an MO diagram, so it also works for pairs the MO model declines (NaCl).
    implementation: (species, count) => {
      const parsed = parseSpecies(speciesText(species));
      return electronCount(count) === 'total' ? parsed.totalElectrons : parsed.valenceElectrons;
    },
  },
  {
    name: 'MOTABLE',
    family: 'Diatomic',
    summary: `Spills the valence levels in energy order (label | bonding/antibonding/nonbonding | electrons), always ${MAX_VALENCE_LEVELS} rows, padded with empty text; give row (and column) for one row (or one value).`,
    params: [
      { ...speciesParam, type: 'range', description: speciesParam.description + ' A single cell or text (never a multi-cell range).' },
      orderingParam,
      { name: 'row', type: 'integer', optional: true, description: `Level number 1–${MAX_VALENCE_LEVELS}, lowest energy first: return that row only.` },
      { name: 'column', type: 'integer', optional: true, description: 'With row: 1 label, 2 character, 3 electrons — return one value.' },
    ],
    returns: { description: `${MAX_VALENCE_LEVELS}×3 table; 1×3 with row; one value with row and column`, kind: 'array' },
    examples: [
      {
        formula: '=MOTABLE("O2")',
        expected: [
          ['σg(2s)', 'bonding', 2],
          ['σu*(2s)', 'antibonding', 2],
          ['σg(2p)', 'bonding', 2],
          ['πu(2p)', 'bonding', 4],
          ['πg*(2p)', 'antibonding', 2],
          ['σu*(2p)', 'antibonding', 0],
        ],
      },
      {
        formula: '=MOTABLE("OH")',
        expected: [
          ['2σ', 'nonbonding', 2],
          ['3σ', 'bonding', 2],
          ['1π', 'nonbonding', 3],
          ['4σ*', 'antibonding', 0],
          ['', '', ''],
          ['', '', ''],
        ],
        note: 'hydride diagram: O 2s lone pair, O–H σ bond, O 2p π pair non-bonding',
      },
      { formula: '=MOTABLE("O2","auto",5)', expected: [['πg*(2p)', 'antibonding', 2]] },
      { formula: '=MOTABLE("N2","auto",4,1)', expected: 'σg(2p)' },
    ],
    source: MODEL_SOURCE,
    spill: (args) => ({
      rows: args.length > 2 ? 1 : MAX_VALENCE_LEVELS,
      cols: args.length > 3 ? 1 : MOTABLE_COLUMNS,
    }),
    implementation: moTable,
  },
];
