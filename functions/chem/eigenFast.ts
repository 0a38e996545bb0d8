// A dense real symmetric eigensolver on flat Float64Arrays for the PPP model, whose SCF diagonalises a
// small Fock matrix dozens of times and whose CIS matrix reaches a few hundred rows: Householder
// reduction to tridiagonal form followed by the QL algorithm with implicit shifts (the EISPACK
// routines tred2/tql2 as given in W. H. Press et al., Numerical Recipes, 2nd ed. (1992), §11.2–11.3).
// eigen.ts keeps ml-matrix for the Hückel family; tests/chem-ppp-eigen.test.ts checks that this
// solver agrees with it.
import { ChemError } from './errors.js';

export interface FlatEigen {
  /** Eigenvalues ascending. */
  values: Float64Array;
  /** Eigenvector k is column k: vectors[i * n + k]. */
  vectors: Float64Array;
}

/** Eigen-decomposition of the symmetric n×n matrix `a` (row-major; overwritten). With valuesOnly the vectors are not accumulated (about three times faster) and `vectors` is empty. */
export function symmetricEigen(a: Float64Array, n: number, valuesOnly = false): FlatEigen {
  const d = new Float64Array(n);
  const e = new Float64Array(n);
  const z = a; // Householder transforms accumulate into z in place
  // tred2
  for (let i = n - 1; i > 0; i--) {
    const l = i - 1;
    let h = 0;
    if (l > 0) {
      let scale = 0;
      for (let k = 0; k <= l; k++) scale += Math.abs(z[i * n + k]);
      if (scale === 0) e[i] = z[i * n + l];
      else {
        for (let k = 0; k <= l; k++) {
          z[i * n + k] /= scale;
          h += z[i * n + k] * z[i * n + k];
        }
        let f = z[i * n + l];
        const g = f >= 0 ? -Math.sqrt(h) : Math.sqrt(h);
        e[i] = scale * g;
        h -= f * g;
        z[i * n + l] = f - g;
        f = 0;
        for (let j = 0; j <= l; j++) {
          z[j * n + i] = z[i * n + j] / h;
          let gg = 0;
          for (let k = 0; k <= j; k++) gg += z[j * n + k] * z[i * n + k];
          for (let k = j + 1; k <= l; k++) gg += z[k * n + j] * z[i * n + k];
          e[j] = gg / h;
          f += e[j] * z[i * n + j];
        }
        const hh = f / (h + h);
        for (let j = 0; j <= l; j++) {
          const ff = z[i * n + j];
          const gj = (e[j] -= hh * ff);
          for (let k = 0; k <= j; k++) z[j * n + k] -= ff * e[k] + gj * z[i * n + k];
        }
      }
    } else e[i] = z[i * n + l];
    d[i] = h;
  }
  d[0] = 0;
  e[0] = 0;
  for (let i = 0; i < n; i++) {
    const l = i - 1;
    if (valuesOnly) {
      d[i] = z[i * n + i];
      continue;
    }
    if (d[i] !== 0) {
      for (let j = 0; j <= l; j++) {
        let g = 0;
        for (let k = 0; k <= l; k++) g += z[i * n + k] * z[k * n + j];
        for (let k = 0; k <= l; k++) z[k * n + j] -= g * z[k * n + i];
      }
    }
    d[i] = z[i * n + i];
    z[i * n + i] = 1;
    for (let j = 0; j <= l; j++) z[j * n + i] = z[i * n + j] = 0;
  }
  // tqli
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
        let r = Math.hypot(g, 1);
        g = d[m] - d[l] + e[l] / (g + (g >= 0 ? Math.abs(r) : -Math.abs(r)));
        let s = 1;
        let c = 1;
        let p = 0;
        let i: number;
        for (i = m - 1; i >= l; i--) {
          let f = s * e[i];
          const b = c * e[i];
          e[i + 1] = r = Math.hypot(f, g);
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
          if (!valuesOnly)
            for (let k = 0; k < n; k++) {
              f = z[k * n + i + 1];
              z[k * n + i + 1] = s * z[k * n + i] + c * f;
              z[k * n + i] = c * z[k * n + i] - s * f;
            }
        }
        if (r === 0 && i >= l) continue;
        d[l] -= p;
        e[l] = g;
        e[m] = 0;
      }
    } while (m !== l);
  }
  // sort ascending
  const order = Array.from({ length: n }, (_, k) => k).sort((x, y) => d[x] - d[y]);
  const values = new Float64Array(n);
  const vectors = new Float64Array(valuesOnly ? 0 : n * n);
  order.forEach((k, col) => {
    values[col] = d[k];
    if (!valuesOnly) for (let i = 0; i < n; i++) vectors[i * n + col] = z[i * n + k];
  });
  return { values, vectors };
}
