// Putting formulas back after an open on stored values (src/core/workbook/model/hydration.ts): each
// slice is written in steps of about a quarter of its budget, with a look at the clock after each,
// so a step that runs long (garbage-collector work lands in whatever allocates) ends the slice
// rather than stretching it, and every formula is still put back exactly once.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { Hydration, type HydrationTarget } from '../src/core/workbook/model/hydration.js';

let clock = 0;
afterEach(() => vi.restoreAllMocks());

/** A sheet of `n` formula cells, one per row; writing a cell costs `costOf(row)` ms of the fake clock. */
function setUp(n: number, costOf: (row: number) => number) {
  vi.spyOn(performance, 'now').mockImplementation(() => clock);
  const writes: number[][] = [];
  const target: HydrationTarget = {
    hasSheet: () => true,
    engineIdOf: () => 0,
    inputOf: (_s, row) => `=A${row + 1}*2`,
    writeEngine: (cells) => {
      writes.push(cells.map((c) => c.row));
      for (const c of cells) clock += costOf(c.row);
    },
    writeRows: () => undefined,
  };
  const rows = Array.from({ length: n }, (_, r) => r);
  const hydration = new Hydration([{ sheetId: 's', rows, cols: rows.map(() => 1) }], [], 1);
  return { hydration, target, writes };
}

describe('putting formulas back in steps', () => {
  it('writes a slice in steps of about a quarter of its budget, and puts every formula back once', () => {
    const { hydration, target, writes } = setUp(5_000, () => 0.1);
    const started = clock;
    expect(hydration.slice(target, 40)).toBe(false);
    expect(clock - started).toBeLessThanOrEqual(40 + 10);
    expect(writes.length).toBeGreaterThan(1); // more than one step, each followed by a look at the clock
    for (const w of writes) expect(w.length).toBeLessThanOrEqual(100); // 10 ms of 0.1 ms cells
    let slices = 1;
    while (!hydration.slice(target, 40)) slices++;
    expect(slices).toBeGreaterThanOrEqual(10);
    const all = writes.flat();
    expect(all).toHaveLength(5_000);
    expect(new Set(all).size).toBe(5_000);
  });

  it('ends the slice after a step that ran long instead of going on to the budget', () => {
    // Rows 3,000-3,999 cost 20 times as much: the collector's marking landing in those writes.
    const { hydration, target } = setUp(8_000, (row) => (row >= 3_000 && row < 4_000 ? 2 : 0.1));
    let longest = 0;
    let done = false;
    while (!done) {
      const started = clock;
      done = hydration.slice(target, 40);
      longest = Math.max(longest, clock - started);
    }
    // One step sized for 10 ms of quick cells (100 cells) at 2 ms each is 200 ms, and the slice stops
    // there; written as one piece sized for the whole budget, 400 such cells took 800 ms.
    expect(longest).toBeLessThanOrEqual(40 + 200);
    expect(hydration.done).toBe(8_000);
  });
});
