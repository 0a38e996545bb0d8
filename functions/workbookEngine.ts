// The one way a workbook becomes an engine: sheets in tab order, each given as the engine's table or
// as sparse [row, col, input] cells (densified here), built by createEngine with the shared config
// (sparse address maps for sparse sheets included). The grid's model, revision snapshots, the
// server's /values and exports all build theirs here.
import type { ConfigParams, HyperFormula } from 'hyperformula';
import { createEngine, type SheetInput } from './engine.js';

/** One non-empty cell: zero-based row and column and the input as typed. */
export type CellTriple = [row: number, col: number, input: string];

export interface EngineSheet {
  name: string;
  /** Tab order; sheets without one keep the order given. */
  position?: number;
  /** Either the table as the engine reads it… */
  table?: SheetInput;
  /** …or the sheet's non-empty cells. */
  cells?: readonly CellTriple[];
}

// Rows without cells share one empty array, so a lone cell in row 900,000 costs one pointer per row
// rather than a dense block (the engine only reads its input).
const emptyRow: SheetInput[number] = Object.freeze([]) as unknown as SheetInput[number];

/** Builds the engine's input for one sheet from its sparse cells. */
export function denseSheet(cells: readonly CellTriple[]): SheetInput {
  const rows: SheetInput = [];
  for (const [row, col, input] of cells) {
    while (rows.length <= row) rows.push(emptyRow);
    if (rows[row] === emptyRow) rows[row] = [];
    const cellsOfRow = rows[row];
    while (cellsOfRow.length < col) cellsOfRow.push(null);
    cellsOfRow[col] = input;
  }
  return rows;
}

/** Sheets in tab order (a stable sort: equal or missing positions keep their order). */
export function inTabOrder<T extends { position?: number }>(sheets: readonly T[]): T[] {
  return sheets.every((s) => s.position !== undefined) ? [...sheets].sort((a, b) => a.position! - b.position!) : [...sheets];
}

export function buildWorkbookEngine(sheets: readonly EngineSheet[], options: Partial<ConfigParams> = {}): HyperFormula {
  return createEngine(Object.fromEntries(inTabOrder(sheets).map((s) => [s.name, s.table ?? denseSheet(s.cells ?? [])])), options);
}
