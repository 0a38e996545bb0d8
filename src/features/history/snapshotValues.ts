// The workbook as it was right after a revision, computed for reading: its inputs go into a scratch
// engine (built as the grid and server build theirs, functions/workbookEngine.ts), the values come out as the grid would show
// them, and the engine is thrown away. Nothing here can be edited or sent.
import { buildWorkbookEngine, inTabOrder } from '@functions/workbookEngine.js';
import type { RevisionSnapshot } from '@shared/team.js';
import { cellView, type CellView } from '../../core/workbook/model/cellView.js';
import { readDisplaySettings } from '../../core/workbook/model/displaySettings.js';
import { SheetInputs } from '../../core/workbook/model/sheetInputs.js';
import { blockValues, valueExtent } from '../../core/workbook/model/sheetViews.js';

export interface SnapshotSheet {
  id: string;
  name: string;
  /** rows × cols of what each cell shows; undefined for an empty cell. */
  cells: (CellView | undefined)[][];
  /** How many rows and columns the sheet really uses (the table may show fewer). */
  usedRows: number;
  usedCols: number;
}

/** A read-only view is for looking, not scrolling a million rows: the first block is shown (common practice). */
export const snapshotMaxRows = 300;
export const snapshotMaxCols = 40;

export function snapshotSheets(snapshot: RevisionSnapshot, maxRows = snapshotMaxRows, maxCols = snapshotMaxCols): SnapshotSheet[] {
  const ordered = inTabOrder(snapshot.sheets);
  const inputs = ordered.map((s) => SheetInputs.from(s.cells));
  const engine = buildWorkbookEngine(ordered.map((s, i) => ({ name: s.name, table: inputs[i].toTable() })), { undoLimit: 0 });
  try {
    return ordered.map((s, i) => {
      const sheetInputs = inputs[i];
      const { rows: usedRows, cols: usedCols } = sheetInputs.extent();
      const engineId = engine.getSheetId(s.name)!;
      const precision = readDisplaySettings(s.settings).precision;
      // Array formulas can spill past the last typed cell. Only the shown block is read: a formula
      // such as =BXX1000000 makes the engine's sheet a million rows long.
      const spilled = valueExtent(engine, { engineId, inputs: sheetInputs });
      const rowCount = Math.min(maxRows, Math.max(usedRows, spilled.rows));
      const colCount = Math.min(maxCols, Math.max(usedCols, spilled.cols));
      const values = blockValues(engine, engineId, rowCount, colCount);
      const cells = Array.from({ length: rowCount }, (_, r) =>
        Array.from({ length: colCount }, (_, c) => {
          const input = sheetInputs.get(r, c);
          const value = values[r]?.[c] ?? null;
          return cellView(input, value, precision, input === '' && value !== null);
        }),
      );
      return { id: s.id, name: s.name, cells, usedRows: spilled.rows, usedCols: spilled.cols };
    });
  } finally {
    engine.destroy();
  }
}
