// Extended-Hückel theory (functions/chem/eht.ts) against textbook facts and measured spectra:
// photoelectron orderings of H2O, NH3 and CH4, the π/π* frontier of ethylene, the carbon lone pair of
// CO, Walsh's shapes of H2O and CO2, the staggered ethane minimum, and, where EHT and simple Hückel
// theory describe the same π system, the same order of π levels. Geometries are XYZ text built here
// from measured bond lengths and angles, or SMILES conformers where the test says so.
import '../functions/openchemlibNode.js';
import { describe, expect, it } from 'vitest';
import { degenerateSet, frontier, homoIndex, levelComposition, mullikenCharge, oneElectronEnergy, solveEht, type EhtModel } from '../functions/chem/eht.js';
import { elementParameters, PARAMETRISED_ELEMENTS, slaterZeta } from '../functions/chem/ehtParams.js';
import { readGeometry } from '../functions/chem/geometry3d.js';
import { huckelModelOf } from '../functions/chem/huckelCache.js';

const model = (text: string, charge?: number) => solveEht(readGeometry(text), charge);

/** X at the origin, two Y atoms in the xz plane at distance r and angle Y–X–Y = deg (C2 axis = z). */
function triatomic(X: string, Y: string, r: number, deg: number): string {
  const h = (deg * Math.PI) / 360;
  return `${X} 0 0 0; ${Y} ${r * Math.sin(h)} 0 ${r * Math.cos(h)}; ${Y} ${-r * Math.sin(h)} 0 ${r * Math.cos(h)}`;
}

/** Coefficients of level k on one atom's p_x, p_y, p_z (or s when l = 0). */
function coefficientsOn(m: EhtModel, k: number, atom: number, shell: 's' | 'p'): number[] {
  return m.basis.flatMap((f, i) => (f.atom === atom && f.shell.endsWith(shell) ? [m.coefficients[k][i]] : []));
}

const TINY = 1e-8;

describe('parameters', () => {
  it("reproduce Hoffmann's 1963 values for H and C", () => {
    // R. Hoffmann, J. Chem. Phys. 39, 1397 (1963): H 1s −13.6 eV; C 2s −21.4, 2p −11.4 eV, ζ 1.625.
    expect(elementParameters('H')!.shells.map((s) => s.energyEv)).toEqual([-13.6]);
    const carbon = elementParameters('C')!.shells;
    expect(carbon.map((s) => s.energyEv)).toEqual([-21.4, -11.4]);
    expect(carbon.map((s) => s.zeta)).toEqual([1.625, 1.625]);
  });

  it("follow Slater's rules for the exponents (Slater 1930 worked values: N 1.95, O 2.275, Na 0.733, Cl 2.033)", () => {
    expect(slaterZeta(7)).toBeCloseTo(1.95, 12);
    expect(slaterZeta(8)).toBeCloseTo(2.275, 12);
    expect(slaterZeta(11)).toBeCloseTo(2.2 / 3, 12);
    expect(slaterZeta(17)).toBeCloseTo(6.1 / 3, 12);
  });

  it('cover H, Li–Ne and Na–Ar with the s level below the p level (common practice)', () => {
    expect(PARAMETRISED_ELEMENTS).toEqual(['H', 'Li', 'Be', 'B', 'C', 'N', 'O', 'F', 'Ne', 'Na', 'Mg', 'Al', 'Si', 'P', 'S', 'Cl', 'Ar']);
    for (const el of PARAMETRISED_ELEMENTS.slice(1)) {
      const [s, p] = elementParameters(el)!.shells;
      expect(s.energyEv, el).toBeLessThan(p.energyEv);
    }
  });
});

