// The Hückel π-system family: levels, gaps, π energies, bond orders, charges, aromaticity and an
// absorption estimate, from a SMILES string or a hand-built Hückel matrix. Science in functions/chem/.
import { oneBasedIndex } from '../chem/errors.js';
import { ChemError, type CatalogEntry, type ParamSpec, type Table } from './types.js';
import { absorptionMaxNm, DEFAULT_BETA_EV, DEFAULT_OFFSET_EV, HC_EV_NM } from '../chem/absorption.js';
import { pppAbsorptionNm } from './spectra.js';
import { aromaticity, ringVerdicts } from '../chem/ringAromaticity.js';
import { bondOrder, checkElectronCount, delocalizationEnergy, frontierGap, piCharge, piEnergy, type HuckelModel } from '../chem/huckel.js';
import { huckelModelOf, piSystemOf, requireSmiles } from './huckelLimits.js';
import { checkSpillLength, column, levelRowsFromText, pickIndex } from './huckelSpill.js';
import { secularEntries } from './huckelSecular.js';

/** Rows a RINGAROMATICITY spill may hold. */
const MAX_RING_ROWS = 20;

const STREITWIESER = 'A. Streitwieser, Molecular Orbital Theory for Organic Chemists (Wiley, 1961)';
const PARAMS_NOTE =
  'Heteroatom parameters α_X = α + hβ, β_CX = kβ: Streitwieser (1961) Table 5-1 by default, or F. A. Van-Catledge, J. Org. Chem. 45, 4801 (1980).';

const structure: ParamSpec = {
  name: 'structure',
  type: 'range',
  description:
    'SMILES text (parsed with openchemlib; π centres found from bonding and charges), or a square range holding the Hückel matrix in β units (diagonal h, off-diagonal k; one π electron per centre unless told otherwise).',
};
const params: ParamSpec = {
  name: 'params',
  type: 'string',
  optional: true,
  choices: ['streitwieser', 'van-catledge'],
  description: 'Heteroatom parameter set for SMILES input: "streitwieser" when omitted (its S and P values are taken from Van-Catledge 1980, which Streitwieser\'s table lacks), or "van-catledge". Not used with a matrix.',
};
const electrons: ParamSpec = {
  name: 'electrons',
  type: 'integer',
  optional: true,
  description: 'π electron count; default: from the structure (SMILES), or one per centre (matrix).',
};
const atomIndex = (name: string): ParamSpec => ({
  name,
  type: 'integer',
  description: 'Atom number: heavy atoms in the order the SMILES writes them, from 1 (or the matrix row).',
});

function electronCount(model: HuckelModel, given: number | undefined): number {
  return given === undefined ? model.electrons : checkElectronCount(model, given);
}

/** Maps a 1-based atom number to a π-centre index, explaining why an atom cannot be used. */
function centreIndex(model: HuckelModel, atom: number): number {
  const pi = model.pi;
  if (!pi) {
    return oneBasedIndex(atom, model.levels.length, { item: 'atom', items: 'centres', holder: 'the matrix' });
  }
  if (!pi.numberingFollowsSmiles)
    throw new ChemError(`atom numbers are ambiguous in '${pi.smiles}': it writes hydrogens as atoms ([H]); write them inside the brackets ([CH2]) or leave them implicit`);
  oneBasedIndex(atom, pi.atomCount, { item: 'atom', items: 'heavy atoms', holder: `'${pi.smiles}'` });
  const centre = pi.centreOfAtom.get(atom);
  if (centre === undefined)
    throw new ChemError(`atom ${atom} (${pi.atomElements[atom - 1]}) of '${pi.smiles}' is not in the π system: it has no p orbital in the conjugated framework`);
  return centre;
}

