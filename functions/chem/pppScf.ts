// The π-electron SCF of the Pariser–Parr–Pople model (closed-shell Roothaan equations with zero
// differential overlap; Pariser & Parr 1953, Pople 1953):
//   core  H_ii = −I_i − Σ_{j≠i} Z_j γ_ij          H_ij = β_ij for bonded pairs, 0 otherwise
//   Fock  F_ii = H_ii + ½ P_ii γ_ii + Σ_{j≠i} P_jj γ_ij      F_ij = H_ij − ½ P_ij γ_ij
// (Goeppert-Mayer–Sklar core; P the bond-order/charge matrix, P_ii the π electron density). γ_ij by
// Mataga–Nishimoto over an idealised planar geometry: openchemlib's 2D drawing of the structure,
// scaled so its mean bond length is 1.40 Å. β follows the SCF bond order (variable β, pppParams.ts),
// iterated together with the density.
import { openchemlib } from './openchemlib.js';
import { symmetricEigen } from './eigenFast.js';
import { ChemError } from './errors.js';
import type { PiSystem } from './piSystem.js';
import { BETA_BOND_ORDER_KAPPA, matagaNishimoto, PPP_ATOMS, pppBeta, STANDARD_BOND_LENGTH } from './pppParams.js';

export interface PppScf {
  pi: PiSystem;
  /** Centre positions in Å (planar, z = 0). */
  positions: [number, number][];
  /** Two-centre repulsion γ_μν (eV), n×n row-major: gamma[μ * n + ν]. */
  gamma: Float64Array;
  /** Orbital energies (eV), ascending. */
  energies: number[];
  /** MO coefficients, orbital k in row k: vectors[k * n + μ]. */
  vectors: Float64Array;
  occupied: number;
  /** Bond-order/charge matrix P, n×n row-major. */
  bondOrders: Float64Array;
  iterations: number;
}

const MAX_ITERATIONS = 200;
/** Largest |FP − PF| element (eV) accepted as self-consistent: orbital energies are then converged far below 1e-6 eV. */
const COMMUTATOR_TOLERANCE = 1e-7;
const DIIS_DEPTH = 8;

/** FP − PF for symmetric F and P (n×n row-major): FP − (FP)ᵀ, with FP formed in `scratch`. */
function commutator(f: Float64Array, p: Float64Array, n: number, scratch: Float64Array): Float64Array {
  const fp = scratch.fill(0);
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    for (let k = 0; k < n; k++) {
      const fik = f[ri + k];
      if (fik === 0) continue;
      const rk = k * n;
      for (let j = 0; j < n; j++) fp[ri + j] += fik * p[rk + j];
    }
  }
  const out = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const v = fp[i * n + j] - fp[j * n + i];
      out[i * n + j] = v;
      out[j * n + i] = -v;
    }
  return out;
}

function dot(x: Float64Array, y: Float64Array): number {
  let s = 0;
  for (let k = 0; k < x.length; k++) s += x[k] * y[k];
  return s;
}

/**
 * DIIS (P. Pulay, Chem. Phys. Lett. 73, 393 (1980)): the combination Σ c_k F_k (Σ c_k = 1) of the last
 * Fock matrices minimising |Σ c_k e_k|² over their commutator errors. The overlaps e_i·e_j are kept
 * as the history moves, so each step adds one row of them.
 */
class Diis {
  private readonly entries: { fock: Float64Array; error: Float64Array }[] = [];
  private readonly overlaps: number[][] = [];

  push(fock: Float64Array, error: Float64Array) {
    if (this.entries.length === DIIS_DEPTH) {
      this.entries.shift();
      this.overlaps.shift();
      for (const row of this.overlaps) row.shift();
    }
    const row = this.entries.map((entry) => dot(entry.error, error));
    this.overlaps.forEach((r, k) => r.push(row[k]));
    row.push(dot(error, error));
    this.overlaps.push(row);
    this.entries.push({ fock, error });
  }

