// The elements Orbitab's diatomic model covers: hydrogen to argon (periods 1–3).
// Symbols, names and atomic numbers: IUPAC Periodic Table of the Elements (version 4 May 2022).
// Valence electrons follow from the ground-state configurations (NIST Atomic Spectra Database,
// ground levels): everything outside the noble-gas core of the previous period.

export interface Element {
  symbol: string;
  name: string;
  /** Atomic number Z: the electron count of the neutral atom. */
  atomicNumber: number;
  /** Period = principal quantum number n of the valence shell. */
  period: 1 | 2 | 3;
  /** Electrons outside the core ([He] for period 2, [Ne] for period 3, none for period 1). */
  valenceElectrons: number;
  /** Core shells as spectroscopic letters: K (1s²) for period 2, K and L (1s² 2s² 2p⁶) for period 3. */
  coreShells: ('K' | 'L')[];
  /** Li, Be, Na, Mg: only an s electron or two outside the core. */
  isSBlockMetal: boolean;
}

const NAMES = [
  'hydrogen', 'helium', 'lithium', 'beryllium', 'boron', 'carbon', 'nitrogen', 'oxygen', 'fluorine', 'neon',
  'sodium', 'magnesium', 'aluminium', 'silicon', 'phosphorus', 'sulfur', 'chlorine', 'argon',
];
const SYMBOLS = ['H', 'He', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar'];

/** Symbols of elements 19–118 (IUPAC 2022): real elements the model does not cover, for a precise message. */
const SYMBOLS_BEYOND_ARGON = new Set(
  ('K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As Se Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe ' +
    'Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn ' +
    'Fr Ra Ac Th Pa U Np Pu Am Cm Bk Cf Es Fm Md No Lr Rf Db Sg Bh Hs Mt Ds Rg Cn Nh Fl Mc Lv Ts Og').split(' '),
);

function describe(symbol: string, index: number): Element {
  const atomicNumber = index + 1;
  const period = atomicNumber <= 2 ? 1 : atomicNumber <= 10 ? 2 : 3;
  const coreElectrons = period === 1 ? 0 : period === 2 ? 2 : 10;
  const valenceElectrons = atomicNumber - coreElectrons;
  return {
    symbol,
    name: NAMES[index],
    atomicNumber,
    period,
    valenceElectrons,
    coreShells: period === 1 ? [] : period === 2 ? ['K'] : ['K', 'L'],
    isSBlockMetal: period > 1 && valenceElectrons <= 2,
  };
}

export const ELEMENTS: readonly Element[] = SYMBOLS.map(describe);
const BY_SYMBOL = new Map(ELEMENTS.map((e) => [e.symbol, e]));

export function elementBySymbol(symbol: string): Element | undefined {
  return BY_SYMBOL.get(symbol);
}

/** True for a real element symbol beyond argon (K…Og), which the model does not cover. */
export function isElementBeyondArgon(symbol: string): boolean {
  return SYMBOLS_BEYOND_ARGON.has(symbol);
}
