// The eigen solver (ml-matrix) cross-checked against a second general-purpose library, mathjs
// (dev dependency, tests only), and against the defining equations HC = SCE, CᵀSC = 1.
import { eigs, inv, multiply } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { inverseSquareRoot, solveSecular, solveSymmetric } from '../functions/chem/eigen.js';

/** Small deterministic generator (mulberry32) so a failure can be reproduced. */
function random(seed: number) {
  let t = seed >>> 0;
  return () => {
    t = (t + 0x6d2b79f5) >>> 0;
    let r = Math.imul(t ^ (t >>> 15), 1 | t);
    r = (r + Math.imul(r ^ (r >>> 7), 61 | r)) ^ r;
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
}

function randomSymmetric(n: number, next: () => number): number[][] {
  const m = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) {
      const v = 4 * next() - 2;
      m[i][j] = m[j][i] = v;
    }
  return m;
}

/** A random overlap matrix: unit diagonal, small off-diagonal overlaps, diagonally dominant so positive definite. */
function randomOverlap(n: number, next: () => number): number[][] {
  const s: number[][] = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (i === j ? 1 : 0)));
  for (let i = 0; i < n; i++)
    for (let j = i + 1; j < n; j++) {
      const v = ((next() - 0.5) * 0.6) / n;
      s[i][j] = s[j][i] = v;
    }
  return s;
}

const mathjsValues = (m: number[][]) => (eigs(m).values as number[]).map(Number).sort((a, b) => a - b);

describe('symmetric eigenvalues: ml-matrix against mathjs', () => {
  const next = random(20240611);
  it.each([2, 3, 5, 8, 13, 21, 30, 40])('agrees on a random symmetric matrix of order %i to 1e-9', (n) => {
    const m = randomSymmetric(n, next);
    const ours = solveSymmetric(m, 'ascending').values;
    const theirs = mathjsValues(m);
    expect(ours).toHaveLength(n);
    ours.forEach((x, k) => expect(Math.abs(x - theirs[k])).toBeLessThan(1e-9));
  });

  it('returns orthonormal eigenvectors that satisfy Hc = xc', () => {
    const m = randomSymmetric(12, random(7));
    const { values, vectors } = solveSymmetric(m, 'descending');
    expect(values).toHaveLength(12);
    expect(vectors.map((v) => v.length)).toEqual(new Array(12).fill(12));
    for (let k = 0; k < values.length; k++) {
      const hc = multiply(m, vectors[k]) as number[];
      hc.forEach((v, i) => expect(Math.abs(v - values[k] * vectors[k][i])).toBeLessThan(1e-10));
      for (let l = 0; l < values.length; l++) {
        const dot = vectors[k].reduce((s, c, i) => s + c * vectors[l][i], 0);
        expect(Math.abs(dot - (k === l ? 1 : 0))).toBeLessThan(1e-10);
      }
    }
    expect(values).toEqual([...values].sort((a, b) => b - a));
  });
});

describe('generalized problem det(H − ES) = 0 by Löwdin orthogonalization', () => {
  const next = random(99);
  it.each([2, 4, 7, 12, 20])('matches mathjs eigenvalues of S⁻¹H and satisfies HC = SCE with CᵀSC = 1 (order %i)', (n) => {
    const h = randomSymmetric(n, next);
    const s = randomOverlap(n, next);
    const { values, vectors } = solveSecular(h, s, 'ascending');
    const theirs = mathjsValues(multiply(inv(s), h) as number[][]);
    expect(values).toHaveLength(n);
    expect(vectors.map((v) => v.length)).toEqual(new Array(n).fill(n));
    values.forEach((e, k) => expect(Math.abs(e - theirs[k])).toBeLessThan(1e-8));
    vectors.forEach((c, k) => {
      const hc = multiply(h, c) as number[];
      const sc = multiply(s, c) as number[];
      hc.forEach((v, i) => expect(Math.abs(v - values[k] * sc[i])).toBeLessThan(1e-9));
      expect(c.reduce((sum, ci, i) => sum + ci * sc[i], 0)).toBeCloseTo(1, 10);
    });
  });

  it('reproduces the two-centre textbook roots (α ± β)/(1 ± S) (e.g. Levine, Quantum Chemistry, H2+ LCAO)', () => {
    const [alpha, beta, overlap] = [-11.4, -3.2, 0.25];
    const { values } = solveSecular([[alpha, beta], [beta, alpha]], [[1, overlap], [overlap, 1]], 'ascending');
    expect(values[0]).toBeCloseTo((alpha + beta) / (1 + overlap), 12);
    expect(values[1]).toBeCloseTo((alpha - beta) / (1 - overlap), 12);
  });

  it('rejects an overlap matrix that is not positive definite', () => {
    expect(() => inverseSquareRoot([[1, 1], [1, 1]])).toThrow('the overlap matrix S is not positive definite');
    expect(() => inverseSquareRoot([[1, 1.5], [1.5, 1]])).toThrow('smallest eigenvalue -0.5');
  });
});
