// A dense real symmetric eigensolver on flat Float64Arrays for the PPP model, whose SCF diagonalises a
// small Fock matrix a dozen times and whose CIS matrix reaches a few hundred rows: Householder
// reduction to tridiagonal form followed by the QL algorithm with implicit shifts (the EISPACK
// routines tred2/tql2 as given in W. H. Press et al., Numerical Recipes, 2nd ed. (1992), §11.2–11.3).
// The arithmetic is theirs; the loops are reordered so every inner loop walks a row (contiguous
// memory): the product A·u of tred2 is taken from the stored lower triangle row by row, the
// accumulation of the Householder matrices gathers a whole row of sums at once, and the QL rotations
// act on the transposed transformation, so they combine two rows instead of two columns. The inner
// loops sit in small functions of their own, which V8 optimises far better (the QL part ran 2–3× faster
// so), and √(f² + g²) replaces Math.hypot (NR's overflow-guarded pythag): the PPP matrices hold
// numbers of a few eV, nowhere near overflow, and Math.hypot costs several times more.
// eigen.ts keeps ml-matrix for the Hückel family; tests/chem-ppp-eigen.test.ts checks this solver
// against mathjs.
import { ChemError } from './errors.js';

export interface FlatEigen {
  /** Eigenvalues ascending. */
  values: Float64Array;
  /** Eigenvector k is row k: vectors[k * n + i] (empty with valuesOnly). */
  vectors: Float64Array;
}

/** y[yo + k] += a · x[xo + k] for k < len. */
function axpy(y: Float64Array, yo: number, x: Float64Array, xo: number, a: number, len: number) {
  for (let k = 0; k < len; k++) y[yo + k] += a * x[xo + k];
}

/** Row j of the lower triangle against u (row i of z): adds A_jk u_j to p_k (k < j) and returns Σ_{k<j} A_jk u_k. */
function symmetricRow(z: Float64Array, rj: number, ri: number, p: Float64Array, uj: number, j: number): number {
  let s = 0;
  for (let k = 0; k < j; k++) {
    const ajk = z[rj + k];
    s += ajk * z[ri + k];
    p[k] += ajk * uj;
  }
  return s;
}

/** z[rj + k] −= f e_k + g z[ri + k] for k ≤ j: the rank-2 update of the reduced block. */
function rankTwoRow(z: Float64Array, rj: number, ri: number, e: Float64Array, f: number, g: number, j: number) {
  for (let k = 0; k <= j; k++) z[rj + k] -= f * e[k] + g * z[ri + k];
}

/** Householder tridiagonalisation (tred2) of the lower triangle of `z`, in place: diagonal to d, sub-diagonal to e[1..], the orthogonal transformation (unless valuesOnly) left in z. */
function tridiagonalise(z: Float64Array, n: number, d: Float64Array, e: Float64Array, valuesOnly: boolean) {
  for (let i = n - 1; i > 0; i--) {
    const l = i - 1;
    const ri = i * n;
    let h = 0;
    if (l > 0) {
      let scale = 0;
      for (let k = 0; k <= l; k++) scale += Math.abs(z[ri + k]);
      if (scale === 0) e[i] = z[ri + l];
      else {
        for (let k = 0; k <= l; k++) {
          z[ri + k] /= scale;
          h += z[ri + k] * z[ri + k];
        }
        let f = z[ri + l];
        const g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        z[ri + l] = f - g;
        // p = A·u/h with A the leading (l+1)×(l+1) block held in its lower triangle: row j gives
        // Σ_{k≤j} A_jk u_k to p_j and A_jk u_j to every p_k, k < j.
        for (let j = 0; j <= l; j++) e[j] = 0;
        for (let j = 0; j <= l; j++) {
          const rj = j * n;
          const uj = z[ri + j];
          z[rj + i] = uj / h; // u/h kept in column i for the accumulation below
          e[j] += symmetricRow(z, rj, ri, e, uj, j) + z[rj + j] * uj;
        }
        f = 0;
        for (let j = 0; j <= l; j++) {
          e[j] /= h;
          f += e[j] * z[ri + j];
        }
        const hh = f / (h + h);
        for (let j = 0; j <= l; j++) {
          const ff = z[ri + j];
          const gj = (e[j] -= hh * ff);
          rankTwoRow(z, j * n, ri, e, ff, gj, j);
        }
      }
    } else e[i] = z[ri + l];
    d[i] = h;
  }
  d[0] = 0;
  e[0] = 0;
  if (valuesOnly) {
    for (let i = 0; i < n; i++) d[i] = z[i * n + i];
    return;
  }
  const g = new Float64Array(n);
  for (let i = 0; i < n; i++) {
    const ri = i * n;
    if (d[i] !== 0) {
      // g_j = Σ_k z_ik z_kj and z_kj −= g_j z_ki for all j < i at once, row by row.
      g.fill(0, 0, i);
      for (let k = 0; k < i; k++) axpy(g, 0, z, k * n, z[ri + k], i);
      for (let k = 0; k < i; k++) axpy(z, k * n, g, 0, -z[k * n + i], i);
    }
    d[i] = z[ri + i];
    z[ri + i] = 1;
    for (let j = 0; j < i; j++) z[j * n + i] = z[ri + j] = 0;
  }
}

