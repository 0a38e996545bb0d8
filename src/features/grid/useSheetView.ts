// What the grid shows of a sheet: its rows (as the model keeps them), minus the frozen first row,
// filtered when a filter is set, with the map from shown rows back to sheet rows.
import { useMemo, useSyncExternalStore } from 'react';
import { filterRows } from '../../core/workbook/model/sortFilter.js';
import type { RowData, WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import type { SheetFilter } from './components/FilterMenu.js';

const NO_ROW: RowData = Object.freeze({});

export interface SheetView {
  rows: RowData[];
  data: RowData[];
  /** View row → sheet row, or null when they coincide. */
  rowMap: number[] | null;
  sheetRow: (viewRow: number) => number;
  viewRowOf: (sheetRow: number) => number | null;
  /** Sheet rows for `count` view rows from `start`, continuing past the last shown row. */
  rowsFrom: (start: number, count: number) => number[];
  frozenRow: RowData | null;
}

export function useSheetView(model: WorkbookModel, sheetId: string, frozen: boolean, filter: SheetFilter | null): SheetView {
  const rows = useSyncExternalStore(
    (cb) => model.subscribe(cb),
    () => (model.hasSheet(sheetId) ? model.rows(sheetId) : []),
  );
  return useMemo(() => {
    const first = frozen ? 1 : 0;
    let rowMap: number[] | null = null;
    if (filter) rowMap = filterRows(first, rows.length - 1, (r) => rows[r]?.[filter.col]?.display ?? '', filter.criterion);
    else if (first > 0) rowMap = Array.from({ length: Math.max(0, rows.length - 1) }, (_, i) => i + 1);
    const data = rowMap ? rowMap.map((r) => rows[r] ?? NO_ROW) : rows;
    // -1 is the frozen first row (picked in the header).
    const sheetRow = (v: number) => (v < 0 ? 0 : rowMap ? (rowMap[v] ?? (rowMap[rowMap.length - 1] ?? first - 1) + (v - rowMap.length + 1)) : v);
    const viewRowOf = (r: number) => {
      if (!rowMap) return r;
      const i = rowMap.indexOf(r);
      if (i !== -1) return i;
      // Rows past the filtered data are shown after it, as sheetRow counts them.
      const last = rowMap[rowMap.length - 1] ?? first - 1;
      return r > last ? rowMap.length - 1 + (r - last) : null;
    };
    const rowsFrom = (start: number, count: number) => Array.from({ length: count }, (_, i) => (rowMap && rowMap.length === 0 ? first + i : sheetRow(start + i)));
    return { rows, data, rowMap, sheetRow, viewRowOf, rowsFrom, frozenRow: frozen ? (rows[0] ?? NO_ROW) : null };
  }, [rows, frozen, filter]);
}
