// Bonds from coordinates (functions/chem/bondPerception.ts, bondOrders.ts): molecules at measured
// gas-phase geometries get the bonds and bond orders every textbook draws for them; frames that are
// not one sensible molecule are refused with a message naming the atoms, and valences that cannot be
// satisfied give "uncertain" with single bonds, never invented orders.
import { describe, expect, it } from 'vitest';
import { bondToleranceAngstrom, covalentRadiusAngstrom, perceiveBonds, perceiveConnectivity } from '../functions/chem/bondPerception.js';
import { assignBondOrders } from '../functions/chem/bondOrders.js';

type Xyz = [number, number, number];
const deg = Math.PI / 180;

/** A bent AH2 or planar H2C=X fragment: A at the origin, the two H in the xz plane below it. */
function bentPair(r: number, angleDeg: number, z = 0): Xyz[] {
  const half = (angleDeg / 2) * deg;
  return [
    [r * Math.sin(half), 0, z - r * Math.cos(half)],
    [-r * Math.sin(half), 0, z - r * Math.cos(half)],
  ];
}

/** The bonds as "i-j:order" with 1-based atoms, for readable comparisons. */
function bondList(elements: string[], coordinates: Xyz[], totalCharge = 0): string[] {
  const p = perceiveBonds(elements, coordinates, { totalCharge });
  expect(p.uncertain).toBeNull();
  return p.bonds.map((b) => `${b.atoms[0] + 1}-${b.atoms[1] + 1}:${b.order}`);
}

describe('molecules at measured geometries', () => {
  it('bonds water’s O to both H (r(OH) 0.9578 Å, ∠HOH 104.48°; NIST CCCBDB, recalled from memory)', () => {
    expect(bondList(['O', 'H', 'H'], [[0, 0, 0], ...bentPair(0.9578, 104.48)])).toEqual(['1-2:1', '1-3:1']);
  });

  it('bonds ammonia’s N to three H (r(NH) 1.012 Å, ∠HNH 106.7°; NIST CCCBDB, recalled from memory)', () => {
    const r = 1.012;
    const rho = (2 * r * Math.sin(53.35 * deg)) / Math.sqrt(3);
    const h = Math.sqrt(r * r - rho * rho);
    const hs: Xyz[] = [0, 120, 240].map((phi) => [rho * Math.cos(phi * deg), rho * Math.sin(phi * deg), -h]);
    expect(bondList(['N', 'H', 'H', 'H'], [[0, 0, 0], ...hs])).toEqual(['1-2:1', '1-3:1', '1-4:1']);
  });

  it('gives benzene one Kekulé structure (r(CC) 1.397 Å, r(CH) 1.084 Å; NIST CCCBDB, recalled from memory)', () => {
    const ring: Xyz[] = Array.from({ length: 6 }, (_, k) => [1.397 * Math.cos(k * 60 * deg), 1.397 * Math.sin(k * 60 * deg), 0]);
    const hs: Xyz[] = ring.map(([x, y]) => [(x * 2.481) / 1.397, (y * 2.481) / 1.397, 0]);
    const p = perceiveBonds([...'CCCCCC', ...'HHHHHH'], [...ring, ...hs]);
    expect(p.uncertain).toBeNull();
    const cc = p.bonds.filter((b) => b.atoms[1] < 6);
    expect(cc).toHaveLength(6);
    // Each carbon carries exactly one double bond: three double, three single, alternating.
    for (let c = 0; c < 6; c++) expect(cc.filter((b) => b.atoms.includes(c) && b.order === 2)).toHaveLength(1);
    expect(p.bonds.filter((b) => b.atoms[1] >= 6).every((b) => b.order === 1)).toBe(true);
  });

  it('makes acetylene’s C–C triple (r(CC) 1.203 Å, r(CH) 1.063 Å; NIST CCCBDB, recalled from memory)', () => {
    expect(bondList(['C', 'C', 'H', 'H'], [[0, 0, 0], [0, 0, 1.203], [0, 0, -1.063], [0, 0, 2.266]])).toEqual(['1-2:3', '1-3:1', '2-4:1']);
  });

  it('makes both C–O bonds of CO2 double (r(CO) 1.160 Å; NIST CCCBDB, recalled from memory)', () => {
    expect(bondList(['C', 'O', 'O'], [[0, 0, 0], [0, 0, 1.16], [0, 0, -1.16]])).toEqual(['1-2:2', '1-3:2']);
  });

  it('makes formaldehyde’s C=O double (r(CO) 1.205 Å, r(CH) 1.111 Å, ∠HCH 116.1°; NIST CCCBDB, recalled from memory)', () => {
    expect(bondList(['C', 'O', 'H', 'H'], [[0, 0, 0], [0, 0, 1.205], ...bentPair(1.111, 116.1)])).toEqual(['1-2:2', '1-3:1', '1-4:1']);
  });
});

