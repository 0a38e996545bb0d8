// Reference checks for the two-centre LCAO family. Closed forms are checked against direct
// numerical integration (tests/helpers/quadrature.ts), the secular problem against mathjs, and
// the H2+ minimum against the textbook LCAO treatment (Levine, Quantum Chemistry).
import { eigs, inv, multiply, sqrtm } from 'mathjs';
import { describe, expect, it } from 'vitest';
import { coulombIntegral1s, exchangeIntegral1s, h2PlusEnergyHartree, h2PlusMinimum, overlap1s, solveSecular2x2 } from '../functions/chem/lcao.js';
import { frontierLevels, levelGap } from '../functions/chem/levelgap.js';
import { HARTREE_EV } from '../functions/chem/units.js';
import { createEngine } from '../functions/engine.js';
import { evaluateStandalone } from '../server/cli/evaluate.js';
import { ellipticIntegral, seededRandom } from './helpers/quadrature.js';

// Confocal elliptic coordinates: r_a = R(ξ+η)/2, r_b = R(ξ−η)/2, dV = (R³/8)(ξ²−η²) dξ dη dφ.
const numericOverlap = (R: number, zeta: number) =>
  (zeta ** 3 / Math.PI) * 2 * Math.PI * (R ** 3 / 8) * ellipticIntegral((xi, eta) => Math.exp(-zeta * R * xi) * (xi * xi - eta * eta), zeta * R);
const numericCoulomb = (R: number) => (R * R / 2) * ellipticIntegral((xi, eta) => (xi + eta) * Math.exp(-R * (xi + eta)), R);
const numericExchange = (R: number) => (R * R / 2) * ellipticIntegral((xi, eta) => (xi - eta) * Math.exp(-R * xi), R);

describe('OVERLAP1S: overlap of two 1s Slater orbitals', () => {
  it('gives S = 0.5865 at R = 2 bohr, ζ = 1 (e^−2 · 13/3 by hand; Levine tabulates 0.586, from memory)', () => {
    expect(overlap1s(2)).toBeCloseTo(Math.exp(-2) * (13 / 3), 14);
    expect(overlap1s(2)).toBeCloseTo(0.5865, 4);
  });

  it.each([
    [0.5, 1],
    [1, 1],
    [2, 1],
    [4, 1],
    [2, 1.24],
    [1.4, 0.8],
  ])('agrees with numerical integration of the definition at R = %s bohr, ζ = %s', (R, zeta) => {
    expect(overlap1s(R, zeta)).toBeCloseTo(numericOverlap(R, zeta), 8);
  });

  it('is 1 at zero distance and vanishes far apart', () => {
    expect(overlap1s(0)).toBe(1);
    expect(overlap1s(60)).toBeLessThan(1e-22);
  });

  it('reads distances in ångström and picometres through the unit argument', () => {
    const [bohr, angstrom, pm] = evaluateStandalone(['=OVERLAP1S(2)', '=OVERLAP1S(CHEMCONVERT(2,"bohr","angstrom"),1,"angstrom")', '=OVERLAP1S(105.8354421806,1,"pm")']);
    expect(angstrom).toEqual({ ...bohr, formula: angstrom.formula });
    // 105.835… pm is 2 bohr (CODATA 2018), so S is the closed form e^−2 · 13/3 computed here.
    expect((pm as { value: number }).value).toBeCloseTo(Math.exp(-2) * (13 / 3), 9);
  });
});

