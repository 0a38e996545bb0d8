// What the address box's Enter does: a cell ("C7") becomes the active cell, a block ("A1:J4100")
// becomes the selection with its top-left corner active, as a desktop spreadsheet's address box does.
import { parseCellName, parseRangeName } from '@shared/a1.js';

/** Where a typed address leads in the grid (view rows), or why it leads nowhere. */
export type GoToTarget =
  | { kind: 'cell'; row: number; col: number }
  | { kind: 'block'; min: { row: number; col: number }; max: { row: number; col: number } }
  | { kind: 'frozen'; col: number }
  | { kind: 'none'; reason: string };

export interface GoToView {
  /** The grid row showing a sheet row, or null when a filter hides it. */
  viewRowOf: (sheetRow: number) => number | null;
  /** Whether sheet row 1 is frozen above the grid (edited from the column header). */
  frozenHeader: boolean;
}

export function goToTarget(text: string, view: GoToView): GoToTarget {
  const typed = text.trim();
  const cell = parseCellName(typed);
  if (cell) {
    if (view.frozenHeader && cell.row === 0) return { kind: 'frozen', col: cell.col };
    const row = view.viewRowOf(cell.row);
    return row === null ? { kind: 'none', reason: `Row ${cell.row + 1} is hidden by the filter.` } : { kind: 'cell', row, col: cell.col };
  }
  const block = parseRangeName(typed);
  if (!block) return { kind: 'none', reason: `"${typed}" is not a cell or a block of cells; type one such as B3 or A1:C20.` };
  // The frozen row is not part of the grid's rows: a block starting on it starts on the next row.
  const top = view.frozenHeader && block.top === 0 ? 1 : block.top;
  if (top > block.bottom) return { kind: 'frozen', col: block.left };
  const first = view.viewRowOf(top);
  const last = view.viewRowOf(block.bottom);
  if (first === null || last === null) return { kind: 'none', reason: `A corner of ${typed.toUpperCase()} is hidden by the filter.` };
  return { kind: 'block', min: { row: first, col: block.left }, max: { row: last, col: block.right } };
}
