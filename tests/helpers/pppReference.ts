// Experimental π→π* band maxima used to judge the PPP-CIS spectra (tests/chem-ppp.test.ts and the
// error table printed by bench/ppp.ts, quoted in docs/spectra.md). Every value is RECALLED FROM
// MEMORY from the named standard tables, not re-read from the printed page.
import { nthSinglet, strongestBand, type PppSpectrum } from '../../functions/chem/ppp.js';

export type BandClass = 'polyene' | 'acene p band' | 'acene β band' | 'benzene' | 'non-alternant' | 'heteroatom' | 'dye';

export interface ReferenceBand {
  name: string;
  smiles: string;
  cls: BandClass;
  observedNm: number;
  /** How the band is picked out of the computed states. */
  pick: (s: PppSpectrum) => { energy: number };
  source: string;
}

const HC = 1239.84198;
export const toEv = (nm: number) => HC / nm;

const strongest = (above = 200) => (s: PppSpectrum) => strongestBand(s, above);
const state = (k: number) => (s: PppSpectrum) => nthSinglet(s, k);
/** Platt's ¹La / Clar's p band: the lowest singlet with appreciable intensity (f ≥ 0.1). */
const firstAllowed = (s: PppSpectrum) => s.singlets.find((x) => x.f >= 0.1)!;
const strongestAnywhere = (s: PppSpectrum) => strongestBand(s, 0);

const POLYENES = 'all-trans polyenes in hydrocarbon solvent, polyene table of D. L. Pavia et al., Introduction to Spectroscopy (recalled from memory)';
const CLAR = 'E. Clar, Polycyclic Hydrocarbons (Academic Press, 1964), p and β bands in solution (recalled from memory)';
const BENZENE = 'benzene vapour/solution bands 254 (¹B2u), 203 (¹B1u), 180 nm (¹E1u): H. H. Jaffé & M. Orchin, Theory and Applications of Ultraviolet Spectroscopy (Wiley, 1962) (recalled from memory)';
const CYANINES = 'streptocyanines Me2N(CH=CH)nCH=NMe2⁺: S. S. Malhotra & M. C. Whiting, J. Chem. Soc. 3812 (1960) (recalled from memory)';

