// The extended-Hückel family: all-valence orbital levels, frontier energies, Mulliken charges and
// overlap populations, the one-electron energy sum and the HOMO's make-up, from a 3D structure
// given as SMILES (a generated conformer), XYZ text or a molfile. Science in functions/chem/eht.ts.
import { ChemError, type CatalogEntry, type ParamSpec, type SpillArg } from './types.js';
import { EHT_MAX_ATOMS, EHT_MAX_BASIS } from '../chem/eht.js';
import { elementParameters } from '../chem/ehtParams.js';
import { summaryCharge, summaryFrontier, summaryHomoMakeup, summaryOverlapPopulation, type EhtSummary } from '../chem/ehtSummary.js';
import { CONFORMER_SEED, structureElements } from '../chem/geometry3d.js';
import { ehtSummaryOf } from '../structureResults.js';
import { checkSpillLength, MAX_SPILL_ROWS, pickIndex } from './huckelSpill.js';

// Water at its measured gas-phase geometry, r(OH) 0.9578 Å, ∠HOH 104.48° (NIST CCCBDB experimental
// geometry; recalled from memory), with O on the origin and the molecule in the xz plane.
const WATER = 'O 0 0 0; H 0.7574 0 0.5864; H -0.7574 0 0.5864';
// Ethylene: C=C 1.339 Å, C–H 1.087 Å, ∠HCC 121.3° (measured; recalled from memory), in the yz plane.
const ETHYLENE = 'C 0 0 0.6695; C 0 0 -0.6695; H 0 0.9288 1.2342; H 0 -0.9288 1.2342; H 0 0.9288 -1.2342; H 0 -0.9288 -1.2342';

const HOFFMANN = 'R. Hoffmann, J. Chem. Phys. 39, 1397 (1963)';
const MULLIKEN = 'R. S. Mulliken, J. Chem. Phys. 23, 1833 (1955)';
const LIMITS =
  'Model limits: no self-consistency (H does not respond to charge), so Mulliken charges are exaggerated and energies are qualitative orderings rather than ionisation energies; one fixed geometry per structure (a generated conformer for SMILES). Parameters, sources and geometry handling: docs/eht.md. Results are model estimates, not measurements: not a basis for handling hazardous species — defer to safety data sheets, local codes and qualified review.';

const structure: ParamSpec = {
  name: 'structure',
  type: 'string',
  description: `SMILES (hydrogens added, one conformer from openchemlib with seed ${CONFORMER_SEED}, tidied with MMFF94s+), XYZ text in ångström ("El x y z" lines separated by newlines or ";", optionally headed by the atom count and a comment line, which may state the net charge as "charge=-1", "charge: +2" or "charge 1"), or a molfile/SDF record with 3D coordinates and every hydrogen. At most ${EHT_MAX_ATOMS} atoms and ${EHT_MAX_BASIS} basis functions.`,
};
const charge: ParamSpec = {
  name: 'charge',
  type: 'integer',
  optional: true,
  description:
    'Net charge; default: from the structure (formal charges of SMILES or molfile; for XYZ text the charge its comment line states, else 0). A charge that differs from the one an XYZ comment line states is an error, not a choice between them.',
};
const atomIndex = (name: string): ParamSpec => ({
  name,
  type: 'integer',
  description: 'Atom number from 1: the XYZ/molfile order, or for SMILES the heavy atoms in the order written, then the added hydrogens.',
});

/** Basis-function count of a structure, without a conformer or a solve (for spill sizes). */
function basisSize(elements: string[]): number {
  return elements.reduce((n, el) => n + (elementParameters(el)?.shells.reduce((m, s) => m + 2 * s.l + 1, 0) ?? 0), 0);
}

function levelSpill(args: SpillArg[]): { rows: number; cols: number } {
  const one = { rows: 1, cols: 1 };
  // k left out, left empty (EHTLEVELS(s,,charge)) or 0 means the whole list.
  if (args.length >= 2 && args[1].kind !== 'empty' && !(args[1].kind === 'literal' && args[1].value === 0)) return one;
  const arg = args[0];
  if (!arg) return one;
  if (arg.kind !== 'literal') return { rows: MAX_SPILL_ROWS, cols: 2 };
  if (typeof arg.value !== 'string') return one;
  try {
    const n = basisSize(structureElements(arg.value));
    return n <= MAX_SPILL_ROWS ? { rows: n, cols: 2 } : one;
  } catch {
    return one; // the implementation reports the error in the anchor cell
  }
}

