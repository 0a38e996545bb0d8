// π spectra by Pariser–Parr–Pople SCF + single-excitation CI, from SMILES. Science in
// functions/chem/ppp.ts, pppScf.ts and pppParams.ts; results are cached per structure text.
import { ChemError, type CatalogEntry, type ParamSpec, type SpillArg } from './types.js';
import { homoLumoBand, MAX_CIS_CONFIGURATIONS, MAX_PPP_CENTRES, nthSinglet, pppSpectrumOf, strongestBand, type ExcitedState, type PppSpectrum } from '../chem/ppp.js';
import { piSystemOf } from './huckelLimits.js';

export const PPP_SOURCE =
  'Pariser–Parr–Pople π-electron SCF (R. Pariser & R. G. Parr, J. Chem. Phys. 21, 466 and 767 (1953); J. A. Pople, Trans. Faraday Soc. 49, 1375 (1953)) with Mataga–Nishimoto repulsion (Z. Phys. Chem. 13, 140 (1957)) and CI of single excitations (Pariser, J. Chem. Phys. 24, 250 (1956)); ' +
  'planar geometry from the 2D drawing scaled to 1.40 Å bonds; β follows the SCF bond order. Parameters: C I = 11.16 eV, γ = 11.13 eV, β = −2.39 eV; heteroatoms from Hinze–Jaffé-based PPP tables (recalled from memory, see docs/spectra.md). ' +
  `Closed-shell π systems of C, N, O, S and halogens up to ${MAX_PPP_CENTRES} centres; CIS keeps the ${MAX_CIS_CONFIGURATIONS} lowest single excitations. ` +
  'Only π→π* bands: n→π* bands (carbonyls, azo, azines) and vibronic structure are not modelled. Error against experiment: RMS about 0.25 eV over polyenes and acenes, acene p bands 0.3–0.5 eV too high (docs/spectra.md).';

const SEE_ALSO = 'See also: PPPEXCITE, PPPLAMBDA, PPPOSC, PPPSTRONGEST, PPPTRIPLET, PPPSTGAP, PPPSTATES; ABSORPTION(…, "ppp").';

const structure: ParamSpec = {
  name: 'structure',
  type: 'string',
  description: 'SMILES text of a closed-shell conjugated molecule (π centres found as in the Hückel family).',
};
const stateIndex: ParamSpec = { name: 'n', type: 'integer', optional: true, default: 1, description: 'Singlet state number, 1 = lowest.' };

const pick = (s: string, n: number | undefined): ExcitedState => nthSinglet(pppSpectrumOf(s), n ?? 1);

/** Rows listed by PPPSTATES. */
export const STATE_ROWS = 10;
const FIELDS = ['ev', 'nm', 'f', 'transition'] as const;

function stateRow(state: ExcitedState): (number | string)[] {
  return [state.energy, state.wavelength, state.f, `${state.leading} (${Math.round(state.leadingWeight * 100)} %)`];
}

function statesSpill(args: SpillArg[]): { rows: number; cols: number } {
  if (args.length >= 2) return { rows: 1, cols: 1 };
  const arg = args[0];
  if (arg?.kind === 'literal') {
    if (typeof arg.value !== 'string') return { rows: 1, cols: 1 };
    try {
      const pi = piSystemOf(arg.value);
      const occupied = Math.floor(pi.electrons / 2);
      const states = Math.min(MAX_CIS_CONFIGURATIONS, occupied * (pi.centres.length - occupied));
      return states > 0 ? { rows: Math.min(STATE_ROWS, states), cols: 4 } : { rows: 1, cols: 1 };
    } catch {
      return { rows: 1, cols: 1 };
    }
  }
  return { rows: STATE_ROWS, cols: 4 };
}

function statesTable(spectrum: PppSpectrum) {
  return spectrum.singlets.slice(0, STATE_ROWS).map(stateRow);
}