describe('water: the photoelectron order 2a1 < 1b2 < 3a1 < 1b1', () => {
  // Measured: r(OH) 0.9578 Å, 104.48° (NIST CCCBDB; recalled from memory). Ionisation energies
  // 1b1 12.6, 3a1 14.7, 1b2 18.5, 2a1 32.2 eV (photoelectron spectrum, e.g. Turner et al., Molecular
  // Photoelectron Spectroscopy (Wiley, 1970); recalled from memory).
  const m = model(triatomic('O', 'H', 0.9578, 104.48));
  // Water lies in the xz plane with its C2 axis along z: b1 uses O p_y only, b2 uses O p_x and the
  // antisymmetric H combination, a1 everything symmetric.
  const symmetry = (k: number): string => {
    const [px, py] = coefficientsOn(m, k, 0, 'p');
    const [h1, h2] = [coefficientsOn(m, k, 1, 's')[0], coefficientsOn(m, k, 2, 's')[0]];
    if (Math.abs(py) > TINY) return 'b1';
    if (Math.abs(px) > TINY || (Math.abs(h1 + h2) < TINY && Math.abs(h1) > TINY)) return 'b2';
    return 'a1';
  };

  it('fills four valence levels in the order a1, b2, a1, b1', () => {
    expect(m.electrons).toBe(8);
    expect(m.levels.slice(0, 4).map((l) => l.occupancy)).toEqual([2, 2, 2, 2]);
    expect([0, 1, 2, 3].map(symmetry)).toEqual(['a1', 'b2', 'a1', 'b1']);
  });

  it('has a non-bonding HOMO: pure O 2p perpendicular to the plane, at H_pp(O)', () => {
    const k = homoIndex(m);
    expect(k).toBe(3);
    const [px, py, pz] = coefficientsOn(m, k, 0, 'p');
    expect(Math.abs(py)).toBeCloseTo(1, 10);
    expect(Math.abs(px) + Math.abs(pz)).toBeLessThan(TINY);
    expect(m.levels[k].energyEv).toBeCloseTo(-14.8, 9);
  });

  it('puts negative charge on oxygen (Mulliken)', () => {
    expect(mullikenCharge(m, 1)).toBeLessThan(-0.3);
    expect(mullikenCharge(m, 2)).toBeGreaterThan(0.1);
  });
});

describe('ammonia and methane', () => {
  // NH3: r 1.012 Å, ∠HNH 106.7°; CH4: r 1.087 Å, tetrahedral (measured; recalled from memory).
  const nh3 = (() => {
    const r = 1.012;
    const angle = (106.7 * Math.PI) / 180;
    // Height of N above the H3 plane for the given H–N–H angle.
    const rho = r * Math.sqrt((2 / 3) * (1 - Math.cos(angle)));
    const h = Math.sqrt(r * r - rho * rho);
    const hs = [0, 1, 2].map((k) => `H ${rho * Math.cos((2 * Math.PI * k) / 3)} ${rho * Math.sin((2 * Math.PI * k) / 3)} ${-h}`);
    return model(['N 0 0 0', ...hs].join('; '));
  })();

  it("NH3's HOMO is the nitrogen lone pair: non-degenerate, mostly on N, along the C3 axis", () => {
    // Photoelectron spectrum: 3a1 (lone pair) 10.8 eV, 1e 16.0 eV (Turner et al. 1970; recalled from memory).
    const k = homoIndex(nh3);
    expect(degenerateSet(nh3, k)).toHaveLength(1);
    const onN = levelComposition(nh3, k).filter((c) => c.element === 'N').reduce((s, c) => s + c.weight, 0);
    expect(onN).toBeGreaterThan(0.6);
    const [px, py, pz] = coefficientsOn(nh3, k, 0, 'p');
    expect(Math.abs(pz)).toBeGreaterThan(0.5);
    expect(Math.abs(px) + Math.abs(py)).toBeLessThan(TINY);
    expect(degenerateSet(nh3, k - 1)).toHaveLength(2); // the 1e pair below
  });

  it("CH4's HOMO is triply degenerate (t2), above the a1 level", () => {
    // Photoelectron spectrum: 1t2 14 eV, 2a1 23 eV (Turner et al. 1970; recalled from memory).
    const s = 1.087 / Math.sqrt(3);
    const ch4 = model(`C 0 0 0; H ${s} ${s} ${s}; H ${-s} ${-s} ${s}; H ${-s} ${s} ${-s}; H ${s} ${-s} ${-s}`);
    const k = homoIndex(ch4);
    expect(degenerateSet(ch4, k)).toEqual([1, 2, 3]);
    expect(ch4.levels[0].energyEv).toBeLessThan(ch4.levels[1].energyEv - 5);
  });
});

