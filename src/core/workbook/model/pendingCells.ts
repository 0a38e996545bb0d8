// Re-evaluating the cells that waited for extended-Hückel results, a slice at a time. HyperFormula has
// no asynchronous functions, so a cell whose result arrives later is written again with its own input:
// the engine then evaluates it (now from the stored result) and everything that depends on it. Slices
// are sized from the time the last one took, so a library of thousands of rows fills in without any
// one slice holding the page.
import type { FormulaCell } from '@functions/structureResults.js';

/** Time one slice aims at: well under the quarter second that a person notices as a stall. */
const TARGET_SLICE_MS = 40;

export interface Reevaluates {
  reevaluate(cells: readonly FormulaCell[]): void;
}

export class PendingReevaluation {
  private queue: FormulaCell[] = [];
  private queued = new Set<string>();
  private timer: ReturnType<typeof setTimeout> | null = null;
  private perSlice = 25;
  private stopped = false;
  /** The longest slice so far, in ms (benchmarks read it). */
  longestSliceMs = 0;

  constructor(private readonly target: Reevaluates) {}

  add(cells: readonly FormulaCell[]) {
    if (this.stopped) return;
    for (const c of cells) {
      const id = `${c.sheet}:${c.row}:${c.col}`;
      if (this.queued.has(id)) continue;
      this.queued.add(id);
      this.queue.push(c);
    }
    if (this.queue.length > 0 && !this.timer) this.timer = setTimeout(this.step, 0);
  }

  stop() {
    this.stopped = true;
    if (this.timer) clearTimeout(this.timer);
    this.queue = [];
  }

  private step = () => {
    this.timer = null;
    if (this.stopped) return;
    const slice = this.queue.splice(0, this.perSlice);
    for (const c of slice) this.queued.delete(`${c.sheet}:${c.row}:${c.col}`);
    const started = performance.now();
    this.target.reevaluate(slice);
    const ms = performance.now() - started;
    this.longestSliceMs = Math.max(this.longestSliceMs, ms);
    this.perSlice = Math.max(1, Math.min(2_000, Math.round((this.perSlice * TARGET_SLICE_MS) / Math.max(ms, 1))));
    if (this.queue.length > 0) this.timer = setTimeout(this.step, 0);
  };
}
