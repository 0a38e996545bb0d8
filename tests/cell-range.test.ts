// A1 ranges for protected ranges (shared by the server's check and the grid's greyed cells).
import { describe, expect, it } from 'vitest';
import { boundsContain, formatCellRange, parseCellRange } from '../shared/cellRange.js';

describe('A1 ranges', () => {
  it('reads cells, blocks, whole columns and whole rows, counting from 0', () => {
    expect(parseCellRange('B2')).toEqual({ top: 1, left: 1, bottom: 1, right: 1 });
    expect(parseCellRange('$A$1:c3')).toEqual({ top: 0, left: 0, bottom: 2, right: 2 });
    expect(parseCellRange('B:C')).toEqual({ top: 0, left: 1, bottom: 999_999, right: 2 });
    expect(parseCellRange('2:5')).toEqual({ top: 1, left: 0, bottom: 4, right: 1_999 });
  });

  it('puts corners given in either order into one canonical form', () => {
    expect(formatCellRange(parseCellRange('C3:A1')!)).toBe('A1:C3');
    expect(formatCellRange(parseCellRange('c:a')!)).toBe('A:C');
    expect(formatCellRange(parseCellRange('5:2')!)).toBe('2:5');
    expect(formatCellRange(parseCellRange('AA10')!)).toBe('AA10');
  });

  it('stops at the grid edge: column BXX (the 2000th) and row 1,000,000', () => {
    expect(parseCellRange('BXX1000000')).toEqual({ top: 999_999, left: 1_999, bottom: 999_999, right: 1_999 });
    expect(parseCellRange('BXY1')).toBeNull();
    expect(parseCellRange('A1000001')).toBeNull();
  });

  it('refuses mixed or partial forms', () => {
    for (const bad of ['A1:C', 'A:3', 'B', '7', 'A0', '1A', 'A1:B2:C3', 'Sheet1!A1', '']) expect(parseCellRange(bad), bad).toBeNull();
  });

  it('tells whether a cell lies inside', () => {
    const b = parseCellRange('B2:C3')!;
    expect([boundsContain(b, 1, 1), boundsContain(b, 2, 2), boundsContain(b, 0, 1), boundsContain(b, 1, 3)]).toEqual([true, true, false, false]);
  });
});
