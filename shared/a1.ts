// A1 addresses, the one module for them (common practice in every desktop spreadsheet): columns
// A…Z, AA…ZZ, AAA…; rows counted from 1. Everything inside Orbitab counts from 0. Server, client and
// importers all read and write addresses through here so they cannot drift apart.

/** Rows 1..1,000,000 and columns A..BXX (2,000), the engine's limits (functions/engine.ts). */
export const maxRowIndex = 999_999;
export const maxColIndex = 1_999;

/** Letters a column name may have: three reach XFD (xlsx's last column) and BXX (ours). */
const COLUMN_LETTERS = 3;

export interface CellRef {
  row: number;
  col: number;
}

/** A block of cells, bounds inclusive. */
export interface CellRange {
  top: number;
  left: number;
  bottom: number;
  right: number;
}

/** 0 → "A", 25 → "Z", 26 → "AA", 701 → "ZZ", 702 → "AAA". */
export function columnName(col: number): string {
  if (!Number.isInteger(col) || col < 0) throw new RangeError(`column index must be a whole number ≥ 0, got ${col}`);
  let name = '';
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}

/** "A" → 0, "aa" → 26; null when the text is not a column name. */
export function columnIndex(name: string): number | null {
  if (!new RegExp(`^[A-Za-z]{1,${COLUMN_LETTERS}}$`).test(name)) return null;
  let n = 0;
  for (const ch of name.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

/** (row 0, col 1) → "B1". */
export function cellName(row: number, col: number): string {
  return `${columnName(col)}${row + 1}`;
}

const CELL_NAME = new RegExp(`^\\s*\\$?([A-Za-z]{1,${COLUMN_LETTERS}})\\$?([0-9]{1,7})\\s*$`);

/** "B3" → { row: 2, col: 1 }; "$B$3" and "b3" are accepted too; null for anything else. */
export function parseCellName(text: string): CellRef | null {
  const m = CELL_NAME.exec(text);
  if (!m) return null;
  const row = Number(m[2]);
  const col = columnIndex(m[1]);
  return row < 1 || col === null ? null : { row: row - 1, col };
}

/** "A1" for one cell, "A1:C4" for a block (corners in any order). */
export function rangeName(range: CellRange): string {
  const a = cellName(Math.min(range.top, range.bottom), Math.min(range.left, range.right));
  const b = cellName(Math.max(range.top, range.bottom), Math.max(range.left, range.right));
  return a === b ? a : `${a}:${b}`;
}

/** "B2:A1" → the normalised block; a single cell is a 1×1 block; null when unreadable. */
export function parseRangeName(text: string): CellRange | null {
  const [first, second, extra] = text.split(':');
  if (extra !== undefined) return null;
  const a = parseCellName(first);
  const b = second === undefined ? a : parseCellName(second);
  if (!a || !b) return null;
  return { top: Math.min(a.row, b.row), left: Math.min(a.col, b.col), bottom: Math.max(a.row, b.row), right: Math.max(a.col, b.col) };
}

export function rangeArea(r: CellRange): number {
  return (r.bottom - r.top + 1) * (r.right - r.left + 1);
}

const PLAIN_SHEET_NAME = /^[A-Za-z_][A-Za-z0-9_]*$/;

/** How a sheet name appears inside a formula: bare when a plain identifier, else quoted with inner apostrophes doubled. */
export function sheetReference(name: string): string {
  return PLAIN_SHEET_NAME.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}

/** "Sheet1!B3" for messages people read, quoted as in formulas. */
export function cellAddress(sheetName: string, row: number, col: number): string {
  return `${sheetReference(sheetName)}!${cellName(row, col)}`;
}

/** One string per cell, for maps and sets keyed by cell (NUL cannot occur in an id). */
export function cellKey(c: { sheetId: string; row: number; col: number }): string {
  return `${c.sheetId}\u0000${c.row}\u0000${c.col}`;
}

/** The sheet id a cellKey() starts with, for dropping one sheet's keys. */
export function cellKeyPrefix(sheetId: string): string {
  return `${sheetId}\u0000`;
}
