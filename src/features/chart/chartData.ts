// The points of a two-column chart: the rows the grid shows (a filter hides the others from the
// chart too) where both cells hold numbers. Rows with text, errors or blanks are counted, not
// plotted, so the panel can say how many were left out. Each point keeps its sheet row and the name
// the row gives it (a species or molecule), for the tip.
import { catalogByName } from '@functions/catalog/index.js';
import type { RowData } from '../../core/workbook/model/workbookModel.js';

export interface ChartPoint {
  x: number;
  y: number;
  /** Sheet row (0-based). */
  row: number;
  /** The row's name from the label column ('' when none). */
  name: string;
}

/**
 * `rows` are the rows on screen, in order; `sheetRowOf(i)` is the sheet row of rows[i]. Rows past the
 * last one holding anything are not counted.
 */
export function numericPairs(rows: readonly RowData[], xCol: number, yCol: number, sheetRowOf: (i: number) => number = (i) => i, labelCol: number | null = null): { points: ChartPoint[]; skipped: number } {
  const points: ChartPoint[] = [];
  let skipped = 0;
  for (let i = 0; i < rows.length; i++) {
    const x = rows[i]?.[xCol];
    const y = rows[i]?.[yCol];
    if (!x && !y) continue;
    if (typeof x?.value === 'number' && typeof y?.value === 'number') {
      const name = labelCol === null ? '' : (rows[i]?.[labelCol]?.display ?? '');
      points.push({ x: x.value, y: y.value, row: sheetRowOf(i), name });
    } else skipped += 1;
  }
  return { points, skipped };
}

/**
 * The column that names the rows: the leftmost column (other than the plotted ones) holding text in
 * most of the rows that have anything, as a list of species or molecules does. Null when none does.
 */
export function nameColumn(rows: readonly RowData[], colCount: number, exclude: readonly number[] = []): number | null {
  for (let col = 0; col < colCount; col++) {
    if (exclude.includes(col)) continue;
    let text = 0;
    let filled = 0;
    for (const r of rows) {
      const c = r?.[col];
      if (!c || c.display === '') continue;
      filled++;
      if (c.kind === 'text') text++;
    }
    if (filled > 0 && text * 2 > filled) return col;
  }
  return null;
}

/**
 * An axis title: the column's title (header row) or letter, with the unit of the cell function that
 * fills it (the first formula found), unless the title already names it.
 */
export function axisTitle(rows: readonly RowData[], col: number, columnLabel: string, title: string | undefined): string {
  let unit: string | undefined;
  for (const r of rows) {
    const input = r?.[col]?.input ?? '';
    if (!input.startsWith('=')) continue;
    const called = /([A-Za-z][A-Za-z0-9_.]*)\s*\(/.exec(input);
    unit = called ? catalogByName.get(called[1].toUpperCase())?.returns.unit : undefined;
    break;
  }
  const name = title ? `${title}` : `column ${columnLabel}`;
  if (!unit || name.includes(unit)) return name;
  return `${name} (${unit})`;
}

/** A line chart joins points in x order. */
export function sortedByX<T extends { x: number; row: number }>(points: readonly T[]): T[] {
  return [...points].sort((a, b) => a.x - b.x || a.row - b.row);
}

export interface PlacedPoint extends ChartPoint {
  /** Where the mark is drawn; differs from x, y only when other points sit on the same spot. */
  px: number;
  py: number;
}

/**
 * Points that would be drawn on top of each other (closer than `fraction` of each axis's span) are
 * set around a ring (`radius`, as a fraction of each span: wider than a mark) centred on where they
 * lie, so each stays visible and has its own tip; their values are unchanged.
 */
export function separateCoincident(points: readonly ChartPoint[], fraction = 0.015, radius = 0.035): { placed: PlacedPoint[]; moved: number } {
  const xs = points.map((p) => p.x);
  const ys = points.map((p) => p.y);
  const xSpan = Math.max(...xs) - Math.min(...xs) || Math.abs(xs[0] ?? 1) || 1;
  const ySpan = Math.max(...ys) - Math.min(...ys) || Math.abs(ys[0] ?? 1) || 1;
  const groups: ChartPoint[][] = [];
  for (const p of points) {
    const near = groups.find((g) => Math.abs(g[0].x - p.x) < fraction * xSpan && Math.abs(g[0].y - p.y) < fraction * ySpan);
    if (near) near.push(p);
    else groups.push([p]);
  }
  const placed: PlacedPoint[] = [];
  let moved = 0;
  for (const g of groups) {
    if (g.length === 1) {
      placed.push({ ...g[0], px: g[0].x, py: g[0].y });
      continue;
    }
    moved += g.length;
    const cx = g.reduce((s, p) => s + p.x, 0) / g.length;
    const cy = g.reduce((s, p) => s + p.y, 0) / g.length;
    g.forEach((p, k) => {
      const angle = (2 * Math.PI * k) / g.length;
      placed.push({ ...p, px: cx + radius * xSpan * Math.cos(angle), py: cy + radius * ySpan * Math.sin(angle) });
    });
  }
  return { placed, moved };
}

/**
 * How far Y lies from X over the points, for a column of predictions plotted against measurements:
 * the mean signed difference (Y − X), its root mean square, and the worst point.
 */
export function agreement<T extends { x: number; y: number }>(points: readonly T[]): { mean: number; rms: number; worst: T } | null {
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