describe('H2PLUS: LCAO energy of the molecule ion', () => {
  it.each([0.8, 1.5, 2, 3, 5])('uses Coulomb and exchange integrals that match numerical integration at R = %s bohr', (R) => {
    expect(coulombIntegral1s(R)).toBeCloseTo(numericCoulomb(R), 8);
    expect(exchangeIntegral1s(R)).toBeCloseTo(numericExchange(R), 8);
  });

  it.each([1, 2, 2.5, 4])('equals (Haa ± Hab)/(1 ± S) rebuilt from numerically integrated S, J, K at R = %s bohr', (R) => {
    const [S, J, K] = [numericOverlap(R, 1), numericCoulomb(R), numericExchange(R)];
    const Haa = -0.5 + 1 / R - J;
    const Hab = (-0.5 + 1 / R) * S - K;
    expect(h2PlusEnergyHartree(R, 'bonding')).toBeCloseTo((Haa + Hab) / (1 + S), 8);
    expect(h2PlusEnergyHartree(R, 'antibonding')).toBeCloseTo((Haa - Hab) / (1 - S), 8);
  });

  it('tends to −0.5 hartree (H atom + proton) at large distance for both levels', () => {
    expect(h2PlusEnergyHartree(30, 'bonding')).toBeCloseTo(-0.5, 10);
    expect(h2PlusEnergyHartree(30, 'antibonding')).toBeCloseTo(-0.5, 10);
  });

  it('keeps the antibonding level above −0.5 hartree at every distance (no bound state)', () => {
    for (let R = 0.2; R < 20; R += 0.1) expect(h2PlusEnergyHartree(R, 'antibonding')).toBeGreaterThan(-0.5);
  });

  it('finds the LCAO minimum at R_e ≈ 2.49 bohr with D_e ≈ 1.76 eV (Levine, Quantum Chemistry; from memory)', () => {
    const min = h2PlusMinimum();
    expect(min.distanceBohr).toBeCloseTo(2.49, 2);
    expect(min.dissociationHartree * HARTREE_EV).toBeCloseTo(1.76, 2);
    expect(min.energyHartree).toBeCloseTo(-0.5648, 4);
  });

  it('puts the minimum where a brute-force scan of the curve finds it', () => {
    let best = { R: 0, E: Infinity };
    for (let R = 1; R <= 5; R += 1e-4) {
      const E = h2PlusEnergyHartree(R);
      if (E < best.E) best = { R, E };
    }
    expect(h2PlusMinimum().distanceBohr).toBeCloseTo(best.R, 3);
    expect(h2PlusMinimum().energyHartree).toBeLessThanOrEqual(best.E + 1e-12);
  });

  it('reports the minimum in the units asked for', () => {
    const [pair, distanceAngstrom, energyEv] = evaluateStandalone(['=H2PLUSMIN()', '=H2PLUSMIN("distance","angstrom")', '=H2PLUSMIN("energy","eV")']);
    // The minimum itself is checked above against Levine (2.49 bohr, −0.5648 Eh, to the digits quoted)
    // and a brute-force scan; here only the units, from CODATA 2018 Å per bohr and eV per hartree.
    const min = h2PlusMinimum();
    expect(pair).toMatchObject({ value: [[expect.closeTo(min.distanceBohr, 9), expect.closeTo(min.energyHartree, 9)]] });
    expect(distanceAngstrom).toMatchObject({ value: expect.closeTo(min.distanceBohr * 0.529177210903, 9) });
    expect(energyEv).toMatchObject({ value: expect.closeTo(min.energyHartree * 27.211386245988, 9) });
  });
});

