// Two-centre overlaps of Slater-type orbitals (functions/chem/sto.ts) against sources outside the
// module: the 1s–1s closed form already in the product (lcao.ts, Levine / Pauling & Wilson), an
// independent numerical integration written here (composite Simpson, tests/helpers/quadrature.ts),
// and the equal-exponent closed forms and a tabulated value of Mulliken, Rieke, Orloff & Orloff,
// J. Chem. Phys. 17, 1248 (1949).
import { describe, expect, it } from 'vitest';
import { overlap1s } from '../functions/chem/lcao.js';
import { auxB, localOverlap, shellOverlapBlock, type StoShell } from '../functions/chem/sto.js';
import { ellipticIntegral, seededRandom } from './helpers/quadrature.js';

// ---- an independent STO evaluator: orbital value at a point, straight from the definition -------
function factorial(n: number): number {
  return n <= 1 ? 1 : n * factorial(n - 1);
}
/** χ(x, y, z) for an STO centred at the origin; kind picks s, p_x or p_z. Slater, Phys. Rev. 36, 57 (1930). */
function stoValue(n: number, zeta: number, kind: 's' | 'px' | 'pz', x: number, y: number, z: number): number {
  const r = Math.sqrt(x * x + y * y + z * z);
  const radial = (Math.pow(2 * zeta, n + 0.5) / Math.sqrt(factorial(2 * n))) * Math.pow(r, n - 1) * Math.exp(-zeta * r);
  if (kind === 's') return radial / Math.sqrt(4 * Math.PI);
  const component = kind === 'px' ? x : z;
  return r === 0 ? 0 : radial * Math.sqrt(3 / (4 * Math.PI)) * (component / r);
}

/**
 * ⟨a|b⟩ with a at the origin and b at (0, 0, R), by Simpson quadrature over confocal elliptic
 * coordinates (ξ, η) at azimuth 0; the azimuth integral is 2π for σ pairs and π for p_x–p_x (cos²φ).
 */
function numericalOverlap(a: { n: number; zeta: number; kind: 's' | 'px' | 'pz' }, b: typeof a, R: number): number {
  const half = R / 2;
  const integrand = (xi: number, eta: number) => {
    const z = half * (1 + xi * eta);
    const rho = half * Math.sqrt(Math.max(0, (xi * xi - 1) * (1 - eta * eta)));
    return (xi * xi - eta * eta) * stoValue(a.n, a.zeta, a.kind, rho, 0, z) * stoValue(b.n, b.zeta, b.kind, rho, 0, z - R);
  };
  const azimuth = a.kind === 'px' ? Math.PI : 2 * Math.PI;
  return half ** 3 * azimuth * ellipticIntegral(integrand, half * Math.min(a.zeta, b.zeta) * 2, 1500, 200);
}

const shell = (n: number, l: 0 | 1, zeta: number): StoShell => ({ n, l, zeta });

describe('1s–1s against the closed form of lcao.ts', () => {
  it('agrees with S = e^(−ρ)(1 + ρ + ρ²/3) for equal exponents at several distances', () => {
    for (const zeta of [0.8, 1, 1.24])
      for (const R of [0.3, 1.4, 2, 4.5, 9]) expect(localOverlap(shell(1, 0, zeta), shell(1, 0, zeta), R, 'sigma')).toBeCloseTo(overlap1s(R, zeta), 12);
  });
});

describe('against an independent numerical integration (Simpson, A&S 25.4.6)', () => {
  // Pairs that occur in EHT molecules: C–H, O–H, C–O, C–C, Si–O, P–Cl; σ and π, with unequal exponents.
  const cases = [
    { what: 'H 1s – C 2s', a: { n: 1, zeta: 1.3, kind: 's' }, b: { n: 2, zeta: 1.625, kind: 's' }, R: 2.06 },
    { what: 'H 1s – O 2pσ', a: { n: 1, zeta: 1.3, kind: 's' }, b: { n: 2, zeta: 2.275, kind: 'pz' }, R: 1.81 },
    { what: 'C 2s – O 2pσ', a: { n: 2, zeta: 1.625, kind: 's' }, b: { n: 2, zeta: 2.275, kind: 'pz' }, R: 2.13 },
    { what: 'O 2pσ – C 2s', a: { n: 2, zeta: 2.275, kind: 'pz' }, b: { n: 2, zeta: 1.625, kind: 's' }, R: 2.13 },
    { what: 'C 2pσ – C 2pσ', a: { n: 2, zeta: 1.625, kind: 'pz' }, b: { n: 2, zeta: 1.625, kind: 'pz' }, R: 2.53 },
    { what: 'C 2pσ – O 2pσ', a: { n: 2, zeta: 1.625, kind: 'pz' }, b: { n: 2, zeta: 2.275, kind: 'pz' }, R: 2.3 },
    { what: 'C 2pπ – O 2pπ', a: { n: 2, zeta: 1.625, kind: 'px' }, b: { n: 2, zeta: 2.275, kind: 'px' }, R: 2.3 },
    { what: 'Si 3pσ – O 2pσ', a: { n: 3, zeta: 1.383, kind: 'pz' }, b: { n: 2, zeta: 2.275, kind: 'pz' }, R: 3.06 },
    { what: 'P 3pπ – Cl 3pπ', a: { n: 3, zeta: 1.6, kind: 'px' }, b: { n: 3, zeta: 2.033, kind: 'px' }, R: 3.8 },
    { what: 'H 1s – S 3s', a: { n: 1, zeta: 1.3, kind: 's' }, b: { n: 3, zeta: 1.817, kind: 's' }, R: 2.53 },
  ] as const;
  for (const c of cases)
    it(`${c.what} at R = ${c.R} bohr`, () => {
      const l = (k: string) => (k === 's' ? 0 : 1) as 0 | 1;
      const closed = localOverlap(shell(c.a.n, l(c.a.kind), c.a.zeta), shell(c.b.n, l(c.b.kind), c.b.zeta), c.R, c.a.kind === 'px' ? 'pi' : 'sigma');
      expect(Math.abs(closed - numericalOverlap(c.a, c.b, c.R))).toBeLessThan(2e-6);
    });
});

