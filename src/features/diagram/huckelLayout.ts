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

/**
 * Label positions at least `minGap` apart, each as near its wanted position as it can be: labels
 * that would collide are stacked as one block centred on where they wanted to be, so two nearly equal
 * levels (pyridine's α + 1.167β and α + β) get readable labels. Returns positions in input order.
 */
export function separateLabels(wanted: readonly number[], minGap: number): number[] {
  const order = wanted.map((y, i) => ({ y, i })).sort((a, b) => a.y - b.y || a.i - b.i);
  // Each block: its members (in order) and the position of its first label.
  const blocks: { members: { y: number; i: number }[]; top: number }[] = [];
  for (const label of order) {
    blocks.push({ members: [label], top: label.y });
    for (;;) {
      const last = blocks[blocks.length - 1];
      const prev = blocks[blocks.length - 2];
      if (!prev || prev.top + prev.members.length * minGap <= last.top) break;
      const members = [...prev.members, ...last.members];
      // The top that puts the block's labels, on average, where they wanted to be.
      const top = members.reduce((sum, m, k) => sum + m.y - k * minGap, 0) / members.length;
      blocks.splice(blocks.length - 2, 2, { members, top });
    }
  }
  const placed = new Array<number>(wanted.length);
  for (const b of blocks) b.members.forEach((m, k) => (placed[m.i] = b.top + k * minGap));
  return placed;
}
