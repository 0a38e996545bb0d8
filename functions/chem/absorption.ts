// Estimated absorption maximum from the Hückel HOMO–LUMO gap through an empirical linear relation,
//   E_max (eV) = |β| · gap + offset,    λ_max (nm) = hc / E_max,
// the long-standing use of a "spectroscopic β" (Streitwieser 1961, ch. 8). hc = 1239.84198 eV·nm
// (CODATA 2018: h and c exact, e exact). This is a screening estimate, not a spectrum: simple Hückel
// theory ignores bond alternation and electron repulsion, so polyenes and acenes fall on different
// lines and one relation for both misses individual bands by up to about 30 % (see the fit below).
import { ChemError } from './errors.js';

export const HC_EV_NM = 1239.84198;

/**
 * Least-squares fit of E_max = |β|·gap + offset over ABSORPTION_REFERENCE_SPECTRA (all nine points,
 * unweighted, energies in eV); RMS residual 0.68 eV. tests/chem-huckel-absorption.test.ts refits
 * from the data and checks these constants. Per-class fits, for users who know their class (RMS
 * 0.08 eV each, same test): polyenes only |β| = 2.911 eV, offset 2.160 eV; acenes only |β| = 2.496 eV,
 * offset 1.155 eV.
 */
export const DEFAULT_BETA_EV = 2.2783;
export const DEFAULT_OFFSET_EV = 1.963;

export interface ReferenceSpectrum {
  name: string;
  smiles: string;
  lambdaMaxNm: number;
  source: string;
}

/**
 * Band maxima of the strong long-wavelength π→π* band (HOMO→LUMO in Hückel terms). Polyenes: the
 * all-trans chains in hydrocarbon solvent; acenes: Clar's p band (¹La in Platt's notation).
 */
export const ABSORPTION_REFERENCE_SPECTRA: ReferenceSpectrum[] = [
  { name: '1,3-butadiene', smiles: 'C=CC=C', lambdaMaxNm: 217, source: 'organic spectroscopy texts, e.g. Pavia et al., Introduction to Spectroscopy, polyene table (from memory)' },
  { name: '1,3,5-hexatriene', smiles: 'C=CC=CC=C', lambdaMaxNm: 258, source: 'same table (from memory)' },
  { name: '1,3,5,7-octatetraene', smiles: 'C=CC=CC=CC=C', lambdaMaxNm: 290, source: 'same table (from memory)' },
  { name: '1,3,5,7,9-decapentaene', smiles: 'C=CC=CC=CC=CC=C', lambdaMaxNm: 334, source: 'same table (from memory)' },
  { name: 'benzene', smiles: 'c1ccccc1', lambdaMaxNm: 204, source: 'E. Clar, Polycyclic Hydrocarbons (1964), p band (from memory)' },
  { name: 'naphthalene', smiles: 'c1ccc2ccccc2c1', lambdaMaxNm: 286, source: 'Clar (1964), p band (from memory)' },
  { name: 'anthracene', smiles: 'c1ccc2cc3ccccc3cc2c1', lambdaMaxNm: 375, source: 'Clar (1964), p band (from memory)' },
  { name: 'tetracene', smiles: 'c1ccc2cc3cc4ccccc4cc3cc2c1', lambdaMaxNm: 471, source: 'Clar (1964), p band (from memory)' },
  { name: 'pentacene', smiles: 'c1ccc2cc3cc4cc5ccccc5cc4cc3cc2c1', lambdaMaxNm: 580, source: 'Clar (1964), p band (from memory)' },
];

export interface LinearGapFit {
  betaEv: number;
  offsetEv: number;
  /** Root-mean-square residual of the fitted energies, eV. */
  rmsEv: number;
}

/** Ordinary least squares of E = β·gap + offset over (gap in |β| units, λ in nm) points. */
export function fitGapRelation(points: { gap: number; lambdaMaxNm: number }[]): LinearGapFit {
  const n = points.length;
  const energies = points.map((p) => HC_EV_NM / p.lambdaMaxNm);
  const meanGap = points.reduce((s, p) => s + p.gap, 0) / n;
  const meanEnergy = energies.reduce((s, e) => s + e, 0) / n;
  let sxy = 0;
  let sxx = 0;
  points.forEach((p, i) => {
    sxy += (p.gap - meanGap) * (energies[i] - meanEnergy);
    sxx += (p.gap - meanGap) ** 2;
  });
  const betaEv = sxy / sxx;
  const offsetEv = meanEnergy - betaEv * meanGap;
  const rmsEv = Math.sqrt(points.reduce((s, p, i) => s + (betaEv * p.gap + offsetEv - energies[i]) ** 2, 0) / n);
  return { betaEv, offsetEv, rmsEv };
}

/** λ_max in nm from a gap in |β| units. */
export function absorptionMaxNm(gap: number, betaEv = DEFAULT_BETA_EV, offsetEv = DEFAULT_OFFSET_EV): number {
  if (betaEv === 0) throw new ChemError('beta_eV must not be 0 (an empty argument counts as 0: leave it out, or give a value)');
  if (gap <= 0) throw new ChemError('the HOMO–LUMO gap is 0 (open-shell degenerate π shell): no absorption estimate for this ground state');
  const energyEv = Math.abs(betaEv) * gap + offsetEv;
  if (!(energyEv > 0)) throw new ChemError(`|β|·gap + offset = ${Number(energyEv.toPrecision(4))} eV is not a positive transition energy; check beta_eV and offset_eV`);
  return HC_EV_NM / energyEv;
}
