// Cell views from the engine: one sheet's rows at once (on first show) or one cell (after an edit).
import type { HyperFormula } from 'hyperformula';
import { cellView, type CellView } from './cellView.js';
import type { SheetInputs } from './sheetInputs.js';
import type { Precision } from './cellView.js';

import { EMPTY_ROW, type RowData } from './valueView.js';

export { EMPTY_ROW, type RowData } from './valueView.js';

interface SheetLike {
  engineId: number;
  inputs: SheetInputs;
  display: { precision: Precision };
  rowCount: number;
}

type ReadOnlyLabel = (row: number, col: number) => string | null | undefined;

/** A value without an input can only come from an array formula elsewhere: it is spilled. */
export function viewOfCell(engine: HyperFormula, s: SheetLike, row: number, col: number, readOnly: ReadOnlyLabel): CellView | undefined {
  const input = s.inputs.get(row, col);
  const value = engine.getCellValue({ sheet: s.engineId, row, col });
  const view = cellView(input, value, s.display.precision, input === '' && value !== null);
  if (!view) return view;
  const reason = readOnly(row, col);
  return reason ? { ...view, readOnlyReason: reason } : view;
}

/**
 * The block of a sheet that holds values: the typed cells, widened to take in what array formulas
 * spill. Not the engine's own sheet size: a formula such as =BXX1000000 stretches that to a million
 * rows by two thousand columns, and reading it whole would stall the tab.
 */
export function valueExtent(engine: HyperFormula, s: Pick<SheetLike, 'engineId' | 'inputs'>, rowLimit = Number.POSITIVE_INFINITY): { rows: number; cols: number } {
  let { rows, cols } = s.inputs.extent();
  rows = Math.min(rows, rowLimit);
  const inArray = (row: number, col: number) => engine.isCellPartOfArray({ sheet: s.engineId, row, col });
  // Only the rows the engine holds so far: read cell by cell when they are a small part of the sheet.
  const cells = rows * cols < s.inputs.size ? blockEntries(s.inputs, rows, cols) : s.inputs.entries();
  for (const { row, col, input } of cells) {
    if (row >= rowLimit || !input.startsWith('=') || !inArray(row, col)) continue;
    // A spill is at most functions/limits.ts maxSpillCells, so these walks stay short.
    let r = row;
    while (inArray(r + 1, col)) r++;
    let c = col;
    while (inArray(row, c + 1)) c++;
    rows = Math.max(rows, r + 1);
    cols = Math.max(cols, c + 1);
  }
  return { rows, cols };
}

function* blockEntries(inputs: SheetInputs, rows: number, cols: number) {
  for (let row = 0; row < rows; row++) {
    for (let col = 0; col < cols; col++) {
      const input = inputs.get(row, col);
      if (input !== '') yield { row, col, input };
    }
  }
}

/** Values of the top-left block of a sheet, as getSheetValues gives them for the whole sheet. */
export function blockValues(engine: HyperFormula, engineId: number, rows: number, cols: number) {
  if (rows === 0 || cols === 0) return [];
  return engine.getRangeValues({ start: { sheet: engineId, row: 0, col: 0 }, end: { sheet: engineId, row: rows - 1, col: cols - 1 } });
}

/**
 * Every row of a sheet; rows without content share one frozen empty object. `rowLimit`: only the
 * rows the engine holds so far (the rest are shown as they are loaded, through `withRowsReplaced`).
 */
export function buildSheetRows(engine: HyperFormula, s: SheetLike, readOnly: ReadOnlyLabel, rowLimit = Number.POSITIVE_INFINITY): RowData[] {
  const { rows: valueRows, cols: valueCols } = valueExtent(engine, s, rowLimit);
  const values = blockValues(engine, s.engineId, valueRows, valueCols);
  const rows = new Array<RowData>(Math.max(s.rowCount, values.length)).fill(EMPTY_ROW);
  for (let r = 0; r < values.length; r++) {
    const line = values[r];
    let row: Record<string, CellView> | null = null;
    for (let c = 0; c < line.length; c++) {
      const value = line[c];
      const input = s.inputs.get(r, c);
      if (value === null && input === '') continue;
      const view = cellView(input, value, s.display.precision, input === '' && value !== null);
      if (!view) continue;
      const reason = readOnly(r, c);
      (row ??= {})[c] = reason ? { ...view, readOnlyReason: reason } : view;
    }
    if (row) rows[r] = row;
  }
  return rows;
}

/** Cells grouped by engine sheet, then row, then the set of columns. */
export function groupCells(cells: readonly { engineId: number; row: number; col: number }[]): Map<number, Map<number, Set<number>>> {
  const bySheet = new Map<number, Map<number, Set<number>>>();
  for (const c of cells) {
    let rows = bySheet.get(c.engineId);
    if (!rows) bySheet.set(c.engineId, (rows = new Map()));
    let cols = rows.get(c.row);
    if (!cols) rows.set(c.row, (cols = new Set()));
    cols.add(c.col);
  }
  return bySheet;
}

/** Whether two views show and carry the same (a view is a plain record of these fields). */
function sameView(a: CellView, b: CellView): boolean {
  return (
    a.input === b.input &&
    a.display === b.display &&
    a.kind === b.kind &&
    Object.is(a.value, b.value) &&
    a.errorCode === b.errorCode &&
    a.errorMessage === b.errorMessage &&
    !a.spilled === !b.spilled &&
    a.readOnlyReason === b.readOnlyReason
  );
}

/**
 * A new rows array in which only the rows holding the given cells are new objects, so memoised
 * grid rows and cells elsewhere keep their identity and do not re-render. A cell whose view comes
 * out as it was keeps its old view, and when no cell changes the old array itself is returned:
 * putting back the formulas of a workbook opened on its stored values mostly gives the values
 * already shown, and rebuilding 100,000 rows' views for them was most of what the page allocated
 * (and then collected) while it opened, besides redrawing a grid that had not changed.
 */
export function withRowsReplaced(old: RowData[], rowCount: number, fixes: Map<number, Set<number>>, view: (row: number, col: number) => CellView | undefined): RowData[] {
  let rows: RowData[] | null = old.length < rowCount ? old.concat(new Array<RowData>(rowCount - old.length).fill(EMPTY_ROW)) : null;
  for (const [row, cols] of fixes) {
    const before: RowData | undefined = (rows ?? old)[row];
    let next: Record<string, CellView | undefined> | null = null;
    for (const col of cols) {
      const v = view(row, col);
      const was = before?.[col];
      if (v ? was !== undefined && sameView(was, v) : was === undefined) continue;
      next ??= { ...before };
      if (v) next[col] = v;
      else delete next[col];
    }
    if (!next) continue;
    rows ??= old.slice();
    rows[row] = Object.keys(next).length === 0 ? EMPTY_ROW : next;
  }
  return rows ?? old;
}
