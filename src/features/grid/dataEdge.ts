// Ctrl+Arrow moves to the edge of the data, as desktop spreadsheets do (common practice): from a
// filled cell whose neighbour is filled, to the last filled cell before a gap; otherwise to the next
// filled cell in that direction; with none, to the edge of the sheet.
export type Direction = 'up' | 'down' | 'left' | 'right';

const steps: Record<Direction, [number, number]> = { up: [-1, 0], down: [1, 0], left: [0, -1], right: [0, 1] };

export function dataEdge(from: { row: number; col: number }, direction: Direction, isFilled: (row: number, col: number) => boolean, extent: { rows: number; cols: number }): { row: number; col: number } {
  const [dr, dc] = steps[direction];
  const inside = (r: number, c: number) => r >= 0 && c >= 0 && r < extent.rows && c < extent.cols;
  let r = from.row;
  let c = from.col;
  if (!inside(r + dr, c + dc)) return { row: r, col: c };
  if (isFilled(r, c) && isFilled(r + dr, c + dc)) {
    while (inside(r + dr, c + dc) && isFilled(r + dr, c + dc)) {
      r += dr;
      c += dc;
    }
    return { row: r, col: c };
  }
  r += dr;
  c += dc;
  while (inside(r + dr, c + dc) && !isFilled(r, c)) {
    r += dr;
    c += dc;
  }
  return { row: r, col: c };
}

/**
 * The last row a fill-handle double-click fills down to: the end of the data in the column beside
 * the selection (left first, else right), counted from the selection's first row.
 */
export function fillDownEnd(top: number, left: number, right: number, isFilled: (row: number, col: number) => boolean, extent: { rows: number; cols: number }): number | null {
  for (const col of [left - 1, right + 1]) {
    if (col < 0 || col >= extent.cols || !isFilled(top, col)) continue;
    let row = top;
    while (row + 1 < extent.rows && isFilled(row + 1, col)) row++;
    return row;
  }
  return null;
}
