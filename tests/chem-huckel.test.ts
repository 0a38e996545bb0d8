// Simple Hückel theory against published results. Level lists are x in E = α + xβ, most bonding
// first. Reference values: A. Streitwieser, Molecular Orbital Theory for Organic Chemists (1961),
// and standard physical chemistry texts (Atkins, Physical Chemistry; Levine, Quantum Chemistry) —
// the three-decimal values below are recalled from those tables (from memory) and checked here.
import { describe, expect, it } from 'vitest';
import { bondOrder, delocalizationEnergy, frontierGap, piCharge, piEnergy, type HuckelModel } from '../functions/chem/huckel.js';
import { huckelModelOf } from '../functions/chem/huckelCache.js';

const model = (smiles: string, params?: string): HuckelModel => huckelModelOf([[smiles]], params);
const levels = (smiles: string, params?: string) => model(smiles, params).levels;
/** Coulson bond order between 1-based atom numbers of a hydrocarbon written without substituents. */
const order = (smiles: string, i: number, j: number) => {
  const m = model(smiles);
  return bondOrder(m, m.electrons, m.pi!.centreOfAtom.get(i)!, m.pi!.centreOfAtom.get(j)!);
};

function expectLevels(actual: number[], expected: number[], tolerance = 5e-4) {
  expect(actual).toHaveLength(expected.length);
  actual.forEach((x, k) => expect(Math.abs(x - expected[k]), `level ${k + 1}: ${x} vs ${expected[k]}`).toBeLessThan(tolerance));
}

describe('Hückel levels of the classic π systems (Streitwieser 1961; Atkins; from memory)', () => {
  it('gives ethylene levels at α ± β', () => expectLevels(levels('C=C'), [1, -1], 1e-12));

  it('gives the allyl cation, radical and anion the same levels √2, 0, −√2', () => {
    for (const s of ['[CH2+]C=C', '[CH2]C=C', '[CH2-]C=C']) expectLevels(levels(s), [Math.SQRT2, 0, -Math.SQRT2], 1e-12);
  });

  it('gives butadiene ±1.618 and ±0.618', () => expectLevels(levels('C=CC=C'), [1.618, 0.618, -0.618, -1.618]));

  it('gives hexatriene ±1.802, ±1.247, ±0.445', () => expectLevels(levels('C=CC=CC=C'), [1.802, 1.247, 0.445, -0.445, -1.247, -1.802]));

  it('gives cyclobutadiene 2, 0, 0, −2', () => expectLevels(levels('C1=CC=C1'), [2, 0, 0, -2], 1e-12));

  it('gives benzene 2, 1, 1, −1, −1, −2', () => expectLevels(levels('c1ccccc1'), [2, 1, 1, -1, -1, -2], 1e-12));

  it('gives the cyclopentadienyl anion 2, 0.618 (×2), −1.618 (×2), whichever way it is written', () => {
    for (const s of ['[cH-]1cccc1', 'C1=CC=C[CH-]1']) expectLevels(levels(s), [2, 0.618, 0.618, -1.618, -1.618]);
  });

  it('gives tropylium 2, 1.247 (×2), −0.445 (×2), −1.802 (×2)', () =>
    expectLevels(levels('[CH+]1C=CC=CC=C1'), [2, 1.247, 1.247, -0.445, -0.445, -1.802, -1.802]));

  it('gives naphthalene ±2.303, ±1.618, ±1.303, ±1, ±0.618', () =>
    expectLevels(levels('c1ccc2ccccc2c1'), [2.303, 1.618, 1.303, 1, 0.618, -0.618, -1, -1.303, -1.618, -2.303]));
});

describe('π energies and delocalization energies (Streitwieser 1961; from memory)', () => {
  it('gives benzene E_π = 6α + 8β and a delocalization energy of 2β', () => {
    const m = model('c1ccccc1');
    expect(piEnergy(m, m.electrons)).toBeCloseTo(8, 12);
    expect(delocalizationEnergy(m)).toBeCloseTo(2, 12);
  });

  it('gives butadiene a delocalization energy of 0.472β', () => expect(delocalizationEnergy(model('C=CC=C'))).toBeCloseTo(0.472, 3));

  it('gives naphthalene a delocalization energy of 3.683β', () => expect(delocalizationEnergy(model('c1ccc2ccccc2c1'))).toBeCloseTo(3.683, 3));

  it('gives each allyl species 0.828β, as the cation, radical and anion share the nonbonding level', () => {
    for (const s of ['[CH2+]C=C', '[CH2]C=C', '[CH2-]C=C']) expect(delocalizationEnergy(model(s))).toBeCloseTo(0.828, 3);
  });

  it('gives tropylium 2.988β and cyclobutadiene none at all', () => {
    expect(delocalizationEnergy(model('[CH+]1C=CC=CC=C1'))).toBeCloseTo(2.988, 3);
    expect(delocalizationEnergy(model('C1=CC=C1'))).toBeCloseTo(0, 12);
  });

  it('does not depend on which Kekulé structure the SMILES writes', () => {
    expect(delocalizationEnergy(model('C1=CC=CC=C1'))).toBeCloseTo(delocalizationEnergy(model('C=1C=CC=CC=1')), 12);
  });
});

