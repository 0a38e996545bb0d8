// Two-centre LCAO: overlap of two 1s Slater orbitals, the LCAO treatment of the one-electron
// molecule ion H2+, and the general 2×2 secular problem det(H − ES) = 0.
//
// Everything here is in atomic units (bohr, hartree); callers convert at the edge (units.ts).
// Closed forms: Levine, Quantum Chemistry, the LCAO treatment of the H2+ ground state
// (integrals over 1s orbitals in confocal elliptic coordinates); also Pauling & Wilson,
// Introduction to Quantum Mechanics (1935), chapter on the hydrogen molecule-ion.
// The tests check each closed form against a direct numerical integration.
import { ChemError } from './errors.js';

/** Energy of the hydrogen 1s orbital, −1/2 hartree (exact for a one-electron atom, Z = 1). */
export const HYDROGEN_1S_ENERGY_HARTREE = -0.5;

/** Beyond this ζR every e^(−ρ)·polynomial(ρ) here is below the smallest double (e^(−750) ≈ 1e-326). */
const LARGE_RHO = 750;

function requireDistanceBohr(distanceBohr: number, allowZero: boolean): void {
  if (!Number.isFinite(distanceBohr)) throw new ChemError(`distance must be a finite number, got ${distanceBohr}`);
  if (distanceBohr < 0 || (!allowZero && distanceBohr === 0)) {
    throw new ChemError(`distance must be ${allowZero ? 'zero or positive' : 'positive'}, got ${distanceBohr}`, 'NUM');
  }
}

/**
 * Overlap S of two 1s Slater orbitals with the same exponent ζ a distance R apart:
 * S = e^(−ρ)(1 + ρ + ρ²/3), ρ = ζR/a0.
 */
export function overlap1s(distanceBohr: number, zeta = 1): number {
  requireDistanceBohr(distanceBohr, true);
  if (!(zeta > 0) || !Number.isFinite(zeta)) throw new ChemError(`orbital exponent zeta must be positive, got ${zeta}`, 'NUM');
  const rho = zeta * distanceBohr;
  // Past ρ ≈ 750 e^(−ρ) underflows to 0 while ρ² may overflow to ∞ (0·∞ = NaN): S is 0 to double precision.
  if (rho > LARGE_RHO) return 0;
  return Math.exp(-rho) * (1 + rho + (rho * rho) / 3);
}

/**
 * Coulomb integral J = ⟨1s_a| 1/r_b |1s_a⟩ = 1/R − e^(−2R)(1 + 1/R): the attraction of the
 * charge cloud on nucleus a to nucleus b (ζ = 1). Written with a positive sign; it enters the
 * energy as −J.
 */
export function coulombIntegral1s(distanceBohr: number): number {
  requireDistanceBohr(distanceBohr, false);
  const r = distanceBohr;
  // Written as (1 − e^(−2R))/R − e^(−2R); expm1 keeps the digits that 1 − e^(−2R) loses at small R.
  return (-Math.expm1(-2 * r)) / r - Math.exp(-2 * r);
}

/**
 * Exchange (resonance) integral K = ⟨1s_a| 1/r_a |1s_b⟩ = e^(−R)(1 + R) (ζ = 1), written with
 * a positive sign; it enters the energy as −K.
 */
export function exchangeIntegral1s(distanceBohr: number): number {
  requireDistanceBohr(distanceBohr, false);
  if (distanceBohr > LARGE_RHO) return 0;
  return Math.exp(-distanceBohr) * (1 + distanceBohr);
}

export type LcaoLevel = 'bonding' | 'antibonding';

/**
 * Total LCAO energy of H2+ (electronic + nuclear repulsion 1/R), in hartree:
 *   E± = E_1s + 1/R − (J ± K)/(1 ± S)
 * from H_aa = E_1s + 1/R − J and H_ab = (E_1s + 1/R)S − K with E± = (H_aa ± H_ab)/(1 ± S).
 * It tends to E_1s = −0.5 hartree (H atom + proton) as R grows.
 */
export function h2PlusEnergyHartree(distanceBohr: number, level: LcaoLevel = 'bonding'): number {
  requireDistanceBohr(distanceBohr, false);
  const S = overlap1s(distanceBohr);
  const K = exchangeIntegral1s(distanceBohr);
  const sign = level === 'bonding' ? 1 : -1;
  // 1/R − J = e^(−2R)(1 + 1/R) exactly (see coulombIntegral1s); this form keeps its digits at large R.
  const screenedRepulsion = Math.exp(-2 * distanceBohr) * (1 + 1 / distanceBohr);
  // E_1s + 1/R − (J ± K)/(1 ± S) = E_1s + [(1/R − J) ± (S/R − K)]/(1 ± S)
  return HYDROGEN_1S_ENERGY_HARTREE + (screenedRepulsion + sign * (S / distanceBohr - K)) / (1 + sign * S);
}

/** Golden-section search for the minimum of a unimodal function on [a, b] (Kiefer 1953). */
export function goldenSectionMinimum(f: (x: number) => number, a: number, b: number, tolerance = 1e-10): number {
  const invPhi = (Math.sqrt(5) - 1) / 2;
  let lo = a;
  let hi = b;
  let x1 = hi - invPhi * (hi - lo);
  let x2 = lo + invPhi * (hi - lo);
  let f1 = f(x1);
  let f2 = f(x2);
  while (hi - lo > tolerance) {
    if (f1 < f2) {
      hi = x2;
      x2 = x1;
      f2 = f1;
      x1 = hi - invPhi * (hi - lo);
      f1 = f(x1);
    } else {
      lo = x1;
      x1 = x2;
      f1 = f2;
      x2 = lo + invPhi * (hi - lo);
      f2 = f(x2);
    }
  }
  return (lo + hi) / 2;
}