export const REFERENCE_BANDS: ReferenceBand[] = [
  { name: 'butadiene', smiles: 'C=CC=C', cls: 'polyene', observedNm: 217, pick: strongest(), source: POLYENES },
  { name: 'hexatriene', smiles: 'C=CC=CC=C', cls: 'polyene', observedNm: 258, pick: strongest(), source: POLYENES },
  { name: 'octatetraene', smiles: 'C=CC=CC=CC=C', cls: 'polyene', observedNm: 290, pick: strongest(), source: POLYENES },
  { name: 'decapentaene', smiles: 'C=CC=CC=CC=CC=C', cls: 'polyene', observedNm: 334, pick: strongest(), source: POLYENES },
  { name: 'benzene ¹B2u', smiles: 'c1ccccc1', cls: 'benzene', observedNm: 254, pick: state(1), source: BENZENE },
  { name: 'benzene ¹B1u (p)', smiles: 'c1ccccc1', cls: 'benzene', observedNm: 203, pick: state(2), source: BENZENE },
  { name: 'benzene ¹E1u (β)', smiles: 'c1ccccc1', cls: 'benzene', observedNm: 184, pick: strongestAnywhere, source: `${CLAR}; ${BENZENE}` },
  { name: 'naphthalene p', smiles: 'c1ccc2ccccc2c1', cls: 'acene p band', observedNm: 286, pick: firstAllowed, source: CLAR },
  { name: 'anthracene p', smiles: 'c1ccc2cc3ccccc3cc2c1', cls: 'acene p band', observedNm: 375, pick: firstAllowed, source: CLAR },
  { name: 'tetracene p', smiles: 'c1ccc2cc3cc4ccccc4cc3cc2c1', cls: 'acene p band', observedNm: 471, pick: firstAllowed, source: CLAR },
  { name: 'pentacene p', smiles: 'c1ccc2cc3cc4cc5ccccc5cc4cc3cc2c1', cls: 'acene p band', observedNm: 580, pick: firstAllowed, source: CLAR },
  { name: 'naphthalene β', smiles: 'c1ccc2ccccc2c1', cls: 'acene β band', observedNm: 221, pick: strongestAnywhere, source: CLAR },
  { name: 'anthracene β', smiles: 'c1ccc2cc3ccccc3cc2c1', cls: 'acene β band', observedNm: 252, pick: strongestAnywhere, source: CLAR },
  { name: 'tetracene β', smiles: 'c1ccc2cc3cc4ccccc4cc3cc2c1', cls: 'acene β band', observedNm: 274, pick: strongestAnywhere, source: CLAR },
  { name: 'pentacene β', smiles: 'c1ccc2cc3cc4cc5ccccc5cc4cc3cc2c1', cls: 'acene β band', observedNm: 310, pick: strongestAnywhere, source: CLAR },
  { name: 'azulene S1', smiles: 'c1ccc2cccc2cc1', cls: 'non-alternant', observedNm: 580, pick: state(1), source: 'azulene visible band maximum, Jaffé & Orchin (1962) (recalled from memory)' },
  { name: 'pyridine ¹B2', smiles: 'c1ccncc1', cls: 'heteroatom', observedNm: 251, pick: state(1), source: 'pyridine π→π* band, Jaffé & Orchin (1962) (recalled from memory)' },
  { name: 'pyridine ¹A1', smiles: 'c1ccncc1', cls: 'heteroatom', observedNm: 195, pick: state(2), source: 'same (recalled from memory)' },
  { name: 'quinoline', smiles: 'c1ccc2ncccc2c1', cls: 'heteroatom', observedNm: 275, pick: firstAllowed, source: 'quinoline 275 nm band, Jaffé & Orchin (1962) (recalled from memory)' },
  { name: 'aniline', smiles: 'Nc1ccccc1', cls: 'heteroatom', observedNm: 230, pick: strongest(), source: 'aniline 230 nm band, Pavia et al. (recalled from memory)' },
  { name: 'phenol', smiles: 'Oc1ccccc1', cls: 'heteroatom', observedNm: 210, pick: strongest(), source: 'phenol 210 nm band, Pavia et al. (recalled from memory)' },
  { name: 'acrolein', smiles: 'C=CC=O', cls: 'heteroatom', observedNm: 210, pick: strongest(), source: 'acrolein π→π*, Pavia et al. (recalled from memory)' },
  { name: 'trimethinecyanine', smiles: 'CN(C)C=CC=[N+](C)C', cls: 'dye', observedNm: 312, pick: strongest(), source: CYANINES },
  { name: 'pentamethinecyanine', smiles: 'CN(C)C=CC=CC=[N+](C)C', cls: 'dye', observedNm: 416, pick: strongest(), source: CYANINES },
  { name: 'heptamethinecyanine', smiles: 'CN(C)C=CC=CC=CC=[N+](C)C', cls: 'dye', observedNm: 519, pick: strongest(), source: CYANINES },
  { name: 'nonamethinecyanine', smiles: 'CN(C)C=CC=CC=CC=CC=[N+](C)C', cls: 'dye', observedNm: 625, pick: strongest(), source: CYANINES },
  {
    name: 'β-carotene',
    smiles: 'CC1=C(C(CCC1)(C)C)/C=C/C(=C/C=C/C(=C/C=C/C=C(/C=C/C=C(/C=C/C2=C(CCCC2(C)C)C)\\C)\\C)/C)/C',
    cls: 'dye',
    observedNm: 450,
    pick: strongest(),
    source: 'β-carotene in hexane, 450 nm main band (recalled from memory)',
  },
  { name: 'trans-azobenzene', smiles: 'c1ccccc1/N=N/c1ccccc1', cls: 'dye', observedNm: 320, pick: strongest(), source: 'trans-azobenzene π→π*, 320 nm (recalled from memory)' },
];

export const HYDROCARBON_CLASSES: BandClass[] = ['polyene', 'benzene', 'acene p band', 'acene β band', 'non-alternant'];

export interface BandError {
  band: ReferenceBand;
  computedEv: number;
  observedEv: number;
  errorEv: number;
}

export function rms(values: number[]): number {
  return Math.sqrt(values.reduce((s, v) => s + v * v, 0) / values.length);
}
