// The one way a workbook becomes an engine: sheets in tab order, each given as the engine's table or
// as sparse [row, col, input] cells (densified here), built by createEngine with the shared config
// (sparse address maps for sparse sheets included). The grid's model, revision snapshots, the
// server's /values and exports all build theirs here.
import { CellType, type ConfigParams, type HyperFormula } from 'hyperformula';
import { createEngine, type SheetInput } from './engine.js';
import { inTabOrder } from './tabOrder.js';

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

export { inTabOrder };

export function buildWorkbookEngine(sheets: readonly EngineSheet[], options: Partial<ConfigParams> = {}): HyperFormula {
  return createEngine(Object.fromEntries(inTabOrder(sheets).map((s) => [s.name, s.table ?? denseSheet(s.cells ?? [])])), options);
}

export interface EngineBlock<T> {
  engineId: number;
  row: number;
  col: number;
  rows: T[][];
}

/**
 * Cells to write, in the order given, gathered into rectangles: a run along a row becomes one line,
 * and lines of the same columns on consecutive rows become one block. The engine pays for each write
 * call (a check of the area, an undo entry it then drops, a cleanup of its undo data: a good part of
 * what putting 700,000 formulas back one by one allocated), so a block costs what one cell did.
 */
export function engineBlocks<T>(cells: readonly { engineId: number; row: number; col: number; content: T }[]): EngineBlock<T>[] {
  const blocks: EngineBlock<T>[] = [];
  let i = 0;
  while (i < cells.length) {
    const first = cells[i];
    const line = [first.content];
    i++;
    while (i < cells.length && cells[i].engineId === first.engineId && cells[i].row === first.row && cells[i].col === first.col + line.length) line.push(cells[i++].content);
    const last = blocks[blocks.length - 1];
    if (last && last.engineId === first.engineId && last.col === first.col && last.row + last.rows.length === first.row && last.rows[0].length === line.length) last.rows.push(line);
    else blocks.push({ engineId: first.engineId, row: first.row, col: first.col, rows: [line] });
  }
  return blocks;
}

/**
 * The area an array formula at `at` fills, in rows × columns (1 × 1 when its result is an error or
 * its spill is blocked), or null when the cell holds no array formula. The walk right and down over
 * cells the engine marks as part of an array is held to the formula's own result size: unbounded,
 * it ran on into a neighbouring array formula's area.
 */
export function arrayAreaAt(engine: HyperFormula, at: { sheet: number; row: number; col: number }): { rows: number; cols: number } | null {
  if (engine.getCellType(at) !== CellType.ARRAYFORMULA) return null;
  // HyperFormula 3.5's ArrayFormulaVertex (its dependency graph is public but marked internal); its
  // size is the predicted one even when the result is an error, so it only bounds the walk.
  const vertex = (engine as unknown as { dependencyGraph?: { getCell?(a: typeof at): { width?: unknown; height?: unknown } | undefined } }).dependencyGraph?.getCell?.(at);
  const width = typeof vertex?.width === 'number' ? vertex.width : Infinity;
  const height = typeof vertex?.height === 'number' ? vertex.height : Infinity;
  const spilled = (row: number, col: number) => engine.getCellType({ sheet: at.sheet, row, col }) === CellType.ARRAY;
  let cols = 1;
  while (cols < width && spilled(at.row, at.col + cols)) cols++;
  let rows = 1;
  while (rows < height && spilled(at.row + rows, at.col)) rows++;
  return { rows, cols };
}
