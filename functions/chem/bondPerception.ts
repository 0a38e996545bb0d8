// Bonds from coordinates alone, for structure formats that carry none (XYZ): which atoms are bonded,
// then (bondOrders.ts) with what bond orders and formal charges.
//
// Connectivity: atoms i and j are bonded when their distance is at most r(i) + r(j) + 0.45 Å, with
// r the covalent radii of B. Cordero et al., "Covalent radii revisited", Dalton Trans. 2008,
// 2832–2838 (Table 2; values recalled from memory; C is the sp³ radius, Mn/Fe/Co the low-spin
// ones). The 0.45 Å allowance for vibration, strain and longer-than-typical bonds is common practice
// among structure viewers. Two guards catch frames that are not one sensible geometry: atoms closer
// than half the sum of their radii (far shorter than any measured bond: overlapping atoms, a
// coordinate typo, a unit mix-up) and an atom with more neighbours than any known compound gives it.
import { assignBondOrders } from './bondOrders.js';
import { ChemError } from './errors.js';

/** Element symbols H (Z = 1) to Xe (Z = 54), in order of atomic number. */
const SYMBOLS = (
  'H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As Se Br Kr ' +
  'Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe'
).split(' ');

/** Covalent radii in Å (Cordero et al. 2008, Table 2), one per symbol above. */
const RADII_ANGSTROM = [
  0.31, 0.28, 1.28, 0.96, 0.84, 0.76, 0.71, 0.66, 0.57, 0.58, 1.66, 1.41, 1.21, 1.11, 1.07, 1.05, 1.02, 1.06,
  2.03, 1.76, 1.7, 1.6, 1.53, 1.39, 1.39, 1.32, 1.26, 1.24, 1.32, 1.22, 1.22, 1.2, 1.19, 1.2, 1.2, 1.16,
  2.2, 1.95, 1.9, 1.75, 1.64, 1.54, 1.47, 1.46, 1.42, 1.39, 1.45, 1.44, 1.42, 1.39, 1.39, 1.38, 1.39, 1.4,
];

const RADIUS = new Map(SYMBOLS.map((s, i) => [s, RADII_ANGSTROM[i]]));

/** The allowance added to the sum of covalent radii (common practice). */
export const bondToleranceAngstrom = 0.45;

/** Atoms closer than this fraction of the sum of their radii are reported, not bonded. */
const tooCloseFraction = 0.5;

/** Atomic number of a symbol in the radius table, or undefined beyond it. */
export function atomicNumberOf(symbol: string): number | undefined {
  const i = SYMBOLS.indexOf(symbol);
  return i < 0 ? undefined : i + 1;
}

export function covalentRadiusAngstrom(symbol: string): number | undefined {
  return RADIUS.get(symbol);
}

/** Most neighbours an atom may have: six for H–Ne (boranes and carboranes reach six), twelve beyond. */
function maxNeighbours(atomicNumber: number): number {
  return atomicNumber <= 10 ? 6 : 12;
}

export interface PerceivedBond {
  /** Zero-based atom indices, the lower first. */
  atoms: [number, number];
  order: 1 | 2 | 3;
  distanceAngstrom: number;
}

export interface BondPerception {
  atomicNumbers: number[];
  bonds: PerceivedBond[];
  /** Formal charge of each atom (all zero when the orders are uncertain). */
  charges: number[];
  /**
   * Null when every atom's valence is satisfied. Otherwise why no bond orders fit the valence rules;
   * the bonds are then all left single (connectivity only) rather than guessed.
   */
  uncertain: string | null;
}

export interface BondPerceptionOptions {
  /** Net charge of the structure (default 0, neutral). */
  totalCharge?: number;
}

type Xyz = readonly [number, number, number];

/** Bonded pairs by distance; throws a ChemError naming the atoms for an element without a radius or atoms too close. */
export function perceiveConnectivity(elements: readonly string[], coordinates: readonly Xyz[]): { atoms: [number, number]; distanceAngstrom: number }[] {
  const radii = elements.map((symbol, i) => {
    const r = RADIUS.get(symbol);
    if (r === undefined)
      throw new ChemError(`atom ${i + 1} (${symbol}): no covalent radius for "${symbol}" (the table covers H to Xe), so its bonds cannot be perceived`);
    return r;
  });
  const largest = radii.reduce((m, r) => Math.max(m, r), 0);
  const reach = 2 * largest + bondToleranceAngstrom;
  // Sweep along x: only atoms within the longest possible bond in x need their distance computed.
  const byX = elements.map((_, i) => i).sort((a, b) => coordinates[a][0] - coordinates[b][0]);
  const pairs: { atoms: [number, number]; distanceAngstrom: number }[] = [];
  const degree = new Array<number>(elements.length).fill(0);
  for (let p = 0; p < byX.length; p++) {
    const i = byX[p];
    const [xi, yi, zi] = coordinates[i];
    for (let q = p + 1; q < byX.length && coordinates[byX[q]][0] - xi <= reach; q++) {
      const j = byX[q];
      const [xj, yj, zj] = coordinates[j];
      const d = Math.hypot(xj - xi, yj - yi, zj - zi);
      const sum = radii[i] + radii[j];
      if (d > sum + bondToleranceAngstrom) continue;
      const [a, b] = i < j ? [i, j] : [j, i];
      if (d < tooCloseFraction * sum)
        throw new ChemError(
          `atoms ${a + 1} (${elements[a]}) and ${b + 1} (${elements[b]}) are ${d.toFixed(3)} Å apart, closer than any bond between them (under ${(tooCloseFraction * sum).toFixed(2)} Å); check the coordinates`,
        );
      pairs.push({ atoms: [a, b], distanceAngstrom: d });
      degree[a]++;
      degree[b]++;
    }
  }
  degree.forEach((count, i) => {
    const most = maxNeighbours(SYMBOLS.indexOf(elements[i]) + 1);
    if (count > most)
      throw new ChemError(`atom ${i + 1} (${elements[i]}) has ${count} atoms within bonding distance, more than ${most}; the frame may hold overlapping molecules`);
  });
  return pairs.sort((x, y) => x.atoms[0] - y.atoms[0] || x.atoms[1] - y.atoms[1]);
}

/**
 * Bonds, bond orders and formal charges of a structure given only as elements and coordinates (Å).
 * Throws a ChemError when the connectivity itself cannot be found; returns `uncertain` when it can
 * but no bond orders satisfy the valence rules.
 */
export function perceiveBonds(elements: readonly string[], coordinates: readonly Xyz[], options: BondPerceptionOptions = {}): BondPerception {
  if (elements.length !== coordinates.length) throw new ChemError(`${elements.length} elements but ${coordinates.length} coordinate triples`);
  const pairs = perceiveConnectivity(elements, coordinates);
  const atomicNumbers = elements.map((e) => atomicNumberOf(e)!);
  const assignment = assignBondOrders(
    elements,
    pairs.map((p) => p.atoms),
    options.totalCharge ?? 0,
  );
  const ok = 'orders' in assignment;
  return {
    atomicNumbers,
    bonds: pairs.map((p, b) => ({ ...p, order: ok ? assignment.orders[b] : 1 })),
    charges: ok ? assignment.charges : elements.map(() => 0),
    uncertain: ok ? null : assignment.problem,
  };
}