const piEntries: CatalogEntry[] = [
  {
    name: 'HUCKEL',
    family: 'Hückel',
    summary: 'Hückel π levels x (E = α + xβ, β < 0), most bonding first; spills a column, or gives level k.',
    params: [structure, params, { name: 'k', type: 'integer', optional: true, description: 'Level number (1 = most bonding); omit to spill all levels.' }],
    returns: { description: 'x for each level, in units of β (a column), or one x', unit: 'β', kind: 'array' },
    examples: [
      { formula: '=HUCKEL("C=CC=C")', expected: [[1.6180339887], [0.6180339887], [-0.6180339887], [-1.6180339887]], tolerance: 1e-8, note: 'butadiene, 2cos(kπ/5)' },
      { formula: '=HUCKEL("c1ccccc1",,2)', expected: 1, tolerance: 1e-9, note: 'benzene e1g pair at α + β' },
      { formula: '=HUCKEL("c1ccncc1","streitwieser",1)', expected: 2.107, tolerance: 1e-3, note: 'pyridine with h_N = 0.5, k_CN = 1 (Streitwieser 1961; from memory)' },
    ],
    source: `E. Hückel, Z. Phys. 70, 204 (1931); ${STREITWIESER}. ${PARAMS_NOTE} A cell reference spills a fixed 50 rows (unused rows empty); use k in screening columns. LEVELGAP fills the lowest energy first, so give it energies: LEVELGAP(-HUCKEL(s), n), as E − α = −x|β| (for alternant hydrocarbons the pairing theorem makes the sign immaterial).`,
    spill: (args) => (args.length >= 3 ? { rows: 1, cols: 1 } : levelRowsFromText(args[0])),
    implementation: (s: Table, p?: string, k?: number) => {
      const model = huckelModelOf(s, p);
      if (k !== undefined) return pickIndex(model.levels, k, 'level', 'levels');
      checkSpillLength(model.levels.length, 'HUCKEL', 'HUCKEL(structure, params, k)');
      return column(model.levels);
    },
  },
  {
    name: 'PIGAP',
    family: 'Hückel',
    summary: 'HOMO–LUMO gap of the π system in units of |β|; 0 when the HOMO is a partly filled degenerate set.',
    params: [structure, params, electrons],
    returns: { description: 'x_HOMO − x_LUMO', unit: '|β|', kind: 'number' },
    examples: [
      { formula: '=PIGAP("C=CC=C")', expected: 1.2360679775, tolerance: 1e-8, note: 'butadiene 0.618 − (−0.618)' },
      { formula: '=PIGAP("c1ccccc1")', expected: 2, tolerance: 1e-9 },
      { formula: '=PIGAP("C1=CC=C1")', expected: 0, tolerance: 1e-9, note: 'cyclobutadiene: two electrons in the degenerate x = 0 pair (open shell)' },
    ],
    source: `${STREITWIESER}. Open-shell degenerate case (gap 0): the least bonding occupied level belongs to a degenerate set that is only partly filled, e.g. cyclobutadiene or the cyclopentadienyl radical. A radical's singly filled non-degenerate level counts as the HOMO.`,
    implementation: (s: Table, p?: string, n?: number) => {
      const model = huckelModelOf(s, p);
      return frontierGap(model, electronCount(model, n)).gap;
    },
  },
  {
    name: 'PIENERGY',
    family: 'Hückel',
    summary: 'Total π energy as the coefficient of β: E_π = nα + (Σ n_k x_k)β, electrons from the structure.',
    params: [structure, params, electrons],
    returns: { description: 'Σ n_k x_k', unit: 'β', kind: 'number' },
    examples: [
      { formula: '=PIENERGY("c1ccccc1")', expected: 8, tolerance: 1e-9, note: 'benzene 6α + 8β' },
      { formula: '=PIENERGY("C=CC=C")', expected: 4.472135955, tolerance: 1e-8 },
      { formula: '=PIENERGY("[CH+]1C=CC=CC=C1")', expected: 8.9879, tolerance: 1e-4, note: 'tropylium, 6 π electrons' },
    ],
    source: `${STREITWIESER}, ch. 2. Electrons: one per carbon, 0 for a carbocation, 2 for a carbanion, and per heteroatom type (pyridine N 1, pyrrole N 2, carbonyl O 1, ether O 2, halogens 2).`,
    implementation: (s: Table, p?: string, n?: number) => {
      const model = huckelModelOf(s, p);
      return piEnergy(model, electronCount(model, n));
    },
  },
  {
    name: 'DELOCALIZATION',
    family: 'Hückel',
    summary: 'Delocalization energy (coefficient of β, positive = stabilized) against the localized Kekulé structure of the SMILES.',
    params: [structure, params],
    returns: { description: 'E_π − E_localized', unit: 'β', kind: 'number' },
    examples: [
      { formula: '=DELOCALIZATION("c1ccccc1")', expected: 2, tolerance: 1e-9, note: 'benzene 2β' },
      { formula: '=DELOCALIZATION("C=CC=C")', expected: 0.472135955, tolerance: 1e-8, note: 'butadiene 0.472β' },
    ],
    source: `${STREITWIESER}. Localized reference: each π bond of the Kekulé structure as an isolated two-centre bond (2 per C=C, the ethylene reference; for X=Y the 2×2 Hückel root with h_X, h_Y, k_XY) plus every other centre's electrons at α_X (lone pairs, empty cation orbital, radical). SMILES input only.`,
    implementation: (s: Table, p?: string) => {
      requireSmiles(s, 'DELOCALIZATION');
      return delocalizationEnergy(huckelModelOf(s, p));
    },
  },
  {
    name: 'PIBONDORDER',
    family: 'Hückel',
    summary: 'Coulson π bond order between two bonded atoms.',
    params: [structure, atomIndex('i'), atomIndex('j'), params, electrons],
    returns: { description: 'p_ij = Σ n_k c_ik c_jk', kind: 'number' },
    examples: [
      { formula: '=PIBONDORDER("C=CC=C",1,2)', expected: 0.894427191, tolerance: 1e-8 },
      { formula: '=PIBONDORDER("C=CC=C",2,3)', expected: 0.4472135955, tolerance: 1e-8 },
      { formula: '=PIBONDORDER("c1ccccc1",1,2)', expected: 0.6666666667, tolerance: 1e-8 },
    ],
    source: `C. A. Coulson, Proc. R. Soc. A 169, 413 (1939); ${STREITWIESER}, ch. 4. Atoms are numbered as the SMILES writes its heavy atoms, from 1.`,
    implementation: (s: Table, i: number, j: number, p?: string, n?: number) => {
      const model = huckelModelOf(s, p);
      const a = centreIndex(model, i);
      const b = centreIndex(model, j);
      if (a === b) throw new ChemError(`i and j are both atom ${i}: a bond order needs two different atoms`);
      if (model.matrix[a][b] === 0) throw new ChemError(`atoms ${i} and ${j} are not bonded in the π system, so they have no bond order`);
      return bondOrder(model, electronCount(model, n), a, b);
    },
  },
  {
    name: 'PICHARGE',
    family: 'Hückel',
    summary: 'Net π charge on an atom: its π core charge minus its Coulson π electron density.',
    params: [structure, atomIndex('i'), params, electrons],
    returns: { description: 'core charge − q_i (positive = π electron poor)', unit: 'e', kind: 'number' },
    examples: [
      { formula: '=PICHARGE("[CH2+]C=C",1)', expected: 0.5, tolerance: 1e-9, note: 'allyl cation terminal carbon' },
      { formula: '=PICHARGE("[CH2+]C=C",2)', expected: 0, tolerance: 1e-9 },
      { formula: '=PICHARGE("c1ccccc1",3)', expected: 0, tolerance: 1e-9 },
    ],
    source: `Coulson (1939); ${STREITWIESER}, ch. 4. Core charge: the electrons the atom gives plus its formal charge (1 for carbon, 2 for pyrrole N, 1 for pyridine N; 1 per centre for a matrix). Atoms numbered as the SMILES writes its heavy atoms.`,
    implementation: (s: Table, i: number, p?: string, n?: number) => {
      const model = huckelModelOf(s, p);
      return piCharge(model, electronCount(model, n), centreIndex(model, i));
    },
  },
  {
    name: 'AROMATICITY',
    family: 'Hückel',
    summary: '"aromatic", "antiaromatic" or "non-aromatic": the 4n+2 / 4n rule ring by ring; the molecule takes the verdict of its most stabilised ring.',
    params: [structure],
    returns: { description: 'verdict', kind: 'text' },
    examples: [
      { formula: '=AROMATICITY("c1ccccc1")', expected: 'aromatic' },
      { formula: '=AROMATICITY("C1=CC=C1")', expected: 'antiaromatic' },
      { formula: '=AROMATICITY("C1=CC=CC1")', expected: 'non-aromatic', note: 'cyclopentadiene: the CH2 breaks the ring' },
      { formula: '=AROMATICITY("C1=CC=C[CH-]1")', expected: 'aromatic', note: 'cyclopentadienide, 6 π electrons' },
      { formula: '=AROMATICITY("O=C1c2ccccc2C(=O)c2ccccc12")', expected: 'aromatic', note: 'anthraquinone: the quinone ring is cross-conjugated, the two benzene rings are intact' },
      { formula: '=AROMATICITY("c1ccc2c(c1)-c1ccccc1-2")', expected: 'aromatic', note: 'biphenylene: benzene rings aromatic, the 4-ring antiaromatic (see RINGAROMATICITY)' },
    ],
    source:
      "Hückel (1931); R. Breslow, Acc. Chem. Res. 6, 393 (1973). Rings: openchemlib's smallest set of small rings; each ring's π electrons are its atoms' own (1 per C, 2 per pyrrole N or furan O). A ring with an sp3 atom, a ring double-bonded outside every ring (quinones, lactones, fulvenes) and every ring of a radical are non-aromatic; an odd ring is judged with the odd rings fused to it on their shared perimeter (azulene 10, pentalene 8; J. R. Platt, J. Chem. Phys. 17, 484 (1949)); rings of 8 or more count their perimeter. Precedence: aromatic if any ring is, else antiaromatic if any ring is, else non-aromatic. Planarity is assumed, so cyclooctatetraene reads antiaromatic. SMILES input only. See also RINGAROMATICITY for the verdict of each ring.",
    implementation: (s: Table) => aromaticity(requireSmiles(s, 'AROMATICITY')),
  },
  {
    name: 'RINGAROMATICITY',
    family: 'Hückel',
    summary: 'Verdict of each ring: spills atoms, π electrons counted, verdict and reason per ring; or the verdict of ring k.',
    params: [structure, { name: 'k', type: 'integer', optional: true, description: 'Ring number (order of the spilled table); omit to spill every ring.' }],
    returns: { description: 'rows of (ring atoms, π electrons, verdict, reason), or one verdict', kind: 'array' },
    examples: [
      {
        formula: '=RINGAROMATICITY("c1ccc2c(c1)-c1ccccc1-2")',
        expected: [
          ['1,2,3,4,5,6', 6, 'aromatic', '6 π electrons in the ring'],
          ['4,5,7,12', 4, 'antiaromatic', '4 π electrons in the ring'],
          ['7,8,9,10,11,12', 6, 'aromatic', '6 π electrons in the ring'],
        ],
        note: 'biphenylene',
      },
      { formula: '=RINGAROMATICITY("O=c1ccc2ccccc2o1",2)', expected: 'non-aromatic', note: 'coumarin: the lactone ring is cross-conjugated; ring 1 (benzo) is aromatic' },
    ],
    source: `Same rules as AROMATICITY. Atoms are numbered as the SMILES writes its heavy atoms; the π electrons column is empty for a ring that is not fully conjugated, and for an odd ring judged with its neighbours it shows the shared perimeter's count. A cell reference spills a fixed ${MAX_RING_ROWS} rows (unused rows empty).`,
    spill: (args) => {
      if (args.length >= 2) return { rows: 1, cols: 1 };
      const arg = args[0];
      if (arg?.kind === 'literal') {
        if (typeof arg.value !== 'string') return { rows: 1, cols: 1 };
        try {
          const n = ringVerdicts(piSystemOf(arg.value)).length;
          return n > 0 && n <= MAX_RING_ROWS ? { rows: n, cols: 4 } : { rows: 1, cols: 1 };
        } catch {
          return { rows: 1, cols: 1 };
        }
      }
      return { rows: MAX_RING_ROWS, cols: 4 };
    },
    implementation: (s: Table, k?: number) => {
      const verdicts = ringVerdicts(requireSmiles(s, 'RINGAROMATICITY'));
      if (verdicts.length === 0) throw new ChemError('no rings in this structure, so no ring verdicts');
      if (k !== undefined) return pickIndex(verdicts, k, 'ring', 'rings').verdict;
      if (verdicts.length > MAX_RING_ROWS) throw new ChemError(`RINGAROMATICITY would spill ${verdicts.length} rings, more than ${MAX_RING_ROWS}; give the ring number k`);
      return verdicts.map((r) => [r.atoms.join(','), r.electrons ?? '', r.verdict, r.reason]);
    },
  },
  {
    name: 'ABSORPTION',
    family: 'Hückel',
    summary: 'ESTIMATED π→π* absorption maximum in nm from the Hückel gap: λ = 1239.84/(|β|·gap + offset). A screening estimate, not a measured spectrum.',
    params: [
      structure,
      { name: 'beta_eV', type: 'number', unit: 'eV', optional: true, default: DEFAULT_BETA_EV, description: 'Spectroscopic |β| in eV.' },
      { name: 'offset_eV', type: 'number', unit: 'eV', optional: true, default: DEFAULT_OFFSET_EV, description: 'Offset of the linear relation in eV.' },
      params,
      {
        name: 'model',
        type: 'string',
        optional: true,
        choices: ['huckel', 'ppp'],
        description:
          '"huckel" (default, the linear gap relation; existing sheets keep their values) or "ppp": the PPP-CIS singlet with the most HOMO→LUMO character (beta_eV, offset_eV and params are then not used).',
      },
    ],
    returns: { description: 'estimated λmax', unit: 'nm', kind: 'number' },
    examples: [
      { formula: '=ABSORPTION("C=CC=CC=C")', expected: 310.7, tolerance: 0.1, note: 'hexatriene; observed 258 nm — the one-line fit overestimates polyenes' },
      { formula: '=ABSORPTION("C=CC=CC=C",2.911,2.160)', expected: 261.0, tolerance: 0.1, note: 'with the polyene-only fit (observed 258 nm)' },
      { formula: '=ABSORPTION("c1ccc2cccc2cc1",,,,"ppp")', expected: 610, tolerance: 2, note: 'azulene by PPP-CIS (observed ≈ 580 nm); the Hückel relation cannot go past ~632 nm and is not calibrated for azulene' },
    ],
    source: `${STREITWIESER}, ch. 8 (spectroscopic β). Defaults |β| = ${DEFAULT_BETA_EV} eV, offset ${DEFAULT_OFFSET_EV} eV: least squares over butadiene 217, hexatriene 258, octatetraene 290, decapentaene 334 nm and the acene p bands of benzene 204, naphthalene 286, anthracene 375, tetracene 471, pentacene 580 nm (E. Clar, Polycyclic Hydrocarbons, 1964); RMS 0.68 eV, errors up to ~30 %. Polyene-only fit: 2.911, 2.160; acene-only: 2.496, 1.155. Ceiling: with the default offset no gap gives more than 1239.84/${DEFAULT_OFFSET_EV} ≈ ${Math.round(HC_EV_NM / DEFAULT_OFFSET_EV)} nm, so deep-coloured dyes are out of reach. Calibrated only on alternant hydrocarbons: non-alternant molecules (azulene) and heteroatom molecules (dyes, carbonyls, azines) lie outside its calibration. For predicted spectra use model "ppp" or the π spectra family: PPPLAMBDA, PPPSTRONGEST, PPPSTATES.`,
    implementation: (s: Table, betaEv: number = DEFAULT_BETA_EV, offsetEv: number = DEFAULT_OFFSET_EV, p?: string, which?: string) => {
      const choice = (which ?? '').trim().toLowerCase();
      if (choice === 'ppp') return pppAbsorptionNm(requireSmiles(s, 'ABSORPTION with model "ppp"').smiles);
      if (choice !== '' && choice !== 'huckel' && choice !== 'hückel') throw new ChemError(`ABSORPTION: model must be "huckel" or "ppp", not "${which}"`);
      const model = huckelModelOf(s, p);
      return absorptionMaxNm(frontierGap(model, model.electrons).gap, betaEv, offsetEv);
    },
  },
];

export const huckelEntries: CatalogEntry[] = [...piEntries, ...secularEntries];
