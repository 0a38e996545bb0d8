// Extended-Hückel parameters: valence-state ionisation energies (VSIE, the diagonal H_ii, in eV) and
// Slater exponents ζ (bohr⁻¹) for the valence s and p shells of H and Li–Ar.
//
// Exponents: Slater's rules (J. C. Slater, Phys. Rev. 36, 57 (1930)), computed below, except hydrogen,
// whose ζ = 1.3 is the value of the common extended-Hückel tables (R. Hoffmann used 1.0 in J. Chem.
// Phys. 39, 1397 (1963); 1.3 became the usual choice in later work — recalled from memory). The common
// tables' second-row and Na, Al, Si values are exactly Slater's-rule values.
//
// H_ii: H and C from R. Hoffmann, J. Chem. Phys. 39, 1397 (1963): H 1s −13.6, C 2s −21.4, C 2p −11.4 eV.
// The rest are the values of the common extended-Hückel parameter table as compiled by S. Alvarez,
// "Table of Parameters for Extended Hückel Calculations" (Universitat de Barcelona, 1993) and used as
// defaults by most EHT programs — all recalled from memory, not re-read from the compilation. For Ne
// and Ar, which those tables rarely list, H_ii is minus the measured ionisation energy of the 2p/3p
// and 2s/3s electrons (NIST Atomic Spectra Database; recalled from memory).

export interface ShellParameter {
  n: number;
  l: 0 | 1;
  /** H_ii, eV. */
  energyEv: number;
  /** Slater exponent ζ, bohr⁻¹. */
  zeta: number;
}

export interface ElementParameters {
  symbol: string;
  atomicNumber: number;
  /** Valence electrons of the neutral atom. */
  valenceElectrons: number;
  shells: ShellParameter[];
}

/** H_ii (eV) of the valence s and p shells; sources in the header comment. */
const VSIE: Record<string, { atomicNumber: number; s: number; p?: number }> = {
  H: { atomicNumber: 1, s: -13.6 },
  Li: { atomicNumber: 3, s: -5.4, p: -3.5 },
  Be: { atomicNumber: 4, s: -10.0, p: -6.0 },
  B: { atomicNumber: 5, s: -15.2, p: -8.5 },
  C: { atomicNumber: 6, s: -21.4, p: -11.4 },
  N: { atomicNumber: 7, s: -26.0, p: -13.4 },
  O: { atomicNumber: 8, s: -32.3, p: -14.8 },
  F: { atomicNumber: 9, s: -40.0, p: -18.1 },
  Ne: { atomicNumber: 10, s: -48.5, p: -21.6 },
  Na: { atomicNumber: 11, s: -5.1, p: -3.0 },
  Mg: { atomicNumber: 12, s: -9.0, p: -4.5 },
  Al: { atomicNumber: 13, s: -12.3, p: -6.5 },
  Si: { atomicNumber: 14, s: -17.3, p: -9.2 },
  P: { atomicNumber: 15, s: -18.6, p: -14.0 },
  S: { atomicNumber: 16, s: -20.0, p: -11.0 },
  Cl: { atomicNumber: 17, s: -26.3, p: -14.2 },
  Ar: { atomicNumber: 18, s: -29.2, p: -15.8 },
};

/** ζ of hydrogen 1s (common EHT tables; see the header). */
export const HYDROGEN_ZETA = 1.3;

/**
 * Slater's-rules exponent ζ = (Z − s)/n* of the outermost s/p shell of a neutral atom with Z ≤ 18
 * (n* = n for n ≤ 3): same-shell electrons screen 0.35 (0.30 within 1s), the shell below 0.85 each,
 * deeper shells 1.00 each (Slater 1930).
 */
export function slaterZeta(atomicNumber: number): number {
  const Z = atomicNumber;
  if (Z <= 2) return (Z - 0.3 * (Z - 1)) / 1;
  if (Z <= 10) return (Z - 0.35 * (Z - 3) - 0.85 * 2) / 2;
  return (Z - 0.35 * (Z - 11) - 0.85 * 8 - 1.0 * 2) / 3;
}

function valenceCount(Z: number): number {
  return Z <= 2 ? Z : Z <= 10 ? Z - 2 : Z - 10;
}

const TABLE = new Map<string, ElementParameters>(
  Object.entries(VSIE).map(([symbol, v]) => {
    const n = v.atomicNumber <= 2 ? 1 : v.atomicNumber <= 10 ? 2 : 3;
    const zeta = symbol === 'H' ? HYDROGEN_ZETA : slaterZeta(v.atomicNumber);
    const shells: ShellParameter[] = [{ n, l: 0, energyEv: v.s, zeta }];
    if (v.p !== undefined) shells.push({ n, l: 1, energyEv: v.p, zeta });
    return [symbol, { symbol, atomicNumber: v.atomicNumber, valenceElectrons: valenceCount(v.atomicNumber), shells }];
  }),
);

/** Elements with parameters, in atomic-number order (for messages). */
export const PARAMETRISED_ELEMENTS = [...TABLE.keys()];

export function elementParameters(symbol: string): ElementParameters | undefined {
  return TABLE.get(symbol);
}

/** The Wolfsberg–Helmholz constant K in H_ij = K S_ij (H_ii + H_jj)/2 (Hoffmann 1963 chose 1.75). */
export const WOLFSBERG_HELMHOLZ_K = 1.75;
