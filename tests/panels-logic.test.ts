// Pure parts of the side panels: level labels kept apart, the panel reading the formula's parameter
// set, chart points from the rows on screen with their names, axis titles with units, coincident
// points set apart, and the stored chart read back.
import { describe, expect, it } from 'vitest';
import { readChartSpec } from '../shared/chartSpec.js';
import { sheetSettingsSchema } from '../shared/sheetSettings.js';
import type { CellView } from '../src/core/workbook/model/cellView.js';
import type { RowData } from '../src/core/workbook/model/workbookModel.js';
import { axisTitle, nameColumn, numericPairs, separateCoincident } from '../src/features/chart/chartData.js';
import { subjectOfCell } from '../src/features/diagram/cellSubject.js';
import { separateLabels } from '../src/features/diagram/huckelLayout.js';
import { snappedPanelWidth } from '../src/app/workbook/usePanelWidth.js';

const num = (value: number, input = String(value)): CellView => ({ input, display: String(value), kind: 'number', value });
const text = (value: string): CellView => ({ input: value, display: value, kind: 'text', value });
const row = (...cells: (CellView | undefined)[]): RowData => Object.fromEntries(cells.flatMap((c, i) => (c ? [[i, c]] : []))) as RowData;

describe('separateLabels', () => {
  it('leaves labels that do not collide where they are', () => {
    expect(separateLabels([10, 40, 80], 14)).toEqual([10, 40, 80]);
  });

  it('stacks two close labels as a block centred on where they wanted to be', () => {
    // Wanted 100 and 104 with a 14 px pitch: the pair's centre 102 stays, so 95 and 109.
    expect(separateLabels([104, 100], 14)).toEqual([109, 95]);
  });

  it('keeps every pair at least the pitch apart, in the order of the levels, for a crowded ladder', () => {
    const wanted = [50, 51, 52, 60, 200, 201];
    const placed = separateLabels(wanted, 14);
    const order = wanted.map((_, i) => i).sort((a, b) => wanted[a] - wanted[b]);
    for (let k = 1; k < order.length; k++) expect(placed[order[k]] - placed[order[k - 1]]).toBeGreaterThanOrEqual(14 - 1e-9);
    // A block's mean stays at its members' mean: 50, 51, 52, 60 average 53.25.
    expect((placed[0] + placed[1] + placed[2] + placed[3]) / 4).toBeCloseTo(53.25, 9);
  });
});

describe('structure panel reads the formula', () => {
  const source = (input: string, cells: Record<string, string> = {}) => ({ input, display: '', textOf: (a1: string) => cells[a1] ?? null });

  it('uses the parameter set written in the formula', () => {
    const s = subjectOfCell(source('=PIGAP(B6,"van-catledge")', { B6: 'c1ccncc1' }));
    expect(s.kind === 'huckel' && s.parameterSet).toBe('van-catledge');
    // Van-Catledge's h_N (0.51) and k_CN (1.02) sit in the matrix, not Streitwieser's 0.5 and 1.
    expect(s.kind === 'huckel' && s.model.matrix.flat()).toContain(0.51);
  });

  it('uses a parameter set held in a cell the formula reads', () => {
    const s = subjectOfCell(source('=PIGAP(B6,C1)', { B6: 'c1ccncc1', C1: 'Van-Catledge' }));
    expect(s.kind === 'huckel' && s.parameterSet).toBe('van-catledge');
  });

  it('falls back to the default set when the formula names none', () => {
    const s = subjectOfCell(source('=PIGAP(B6)', { B6: 'c1ccsc1' }));
    expect(s.kind === 'huckel' && s.parameterSet).toBe('streitwieser');
  });
});