describe('Coulson bond orders and π charges', () => {
  it('gives butadiene p12 = 0.894 and p23 = 0.447 (Coulson 1939; Streitwieser, from memory)', () => {
    expect(order('C=CC=C', 1, 2)).toBeCloseTo(0.894, 3);
    expect(order('C=CC=C', 2, 3)).toBeCloseTo(0.447, 3);
  });

  it('gives every benzene bond 2/3', () => {
    for (let i = 1; i <= 6; i++) expect(order('c1ccccc1', i, (i % 6) + 1)).toBeCloseTo(2 / 3, 12);
  });

  it('gives naphthalene p12 = 0.725, p23 = 0.603, p1,8a = 0.555 and p4a,8a = 0.518 (Coulson, from memory)', () => {
    // c1ccc2ccccc2c1: atoms 1..10; 1 = C2, 2 = C3, 3 = C4, 4 = C4a, 9 = C8a, 10 = C1 (IUPAC numbering)
    const s = 'c1ccc2ccccc2c1';
    expect(order(s, 10, 1)).toBeCloseTo(0.725, 3);
    expect(order(s, 1, 2)).toBeCloseTo(0.603, 3);
    expect(order(s, 10, 9)).toBeCloseTo(0.555, 3);
    expect(order(s, 4, 9)).toBeCloseTo(0.518, 3);
  });

  it('puts half a positive charge on each end of the allyl cation and half a negative one on the anion', () => {
    const cation = model('[CH2+]C=C');
    const anion = model('[CH2-]C=C');
    expect([0, 1, 2].map((i) => piCharge(cation, cation.electrons, i))).toEqual([0.5, 0, 0.5].map((v) => expect.closeTo(v, 12)));
    expect([0, 1, 2].map((i) => piCharge(anion, anion.electrons, i))).toEqual([-0.5, 0, -0.5].map((v) => expect.closeTo(v, 12)));
  });

  it('leaves every atom of an alternant hydrocarbon neutral (Coulson–Rushbrooke theorem, 1940)', () => {
    for (const [s, centres] of [['C=CC=CC=CC=C', 8], ['c1ccc2cc3ccccc3cc2c1', 14], ['c1ccc(cc1)-c1ccccc1', 12], ['C=Cc1ccccc1', 8]] as const) {
      const m = model(s);
      expect(m.levels, s).toHaveLength(centres);
      m.levels.forEach((_, i) => expect(Math.abs(piCharge(m, m.electrons, i)), `${s} atom ${i + 1}`).toBeLessThan(1e-10));
    }
  });

  it('makes the π charges of an ion add up to its charge', () => {
    for (const [s, charge] of [['[CH+]1C=CC=CC=C1', 1], ['C1=CC=C[CH-]1', -1], ['c1cc[nH+]cc1', 1]] as const) {
      const m = model(s);
      expect(m.levels.reduce((sum, _, i) => sum + piCharge(m, m.electrons, i), 0)).toBeCloseTo(charge, 10);
    }
  });
});

describe('the solver against the analytic chain and ring formulas, N up to 30', () => {
  const chain = (n: number) => 'C' + 'C'.repeat(n - 1).split('').map((c, i) => (i % 2 === 0 ? '=' : '') + c).join('');
  const sortedDesc = (xs: number[]) => [...xs].sort((a, b) => b - a);

  it.each(Array.from({ length: 29 }, (_, i) => i + 2))('reproduces x_k = 2cos(kπ/(N+1)) for a linear chain of %i centres', (n) => {
    // Odd chains are radicals written with a terminal [CH2]; the levels depend only on the topology.
    const smiles = n % 2 === 0 ? chain(n) : `[CH2]${chain(n - 1)}`;
    const expected = sortedDesc(Array.from({ length: n }, (_, k) => 2 * Math.cos(((k + 1) * Math.PI) / (n + 1))));
    expectLevels(levels(smiles), expected, 1e-10);
  });

  it.each(Array.from({ length: 28 }, (_, i) => i + 3))('reproduces x_k = 2cos(2πk/N) for a ring of %i centres', (n) => {
    // A ring written as a matrix: the same cyclic topology for every N, odd or even.
    const matrix = Array.from({ length: n }, (_, i) => Array.from({ length: n }, (_, j) => (Math.abs(i - j) === 1 || Math.abs(i - j) === n - 1 ? 1 : 0)));
    const expected = sortedDesc(Array.from({ length: n }, (_, k) => 2 * Math.cos((2 * Math.PI * k) / n)));
    expectLevels(huckelModelOf(matrix).levels, expected, 1e-10);
  });

  it('gives the same ring levels from SMILES as from the matrix for even annulenes', () => {
    for (const n of [6, 10, 14, 18, 30]) {
      const smiles = 'C1=C' + 'C=C'.repeat(n / 2 - 1) + '1';
      const expected = sortedDesc(Array.from({ length: n }, (_, k) => 2 * Math.cos((2 * Math.PI * k) / n)));
      expectLevels(levels(smiles), expected, 1e-10);
    }
  });
});