  /** The extrapolated Fock matrix; undefined with fewer than two entries or a singular system. */
  extrapolate(): Float64Array | undefined {
    const m = this.entries.length;
    if (m < 2) return undefined;
    const size = m + 1;
    const a = Array.from({ length: size }, () => new Array<number>(size + 1).fill(0));
    for (let i = 0; i < m; i++) {
      for (let j = 0; j < m; j++) a[i][j] = this.overlaps[i][j];
      a[i][m] = a[m][i] = -1;
    }
    a[m][size] = -1;
    // Gaussian elimination with partial pivoting on the augmented matrix.
    for (let col = 0; col < size; col++) {
      let pivot = col;
      for (let r = col + 1; r < size; r++) if (Math.abs(a[r][col]) > Math.abs(a[pivot][col])) pivot = r;
      if (Math.abs(a[pivot][col]) < 1e-30) return undefined;
      [a[col], a[pivot]] = [a[pivot], a[col]];
      for (let r = 0; r < size; r++) {
        if (r === col) continue;
        const factor = a[r][col] / a[col][col];
        for (let c = col; c <= size; c++) a[r][c] -= factor * a[col][c];
      }
    }
    const coefficients = this.entries.map((_, i) => a[i][size] / a[i][i]);
    if (coefficients.some((c) => !Number.isFinite(c))) return undefined;
    const out = new Float64Array(this.entries[0].fock.length);
    this.entries.forEach((entry, k) => {
      const c = coefficients[k];
      for (let x = 0; x < out.length; x++) out[x] += c * entry.fock[x];
    });
    return out;
  }
}

/** Idealised planar geometry of the π centres from the structure's 2D coordinates. */
function planarGeometry(pi: PiSystem): [number, number][] {
  const molecule = openchemlib().Molecule.fromSmiles(pi.smiles, { noStereo: true });
  if (!pi.numberingFollowsSmiles)
    throw new ChemError(`'${pi.smiles}' writes hydrogens as atoms ([H]); write them inside the brackets ([CH2]) or leave them implicit for a PPP geometry`);
  const scale = STANDARD_BOND_LENGTH / (molecule.getAverageBondLength(true) || 1);
  const positions = pi.centres.map((c) => [molecule.getAtomX(c.atom - 1) * scale, molecule.getAtomY(c.atom - 1) * scale] as [number, number]);
  for (let i = 0; i < positions.length; i++)
    for (let j = 0; j < i; j++) {
      const d = Math.hypot(positions[i][0] - positions[j][0], positions[i][1] - positions[j][1]);
      if (d < 0.5) throw new ChemError(`the 2D drawing of '${pi.smiles}' puts π atoms ${pi.centres[j].atom} and ${pi.centres[i].atom} on top of each other; no planar PPP geometry`);
    }
  return positions;
}

/** P = 2 Σ_occ c cᵀ into `p`, from the orbitals in rows of `vectors`. */
function density(vectors: Float64Array, occupied: number, n: number, p: Float64Array): Float64Array {
  p.fill(0);
  for (let k = 0; k < occupied; k++) {
    const c = k * n;
    for (let i = 0; i < n; i++) {
      const ci = 2 * vectors[c + i];
      const ri = i * n;
      for (let j = 0; j < n; j++) p[ri + j] += ci * vectors[c + j];
    }
  }
  return p;
}

/** Orbital energies and coefficients (rows) of `fock` (consumed), each orbital's largest coefficient made positive so results are reproducible (eigenvectors are defined up to sign). */
function diagonalise(fock: Float64Array, n: number): { energies: number[]; vectors: Float64Array } {
  const { values, vectors } = symmetricEigen(fock, n);
  for (let k = 0; k < n; k++) {
    const row = vectors.subarray(k * n, k * n + n);
    let largest = 0;
    for (const c of row) if (Math.abs(c) > Math.abs(largest) + 1e-12) largest = c;
    if (largest < 0) for (let i = 0; i < n; i++) row[i] = -row[i];
  }
  return { energies: Array.from(values), vectors };
}

