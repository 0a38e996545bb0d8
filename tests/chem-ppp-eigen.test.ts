// The flat-array eigensolver of the PPP model (functions/chem/eigenFast.ts) against mathjs (a second,
// independent library; dev dependency) and against its defining equations A v = λ v, VᵀV = 1.
import { eigs } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { symmetricEigen } from '../functions/chem/eigenFast.js';
import { seededRandom as random } from './helpers/quadrature.js';

function randomSymmetric(n: number, next: () => number): number[][] {
  const m = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let i = 0; i < n; i++)
    for (let j = i; j < n; j++) m[i][j] = m[j][i] = 4 * next() - 2;
  return m;
}

const mathjsValues = (m: number[][]) => (eigs(m).values as number[]).map(Number).sort((a, b) => a - b);

describe('flat symmetric eigensolver', () => {
  const next = random(31337);
  it.each([1, 2, 3, 7, 20, 41, 100])('order %i: eigenvalues agree with mathjs, vectors satisfy Av = λv and are orthonormal', (n) => {
    const m = randomSymmetric(n, next);
    const { values, vectors } = symmetricEigen(Float64Array.from(m.flat()), n);
    expect(values).toHaveLength(n);
    expect(vectors).toHaveLength(n * n);
    const theirs = mathjsValues(m);
    values.forEach((x, k) => expect(Math.abs(x - theirs[k])).toBeLessThan(1e-9));
    let residual = 0;
    let orthogonality = 0;
    for (let k = 0; k < n; k++) {
      const v = vectors.subarray(k * n, k * n + n);
      for (let i = 0; i < n; i++) residual = Math.max(residual, Math.abs(m[i].reduce((s, a, j) => s + a * v[j], 0) - values[k] * v[i]));
      for (let l = 0; l < n; l++) {
        const w = vectors.subarray(l * n, l * n + n);
        orthogonality = Math.max(orthogonality, Math.abs(v.reduce((s, c, i) => s + c * w[i], 0) - (k === l ? 1 : 0)));
      }
    }
    expect(residual).toBeLessThan(1e-10);
    expect(orthogonality).toBeLessThan(1e-10);
    expect(Array.from(values)).toEqual(Array.from(values).sort((a, b) => a - b));
  });

  it('reads only the lower triangle, and gives the same values without vectors', () => {
    const n = 30;
    const m = randomSymmetric(n, random(5));
    const lower = Float64Array.from(m.flat());
    for (let i = 0; i < n; i++) for (let j = i + 1; j < n; j++) lower[i * n + j] = 1e6; // junk above the diagonal
    const full = symmetricEigen(Float64Array.from(m.flat()), n).values;
    const fromLower = symmetricEigen(lower.slice(), n).values;
    const valuesOnly = symmetricEigen(lower.slice(), n, true);
    expect(valuesOnly.vectors).toHaveLength(0);
    expect(fromLower).toHaveLength(n);
    expect(valuesOnly.values).toHaveLength(n);
    full.forEach((x, k) => {
      expect(Math.abs(fromLower[k] - x)).toBeLessThan(1e-12);
      expect(Math.abs(valuesOnly.values[k] - x)).toBeLessThan(1e-12);
    });
  });

  it('resolves a degenerate pair exactly (the Hückel ring of six: 2β, β, β, −β, −β, −2β with β = −1; textbook result)', () => {
    const n = 6;
    const ring = new Float64Array(n * n);
    for (let i = 0; i < n; i++) ring[i * n + ((i + 1) % n)] = ring[((i + 1) % n) * n + i] = -1;
    const { values } = symmetricEigen(ring, n);
    [-2, -1, -1, 1, 1, 2].forEach((x, k) => expect(values[k]).toBeCloseTo(x, 12));
  });
});