function describeGeometry(g: EhtSummary): string {
  const atoms = `${g.atoms} atom${g.atoms === 1 ? '' : 's'}`;
  if (g.source === 'xyz') return `XYZ text as given, ${atoms}`;
  if (g.source === 'molfile') return `molfile 3D coordinates as given, ${atoms}`;
  return g.forceFieldTidied
    ? `SMILES: openchemlib conformer (seed ${CONFORMER_SEED}) tidied with MMFF94s+, ${atoms} with hydrogens`
    : `SMILES: openchemlib conformer (seed ${CONFORMER_SEED}), not tidied (MMFF94s+ has no types for an atom), ${atoms} with hydrogens`;
}

export const ehtEntries: CatalogEntry[] = [
  {
    name: 'EHTLEVELS',
    family: 'Extended Hückel',
    summary: 'Extended-Hückel orbital energies in eV, lowest first, with occupancies; spills two columns (energy, electrons), or gives level k.',
    params: [structure, { name: 'k', type: 'integer', optional: true, description: 'Level number (1 = lowest); omit, leave empty or give 0 to spill all levels.' }, charge],
    returns: { description: 'orbital energy and occupancy per level (two columns), or one energy', unit: 'eV', kind: 'array' },
    examples: [
      { formula: `=EHTLEVELS("${WATER}")`, expected: [[-33.251, 2], [-17.107, 2], [-15.464, 2], [-14.8, 2], [-0.243, 0], [9.583, 0]], tolerance: 0.001, note: 'water: 2a1 < 1b2 < 3a1 < 1b1 (the O 2p lone pair at exactly H_pp = −14.8 eV), then two empty levels' },
      { formula: `=EHTLEVELS("${WATER}",4)`, expected: -14.8, tolerance: 1e-6, note: 'the HOMO, level 4 of 6' },
    ],
    source: `${HOFFMANN}; Slater-type overlaps R. S. Mulliken, C. A. Rieke, D. Orloff, H. Orloff, J. Chem. Phys. 17, 1248 (1949); H_ij = 1.75·S_ij(H_ii + H_jj)/2 (M. Wolfsberg, L. Helmholz, J. Chem. Phys. 20, 837 (1952)); HC = SCE by Löwdin orthogonalization. Electrons fill from the lowest level, two per level; a partly filled degenerate set shares its electrons equally. A cell reference spills a fixed ${MAX_SPILL_ROWS}×2 area; larger molecules must use k. ${LIMITS}`,
    spill: levelSpill,
    implementation: (s: string, k?: number, q?: number) => {
      const model = ehtSummaryOf(s, q);
      if (k !== undefined && k !== 0) return pickIndex(model.levels, k, 'level', 'levels')[0];
      checkSpillLength(model.levels.length, 'EHTLEVELS', 'EHTLEVELS(structure, k)');
      return model.levels.map(([energy, electrons]) => [energy, electrons]);
    },
  },
  {
    name: 'EHTHOMO',
    family: 'Extended Hückel',
    summary: 'Energy of the highest occupied extended-Hückel orbital, eV.',
    params: [structure, charge],
    returns: { description: 'ε_HOMO', unit: 'eV', kind: 'number' },
    examples: [{ formula: `=EHTHOMO("${WATER}")`, expected: -14.8, tolerance: 1e-6, note: 'the out-of-plane O 2p (1b1) takes no part in bonding, so it sits at H_pp(O)' }],
    source: `${HOFFMANN}. A radical's singly filled level counts as the HOMO. ${LIMITS}`,
    implementation: (s: string, q?: number) => summaryFrontier(ehtSummaryOf(s, q)).homoEv,
  },
  {
    name: 'EHTLUMO',
    family: 'Extended Hückel',
    summary: 'Energy of the lowest unoccupied extended-Hückel orbital, eV (the HOMO energy for a partly filled degenerate set).',
    params: [structure, charge],
    returns: { description: 'ε_LUMO', unit: 'eV', kind: 'number' },
    examples: [{ formula: `=EHTLUMO("${ETHYLENE}")`, expected: -8.231, tolerance: 0.001, note: 'ethylene π*' }],
    source: `${HOFFMANN}. ${LIMITS}`,
    implementation: (s: string, q?: number) => summaryFrontier(ehtSummaryOf(s, q)).lumoEv,
  },
  {
    name: 'EHTGAP',
    family: 'Extended Hückel',
    summary: 'HOMO–LUMO gap of the extended-Hückel levels, eV; 0 when the HOMO is a partly filled degenerate set.',
    params: [structure, charge],
    returns: { description: 'ε_LUMO − ε_HOMO', unit: 'eV', kind: 'number' },
    examples: [{ formula: `=EHTGAP("${ETHYLENE}")`, expected: 4.988, tolerance: 0.001, note: 'ethylene π → π*; a one-electron gap, not an excitation energy' }],
    source: `${HOFFMANN}. ${LIMITS}`,
    implementation: (s: string, q?: number) => {
      const { homoEv, lumoEv } = summaryFrontier(ehtSummaryOf(s, q));
      return lumoEv - homoEv;
    },
  },
  {
    name: 'EHTCHARGE',
    family: 'Extended Hückel',
    summary: 'Mulliken net charge on an atom from the extended-Hückel density (valence electrons minus gross population).',
    params: [structure, atomIndex('atom'), charge],
    returns: { description: 'q_A', unit: 'e', kind: 'number' },
    examples: [{ formula: `=EHTCHARGE("${WATER}",1)`, expected: -0.880, tolerance: 0.001, note: 'oxygen; exaggerated, as EHT charges are' }],
    source: `${MULLIKEN}; ${HOFFMANN}. ${LIMITS}`,
    implementation: (s: string, atom: number, q?: number) => summaryCharge(ehtSummaryOf(s, q), atom),
  },
  {
    name: 'EHTBONDPOP',
    family: 'Extended Hückel',
    summary: 'Mulliken overlap population between two atoms (positive = bonding, negative = antibonding).',
    params: [structure, atomIndex('i'), atomIndex('j'), charge],
    returns: { description: '2 Σ P_μν S_μν over μ on i, ν on j', unit: 'e', kind: 'number' },
    examples: [{ formula: `=EHTBONDPOP("${ETHYLENE}",1,2)`, expected: 1.304, tolerance: 0.001, note: 'C=C' }],
    source: `${MULLIKEN}. Atoms need not be bonded: non-bonded pairs give small or negative values. ${LIMITS}`,
    implementation: (s: string, i: number, j: number, q?: number) => summaryOverlapPopulation(ehtSummaryOf(s, q), i, j),
  },
  {
    name: 'EHTENERGY',
    family: 'Extended Hückel',
    summary: 'Sum of occupied extended-Hückel orbital energies Σ n_k ε_k, eV: compares shapes of one molecule (same atoms, same charge), not different molecules.',
    params: [structure, charge],
    returns: { description: 'Σ n_k ε_k', unit: 'eV', kind: 'number' },
    examples: [{ formula: `=EHTENERGY("${WATER}")`, expected: -161.242, tolerance: 0.001 }],
    source: `${HOFFMANN}; Walsh-type shape comparisons: A. D. Walsh, J. Chem. Soc. 2260 (1953). No nuclear repulsion term: differences between geometries are meaningful only qualitatively. ${LIMITS}`,
    implementation: (s: string, q?: number) => ehtSummaryOf(s, q).oneElectronEnergyEv,
  },
  {
    name: 'EHTHOMOMAKEUP',
    family: 'Extended Hückel',
    summary: 'The HOMO\'s largest atomic contributions as text, e.g. "O1 2p 1.00": element and atom number, shell, Mulliken share.',
    params: [structure, charge],
    returns: { description: 'up to four shares of at least 0.05, largest first', kind: 'text' },
    examples: [
      { formula: `=EHTHOMOMAKEUP("${WATER}")`, expected: 'O1 2p 1.00', note: 'the out-of-plane lone pair' },
      { formula: `=EHTHOMOMAKEUP("${ETHYLENE}")`, expected: 'C1 2p 0.50; C2 2p 0.50', note: 'the C=C π bond' },
    ],
    source: `Mulliken shares c_μ Σ_ν S_μν c_ν summed over each atom's shell (${MULLIKEN}); a degenerate HOMO set is averaged. ${LIMITS}`,
    implementation: (s: string, q?: number) => {
      return summaryHomoMakeup(ehtSummaryOf(s, q));
    },
  },
  {
    name: 'EHTGEOMETRY',
    family: 'Extended Hückel',
    summary: 'Which 3D geometry the extended-Hückel functions used for a structure: XYZ or molfile as given, or the SMILES conformer.',
    params: [structure],
    returns: { description: 'geometry source and atom count', kind: 'text' },
    examples: [{ formula: `=EHTGEOMETRY("${WATER}")`, expected: 'XYZ text as given, 3 atoms' }],
    source: `SMILES conformers: openchemlib ConformerGenerator (fixed seed ${CONFORMER_SEED}) and MMFF94s+ (T. A. Halgren, J. Comput. Chem. 17, 490 (1996); 20, 720 (1999)).`,
    implementation: (s: string) => {
      if (typeof s !== 'string') throw new ChemError('the structure must be text: SMILES, XYZ or a molfile');
      return describeGeometry(ehtSummaryOf(s));
    },
  },
];