describe('chart points', () => {
  const rows = [row(text('Species'), text('x'), text('y')), row(text('O2'), num(2), num(2)), row(text('N2'), num(3), num(0)), row(text('F2'), text('n/a'), num(0)), row()];

  it('takes the rows given (the filtered view) with their sheet rows and names', () => {
    // The view shows sheet rows 2 and 4 only (a filter): rows[1] and rows[3] of the sheet.
    const shown = [rows[1], rows[3]];
    const { points, skipped } = numericPairs(shown, 1, 2, (i) => [1, 3][i], 0);
    expect(points).toEqual([{ x: 2, y: 2, row: 1, name: 'O2' }]);
    expect(skipped).toBe(1);
  });

  it('finds the column that names the rows', () => {
    expect(nameColumn(rows, 3, [1, 2])).toBe(0);
    expect(nameColumn([row(num(1), num(2))], 2)).toBeNull();
  });

  it('titles an axis with the header and the unit of the function filling the column', () => {
    const gaps = [row(undefined, num(1.2, '=PIGAP(A2)')), row(undefined, num(2, '=PIGAP(A3)'))];
    expect(axisTitle(gaps, 1, 'B', 'Gap')).toBe('Gap (|β|)');
    expect(axisTitle(gaps, 1, 'B', undefined)).toBe('column B (|β|)');
    expect(axisTitle(gaps, 1, 'B', 'Gap / |β|')).toBe('Gap / |β|');
    expect(axisTitle([row(num(3))], 0, 'A', 'Bond order')).toBe('Bond order');
  });

  it('draws coincident points apart and leaves the others where they are', () => {
    const pts = [
      { x: 8, y: 2, row: 1, name: 'benzene' },
      { x: 8, y: 2, row: 6, name: 'benzene batch 2' },
      { x: 4.47, y: 1.24, row: 4, name: 'butadiene' },
    ];
    const { placed, moved } = separateCoincident(pts);
    expect(moved).toBe(2);
    const [a, b, c] = [0, 1, 2].map((i) => placed.find((p) => p.row === pts[i].row)!);
    expect(a.x).toBe(8);
    expect(Math.hypot(a.px - b.px, a.py - b.py)).toBeGreaterThan(0);
    expect((a.px + b.px) / 2).toBeCloseTo(8, 12);
    expect({ px: c.px, py: c.py }).toEqual({ px: 4.47, py: 1.24 });
  });
});

describe('stored chart', () => {
  it('reads a stored chart and ignores one that no longer reads', () => {
    expect(readChartSpec({ chart: { x: 3, y: 2, kind: 'scatter', label: 0 } })).toEqual({ x: 3, y: 2, kind: 'scatter', label: 0 });
    expect(readChartSpec({ chart: { x: -1, y: 2, kind: 'scatter', label: null } })).toBeNull();
    expect(readChartSpec({})).toBeNull();
  });

  it('is checked at the edge with the sheet settings', () => {
    expect(sheetSettingsSchema.safeParse({ chart: { x: 1, y: 2, kind: 'line', label: null } }).success).toBe(true);
    const bad = sheetSettingsSchema.safeParse({ chart: { x: 1, y: 2, kind: 'pie', label: null } });
    expect(bad.success).toBe(false);
  });
});

describe('side panel width', () => {
  const fit = (rowPx: number, widths: number[] = [], scrollbarPx = 0) =>
    snappedPanelWidth({ rowPx, scrollbarPx, gutterPx: 52, minPanelPx: 338, maxPanelPx: 498, colCount: 26, widthOf: (c) => widths[c] ?? 112 });

  it('leaves the grid whole columns: gutter plus columns plus panel fill the row', () => {
    // 1280 − 52 = 1228 px of room; seven 112 px columns (784) leave 443 ≥ 338, an eighth would not.
    expect(fit(1280)).toBe(1228 - 7 * 112);
    // The grid's own scrollbar takes room from the columns, not from the panel.
    expect(fit(1280, [], 15)).toBe(1213 - 7 * 112);
  });

  it('follows set column widths', () => {
    expect(fit(1280, [300, 300])).toBe(1228 - 600 - 2 * 112);
  });

  it('keeps its usual width when closing the gap would take a very wide column', () => {
    // 60 px fits; the 900 px column after it does not, and 1,168 px of panel would be too wide.
    expect(fit(1280, [60, 900])).toBe(338);
  });
});