describe('frontier orbitals of ethylene and carbon monoxide', () => {
  it("ethylene's HOMO is the C=C π bond and its LUMO the π* (p perpendicular to the plane)", () => {
    // Ethylene (yz plane): C=C 1.339 Å, C–H 1.087 Å, ∠HCC 121.3° (measured; recalled from memory).
    // π/π* frontier: any organic chemistry text, e.g. Fleming, Molecular Orbitals and Organic Chemical Reactions.
    const y = 1.087 * Math.sin((58.7 * Math.PI) / 180);
    const z = 0.6695 + 1.087 * Math.cos((58.7 * Math.PI) / 180);
    const m = model(`C 0 0 0.6695; C 0 0 -0.6695; H 0 ${y} ${z}; H 0 ${-y} ${z}; H 0 ${y} ${-z}; H 0 ${-y} ${-z}`);
    const homo = homoIndex(m);
    const lumo = homo + 1;
    for (const [k, sign] of [[homo, 1], [lumo, -1]] as const) {
      const c1 = coefficientsOn(m, k, 0, 'p');
      const c2 = coefficientsOn(m, k, 1, 'p');
      // Only p_x (out of plane) on both carbons, equal magnitude; same sign in π, opposite in π*.
      expect(Math.abs(c1[1]) + Math.abs(c1[2]) + Math.abs(c2[1]) + Math.abs(c2[2])).toBeLessThan(TINY);
      expect(Math.abs(c1[0])).toBeGreaterThan(0.4);
      expect(c2[0]).toBeCloseTo(sign * c1[0], 9);
    }
    expect(m.levels[lumo].occupancy).toBe(0);
  });

  it("CO's HOMO (5σ) is weighted on carbon", () => {
    // r(CO) 1.1283 Å (Huber & Herzberg 1979; recalled from memory). The carbon-end lone pair is the
    // textbook reason CO binds metals through carbon.
    const m = model('C 0 0 0; O 0 0 1.1283');
    const k = homoIndex(m);
    expect(degenerateSet(m, k)).toHaveLength(1);
    const parts = levelComposition(m, k);
    const share = (el: string) => parts.filter((c) => c.element === el).reduce((s, c) => s + c.weight, 0);
    expect(share('C')).toBeGreaterThan(share('O'));
    const sumSq = (atom: number) => [...coefficientsOn(m, k, atom, 's'), ...coefficientsOn(m, k, atom, 'p')].reduce((s, c) => s + c * c, 0);
    expect(sumSq(0)).toBeGreaterThan(sumSq(1));
  });
});

describe("Walsh's shapes and the ethane barrier (sum of one-electron energies)", () => {
  // A. D. Walsh, J. Chem. Soc. 2260 and 2266 (1953): 8 valence electrons (H2O) bent, 16 (CO2) linear.
  const energyAt = (X: string, Y: string, r: number, deg: number) => oneElectronEnergy(model(triatomic(X, Y, r, deg)));
  const scan = (X: string, Y: string, r: number) => {
    const angles = Array.from({ length: 19 }, (_, i) => 90 + 5 * i);
    const energies = angles.map((a) => energyAt(X, Y, r, a));
    return { angles, energies, best: angles[energies.indexOf(Math.min(...energies))] };
  };

  it('water is bent: its lowest energy lies below 180°, and linear water is higher', () => {
    const { best, energies } = scan('O', 'H', 0.9578);
    expect(best).toBeLessThan(180);
    expect(energies[energies.length - 1]).toBeGreaterThan(Math.min(...energies));
  });

  it('carbon dioxide is linear: every bent shape is higher', () => {
    const { best } = scan('C', 'O', 1.16);
    expect(best).toBe(180);
    expect(energyAt('C', 'O', 1.16, 120)).toBeGreaterThan(energyAt('C', 'O', 1.16, 180));
  });

  it('staggered ethane lies below eclipsed (measured barrier 2.9 kcal/mol; Hoffmann 1963 found it with EHT)', () => {
    // C–C 1.54 Å, C–H 1.10 Å, tetrahedral angles (common practice).
    const ethane = (dihedralDeg: number) => {
      const tilt = ((180 - 109.4712) * Math.PI) / 180;
      const lines = ['C 0 0 0', 'C 0 0 1.54'];
      for (const [zc, sign, offset] of [[0, -1, 0], [1.54, 1, dihedralDeg]] as const)
        for (let k = 0; k < 3; k++) {
          const phi = ((120 * k + offset) * Math.PI) / 180;
          lines.push(`H ${1.1 * Math.sin(tilt) * Math.cos(phi)} ${1.1 * Math.sin(tilt) * Math.sin(phi)} ${zc + sign * 1.1 * Math.cos(tilt)}`);
        }
      return oneElectronEnergy(model(lines.join('; ')));
    };
    const barrierKcal = (ethane(0) - ethane(60)) * 23.0605; // eV → kcal/mol (CODATA 2018)
    expect(barrierKcal).toBeGreaterThan(0.5);
    expect(barrierKcal).toBeLessThan(10);
  });
});