export const spectraEntries: CatalogEntry[] = [
  {
    name: 'PPPEXCITE',
    family: 'π spectra',
    summary: 'Energy of the n-th singlet π→π* excitation (PPP-CIS), eV.',
    params: [structure, stateIndex],
    returns: { description: 'vertical excitation energy', unit: 'eV', kind: 'number' },
    examples: [
      { formula: '=PPPEXCITE("c1ccccc1")', expected: 4.907, tolerance: 0.005, note: 'benzene ¹B2u; observed 4.9 eV (254 nm band)' },
      { formula: '=PPPEXCITE("C=CC=C")', expected: 5.795, tolerance: 0.005, note: 'butadiene; observed band maximum 217 nm = 5.71 eV' },
    ],
    source: `${PPP_SOURCE} ${SEE_ALSO}`,
    implementation: (s: string, n?: number) => pick(s, n).energy,
  },
  {
    name: 'PPPLAMBDA',
    family: 'π spectra',
    summary: 'Wavelength of the n-th singlet π→π* excitation (PPP-CIS), nm: 1239.84 / E(eV).',
    params: [structure, stateIndex],
    returns: { description: 'wavelength of the vertical excitation', unit: 'nm', kind: 'number' },
    examples: [
      { formula: '=PPPLAMBDA("c1ccc2cccc2cc1")', expected: 610, tolerance: 2, note: 'azulene, the weak visible band (observed ≈ 580 nm; non-alternant, outside ABSORPTION\'s reach)' },
      { formula: '=PPPLAMBDA("C=CC=CC=CC=CC=C")', expected: 341, tolerance: 1, note: 'decapentaene; observed 334 nm' },
    ],
    source: `${PPP_SOURCE} ${SEE_ALSO}`,
    implementation: (s: string, n?: number) => pick(s, n).wavelength,
  },
  {
    name: 'PPPOSC',
    family: 'π spectra',
    summary: 'Oscillator strength of the n-th singlet: f = (2/3)·ΔE·|μ|² in atomic units.',
    params: [structure, stateIndex],
    returns: { description: 'oscillator strength (dimensionless; 0 for a symmetry-forbidden band)', kind: 'number' },
    examples: [
      { formula: '=PPPOSC("c1ccccc1",1)', expected: 0, tolerance: 1e-6, note: 'benzene ¹B2u is symmetry-forbidden (observed only through vibronic coupling, f ≈ 0.001)' },
      { formula: '=PPPOSC("C=CC=CC=C")', expected: 1.438, tolerance: 0.01, note: 'hexatriene, the strong 1Bu band' },
    ],
    source: `${PPP_SOURCE} Transition dipoles from the planar geometry with zero differential overlap; PPP-CIS oscillator strengths run high (often 1.5–2× measured band intensities). ${SEE_ALSO}`,
    implementation: (s: string, n?: number) => pick(s, n).f,
  },
  {
    name: 'PPPSTRONGEST',
    family: 'π spectra',
    summary: 'Wavelength (nm) of the singlet band with the largest oscillator strength above a given wavelength.',
    params: [structure, { name: 'above_nm', type: 'number', unit: 'nm', optional: true, default: 200, description: 'Only bands at longer wavelength than this count (200 nm: the usual UV-vis window).' }],
    returns: { description: 'wavelength of the strongest band', unit: 'nm', kind: 'number' },
    examples: [
      { formula: '=PPPSTRONGEST("c1ccc2cc3ccccc3cc2c1")', expected: 244.6, tolerance: 1, note: 'anthracene β band; observed 252 nm' },
      { formula: '=PPPSTRONGEST("c1ccc2cc3ccccc3cc2c1",300)', expected: 337.3, tolerance: 1, note: 'anthracene p band; observed 375 nm (PPP-CIS places acene p bands high)' },
    ],
    source: `${PPP_SOURCE} ${SEE_ALSO}`,
    implementation: (s: string, above?: number) => strongestBand(pppSpectrumOf(s), above ?? 200).wavelength,
  },
  {
    name: 'PPPTRIPLET',
    family: 'π spectra',
    summary: 'Energy of the lowest triplet π→π* state T1 (PPP-CIS), eV.',
    params: [structure],
    returns: { description: 'T1 vertical excitation energy', unit: 'eV', kind: 'number' },
    examples: [{ formula: '=PPPTRIPLET("c1ccc2ccccc2c1")', expected: 1.85, tolerance: 0.01, note: 'naphthalene; observed T1 2.6 eV (recalled from memory): PPP-CIS triplets run low' }],
    source: `${PPP_SOURCE} Triplet CIS: ΔE − J; without correlation the triplets fall 0.5–1 eV below experiment. ${SEE_ALSO}`,
    implementation: (s: string) => pppSpectrumOf(s).triplets[0],
  },
  {
    name: 'PPPSTGAP',
    family: 'π spectra',
    summary: 'Singlet–triplet gap E(S1) − E(T1) from PPP-CIS, eV.',
    params: [structure],
    returns: { description: 'S1 − T1', unit: 'eV', kind: 'number' },
    examples: [{ formula: '=PPPSTGAP("C=CC=C")', expected: 4.225, tolerance: 0.01, note: 'butadiene' }],
    source: `${PPP_SOURCE} The gap inherits the low triplets (see PPPTRIPLET): read it as an upper estimate. ${SEE_ALSO}`,
    implementation: (s: string) => {
      const spectrum = pppSpectrumOf(s);
      return spectrum.singlets[0].energy - spectrum.triplets[0];
    },
  },
  {
    name: 'PPPSTATES',
    family: 'π spectra',
    summary: `Table of the lowest singlet states (up to ${STATE_ROWS}): energy eV, wavelength nm, oscillator strength, leading transition; or one value with a state number and field.`,
    params: [
      structure,
      { name: 'n', type: 'integer', optional: true, description: 'State number (1 = lowest); omit to spill the table.' },
      { name: 'field', type: 'string', optional: true, choices: ['eV', 'nm', 'f', 'transition'], description: 'Column for a single value: "eV" (default), "nm", "f" or "transition".' },
    ],
    returns: { description: 'rows of (eV, nm, f, leading transition with its weight)', kind: 'array' },
    examples: [
      {
        formula: '=PPPSTATES("C=CC=C")',
        expected: [
          [5.795, 213.9, 1.033, 'HOMO→LUMO (99 %)'],
          [6.8, 182.3, 0, 'HOMO−1→LUMO (50 %)'],
          [8.402, 147.6, 0, 'HOMO−1→LUMO (50 %)'],
          [9.781, 126.8, 0.441, 'HOMO−1→LUMO+1 (99 %)'],
        ],
        tolerance: 0.1,
        note: 'butadiene: 2×2 = 4 single excitations',
      },
      { formula: '=PPPSTATES("C=CC=CC=C",1,"transition")', expected: 'HOMO→LUMO (99 %)', note: 'hexatriene S1' },
    ],
    source: `${PPP_SOURCE} A cell reference spills a fixed ${STATE_ROWS} rows (unused rows empty). ${SEE_ALSO}`,
    spill: statesSpill,
    implementation: (s: string, n?: number, field?: string) => {
      const spectrum = pppSpectrumOf(s);
      if (n === undefined) {
        if (field !== undefined && field.trim() !== '') throw new ChemError('PPPSTATES: give a state number n with field');
        return statesTable(spectrum);
      }
      const state = nthSinglet(spectrum, n);
      const key = (field ?? 'eV').trim().toLowerCase() || 'ev';
      const column = FIELDS.indexOf(key as (typeof FIELDS)[number]);
      if (column < 0) throw new ChemError(`PPPSTATES: field must be "eV", "nm", "f" or "transition", not "${field}"`);
      return stateRow(state)[column];
    },
  },
];

/** The PPP band the Hückel gap estimate aims at (most HOMO→LUMO character), nm: ABSORPTION's "ppp" model. */
export function pppAbsorptionNm(smiles: string): number {
  return homoLumoBand(pppSpectrumOf(smiles)).wavelength;
}
