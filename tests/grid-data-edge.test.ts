// Ctrl+Arrow data-edge jumps and the fill handle's double-click extent (desktop-spreadsheet habits,
// common practice): worked on small hand-drawn sheets.
import { describe, expect, it } from 'vitest';
import { dataEdge, fillDownEnd } from '../src/features/grid/dataEdge.js';

// A sheet drawn as text: '#' filled, '.' empty. Rows top to bottom.
function sheet(...rows: string[]) {
  const isFilled = (r: number, c: number) => rows[r]?.[c] === '#';
  return { isFilled, extent: { rows: 1000, cols: 26 } };
}

describe('Ctrl+Arrow goes to the edge of the data', () => {
  const s = sheet('#####', '#....', '#....', '.....', '.....', '#....');
  it('runs to the last filled cell of a block', () => {
    expect(dataEdge({ row: 0, col: 0 }, 'down', s.isFilled, s.extent)).toEqual({ row: 2, col: 0 });
    expect(dataEdge({ row: 0, col: 0 }, 'right', s.isFilled, s.extent)).toEqual({ row: 0, col: 4 });
  });
  it('jumps over a gap to the next filled cell', () => {
    expect(dataEdge({ row: 2, col: 0 }, 'down', s.isFilled, s.extent)).toEqual({ row: 5, col: 0 });
    expect(dataEdge({ row: 5, col: 0 }, 'up', s.isFilled, s.extent)).toEqual({ row: 2, col: 0 });
  });
  it('stops at the sheet edge when nothing more is filled, not 180 rows past the data', () => {
    expect(dataEdge({ row: 5, col: 0 }, 'down', s.isFilled, s.extent)).toEqual({ row: 999, col: 0 });
    expect(dataEdge({ row: 0, col: 4 }, 'right', s.isFilled, s.extent)).toEqual({ row: 0, col: 25 });
    expect(dataEdge({ row: 0, col: 0 }, 'up', s.isFilled, s.extent)).toEqual({ row: 0, col: 0 });
  });
});

describe('double-clicking the fill handle', () => {
  const s = sheet('##', '#.', '#.', '#.', '..', '#.');
  it('fills down to the end of the neighbouring column’s data', () => {
    expect(fillDownEnd(0, 1, 1, s.isFilled, s.extent)).toBe(3);
  });
  it('does nothing without data beside the selection', () => {
    expect(fillDownEnd(0, 3, 3, s.isFilled, s.extent)).toBeNull();
  });
});
