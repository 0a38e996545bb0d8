// The points of a two-column chart: rows where both cells hold numbers. Rows with text, errors or
// blanks are counted, not plotted, so the panel can say how many were left out.
import type { RowData } from '../../core/workbook/model/workbookModel.js';

export interface ChartPoint {
  x: number;
  y: number;
  /** Sheet row (0-based). */
  row: number;
}

export function numericPairs(rows: readonly RowData[], xCol: number, yCol: number, firstRow = 0): { points: ChartPoint[]; skipped: number } {
  const points: ChartPoint[] = [];
  let skipped = 0;
  for (let row = firstRow; row < rows.length; row++) {
    const x = rows[row]?.[xCol];
    const y = rows[row]?.[yCol];
    if (!x && !y) continue;
    if (typeof x?.value === 'number' && typeof y?.value === 'number') points.push({ x: x.value, y: y.value, row });
    else skipped += 1;
  }
  return { points, skipped };
}

/** A line chart joins points in x order. */
export function sortedByX(points: readonly ChartPoint[]): ChartPoint[] {
  return [...points].sort((a, b) => a.x - b.x || a.row - b.row);
}

/**
 * How far Y lies from X over the points, for a column of predictions plotted against measurements:
 * the mean signed difference (Y − X), its root mean square, and the worst point.
 */
export function agreement(points: readonly { x: number; y: number }[]): { mean: number; rms: number; worst: { x: number; y: number } } | null {
  if (points.length === 0) return null;
  let sum = 0;
  let squares = 0;
  let worst = points[0];
  for (const p of points) {
    const d = p.y - p.x;
    sum += d;
    squares += d * d;
    if (Math.abs(d) > Math.abs(worst.y - worst.x)) worst = p;
  }
  return { mean: sum / points.length, rms: Math.sqrt(squares / points.length), worst };
}
