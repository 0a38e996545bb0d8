// The level ladder of a Hückel π system: energies E = α + xβ (β < 0, so larger x lies lower),
// degenerate levels side by side, electrons by Aufbau with Hund's rule inside a degenerate set.
import type { HuckelModel } from '@functions/chem/huckel.js';
import { hundFilling, type OrbitalFilling } from './moLayout.js';

export interface LadderLevel {
  /** x in E = α + xβ. */
  x: number;
  orbitals: OrbitalFilling[];
}

const DEGENERACY_TOLERANCE = 1e-6;

/** Groups the model's levels (most bonding first) and places `electrons` from the bottom up. */
export function ladderLevels(model: Pick<HuckelModel, 'levels'>, electrons: number): LadderLevel[] {
  const groups: number[][] = [];
  for (const x of [...model.levels].sort((p, q) => q - p)) {
    const last = groups[groups.length - 1];
    if (last && Math.abs(last[0] - x) < DEGENERACY_TOLERANCE) last.push(x);
    else groups.push([x]);
  }
  let left = electrons;
  return groups.map((g) => {
    const here = Math.min(left, 2 * g.length);
    left -= here;
    return { x: g[0], orbitals: hundFilling(here, g.length) };
  });
}

/** "α + 1.618β", "α", "α − 0.618β" */
export function levelLabel(x: number): string {
  const r = Math.round(x * 1000) / 1000;
  if (r === 0) return 'α';
  const magnitude = Math.abs(r) === 1 ? '' : String(Math.abs(r));
  return `α ${r > 0 ? '+' : '−'} ${magnitude}β`;
}
