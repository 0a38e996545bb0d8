// The π-electron SCF of the Pariser–Parr–Pople model (closed-shell Roothaan equations with zero
// differential overlap; Pariser & Parr 1953, Pople 1953):
//   core  H_ii = −I_i − Σ_{j≠i} Z_j γ_ij          H_ij = β_ij for bonded pairs, 0 otherwise
//   Fock  F_ii = H_ii + ½ P_ii γ_ii + Σ_{j≠i} P_jj γ_ij      F_ij = H_ij − ½ P_ij γ_ij
// (Goeppert-Mayer–Sklar core; P the bond-order/charge matrix, P_ii the π electron density). γ_ij by
// Mataga–Nishimoto over an idealised planar geometry: openchemlib's 2D drawing of the structure,
// scaled so its mean bond length is 1.40 Å. β follows the SCF bond order (variable β, pppParams.ts),
// iterated together with the density.
import { Molecule } from 'openchemlib';
import { symmetricEigen } from './eigenFast.js';
import { ChemError } from './errors.js';
import type { PiSystem } from './piSystem.js';
import { BETA_BOND_ORDER_KAPPA, matagaNishimoto, PPP_ATOMS, pppBeta, STANDARD_BOND_LENGTH } from './pppParams.js';

export interface PppScf {
  pi: PiSystem;
  /** Centre positions in Å (planar, z = 0). */
  positions: [number, number][];
  gamma: number[][];
  /** Orbital energies (eV), ascending, and coefficients vectors[k][μ]. */
  energies: number[];
  vectors: number[][];
  occupied: number;
  bondOrders: number[][];
  iterations: number;
}

const MAX_ITERATIONS = 200;
/** Largest |FP − PF| element (eV) accepted as self-consistent: orbital energies are then converged far below 1e-6 eV. */
const COMMUTATOR_TOLERANCE = 1e-7;
const DIIS_DEPTH = 8;

function commutator(f: number[][], p: number[][]): number[] {
  const n = f.length;
  const out: number[] = [];
  for (let i = 0; i < n; i++)
    for (let j = 0; j < n; j++) {
      let s = 0;
      for (let k = 0; k < n; k++) s += f[i][k] * p[k][j] - p[i][k] * f[k][j];
      out.push(s);
    }
  return out;
}

/** DIIS: the combination Σ c_k F_k (Σ c_k = 1) minimising |Σ c_k e_k|²; undefined if the system is singular. */
function extrapolate(history: { fock: number[][]; error: number[] }[]): number[][] | undefined {
  const m = history.length;
  if (m < 2) return undefined;
  const size = m + 1;
  const a = Array.from({ length: size }, () => new Array<number>(size + 1).fill(0));
  for (let i = 0; i < m; i++) {
    for (let j = 0; j < m; j++) a[i][j] = history[i].error.reduce((s, v, k) => s + v * history[j].error[k], 0);
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
  const coefficients = history.map((_, i) => a[i][size] / a[i][i]);
  if (coefficients.some((c) => !Number.isFinite(c))) return undefined;
  const n = history[0].fock.length;
  return Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => history.reduce((s, h, k) => s + coefficients[k] * h.fock[i][j], 0)));
}

/** Idealised planar geometry of the π centres from the structure's 2D coordinates. */
function planarGeometry(pi: PiSystem): [number, number][] {
  const molecule = Molecule.fromSmiles(pi.smiles, { noStereo: true });
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

function density(vectors: number[][], occupied: number, n: number): number[][] {
  const p = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let k = 0; k < occupied; k++) {
    const c = vectors[k];
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) p[i][j] += 2 * c[i] * c[j];
  }
  return p;
}

function diagonalise(matrix: number[][]): { energies: number[]; vectors: number[][] } {
  const n = matrix.length;
  const { values, vectors } = symmetricEigen(Float64Array.from(matrix.flat()), n);
  return {
    energies: Array.from(values),
    vectors: Array.from({ length: n }, (_, k) => fixSign(Array.from({ length: n }, (_, i) => vectors[i * n + k]))),
  };
}

/** Eigenvectors are defined up to sign; make the largest coefficient positive so results are reproducible. */
function fixSign(vector: number[]): number[] {
  let largest = 0;
  for (const c of vector) if (Math.abs(c) > Math.abs(largest) + 1e-12) largest = c;
  return largest < 0 ? vector.map((c) => -c) : vector;
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
  const gamma = positions.map((pi_, i) =>
    positions.map((pj, j) => (i === j ? atoms[i].gamma : matagaNishimoto(Math.hypot(pi_[0] - pj[0], pi_[1] - pj[1]), atoms[i].gamma, atoms[j].gamma))),
  );
  const core = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++) {
    core[i][i] = -atoms[i].ionisation;
    // The core charge is the atom's π electrons plus its formal charge: a trigonal N keeps core +2
    // whether it is −N< (2 e) or =N⁺< (1 e), a carbocation or carbanion carbon keeps core +1.
    for (let j = 0; j < n; j++) if (j !== i) core[i][i] -= (pi.centres[j].electrons + pi.centres[j].formalCharge) * gamma[i][j];
  }
  const beta0 = pi.bonds.map((b) => pppBeta(pi.centres[b.a].type!, pi.centres[b.b].type!));
  const occupied = pi.electrons / 2;
  if (occupied === 0 || occupied === n) throw new ChemError(`'${pi.smiles}' has ${occupied === 0 ? 'no' : 'only filled'} π orbitals: no π→π* excitation`);

  // Start from the core guess with β at the reference bond order; then F(P) (β included, since it
  // follows the bond order) is extrapolated by DIIS (P. Pulay, Chem. Phys. Lett. 73, 393 (1980)) on
  // the commutator FP − PF, which vanishes at self-consistency.
  let p = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  let energies: number[] = [];
  let vectors: number[][] = [];
  let iterations = 0;
  const history: { fock: number[][]; error: number[] }[] = [];
  for (; iterations < MAX_ITERATIONS; iterations++) {
    const fock = core.map((row) => row.slice());
    pi.bonds.forEach((b, k) => {
      const beta = iterations === 0 ? beta0[k] : beta0[k] * Math.exp(BETA_BOND_ORDER_KAPPA * (p[b.a][b.b] - 2 / 3));
      fock[b.a][b.b] = fock[b.b][b.a] = beta;
    });
    if (iterations > 0)
      for (let i = 0; i < n; i++) {
        let diagonal = 0.5 * p[i][i] * gamma[i][i];
        for (let k = 0; k < n; k++) if (k !== i) diagonal += p[k][k] * gamma[i][k];
        fock[i][i] += diagonal;
        for (let j = 0; j < n; j++) if (j !== i) fock[i][j] -= 0.5 * p[i][j] * gamma[i][j];
      }
    let solveWith = fock;
    if (iterations > 0) {
      const error = commutator(fock, p);
      const size = Math.max(...error.map(Math.abs));
      if (size < COMMUTATOR_TOLERANCE) {
        ({ energies, vectors } = diagonalise(fock));
        break;
      }
      history.push({ fock, error });
      if (history.length > DIIS_DEPTH) history.shift();
      solveWith = extrapolate(history) ?? fock;
    }
    ({ energies, vectors } = diagonalise(solveWith));
    p = density(vectors, occupied, n);
  }
  if (iterations >= MAX_ITERATIONS) throw new ChemError(`the PPP SCF for '${pi.smiles}' did not converge in ${MAX_ITERATIONS} iterations`);
  return { pi, positions, gamma, energies, vectors, occupied, bondOrders: p, iterations };
}
