// Slater-type orbitals (STOs) and their two-centre overlap integrals in closed form.
//
// An STO is χ = N r^(n−1) e^(−ζr) Y_lm(θ, φ) with N = (2ζ)^(n+½)/√((2n)!) and real, normalised
// spherical harmonics (J. C. Slater, Phys. Rev. 36, 57 (1930)). All lengths are in bohr.
//
// Overlaps follow R. S. Mulliken, C. A. Rieke, D. Orloff and H. Orloff, J. Chem. Phys. 17, 1248
// (1949): in a local frame with both z axes along the A→B line, the integrand is written in
// confocal elliptic coordinates ξ = (r_a + r_b)/R, η = (r_a − r_b)/R, where
//   r_a = R(ξ+η)/2, r_b = R(ξ−η)/2, z_a = R(1+ξη)/2, z_b = R(ξη−1)/2,
//   ρ² (distance² from the axis) = (R/2)²(ξ²−1)(1−η²),  dτ = (R/2)³(ξ²−η²) dξ dη dφ,
// and the exponential is e^(−pξ − tη) with p = R(ζa+ζb)/2, t = R(ζa−ζb)/2. Every s/p product is then
// a polynomial in ξ and η, and each monomial ξ^i η^j integrates to A_i(p)·B_j(t) with the auxiliary
// integrals A_k(p) = ∫₁^∞ ξ^k e^(−pξ) dξ and B_k(t) = ∫₋₁¹ η^k e^(−tη) dη (ibid., eq. 7).
// The local σ and π integrals are rotated to the molecular frame by treating p orbitals as the
// components of a vector (J. C. Slater and G. F. Koster, Phys. Rev. 94, 1498 (1954), Table I).
import { ChemError } from './errors.js';

/** One valence shell of an atom: principal quantum number, l (0 = s, 1 = p) and Slater exponent (bohr⁻¹). */
export interface StoShell {
  n: number;
  l: 0 | 1;
  zeta: number;
}

/** Polynomial in ξ, η: coefficient of ξ^i η^j at [i][j]. */
type Poly = number[][];

function polyMul(a: Poly, b: Poly): Poly {
  const out: Poly = Array.from({ length: a.length + b.length - 1 }, () => new Array<number>(a[0].length + b[0].length - 1).fill(0));
  for (let i = 0; i < a.length; i++)
    for (let j = 0; j < a[i].length; j++) {
      if (a[i][j] === 0) continue;
      for (let k = 0; k < b.length; k++) for (let m = 0; m < b[k].length; m++) out[i + k][j + m] += a[i][j] * b[k][m];
    }
  return out;
}

function polyPow(a: Poly, e: number): Poly {
  let out: Poly = [[1]];
  for (let i = 0; i < e; i++) out = polyMul(out, a);
  return out;
}

// The building blocks, each without its factor R/2 (collected once below).
const R_A: Poly = [[0, 1], [1, 0]]; // ξ + η
const R_B: Poly = [[0, -1], [1, 0]]; // ξ − η
const Z_A: Poly = [[1, 0], [0, 1]]; // 1 + ξη
const Z_B: Poly = [[-1, 0], [0, 1]]; // ξη − 1
const RHO2: Poly = [[-1, 0, 1], [0, 0, 0], [1, 0, -1]]; // (ξ² − 1)(1 − η²)
const VOLUME: Poly = [[0, 0, -1], [0, 0, 0], [1, 0, 0]]; // ξ² − η²

/** A_k(p) = ∫₁^∞ ξ^k e^(−pξ) dξ = e^(−p) Σ_{μ=0..k} k!/(μ! p^(k−μ+1))  (Mulliken et al. 1949, eq. 7a). */
export function auxA(k: number, p: number): number {
  let term = 1 / p; // μ = k term: k!/(k! p)
  let sum = term;
  for (let mu = k - 1; mu >= 0; mu--) {
    term *= (mu + 1) / p;
    sum += term;
  }
  return Math.exp(-p) * sum;
}

/**
 * B_k(t) = ∫₋₁¹ η^k e^(−tη) dη by its everywhere-convergent power series Σ_m (−t)^m/m! · 2/(k+m+1)
 * over k+m even. The closed form of Mulliken et al. (eq. 7b) loses all digits as t → 0 (ζa ≈ ζb),
 * while the series terms never exceed the result by more than about √|t|, so it is used throughout.
 */
export function auxB(k: number, t: number): number {
  let sum = 0;
  let power = 1; // (−t)^m / m!
  for (let m = 0; m < 400; m++) {
    if (m > 0) power *= -t / m;
    if ((k + m) % 2 === 0) {
      const term = (power * 2) / (k + m + 1);
      sum += term;
      if (m > Math.abs(t) && Math.abs(term) < 1e-17 * Math.abs(sum)) break;
    }
  }
  return sum;
}