describe('planar hydrocarbons: EHT π levels in the Hückel order', () => {
  // SMILES conformers (openchemlib + MMFF94s+). In a planar molecule σ and π do not mix, so the π
  // levels are the MOs made only of p orbitals along the plane normal; each must lie in the span of
  // the Hückel MO(s) at the same rank (E. Hückel 1931; Streitwieser 1961).
  for (const smiles of ['C=CC=C', 'c1ccccc1', 'c1ccc2ccccc2c1']) {
    it(`${smiles}`, () => {
      const geometry = readGeometry(smiles);
      const m = solveEht(geometry);
      const heavy = geometry.elements.map((e, i) => (e === 'C' ? i : -1)).filter((i) => i >= 0);
      // Plane normal from three well-separated carbons; all atoms must lie in that plane.
      const [a, b, c] = [heavy[0], heavy[Math.floor(heavy.length / 2)], heavy[heavy.length - 1]].map((i) => geometry.coordinates[i]);
      const u = b.map((v, i) => v - a[i]);
      const w = c.map((v, i) => v - a[i]);
      let normal = [u[1] * w[2] - u[2] * w[1], u[2] * w[0] - u[0] * w[2], u[0] * w[1] - u[1] * w[0]];
      const length = Math.hypot(...normal);
      normal = normal.map((x) => x / length);
      for (const p of geometry.coordinates) expect(Math.abs(p.reduce((s, x, i) => s + (x - a[i]) * normal[i], 0))).toBeLessThan(0.05);

      const huckel = huckelModelOf([[smiles]]);
      const centres = huckel.pi!.centres.map((centre) => centre.atom - 1);
      expect(centres).toEqual(heavy);
      // π levels: weight on the normal p components of carbons ≈ 1.
      const piLevels: number[][] = [];
      m.levels.forEach((_, k) => {
        const perp = centres.map((atom) => coefficientsOn(m, k, atom, 'p').reduce((s, cf, i) => s + cf * normal[i], 0));
        const all = m.coefficients[k].reduce((s, cf) => s + cf * cf, 0);
        if (perp.reduce((s, x) => s + x * x, 0) > 0.98 * all) piLevels.push(perp);
      });
      expect(piLevels).toHaveLength(centres.length);
      piLevels.forEach((vector, rank) => {
        const norm = Math.hypot(...vector);
        const target = huckel.levels[rank];
        const span = huckel.vectors.filter((_, k) => Math.abs(huckel.levels[k] - target) < 1e-6);
        const projection = span.reduce((s, h) => s + (h.reduce((t, hi, i) => t + hi * vector[i], 0) / norm) ** 2, 0);
        expect(projection, `π level ${rank + 1} of ${smiles}`).toBeGreaterThan(0.9);
      });
    });
  }
});