export interface H2PlusMinimum {
  distanceBohr: number;
  energyHartree: number;
  /** D_e = E(∞) − E(R_e) = −0.5 − E(R_e), positive for a bound ion. */
  dissociationHartree: number;
}

let cachedMinimum: H2PlusMinimum | undefined;

/**
 * Minimum of the bonding LCAO curve, found numerically (the curve has a single minimum between
 * 1 and 6 bohr). Levine reports R_e ≈ 2.49 bohr and D_e ≈ 1.76 eV for this treatment (from memory).
 */
export function h2PlusMinimum(): H2PlusMinimum {
  if (!cachedMinimum) {
    const distanceBohr = goldenSectionMinimum((r) => h2PlusEnergyHartree(r, 'bonding'), 1, 6);
    const energyHartree = h2PlusEnergyHartree(distanceBohr, 'bonding');
    cachedMinimum = { distanceBohr, energyHartree, dissociationHartree: HYDROGEN_1S_ENERGY_HARTREE - energyHartree };
  }
  return cachedMinimum;
}

// ---- The general two-orbital secular problem --------------------------------------------------

export interface SecularSolution {
  /** [lower, upper] orbital energies, in the unit of the H matrix elements. */
  energies: [number, number];
  /** Coefficients [c_a, c_b] for each energy, normalised so c_a² + c_b² + 2S·c_a·c_b = 1. */
  coefficients: [[number, number], [number, number]];
}

function requireFinite(value: number, name: string): void {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new ChemError(`${name} must be a finite number, got ${String(value)}`);
}

/**
 * Roots of det(H − ES) = 0 for H = [[Haa, Hab], [Hab, Hbb]], S = [[1, S], [S, 1]]:
 *   (1 − S²)E² − (Haa + Hbb − 2·Hab·S)E + (Haa·Hbb − Hab²) = 0,
 * whose discriminant is (Haa − Hbb)² + 4(Hab − Haa·S)(Hab − Hbb·S) ≥ 0 for |S| < 1
 * (a symmetric-definite pencil has real roots). For Haa = Hbb the roots are (Haa ± Hab)/(1 ± S).
 * The lower root is the bonding level whenever Hab < S·Haa, the physical case.
 */
export function solveSecular2x2(Haa: number, Hbb: number, Hab: number, S: number): SecularSolution {
  requireFinite(Haa, 'Haa');
  requireFinite(Hbb, 'Hbb');
  requireFinite(Hab, 'Hab');
  requireFinite(S, 'overlap S');
  if (!(Math.abs(S) < 1)) {
    throw new ChemError(`overlap S must lie strictly between −1 and 1, got ${S}: at |S| ≥ 1 the two basis orbitals are not independent`, 'NUM');
  }
  const a = 1 - S * S;
  const half = (Haa + Hbb - 2 * Hab * S) / 2;
  const discriminant = Math.max(0, ((Haa - Hbb) / 2) ** 2 + (Hab - Haa * S) * (Hab - Hbb * S));
  const root = Math.sqrt(discriminant);
  const c = Haa * Hbb - Hab * Hab;
  // Stable quadratic formula: take the root without cancellation, the other from the product c/a.
  let lower: number;
  let upper: number;
  if (half >= 0) {
    upper = (half + root) / a;
    lower = upper !== 0 ? c / (a * upper) : 0;
  } else {
    lower = (half - root) / a;
    upper = lower !== 0 ? c / (a * lower) : 0;
  }
  if (lower > upper) [lower, upper] = [upper, lower];
  return {
    energies: [lower, upper],
    coefficients: [coefficientsFor(lower, Haa, Hbb, Hab, S, +1), coefficientsFor(upper, Haa, Hbb, Hab, S, -1)],
  };
}

function normalise(ca: number, cb: number, S: number): [number, number] {
  const norm = Math.sqrt(ca * ca + cb * cb + 2 * S * ca * cb);
  let [x, y] = [ca / norm, cb / norm];
  // Sign convention: c_a ≥ 0 (or c_b > 0 when c_a = 0), so results are reproducible.
  if (x < 0 || (x === 0 && y < 0)) [x, y] = [-x, -y];
  return [x + 0, y + 0];
}

/**
 * Solves (H − ES)c = 0 from whichever row of the singular matrix is larger. When both rows
 * vanish (a doubly degenerate level) any vector is a solution: take the in-phase (phase +1)
 * or out-of-phase (phase −1) combination, which are S-orthogonal.
 */
function coefficientsFor(E: number, Haa: number, Hbb: number, Hab: number, S: number, phase: 1 | -1): [number, number] {
  const offDiagonal = Hab - E * S;
  const rowA: [number, number] = [-offDiagonal, Haa - E];
  const rowB: [number, number] = [Hbb - E, -offDiagonal];
  const size = (v: [number, number]) => Math.hypot(v[0], v[1]);
  const scale = Math.max(Math.abs(Haa), Math.abs(Hbb), Math.abs(Hab), Math.abs(E), 1);
  const best = size(rowA) >= size(rowB) ? rowA : rowB;
  if (size(best) <= 1e-12 * scale) return normalise(1, phase, S);
  return normalise(best[0], best[1], S);
}
