// Symmetric eigenproblems for π-electron models, on top of ml-matrix (a maintained linear-algebra
// package; its symmetric path is the Householder tridiagonalisation + QL algorithm of the EISPACK
// routines tred2/tql2). The generalized problem HC = SCE is reduced to an ordinary one by Löwdin's
// symmetric orthogonalization: H' = S^-1/2 H S^-1/2, C = S^-1/2 C' (P.-O. Löwdin, J. Chem. Phys. 18,
// 365 (1950)).
import { EigenvalueDecomposition, Matrix } from 'ml-matrix';
import { ChemError } from './errors.js';

export interface EigenSystem {
  /** Eigenvalues in the requested order. */
  values: number[];
  /** vectors[k][i]: coefficient of basis function i in eigenvector k (normalised: Σ_i c_ik² = 1, or CᵀSC = 1 with overlap). */
  vectors: number[][];
}

export type EigenOrder = 'ascending' | 'descending';

/** Relative size below which an overlap eigenvalue counts as zero (S singular, not positive definite). */
const OVERLAP_EIGENVALUE_FLOOR = 1e-10;

/** Eigenvalues and eigenvectors of a real symmetric matrix (the caller has checked symmetry). */
export function solveSymmetric(matrix: number[][], order: EigenOrder): EigenSystem {
  const n = matrix.length;
  if (n === 1) return { values: [matrix[0][0]], vectors: [[1]] };
  const evd = new EigenvalueDecomposition(new Matrix(matrix), { assumeSymmetric: true });
  const values = evd.realEigenvalues;
  const columns = evd.eigenvectorMatrix;
  const indices = values.map((_, k) => k);
  indices.sort((a, b) => (order === 'ascending' ? values[a] - values[b] : values[b] - values[a]));
  return {
    values: indices.map((k) => values[k]),
    vectors: indices.map((k) => fixSign(columns.getColumn(k))),
  };
}

/** Eigenvectors are defined up to sign; make the largest coefficient positive so results are reproducible. */
function fixSign(vector: number[]): number[] {
  let largest = 0;
  for (const c of vector) if (Math.abs(c) > Math.abs(largest) + 1e-12) largest = c;
  return largest < 0 ? vector.map((c) => -c) : vector;
}

/** S^-1/2 for a symmetric overlap matrix; throws a ChemError when S is not positive definite. */
export function inverseSquareRoot(overlap: number[][]): number[][] {
  const { values, vectors } = solveSymmetric(overlap, 'ascending');
  const largest = Math.max(...values.map(Math.abs), 1);
  const smallest = values[0];
  if (!(smallest > OVERLAP_EIGENVALUE_FLOOR * largest)) {
    throw new ChemError(
      `the overlap matrix S is not positive definite (smallest eigenvalue ${formatNumber(smallest)}); overlaps must satisfy |S_ij| < 1 and describe independent orbitals`,
    );
  }
  const n = overlap.length;
  const result = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let k = 0; k < n; k++) {
    const scale = 1 / Math.sqrt(values[k]);
    const v = vectors[k];
    for (let i = 0; i < n; i++) for (let j = 0; j < n; j++) result[i][j] += v[i] * scale * v[j];
  }
  return result;
}

function multiply(a: number[][], b: number[][]): number[][] {
  return new Matrix(a).mmul(new Matrix(b)).to2DArray();
}

/** Roots of det(H − ES) = 0 with their coefficient vectors (Löwdin orthogonalization); S omitted means S = 1. */
export function solveSecular(hamiltonian: number[][], overlap: number[][] | undefined, order: EigenOrder): EigenSystem {
  if (!overlap) return solveSymmetric(hamiltonian, order);
  const sInvHalf = inverseSquareRoot(overlap);
  const orthogonal = multiply(multiply(sInvHalf, hamiltonian), sInvHalf);
  symmetrize(orthogonal);
  const { values, vectors } = solveSymmetric(orthogonal, order);
  return {
    values,
    vectors: vectors.map((v) => fixSign(sInvHalf.map((row) => row.reduce((sum, s, j) => sum + s * v[j], 0)))),
  };
}

/** Removes the round-off asymmetry of a product that is symmetric in exact arithmetic. */
function symmetrize(m: number[][]) {
  for (let i = 0; i < m.length; i++)
    for (let j = i + 1; j < m.length; j++) {
      const mean = (m[i][j] + m[j][i]) / 2;
      m[i][j] = mean;
      m[j][i] = mean;
    }
}

function formatNumber(x: number) {
  return Number(x.toPrecision(4)).toString();
}