describe('geometry input', () => {
  it('gives the same numbers for the same SMILES every time (fixed conformer seed)', () => {
    const first = readGeometry('CC(=O)O').coordinates;
    const second = readGeometry('CC(=O)O').coordinates;
    expect(second).toEqual(first);
  });

  it('reads a V2000 molfile with 3D coordinates and gives the XYZ result for the same atoms', () => {
    const xyz = triatomic('O', 'H', 0.9578, 104.48);
    const atoms = xyz.split('; ').map((l) => l.split(' '));
    const atomLine = ([el, x, y, z]: string[]) =>
      `${Number(x).toFixed(4).padStart(10)}${Number(y).toFixed(4).padStart(10)}${Number(z).toFixed(4).padStart(10)} ${el.padEnd(3)} 0  0  0  0  0  0  0  0  0  0  0  0`;
    const molfile = ['water', '  test    01012600003D', '', '  3  2  0  0  0  0  0  0  0  0999 V2000', ...atoms.map(atomLine), '  1  2  1  0', '  1  3  1  0', 'M  END', '$$$$'].join('\n');
    const fromMol = model(molfile);
    const fromXyz = model(atoms.map(([el, x, y, z]) => `${el} ${Number(x).toFixed(4)} ${Number(y).toFixed(4)} ${Number(z).toFixed(4)}`).join('\n'));
    expect(fromMol.geometry.source).toBe('molfile');
    fromMol.levels.forEach((l, k) => expect(l.energyEv).toBeCloseTo(fromXyz.levels[k].energyEv, 9));
  });

  it('reads XYZ with a count and comment line, and takes a charge for XYZ input', () => {
    const text = `5\nammonium\nN 0 0 0\nH 0.59 0.59 0.59\nH -0.59 -0.59 0.59\nH -0.59 0.59 -0.59\nH 0.59 -0.59 -0.59`;
    const m = model(text, 1);
    expect(m.electrons).toBe(8);
    expect(frontier(m).lumoEv).toBeGreaterThan(frontier(m).homoEv);
  });

  it('takes the net charge an XYZ comment line states, and refuses a charge argument that contradicts it', () => {
    const atoms = ['N 0 0 0', 'H 0.59 0.59 0.59', 'H -0.59 -0.59 0.59', 'H -0.59 0.59 -0.59', 'H 0.59 -0.59 -0.59'];
    const stated = ['5', 'ammonium, Charge: +1', ...atoms].join('\n');
    expect(readGeometry(stated)).toMatchObject({ charge: 1, commentCharge: 1 });
    // NH4: N 5 + 4 × H 1 valence electrons, less one for the cation.
    expect(model(stated).electrons).toBe(8);
    expect(model(stated, 1).electrons).toBe(8);
    expect(() => model(stated, 0)).toThrow('the charge argument is 0 but the XYZ comment line says charge=1');
    // Without the count there is no comment line, and a comment without a charge states none.
    expect(readGeometry(atoms.join('; ')).commentCharge).toBeUndefined();
    expect(model(['5', 'ammonium', ...atoms].join('\n'), -1).electrons).toBe(10);
  });

  it('splits XYZ text with line breaks at those alone, so a ";" in the comment stays in the comment', () => {
    const atoms = ['O 0 0 0', 'H 0 0 0.964'];
    const pasted = ['2', 'hydroxide; from the anion set; charge=-1', ...atoms].join('\n');
    expect(readGeometry(pasted)).toMatchObject({ elements: ['O', 'H'], charge: -1, commentCharge: -1 });
    // On one line, ";" separates the lines as before.
    expect(readGeometry(['2', 'hydroxide charge=-1', ...atoms].join('; '))).toMatchObject({ elements: ['O', 'H'], charge: -1 });
    // OH-: O 6 + H 1 valence electrons, one more for the anion.
    expect(model(pasted).electrons).toBe(8);
  });

  it('rejects input it cannot use, naming what is wrong', () => {
    expect(() => model('Fe 0 0 0; O 0 0 1.6')).toThrow(/no extended-Hückel parameters for Fe/);
    expect(() => model('3\nwater\nO 0 0 0\nH 0 0 1')).toThrow(/announces 3 atoms but lists 2/);
    expect(() => model('O 0 0 0; H 0 0 0.01')).toThrow(/0.010 Å apart/);
    expect(() => model('O 0 0 zero')).toThrow(/not "element x y z"/);
    expect(() => model('C1CC')).toThrow(/cannot read SMILES 'C1CC': dangling ring closure/);
    const twoD = ['x', '  test    01012600002D', '', '  1  0  0  0  0  0  0  0  0  0999 V2000', '    0.0000    0.0000    0.0000 O   0  0', 'M  END'].join('\n');
    expect(() => model(twoD)).toThrow(/2D coordinates/);
  });
});
