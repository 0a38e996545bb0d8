// Parameters of the Pariser–Parr–Pople π-electron model (R. Pariser & R. G. Parr, J. Chem. Phys. 21,
// 466 and 767 (1953); J. A. Pople, Trans. Faraday Soc. 49, 1375 (1953)).
//
// Per centre type (the same types the Hückel family assigns, see piSystem.ts):
//   I   valence-state ionisation potential of the π orbital, eV (the core integral is U = −I);
//   γ   one-centre repulsion γ_ii = I − A (Pariser's approximation, J. Chem. Phys. 21, 568 (1953));
//   Z   core charge = π electrons the centre gives.
// Carbon: I = 11.16 eV, γ = 11.13 eV (Hinze & Jaffé valence-state values, J. Am. Chem. Soc. 84, 540
// (1962), as used throughout the PPP literature). Heteroatoms: the Hinze–Jaffé-based set as commonly
// tabulated for PPP dye calculations (e.g. J. Griffiths, Colour and Constitution of Organic Molecules,
// Academic Press 1976, ch. 2). All values are RECALLED FROM MEMORY and not checked against the printed
// tables; tests/chem-ppp.test.ts checks the spectra they give against experiment instead.
//
// Resonance integrals β_XY (eV) at the aromatic reference bond order p = 2/3 (R ≈ 1.397 Å): C–C −2.39
// (Pariser & Parr 1953, fitted to benzene); heteroatom bonds from the same compilations (recalled from
// memory). The variable-β rule in pppScf.ts scales them with the SCF bond order.
import { ChemError } from './errors.js';
import type { CentreType } from './huckelParams.js';

export interface PppAtom {
  ionisation: number;
  gamma: number;
}

export const PPP_ATOMS: Partial<Record<CentreType, PppAtom>> = {
  C: { ionisation: 11.16, gamma: 11.13 },
  N1: { ionisation: 14.12, gamma: 12.34 }, // pyridine-type =N−
  N2: { ionisation: 25.59, gamma: 16.76 }, // pyrrole / amine −N<
  'N+': { ionisation: 25.59, gamma: 16.76 }, // iminium / pyridinium =N⁺<: same core as −N< (trigonal N⁺ core)
  O1: { ionisation: 17.7, gamma: 15.23 }, // carbonyl =O
  O2: { ionisation: 33.9, gamma: 21.53 }, // ether / hydroxyl / furan −O−
  'O+': { ionisation: 33.9, gamma: 21.53 }, // pyrylium-type =O⁺−
  S2: { ionisation: 20.0, gamma: 10.84 }, // thiophene / thioether −S−
  F: { ionisation: 39.39, gamma: 24.36 },
  Cl: { ionisation: 26.07, gamma: 15.03 },
  Br: { ionisation: 22.07, gamma: 13.1 },
};

/** β at the reference bond order, eV, keyed by the sorted pair of centre types (recalled from memory). */
const BETA: Record<string, number> = {
  'C|C': -2.39,
  'C|N1': -2.576,
  'N1|N1': -2.576,
  'C|N2': -2.2,
  'C|N+': -2.576,
  'C|O1': -2.576,
  'C|O2': -2.1,
  'C|O+': -2.576,
  'C|S2': -1.5,
  'C|F': -1.8,
  'C|Cl': -1.3,
  'Br|C': -1.0,
  'N1|N2': -2.3,
  'N2|O1': -2.3,
  'N1|O1': -2.576,
};

export function pppBeta(a: CentreType, b: CentreType): number {
  const key = a < b ? `${a}|${b}` : `${b}|${a}`;
  const beta = BETA[key];
  if (beta === undefined) throw new ChemError(`no PPP resonance integral for a ${a}–${b} bond in the parameter set (covered: ${Object.keys(BETA).join(', ').replace(/\|/g, '–')})`);
  return beta;
}

/** Coulomb constant e²/(4πε₀) in eV·Å (CODATA 2018: 14.399645 eV·Å). */
export const E2_EV_ANGSTROM = 14.399645;

/**
 * Mataga–Nishimoto two-centre repulsion γ_ij = e²/(R_ij + a_ij), a_ij = 2e²/(γ_ii + γ_jj)
 * (N. Mataga & K. Nishimoto, Z. Phys. Chem. (Frankfurt) 13, 140 (1957)); R in Å, γ in eV.
 */
export function matagaNishimoto(r: number, gammaI: number, gammaJ: number): number {
  return E2_EV_ANGSTROM / (r + (2 * E2_EV_ANGSTROM) / (gammaI + gammaJ));
}

/** Standard bond length the 2D drawing is scaled to, Å (aromatic C–C ≈ 1.40 Å: common practice). */
export const STANDARD_BOND_LENGTH = 1.4;

/**
 * Variable β: β_ij = β⁰_XY · exp(κ (p_ij − 2/3)). Bond length follows bond order, R = 1.520 − 0.186 p Å
 * (Coulson's order–length relation, recalled from memory), and β falls off exponentially with R;
 * κ = 0.316 makes β(ethylene, p = 1)/β⁰ = 1.11 and β(polyene single bond, p ≈ 0.3)/β⁰ = 0.89, the
 * ratio k_double/k_single = 1.1/0.9 Streitwieser (1961) recommends for alternating bonds. Benzene
 * (p = 2/3) keeps β⁰.
 */
export const BETA_BOND_ORDER_KAPPA = 0.316;