describe('LCAOLEVELS and LCAOCOEFFS: the 2×2 secular problem', () => {
  it('reduces to (Haa ± Hab)/(1 ± S) for a homonuclear pair', () => {
    const { energies } = solveSecular2x2(-11.4, -11.4, -7.3, 0.3);
    expect(energies[0]).toBeCloseTo((-11.4 - 7.3) / 1.3, 12);
    expect(energies[1]).toBeCloseTo((-11.4 + 7.3) / 0.7, 12);
  });

  it('agrees with mathjs solving S^(−1/2) H S^(−1/2) on 300 random problems (energies and coefficients)', () => {
    const random = seededRandom(20240611);
    for (let trial = 0; trial < 300; trial++) {
      const Haa = -20 * random();
      const Hbb = -20 * random();
      const Hab = -10 * random() + 2;
      const S = 1.9 * random() - 0.95;
      const X = inv(sqrtm([[1, S], [S, 1]])) as number[][];
      const { eigenvectors } = eigs(multiply(multiply(X, [[Haa, Hab], [Hab, Hbb]]), X) as number[][]);
      const reference = eigenvectors
        .map(({ value, vector }) => ({ energy: value as number, c: multiply(X, vector as number[]) as number[] }))
        .sort((p, q) => p.energy - q.energy);
      const ours = solveSecular2x2(Haa, Hbb, Hab, S);
      reference.forEach((ref, k) => {
        // mathjs iterates to ~1e-12 relative; compare relative to the size of the energy.
        expect(Math.abs(ours.energies[k] - ref.energy)).toBeLessThan(1e-9 * Math.max(1, Math.abs(ref.energy)));
        const sign = Math.sign(ref.c[0]) || Math.sign(ref.c[1]);
        expect(ours.coefficients[k][0]).toBeCloseTo(sign * ref.c[0], 7);
        expect(ours.coefficients[k][1]).toBeCloseTo(sign * ref.c[1], 7);
      });
    }
  });

  it('returns coefficients normalised and orthogonal with the overlap metric', () => {
    const S = 0.42;
    const [[a1, b1], [a2, b2]] = solveSecular2x2(-3, -1.5, -1.1, S).coefficients;
    expect(a1 * a1 + b1 * b1 + 2 * S * a1 * b1).toBeCloseTo(1, 12);
    expect(a2 * a2 + b2 * b2 + 2 * S * a2 * b2).toBeCloseTo(1, 12);
    expect(a1 * a2 + b1 * b2 + S * (a1 * b2 + a2 * b1)).toBeCloseTo(0, 12);
  });

  it('gives the Hückel α ± β levels when the overlap is neglected', () => {
    expect(solveSecular2x2(-1, -1, -0.5, 0).energies).toEqual([-1.5, -0.5]);
  });

  it('spills a column and gives one value when the level is named', () => {
    const [column, antibonding, row, one] = evaluateStandalone([
      '=LCAOLEVELS(-1,-1,-0.5,0.25)',
      '=LCAOLEVELS(-1,-1,-0.5,0.25,"antibonding")',
      '=LCAOCOEFFS(-1,-1,-0.5,0.25,"bonding")',
      '=LCAOCOEFFS(-1,-1,-0.5,0.25,"antibonding","b")',
    ]);
    expect(column).toMatchObject({ value: [[-1.2], [expect.closeTo(-2 / 3, 12)]] });
    expect(antibonding).toMatchObject({ value: expect.closeTo(-2 / 3, 12) });
    expect(row).toMatchObject({ value: [[expect.closeTo(1 / Math.sqrt(2.5), 12), expect.closeTo(1 / Math.sqrt(2.5), 12)]] });
    expect(one).toMatchObject({ value: expect.closeTo(-1 / Math.sqrt(1.5), 12) });
  });
});

describe('LEVELGAP: HOMO–LUMO gap with aufbau filling', () => {
  it('gives the bonding–antibonding splitting for two electrons in a two-level problem', () => {
    expect(levelGap([-1.2, -2 / 3], 2)).toBeCloseTo(1.2 - 2 / 3, 14);
  });

  it('fills levels in energy order whatever order they are listed in', () => {
    expect(frontierLevels([0.5, -2, 1.5, -1], 4)).toEqual({ homo: -1, lumo: 0.5, gap: 1.5 });
  });

  it('gives 0 for cyclobutadiene-like Hückel levels (α+2β, α, α, α−2β) with four π electrons (common practice)', () => {
    expect(levelGap([-2, 0, 0, 2], 4)).toBe(0);
    expect(levelGap([-2, 0, 0, 2], 6)).toBe(2);
  });

  it('groups levels equal within rounding as one degenerate level', () => {
    expect(levelGap([-2, 0.1 + 0.2, 0.3, 2], 4)).toBe(0);
  });

  it('takes a singly occupied non-degenerate orbital as the HOMO and the next level as LUMO', () => {
    expect(levelGap([-1, 1, 3], 3)).toBe(2);
  });

  it('composes with a spilled result, an inline array and a range', () => {
    const [spilled, inline] = evaluateStandalone(['=LEVELGAP(LCAOLEVELS(-1,-1,-0.5,0.25),2)', '=LEVELGAP({-2,0,0,2},6)']);
    expect(spilled).toMatchObject({ value: expect.closeTo(1.2 - 2 / 3, 12) });
    expect(inline).toMatchObject({ value: 2 });
  });
});