/** Runs the closed-shell PPP SCF on a π system (every centre must have a PPP parameter). */
export function pppScf(pi: PiSystem): PppScf {
  const n = pi.centres.length;
  if (pi.electrons % 2 !== 0)
    throw new ChemError(`'${pi.smiles}' has ${pi.electrons} π electrons (a radical): the PPP spectrum here needs a closed-shell ground state`);
  const atoms = pi.centres.map((c) => {
    const atom = c.type && PPP_ATOMS[c.type];
    if (!atom) throw new ChemError(`atom ${c.atom} (${c.label}) has no PPP parameters (covered: C, pyridine- and pyrrole-type N, N⁺, carbonyl and ether O, O⁺, thiophene S, F, Cl, Br)`);
    return atom;
  });
  const positions = planarGeometry(pi);
  const gamma = new Float64Array(n * n);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++)
      gamma[i * n + j] = i === j ? atoms[i].gamma : matagaNishimoto(Math.hypot(positions[i][0] - positions[j][0], positions[i][1] - positions[j][1]), atoms[i].gamma, atoms[j].gamma);
  // The core charge is the atom's π electrons plus its formal charge: a trigonal N keeps core +2
  // whether it is −N< (2 e) or =N⁺< (1 e), a carbocation or carbanion carbon keeps core +1.
  const coreCharge = pi.centres.map((c) => c.electrons + c.formalCharge);
  const coreDiagonal = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    coreDiagonal[i] = -atoms[i].ionisation;
    for (let j = 0; j < n; j++) if (j !== i) coreDiagonal[i] -= coreCharge[j] * gamma[i * n + j];
  }
  const beta0 = pi.bonds.map((b) => pppBeta(pi.centres[b.a].type!, pi.centres[b.b].type!));
  const occupied = pi.electrons / 2;
  if (occupied === 0 || occupied === n) throw new ChemError(`'${pi.smiles}' has ${occupied === 0 ? 'no' : 'only filled'} π orbitals: no π→π* excitation`);

  /** F(P): the density enters the two-centre terms and, through the bond order, β. */
  const fockOf = (p: Float64Array): Float64Array => {
    const fock = new Float64Array(n * n);
    for (let i = 0; i < n; i++) fock[i * n + i] = coreDiagonal[i];
    pi.bonds.forEach((b, k) => {
      fock[b.a * n + b.b] = fock[b.b * n + b.a] = beta0[k] * Math.exp(BETA_BOND_ORDER_KAPPA * (p[b.a * n + b.b] - 2 / 3));
    });
    for (let i = 0; i < n; i++) {
      const ri = i * n;
      let diagonal = 0.5 * p[ri + i] * gamma[ri + i];
      for (let k = 0; k < n; k++) if (k !== i) diagonal += p[k * n + k] * gamma[ri + k];
      for (let j = 0; j < n; j++) if (j !== i) fock[ri + j] -= 0.5 * p[ri + j] * gamma[ri + j];
      fock[ri + i] += diagonal;
    }
    return fock;
  };

  // The first Fock matrix is built from the density of neutral centres (P_μμ = the centre's π
  // electrons) with the reference bond order 2/3 on every bond: the diagonal is then −I_μ + ½ P_μμ γ_μμ
  // (plus the pull of any formal charges), a Hückel-like start, where the bare core (P = 0) overweights the middle of a long chain and costs
  // several more iterations. Then F(P) is extrapolated by DIIS (P. Pulay, Chem. Phys. Lett. 73, 393
  // (1980)) on the commutator FP − PF, which vanishes at self-consistency.
  const guess = new Float64Array(n * n);
  pi.centres.forEach((c, i) => (guess[i * n + i] = c.electrons));
  for (const b of pi.bonds) guess[b.a * n + b.b] = guess[b.b * n + b.a] = 2 / 3;
  const p = new Float64Array(n * n);
  const scratch = new Float64Array(n * n);
  let orbitals = diagonalise(fockOf(guess), n);
  let iterations = 1;
  const diis = new Diis();
  for (; iterations < MAX_ITERATIONS; iterations++) {
    density(orbitals.vectors, occupied, n, p);
    const fock = fockOf(p);
    const error = commutator(fock, p, n, scratch);
    let size = 0;
    for (const v of error) size = Math.max(size, Math.abs(v));
    if (size < COMMUTATOR_TOLERANCE) {
      orbitals = diagonalise(fock, n);
      break;
    }
    diis.push(fock, error);
    // The extrapolated matrix is fresh and may be consumed; F stays in the DIIS history, so a copy.
    orbitals = diagonalise(diis.extrapolate() ?? fock.slice(), n);
  }
  if (iterations >= MAX_ITERATIONS) throw new ChemError(`the PPP SCF for '${pi.smiles}' did not converge in ${MAX_ITERATIONS} iterations`);
  return { pi, positions, gamma, energies: orbitals.energies, vectors: orbitals.vectors, occupied, bondOrders: p, iterations };
}