function normalisation(n: number, zeta: number): number {
  let factorial = 1;
  for (let i = 2; i <= 2 * n; i++) factorial *= i;
  return Math.pow(2 * zeta, n + 0.5) / Math.sqrt(factorial);
}

export type LocalComponent = 'sigma' | 'pi';

interface Integrand {
  poly: Poly;
  /** ∫ dφ of the azimuthal factor. */
  azimuth: number;
  /** Power of R/2 collected from the radial factors, the angular factors and the volume element. */
  powerOfHalfR: number;
}

/** The ξ, η polynomial depends only on the quantum numbers, so it is built once per kind of pair. */
const integrands = new Map<string, Integrand>();

function integrandPolynomial(na: number, la: 0 | 1, nb: number, lb: 0 | 1, component: LocalComponent): Integrand {
  const key = `${na}${la}${nb}${lb}${component}`;
  const known = integrands.get(key);
  if (known) return known;
  // Radial powers left after the angular factors take l powers of r.
  let poly = polyMul(polyPow(R_A, na - 1 - la), polyPow(R_B, nb - 1 - lb));
  let azimuth = 2 * Math.PI; // ∫ dφ for σ
  let powerOfHalfR = na - 1 - la + (nb - 1 - lb) + 3;
  if (component === 'sigma') {
    if (la === 1) poly = polyMul(poly, Z_A);
    if (lb === 1) poly = polyMul(poly, Z_B);
    powerOfHalfR += la + lb;
  } else {
    poly = polyMul(poly, RHO2); // x_a x_b = ρ² cos²φ
    azimuth = Math.PI; // ∫ cos²φ dφ
    powerOfHalfR += 2;
  }
  poly = polyMul(poly, VOLUME);
  const integrand = { poly, azimuth, powerOfHalfR };
  integrands.set(key, integrand);
  return integrand;
}

/**
 * Overlap in the local frame (A at the origin, B at +R on the z axis, both z axes pointing A→B):
 * component 'sigma' pairs s or p_z with s or p_z; 'pi' pairs p_x on A with p_x on B (needs two p shells).
 */
export function localOverlap(a: StoShell, b: StoShell, distanceBohr: number, component: LocalComponent): number {
  const R = distanceBohr;
  if (!(R > 0)) throw new ChemError(`two-centre overlap needs a positive distance, got ${R}`, 'NUM');
  if (component === 'pi' && (a.l !== 1 || b.l !== 1)) throw new ChemError('a π overlap needs a p shell on both centres');
  const { poly, azimuth, powerOfHalfR } = integrandPolynomial(a.n, a.l, b.n, b.l, component);
  const p = (R * (a.zeta + b.zeta)) / 2;
  const t = (R * (a.zeta - b.zeta)) / 2;
  const aValues = poly.map((_, i) => auxA(i, p));
  const bValues = poly[0].map((_, j) => auxB(j, t));
  let integral = 0;
  for (let i = 0; i < poly.length; i++) for (let j = 0; j < poly[i].length; j++) if (poly[i][j] !== 0) integral += poly[i][j] * aValues[i] * bValues[j];
  // Angular normalisation: Y_00 = 1/√(4π), Y_1m = √(3/4π)·(component)/r.
  const angular = (a.l === 0 ? 1 / Math.sqrt(4 * Math.PI) : Math.sqrt(3 / (4 * Math.PI))) * (b.l === 0 ? 1 / Math.sqrt(4 * Math.PI) : Math.sqrt(3 / (4 * Math.PI)));
  return normalisation(a.n, a.zeta) * normalisation(b.n, b.zeta) * angular * azimuth * Math.pow(R / 2, powerOfHalfR) * integral;
}

/**
 * Overlap block between the shells of two atoms in the molecular frame. `vector` is B − A in bohr.
 * Rows: functions of A (s, or p_x p_y p_z); columns: functions of B.
 */
export function shellOverlapBlock(a: StoShell, b: StoShell, vector: [number, number, number]): number[][] {
  const R = Math.hypot(vector[0], vector[1], vector[2]);
  const e = vector.map((c) => c / R);
  if (a.l === 0 && b.l === 0) return [[localOverlap(a, b, R, 'sigma')]];
  if (a.l === 0) {
    const s = localOverlap(a, b, R, 'sigma');
    return [e.map((c) => c * s)];
  }
  if (b.l === 0) {
    const s = localOverlap(a, b, R, 'sigma');
    return e.map((c) => [c * s]);
  }
  const sigma = localOverlap(a, b, R, 'sigma');
  const pi = localOverlap(a, b, R, 'pi');
  return e.map((ei, i) => e.map((ej, j) => ei * ej * sigma + ((i === j ? 1 : 0) - ei * ej) * pi));
}
