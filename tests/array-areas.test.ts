// Two array formulas side by side: each anchor's area is its own result's size, and no cell comes
// out twice. Measured by walking right and down while cells were part of an array, the walk ran on
// into the neighbour's area (E3's 2 × 2 SEQUENCE was written as E3:H4, and G4 twice, in exports).
import { HyperFormula } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { arrayAreaAt } from '../functions/workbookEngine.js';
import { computeValues } from '../server/services/values.js';
import { computeWorkbook } from '../server/xlsx/engineValues.js';
import type { CellTriple } from '../server/xlsx/types.js';

// G2:H3 and E3:F4 touch at G3 (right of F3); C3:D4 touches E3:F4; A5's 3 × 3 is blocked by B5.
const cells: CellTriple[] = [
  [1, 6, '=SEQUENCE(2,2)'],
  [2, 2, '=SEQUENCE(2,2)'],
  [2, 4, '=SEQUENCE(2,2)'],
  [3, 6, '=TRUE()'],
  [4, 0, '=SEQUENCE(3,3)'],
  [4, 1, '5'],
];

describe('array formulas side by side', () => {
  it('export: each anchor has its own area and every cell is listed once', () => {
    const out = computeWorkbook([{ name: 'S', cells }]).sheets[0].cells;
    const spills = out.filter((c) => c.spill).map((c) => [c.row, c.col, c.spill!.rows, c.spill!.cols]);
    expect(spills).toEqual([
      [1, 6, 2, 2],
      [2, 2, 2, 2],
      [2, 4, 2, 2],
      [4, 0, 1, 1],
    ]);
    const keys = out.map((c) => `${c.row},${c.col}`);
    expect(new Set(keys).size).toBe(keys.length);
    // 4 anchors + 3 spilled cells each for the three 2 × 2 arrays + TRUE() + the 5.
    expect(out.length).toBe(4 + 9 + 2);
    expect(out.find((c) => c.row === 3 && c.col === 6)).toMatchObject({ input: '=TRUE()', value: true });
  });

  it('/values: the same cells, once each', () => {
    const payload = computeValues({ revision: 1, sheets: [{ id: 's', name: 'S', cells }] });
    const keys = payload.sheets[0].values.map(([r, c]) => `${r},${c}`);
    expect(new Set(keys).size).toBe(keys.length);
    expect(keys.length).toBe(15);
  });

  it('an array formula whose result is an error fills its own cell only (here a circular one)', () => {
    const out = computeWorkbook([{ name: 'S', cells: [[0, 0, '=SEQUENCE(2,2)+A1'], [0, 1, '7']] }]).sheets[0].cells;
    expect(out.map((c) => [c.row, c.col, c.spill?.rows ?? 0, c.spill?.cols ?? 0])).toEqual([
      [0, 0, 1, 1],
      [0, 1, 0, 0],
    ]);
  });

  it('arrayAreaAt: null off an array formula, the blocked spill 1 × 1', () => {
    const hf = HyperFormula.buildFromArray([['=SEQUENCE(2,3)', null, null], [null, null, null], ['=SEQUENCE(2,2)', 'x']], { licenseKey: 'gpl-v3' });
    expect(arrayAreaAt(hf, { sheet: 0, row: 0, col: 0 })).toEqual({ rows: 2, cols: 3 });
    expect(arrayAreaAt(hf, { sheet: 0, row: 0, col: 1 })).toBeNull();
    expect(arrayAreaAt(hf, { sheet: 0, row: 2, col: 0 })).toEqual({ rows: 1, cols: 1 });
    hf.destroy();
  });
});
