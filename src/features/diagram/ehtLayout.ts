// The extended-Hückel ladder the side panel shows: the levels around the frontier (all of them for a
// small molecule), highest first, each with its electrons and its largest atomic contributions.
import type { EhtSummary } from '@functions/chem/ehtSummary.js';

export interface EhtLadderRow {
  /** Level number from 1 (lowest), as EHTLEVELS(structure, k) counts. */
  level: number;
  energyEv: number;
  electrons: number;
  /** e.g. "O1 2p 1.00": the shares EHTHOMOMAKEUP gives for the HOMO. */
  makeup: string;
  role: 'HOMO' | 'LUMO' | null;
}

export interface EhtLadder {
  rows: EhtLadderRow[];
  /** Levels left out below and above the window. */
  hiddenBelow: number;
  hiddenAbove: number;
}

export function ehtLadder(s: EhtSummary, below = 6, above = 4): EhtLadder {
  let homo = -1;
  s.levels.forEach(([, electrons], k) => {
    if (electrons > 0) homo = k;
  });
  const lumo = s.levels.findIndex(([, electrons], k) => k > homo && electrons === 0);
  const from = Math.max(0, homo - below + 1);
  const to = Math.min(s.levels.length - 1, (lumo >= 0 ? lumo : homo) + above - 1);
  const rows: EhtLadderRow[] = [];
  for (let k = to; k >= from; k--) {
    const [energyEv, electrons] = s.levels[k];
    rows.push({ level: k + 1, energyEv, electrons, makeup: s.levelMakeups[k] ?? '', role: k === homo ? 'HOMO' : k === lumo ? 'LUMO' : null });
  }
  return { rows, hiddenBelow: from, hiddenAbove: s.levels.length - 1 - to };
}