function transpose(z: Float64Array, n: number) {
  for (let i = 0; i < n; i++)
    for (let j = 0; j < i; j++) {
      const t = z[i * n + j];
      z[i * n + j] = z[j * n + i];
      z[j * n + i] = t;
    }
}

/** Rows r0 and r0 + n of z turned by the plane rotation (c, s). */
function rotateRows(z: Float64Array, r0: number, n: number, s: number, c: number) {
  const r1 = r0 + n;
  for (let k = 0; k < n; k++) {
    const zn = z[r1 + k];
    const zi = z[r0 + k];
    z[r1 + k] = s * zi + c * zn;
    z[r0 + k] = c * zi - s * zn;
  }
}

/** QL with implicit shifts (tqli) on the tridiagonal d, e; rotations applied to the rows of zt (the transposed transformation) unless valuesOnly. */
function diagonaliseTridiagonal(d: Float64Array, e: Float64Array, n: number, zt: Float64Array, valuesOnly: boolean) {
  for (let i = 1; i < n; i++) e[i - 1] = e[i];
  e[n - 1] = 0;
  for (let l = 0; l < n; l++) {
    let iter = 0;
    let m: number;
    do {
      for (m = l; m < n - 1; m++) {
        const dd = Math.abs(d[m]) + Math.abs(d[m + 1]);
        if (Math.abs(e[m]) <= Number.EPSILON * dd) break;
      }
      if (m !== l) {
        if (iter++ === 60) throw new ChemError('the eigenvalue iteration did not converge');
        let g = (d[l + 1] - d[l]) / (2 * e[l]);
        let r = Math.sqrt(g * g + 1);
        g = d[m] - d[l] + e[l] / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
        let s = 1;
        let c = 1;
        let p = 0;
        let i: number;
        for (i = m - 1; i >= l; i--) {
          const f = s * e[i];
          const b = c * e[i];
          e[i + 1] = r = Math.sqrt(f * f + g * g);
          if (r === 0) {
            d[i + 1] -= p;
            e[m] = 0;
            break;
          }
          s = f / r;
          c = g / r;
          g = d[i + 1] - p;
          r = (d[i] - g) * s + 2 * c * b;
          d[i + 1] = g + (p = s * r);
          g = c * r - b;
          if (!valuesOnly) rotateRows(zt, i * n, n, s, c);
        }
        if (r === 0 && i >= l) continue;
        d[l] -= p;
        e[l] = g;
        e[m] = 0;
      }
    } while (m !== l);
  }
}

/** Puts row order[r] of the n×n row-major `z` into row r, in place (cycle by cycle, one spare row). */
function permuteRows(z: Float64Array, n: number, order: number[]) {
  const done = new Uint8Array(n);
  const spare = new Float64Array(n);
  for (let start = 0; start < n; start++) {
    if (done[start] || order[start] === start) continue;
    spare.set(z.subarray(start * n, start * n + n));
    let row = start;
    for (;;) {
      done[row] = 1;
      const source = order[row];
      if (source === start) {
        z.set(spare, row * n);
        break;
      }
      z.copyWithin(row * n, source * n, source * n + n);
      row = source;
    }
  }
}

/**
 * Eigen-decomposition of the symmetric n×n matrix `a` (row-major; only its lower triangle is read).
 * `a` is overwritten and, unless valuesOnly, returned as `vectors`. With valuesOnly the vectors are not
 * accumulated (about three times faster) and `vectors` is empty.
 */
export function symmetricEigen(a: Float64Array, n: number, valuesOnly = false): FlatEigen {
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  tridiagonalise(a, n, d, e, valuesOnly);
  if (!valuesOnly) transpose(a, n);
  diagonaliseTridiagonal(d, e, n, a, valuesOnly);
  const order = Array.from({ length: n }, (_, k) => k).sort((x, y) => d[x] - d[y]);
  const values = Float64Array.from(order, (k) => d[k]);
  if (valuesOnly) return { values, vectors: new Float64Array(0) };
  permuteRows(a, n, order);
  return { values, vectors: a };
}