describe('Mulliken, Rieke, Orloff & Orloff (1949)', () => {
  // Their equal-exponent closed forms with p = ζR (recalled from memory); their pσ convention points
  // both lobes at each other, ours points both along A→B, so the σσ sign flips.
  const forms = {
    '2s–2s': (p: number) => Math.exp(-p) * (1 + p + (4 * p * p) / 9 + p ** 3 / 9 + p ** 4 / 45),
    '2pσ–2pσ': (p: number) => -Math.exp(-p) * (-1 - p - (p * p) / 5 + (2 * p ** 3) / 15 + p ** 4 / 15),
    '2pπ–2pπ': (p: number) => Math.exp(-p) * (1 + p + (2 * p * p) / 5 + p ** 3 / 15),
  };
  it('matches their equal-exponent closed forms over a range of p', () => {
    for (const p of [0.5, 2, 4.29, 7, 12]) {
      const R = p / 1.625;
      expect(localOverlap(shell(2, 0, 1.625), shell(2, 0, 1.625), R, 'sigma')).toBeCloseTo(forms['2s–2s'](p), 12);
      expect(localOverlap(shell(2, 1, 1.625), shell(2, 1, 1.625), R, 'sigma')).toBeCloseTo(forms['2pσ–2pσ'](p), 12);
      expect(localOverlap(shell(2, 1, 1.625), shell(2, 1, 1.625), R, 'pi')).toBeCloseTo(forms['2pπ–2pπ'](p), 12);
    }
  });
  it('gives their C 2pπ–2pπ overlap of about 0.25 at the benzene C–C distance (1.397 Å, ζ = 1.625)', () => {
    // The "S ≈ 0.25" of Hückel theory with overlap comes from their tables (recalled from memory).
    expect(localOverlap(shell(2, 1, 1.625), shell(2, 1, 1.625), 1.397 / 0.529177, 'pi')).toBeCloseTo(0.25, 1);
  });
});

describe('auxiliary integral B_k(t) and the rotation to the molecular frame', () => {
  it('B_k(t) matches a direct Simpson integral of η^k e^(−tη) for small and large t', () => {
    for (const k of [0, 1, 4, 7])
      for (const t of [0, 1e-6, 0.3, -2.5, 9, -14]) {
        let sum = 0;
        const N = 20000;
        for (let i = 0; i <= N; i++) {
          const eta = -1 + (2 * i) / N;
          const w = i === 0 || i === N ? 1 : i % 2 ? 4 : 2;
          sum += w * eta ** k * Math.exp(-t * eta);
        }
        const direct = (sum * (2 / N)) / 3;
        expect(Math.abs(auxB(k, t) - direct)).toBeLessThan(1e-9 * Math.max(1, Math.abs(direct)));
      }
  });

  it('p orbitals turn like a vector: the block for any direction equals σ/π projected on it', () => {
    const random = seededRandom(7);
    const a = shell(2, 1, 1.625);
    const b = shell(2, 1, 2.275);
    for (let trial = 0; trial < 5; trial++) {
      const v: [number, number, number] = [random() * 4 - 2, random() * 4 - 2, random() * 4 - 2];
      const R = Math.hypot(...v);
      const block = shellOverlapBlock(a, b, v);
      // The block is symmetric and its trace is σ + 2π (invariant under rotation).
      expect(block[0][1]).toBeCloseTo(block[1][0], 14);
      expect(block[0][0] + block[1][1] + block[2][2]).toBeCloseTo(localOverlap(a, b, R, 'sigma') + 2 * localOverlap(a, b, R, 'pi'), 12);
      // Along the bond direction it gives σ.
      const e = v.map((c) => c / R);
      const along = e.reduce((s, ei, i) => s + ei * e.reduce((t, ej, j) => t + block[i][j] * ej, 0), 0);
      expect(along).toBeCloseTo(localOverlap(a, b, R, 'sigma'), 12);
    }
  });

  it('an s orbital on A meets the negative lobe of p_x on B when B lies along +x', () => {
    const block = shellOverlapBlock(shell(1, 0, 1.3), shell(2, 1, 1.625), [2, 0, 0]);
    expect(block[0][0]).toBeLessThan(-0.1);
    expect(block[0][1]).toBeCloseTo(0, 14);
    expect(block[0][2]).toBeCloseTo(0, 14);
  });
});
