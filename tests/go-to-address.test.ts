// The address box's Enter: a cell becomes active, a block becomes the selection (corners in any
// order, $ signs allowed), the frozen row 1 is reached through its header, and anything else is
// refused with a reason instead of leaving the keyboard stranded in the box.
import { describe, expect, it } from 'vitest';
import { goToTarget } from '../src/features/grid/goToAddress.js';

const plain = { viewRowOf: (r: number) => r, frozenHeader: false };
// Frozen row 1: the grid's view row v shows sheet row v + 1.
const frozen = { viewRowOf: (r: number) => (r === 0 ? null : r - 1), frozenHeader: true };
// A filter showing sheet rows 2, 5 and 9 only.
const shown = [2, 5, 9];
const filtered = { viewRowOf: (r: number) => (shown.includes(r) ? shown.indexOf(r) : null), frozenHeader: false };

describe('goToTarget', () => {
  it('goes to a cell, upper or lower case, with or without $', () => {
    expect(goToTarget('C7', plain)).toEqual({ kind: 'cell', row: 6, col: 2 });
    expect(goToTarget(' $c$7 ', plain)).toEqual({ kind: 'cell', row: 6, col: 2 });
  });

  it('selects a block with its top-left corner first, whichever corner was typed first', () => {
    const block = { kind: 'block', min: { row: 0, col: 0 }, max: { row: 4099, col: 9 } };
    expect(goToTarget('A1:J4100', plain)).toEqual(block);
    expect(goToTarget('j4100:a1', plain)).toEqual(block);
  });

  it('reaches the frozen row 1 through its header, and starts a block below it', () => {
    expect(goToTarget('B1', frozen)).toEqual({ kind: 'frozen', col: 1 });
    expect(goToTarget('A1:B3', frozen)).toEqual({ kind: 'block', min: { row: 0, col: 0 }, max: { row: 1, col: 1 } }); // sheet rows 2–3
    expect(goToTarget('C1:D1', frozen)).toEqual({ kind: 'frozen', col: 2 });
    expect(goToTarget('B4', frozen)).toEqual({ kind: 'cell', row: 2, col: 1 });
  });

  it('maps sheet rows to the rows a filter shows, and says so when a row is hidden', () => {
    expect(goToTarget('A6', filtered)).toEqual({ kind: 'cell', row: 1, col: 0 });
    expect(goToTarget('A3:B10', filtered)).toEqual({ kind: 'block', min: { row: 0, col: 0 }, max: { row: 2, col: 1 } });
    expect(goToTarget('A4', filtered)).toMatchObject({ kind: 'none', reason: expect.stringContaining('hidden by the filter') });
    expect(goToTarget('A4:B9', filtered)).toMatchObject({ kind: 'none', reason: expect.stringContaining('A4:B9') });
  });

  it('refuses what is not an address, naming it', () => {
    for (const text of ['hello', 'A0', 'A1:B2:C3', '', 'B']) {
      const target = goToTarget(text, plain);
      expect(target.kind).toBe('none');
      if (target.kind === 'none') expect(target.reason).toContain(`"${text.trim()}"`);
    }
  });
});
