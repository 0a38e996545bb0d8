// A1 notation, zero-based inside Orbitab: "A1" is row 0, col 0.

export function columnLetters(col: number): string {
  let s = '';
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

export function addressOf(row: number, col: number): string {
  return `${columnLetters(col)}${row + 1}`;
}

export interface CellRef {
  row: number;
  col: number;
}

export interface RangeRef {
  top: number;
  left: number;
  bottom: number;
  right: number;
}

export function parseAddress(text: string): CellRef | null {
  const m = /^\$?([A-Za-z]{1,3})\$?(\d{1,7})$/.exec(text.trim());
  if (!m) return null;
  let col = 0;
  for (const ch of m[1].toUpperCase()) col = col * 26 + (ch.charCodeAt(0) - 64);
  const row = Number(m[2]);
  if (row < 1) return null;
  return { row: row - 1, col: col - 1 };
}

/** "A1:C3" or "B2" (a single cell is a 1×1 range). Corners may come in any order. */
export function parseRange(text: string): RangeRef | null {
  const [a, b = a] = text.split(':');
  const p = parseAddress(a);
  const q = parseAddress(b);
  if (!p || !q) return null;
  return { top: Math.min(p.row, q.row), left: Math.min(p.col, q.col), bottom: Math.max(p.row, q.row), right: Math.max(p.col, q.col) };
}

export function rangeArea(r: RangeRef): number {
  return (r.bottom - r.top + 1) * (r.right - r.left + 1);
}

export function rangeText(r: RangeRef): string {
  const a = addressOf(r.top, r.left);
  return r.top === r.bottom && r.left === r.right ? a : `${a}:${addressOf(r.bottom, r.right)}`;
}