describe('heteroatom levels with the published parameters', () => {
  it('gives pyridine 2.107, 1.167, 1, −0.841, −1, −1.934 with Streitwieser h_N = 0.5, k_CN = 1 (from memory)', () =>
    expectLevels(levels('c1ccncc1'), [2.107, 1.167, 1, -0.841, -1, -1.934], 1e-3));

  it('keeps the two pyridine levels whose nodes pass through N at exactly ±1, in either parameter set (symmetry; common practice)', () => {
    for (const set of ['streitwieser', 'van-catledge']) {
      const xs = levels('c1ccncc1', set);
      expect(xs.filter((x) => Math.abs(Math.abs(x) - 1) < 1e-10)).toHaveLength(2);
    }
  });

  it('puts h_N on the pyridine diagonal: the levels sum to 0.5 (Streitwieser) or 0.51 (Van-Catledge)', () => {
    expect(levels('c1ccncc1').reduce((a, b) => a + b)).toBeCloseTo(0.5, 12);
    expect(levels('c1ccncc1', 'van-catledge').reduce((a, b) => a + b)).toBeCloseTo(0.51, 12);
  });

  it('solves pyrrole (h_N = 1.5, k_CN = 0.8, Streitwieser): a2 levels (−1 ± √5)/2 and b1 levels from the factored determinant', () => {
    // C2v factoring (common practice): the a2 block [[0,1],[1,−1]] does not see N; the b1 block in the basis
    // N, (C2+C5)/√2, (C3+C4)/√2 is [[h, √2k, 0], [√2k, 0, 1], [0, 1, 1]], det = (h−x)(x²−x−1) − 2k²(1−x).
    const [h, k] = [1.5, 0.8];
    const xs = levels('c1cc[nH]c1');
    const a2 = [(-1 + Math.sqrt(5)) / 2, (-1 - Math.sqrt(5)) / 2];
    for (const x of a2) expect(xs.some((y) => Math.abs(y - x) < 1e-10), `a2 level ${x}`).toBe(true);
    const b1 = xs.filter((y) => a2.every((x) => Math.abs(x - y) > 1e-10));
    expect(b1).toHaveLength(3);
    for (const x of b1) expect(Math.abs((h - x) * (x * x - x - 1) - 2 * k * k * (1 - x))).toBeLessThan(1e-10);
    expect(xs.reduce((a, b) => a + b)).toBeCloseTo(h, 12);
  });

  it('gives pyrrole six π electrons and a positive π charge on nitrogen (lone-pair donor)', () => {
    const m = model('c1cc[nH]c1');
    expect(m.electrons).toBe(6);
    const n = m.pi!.centreOfAtom.get(4)!;
    expect(piCharge(m, m.electrons, n)).toBeGreaterThan(0.2);
  });

  it('uses each set\'s own numbers for chlorobenzene: h_Cl 2.0, k 0.4 (Streitwieser) vs 1.48, 0.62 (Van-Catledge)', () => {
    const s = model('Clc1ccccc1', 'streitwieser').matrix;
    const v = model('Clc1ccccc1', 'van-catledge').matrix;
    expect([s[0][0], s[0][1]]).toEqual([2, 0.4]);
    expect([v[0][0], v[0][1]]).toEqual([1.48, 0.62]);
  });
});

describe('HOMO–LUMO gaps', () => {
  it('gives butadiene 1.236|β| and benzene 2|β|', () => {
    expect(frontierGap(model('C=CC=C'), 4).gap).toBeCloseTo(1.236, 3);
    expect(frontierGap(model('c1ccccc1'), 6).gap).toBeCloseTo(2, 12);
  });

  it('gives 0 for open-shell degenerate shells: cyclobutadiene and the cyclopentadienyl radical', () => {
    expect(frontierGap(model('C1=CC=C1'), 4)).toMatchObject({ gap: 0, openShellDegenerate: true });
    expect(frontierGap(model('C1=CC=C[CH]1'), 5)).toMatchObject({ gap: 0, openShellDegenerate: true });
  });

  it('runs from a radical\'s singly filled level to the next empty one (allyl radical √2)', () =>
    expect(frontierGap(model('[CH2]C=C'), 3).gap).toBeCloseTo(Math.SQRT2, 12));

  it('refuses a shell with every level full, naming the count', () =>
    expect(() => frontierGap(model('C=C'), 4)).toThrow('every π level is full (4 electrons on 2 levels)'));
});