describe('the distance rule', () => {
  it('bonds two atoms up to the sum of their Cordero radii plus the tolerance, and not beyond', () => {
    // Cordero et al., Dalton Trans. 2008, 2832: C (sp3) 0.76 Å, recalled from memory.
    expect(covalentRadiusAngstrom('C')).toBe(0.76);
    const limit = 2 * 0.76 + bondToleranceAngstrom;
    expect(perceiveConnectivity(['C', 'C'], [[0, 0, 0], [0, 0, limit - 0.01]])).toHaveLength(1);
    expect(perceiveConnectivity(['C', 'C'], [[0, 0, 0], [0, 0, limit + 0.01]])).toHaveLength(0);
  });

  it('finds the same pairs as checking every pair (the sweep along x misses none)', () => {
    // Carbon atoms on a jittered 2 Å grid, listed in shuffled order: neighbours along an axis fall on
    // both sides of the 1.97 Å limit, diagonals never reach it. The reference checks all pairs.
    let seed = 12345;
    const random = () => ((seed = (seed * 1103515245 + 12345) % 2 ** 31) / 2 ** 31);
    const coordinates: Xyz[] = [];
    for (let i = 0; i < 6; i++) for (let j = 0; j < 6; j++) for (let k = 0; k < 6; k++) coordinates.push([i, j, k].map((g) => 2 * g + 0.5 * (random() - 0.5)) as Xyz);
    coordinates.sort(() => random() - 0.5);
    const elements = coordinates.map(() => 'C');
    const expected: string[] = [];
    for (let a = 0; a < coordinates.length; a++)
      for (let b = a + 1; b < coordinates.length; b++) {
        const [p, q] = [coordinates[a], coordinates[b]];
        if (Math.hypot(p[0] - q[0], p[1] - q[1], p[2] - q[2]) <= 0.76 + 0.76 + 0.45) expected.push(`${a}-${b}`);
      }
    expect(expected.length).toBeGreaterThan(100);
    expect(perceiveConnectivity(elements, coordinates).map((b) => b.atoms.join('-'))).toEqual(expected);
  });
});

describe('frames that cannot be bonded', () => {
  it('refuses atoms closer than any bond, naming them', () => {
    expect(() => perceiveBonds(['O', 'H', 'H'], [[0, 0, 0], [0.1, 0, 0], [-0.96, 0, 0]])).toThrow(/atoms 1 \(O\) and 2 \(H\) are 0\.100 Å apart/);
  });

  it('refuses an element without a covalent radius, naming the atom', () => {
    expect(() => perceiveBonds(['Pt', 'Cl'], [[0, 0, 0], [0, 0, 2.3]])).toThrow(/atom 1 \(Pt\): no covalent radius for "Pt"/);
    expect(() => perceiveBonds(['H', 'Xx'], [[0, 0, 0], [0, 0, 1]])).toThrow(/atom 2 \(Xx\)/);
  });

  it('refuses an atom with more neighbours than any compound gives it', () => {
    const cube: Xyz[] = [];
    for (const x of [-1, 1]) for (const y of [-1, 1]) for (const z of [-1, 1]) cube.push([0.635 * x, 0.635 * y, 0.635 * z]);
    expect(() => perceiveBonds(['C', ...'HHHHHHHH'], [[0, 0, 0], ...cube])).toThrow(/atom 1 \(C\) has 8 atoms within bonding distance/);
  });

  // The methyl radical: planar, r(CH) 1.079 Å (NIST CCCBDB; recalled from memory).
  const methyl: Xyz[] = [[0, 0, 0], ...[0, 120, 240].map((phi): Xyz => [1.079 * Math.cos(phi * deg), 1.079 * Math.sin(phi * deg), 0])];

  it('leaves a radical uncertain with single bonds, and takes it as an anion when the charge is given', () => {
    const radical = perceiveBonds(['C', 'H', 'H', 'H'], methyl);
    expect(radical.uncertain).toMatch(/an odd number of electrons \(neutral\)/);
    expect(radical.bonds.map((b) => b.order)).toEqual([1, 1, 1]);
    expect(radical.charges).toEqual([0, 0, 0, 0]);
    const anion = perceiveBonds(['C', 'H', 'H', 'H'], methyl, { totalCharge: -1 });
    expect(anion.uncertain).toBeNull();
    expect(anion.charges).toEqual([-1, 0, 0, 0]);
  });

  it('leaves methylene (carbene, even electron count but C short of four bonds) uncertain', () => {
    // CH2 at r(CH) 1.08 Å, ∠HCH 134° (triplet ground state; NIST CCCBDB, recalled from memory).
    expect(perceiveBonds(['C', 'H', 'H'], [[0, 0, 0], ...bentPair(1.08, 134)]).uncertain).toMatch(/no bond orders satisfy every atom's valence \(neutral/);
  });

  it('leaves ammonium uncertain unless its +1 charge is given', () => {
    const bonds = [[0, 1], [0, 2], [0, 3], [0, 4]] as const;
    // Neutral NH4 has nine valence electrons; NH4⁻ an even count, but N with four bonds must be N⁺.
    expect(assignBondOrders(['N', 'H', 'H', 'H', 'H'], bonds, 0)).toEqual({ problem: expect.stringMatching(/odd number of electrons \(neutral\)/) });
    expect(assignBondOrders(['N', 'H', 'H', 'H', 'H'], bonds, -1)).toEqual({ problem: expect.stringMatching(/no bond orders satisfy every atom's valence \(net charge -1/) });
    expect(assignBondOrders(['N', 'H', 'H', 'H', 'H'], bonds, 1)).toEqual({ orders: [1, 1, 1, 1], charges: [1, 0, 0, 0, 0] });
  });

  it('leaves a metal uncertain: no valence rule is guessed for it', () => {
    expect(assignBondOrders(['Fe', 'C', 'O'], [[0, 1], [1, 2]], 0)).toEqual({ problem: expect.stringMatching(/atom 1 \(Fe\): no valence rule for Fe/) });
  });

  it('leaves a lone hydrogen atom uncertain', () => {
    expect(perceiveBonds(['H'], [[0, 0, 0]]).uncertain).toMatch(/atom 1 \(H\) with 0 bonded neighbours fits none of its valences/);
  });
});
