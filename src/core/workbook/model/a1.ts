// A1-style names for columns and cells, as every desktop spreadsheet prints them (common practice):
// columns A…Z, AA…AZ, …; rows counted from 1. Everything inside the grid counts from 0.

/** 0 → "A", 25 → "Z", 26 → "AA", 701 → "ZZ", 702 → "AAA". */
export function columnName(col: number): string {
  if (!Number.isInteger(col) || col < 0) throw new RangeError(`column index must be a whole number ≥ 0, got ${col}`);
  let name = '';
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) name = String.fromCharCode(65 + ((n - 1) % 26)) + name;
  return name;
}

/** "A" → 0, "aa" → 26; null when the text is not a column name. */
export function columnIndex(name: string): number | null {
  if (!/^[A-Za-z]{1,4}$/.test(name)) return null;
  let n = 0;
  for (const ch of name.toUpperCase()) n = n * 26 + (ch.charCodeAt(0) - 64);
  return n - 1;
}

/** (row 0, col 1) → "B1". */
export function cellName(row: number, col: number): string {
  return `${columnName(col)}${row + 1}`;
}

export interface CellRef {
  row: number;
  col: number;
}

/** "B3" → { row: 2, col: 1 }; "$B$3" is accepted too; null for anything else. */
export function parseCellName(text: string): CellRef | null {
  const m = /^\s*\$?([A-Za-z]{1,4})\$?([1-9][0-9]{0,6})\s*$/.exec(text);
  if (!m) return null;
  const col = columnIndex(m[1]);
  return col === null ? null : { row: Number(m[2]) - 1, col };
}

export interface CellRange {
  top: number;
  left: number;
  bottom: number;
  right: number;
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

/** How a sheet name appears inside a formula: quoted unless it is a plain identifier. */
export function sheetReference(name: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(name) ? name : `'${name.replace(/'/g, "''")}'`;
}
