// Ranges in A1 notation for protected ranges: "B2", "A1:C3", whole columns "A:C" and whole rows
// "2:5" (common practice in spreadsheet programs). Rows and columns count from 0 inside Orbitab;
// bounds are inclusive. Shared so the server's check and the client's greyed cells agree exactly.
import { columnIndex, columnName } from './a1.js';
import { maxColIndex, maxRowIndex } from './workbooks.js';

export interface CellBounds {
  top: number;
  left: number;
  bottom: number;
  right: number;
}

type Corner = { row: number | null; col: number | null };

/** "B2" → both; "B" → column only; "2" → row only; null when it is none of these or off the grid. */
function parseCorner(text: string): Corner | null {
  const m = /^\$?([A-Za-z]{1,3})?\$?(\d{1,7})?$/.exec(text);
  if (!m || (!m[1] && !m[2])) return null;
  const col = m[1] ? columnIndex(m[1])! : null;
  const row = m[2] ? Number(m[2]) - 1 : null;
  if (row !== null && (row < 0 || row > maxRowIndex)) return null;
  if (col !== null && col > maxColIndex) return null;
  return { row, col };
}

/**
 * Parses a range; null when the text is not A1 notation or reaches past the grid
 * (rows 1..1,000,000, columns A..BXX). Corners may come in either order.
 */
export function parseCellRange(text: string): CellBounds | null {
  const parts = text.trim().split(':');
  if (parts.length > 2) return null;
  const a = parseCorner(parts[0]);
  const b = parts.length === 2 ? parseCorner(parts[1]) : a;
  if (!a || !b) return null;
  const kind = (c: Corner) => (c.row !== null && c.col !== null ? 'cell' : c.col !== null ? 'column' : 'row');
  // "A1:C" or "A:3" mix kinds; a lone "B" or "2" is not a range either.
  if (kind(a) !== kind(b) || (parts.length === 1 && kind(a) !== 'cell')) return null;
  const rows = a.row === null ? [0, maxRowIndex] : [a.row, b.row!];
  const cols = a.col === null ? [0, maxColIndex] : [a.col, b.col!];
  return { top: Math.min(...rows), bottom: Math.max(...rows), left: Math.min(...cols), right: Math.max(...cols) };
}

/** The canonical text of a range: "B2", "A1:C3", "A:C", "2:5". */
export function formatCellRange(b: CellBounds): string {
  const wholeColumns = b.top === 0 && b.bottom === maxRowIndex;
  const wholeRows = b.left === 0 && b.right === maxColIndex;
  if (wholeColumns && !wholeRows) return `${columnName(b.left)}:${columnName(b.right)}`;
  if (wholeRows && !wholeColumns) return `${b.top + 1}:${b.bottom + 1}`;
  const first = `${columnName(b.left)}${b.top + 1}`;
  return b.top === b.bottom && b.left === b.right ? first : `${first}:${columnName(b.right)}${b.bottom + 1}`;
}

export function boundsContain(b: CellBounds, row: number, col: number): boolean {
  return row >= b.top && row <= b.bottom && col >= b.left && col <= b.right;
}