describe('bad input to the LCAO family: a clear error, never an exception', () => {
  it.each([
    ['=OVERLAP1S(-1)', '#NUM!', 'distance must be zero or positive, got -1'],
    ['=OVERLAP1S("two")', '#VALUE!', 'OVERLAP1S: distance must be a number, not "two"'],
    ['=OVERLAP1S(2,-1)', '#NUM!', 'orbital exponent zeta must be positive, got -1'],
    ['=OVERLAP1S(2,1,"furlong")', '#VALUE!', "unknown distance unit 'furlong'; use one of bohr, angstrom, pm, nm"],
    ['=OVERLAP1S(2,1,"eV")', '#VALUE!', "distance unit 'eV' is not a length unit; use one of bohr, angstrom, pm, nm"],
    ['=H2PLUS(0)', '#NUM!', 'distance must be positive, got 0'],
    ['=H2PLUS(-2)', '#NUM!', 'distance must be positive, got -2'],
    ['=H2PLUS(2,"sideways")', '#VALUE!', `level must be "bonding" or "antibonding", got 'sideways'`],
    ['=H2PLUS(2,"bonding","bohr","angstrom")', '#VALUE!', "energy unit 'angstrom' is not an energy unit; use one of hartree, eV, kJ/mol, kcal/mol, cm-1"],
    ['=H2PLUSMIN("radius")', '#VALUE!', `quantity must be "distance", "energy" or "dissociation", got 'radius'; omit it to spill distance and energy`],
    ['=H2PLUSMIN(,"angstrom")', '#VALUE!', `quantity must be "distance", "energy" or "dissociation", got ''; omit it to spill distance and energy`],
    ['=H2PLUSMIN("distance","eV")', '#VALUE!', "unit 'eV' is not a length unit; use one of bohr, angstrom, pm, nm"],
    ['=LCAOLEVELS(-1,-1,-0.5,1)', '#NUM!', 'overlap S must lie strictly between −1 and 1, got 1: at |S| ≥ 1 the two basis orbitals are not independent'],
    ['=LCAOLEVELS(-1,-1,-0.5,-1.2)', '#NUM!', 'overlap S must lie strictly between −1 and 1, got -1.2: at |S| ≥ 1 the two basis orbitals are not independent'],
    ['=LCAOLEVELS(-1,"x",-0.5,0.2)', '#VALUE!', 'LCAOLEVELS: Hbb must be a number, not "x"'],
    ['=LCAOLEVELS(-1,-1,-0.5,0.2,"middle")', '#VALUE!', `level must be "bonding" or "antibonding", got 'middle'; omit the argument to spill both`],
    ['=LCAOCOEFFS(-1,-1,-0.5,0.2,"bonding","c")', '#VALUE!', `atom must be "a" or "b", got 'c'`],
    ['=LEVELGAP({-1;1},5)', '#VALUE!', '5 electrons do not fit in 2 orbitals (room for 4)'],
    ['=LEVELGAP({-1;1},4)', '#VALUE!', '4 electrons fill all 2 orbitals; there is no LUMO'],
    ['=LEVELGAP({-1;1},0)', '#VALUE!', 'electrons must be at least 1 to have a HOMO, got 0'],
    ['=LEVELGAP({-1;1},1.5)', '#VALUE!', 'electrons must be a whole number, got 1.5'],
    ['=LEVELGAP({-1;"high"},1)', '#VALUE!', "levels must be numbers (orbital energies); found 'high' at row 2, column 1 of the list"],
    ['=LEVELGAP(LCAOLEVELS(-1,-1,-0.5,2),2)', '#NUM!', 'overlap S must lie strictly between −1 and 1, got 2: at |S| ≥ 1 the two basis orbitals are not independent'],
    ['=OVERLAP1S()', '#N/A', 'Wrong number of arguments.'],
  ])('%s gives %s "%s"', (formula, error, message) => {
    expect(evaluateStandalone([formula])).toEqual([{ formula, error, message }]);
  });

  it('refuses a range where a spilling function wants one number, without throwing out of the engine', () => {
    // Vectorising a spilling function makes the engine throw "Function returning array cannot be
    // vectorized"; the plugin forbids it, and the engine reads one cell of the range instead.
    const sheet = [[1, '=LCAOLEVELS(A1:A3,-1,-0.5,0.1,"bonding")'], [2], [3]];
    let value: unknown;
    expect(() => {
      const engine = createEngine({ Sheet1: sheet });
      value = engine.getCellValue({ sheet: 0, row: 0, col: 1 });
      engine.destroy();
    }).not.toThrow();
    expect(value).toBeCloseTo(solveSecular2x2(1, -1, -0.5, 0.1).energies[0], 9);
  });
});
