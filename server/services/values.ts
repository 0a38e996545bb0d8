// Values computed on the server with the same engine the browser uses (functions/engine.ts), for
// integrations and export. Only non-empty values are returned, as [row, col, value] per sheet.
import { CellType, DenseSparseChooseBasedOnThreshold, DetailedCellError, ErrorType, type CellValue, type HyperFormula } from 'hyperformula';
import '../../functions/openchemlibNode.js';
import { createEngine, type SheetInput } from '../../functions/engine.js';
import type { ComputedValue, SheetPayload, ValueEntry, ValuesPayload, WorkbookPayload } from '../../shared/workbooks.js';

// Rows without cells share one empty array, so a lone cell in row 900,000 costs one pointer per row
// rather than a dense block (the engine only reads its input).
const emptyRow: SheetInput[number] = Object.freeze([]) as unknown as SheetInput[number];

/** Builds the engine's input for one sheet from its sparse cells. */
export function denseSheet(cells: WorkbookPayload['sheets'][number]['cells']): SheetInput {
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

/** What the engine's own errors mean, for those it raises without a message (common practice). */
const errorMeaning: Partial<Record<ErrorType, string>> = {
  [ErrorType.DIV_BY_ZERO]: 'division by zero',
  [ErrorType.NA]: 'a value is not available',
  [ErrorType.NAME]: 'unknown function or name',
  [ErrorType.NUM]: 'a number out of range',
  [ErrorType.REF]: 'a reference to a cell that does not exist',
  [ErrorType.VALUE]: 'an argument of the wrong type',
  [ErrorType.CYCLE]: 'a circular reference',
  [ErrorType.SPILL]: 'the result cannot spill: other cells are in the way',
};

function toComputed(value: CellValue): ComputedValue | null {
  if (value === null || value === undefined) return null;
  if (value instanceof DetailedCellError) return { error: value.value, message: value.message || errorMeaning[value.type] || 'error' };
  return value;
}

/**
 * The cells that can hold a value: every input cell, plus the cells an array formula spills into
 * (found by walking right and down from its anchor while the engine marks cells as part of an array).
 */
function candidateCells(engine: HyperFormula, sheet: number, cells: WorkbookPayload['sheets'][number]['cells']): [number, number][] {
  const seen = new Set<string>();
  const out: [number, number][] = [];
  const add = (row: number, col: number) => {
    const k = `${row},${col}`;
    if (!seen.has(k)) {
      seen.add(k);
      out.push([row, col]);
    }
  };
  const isSpill = (row: number, col: number) => engine.getCellType({ sheet, row, col }) === CellType.ARRAY;
  for (const [row, col] of cells) {
    add(row, col);
    if (engine.getCellType({ sheet, row, col }) !== CellType.ARRAYFORMULA) continue;
    let width = 1;
    while (isSpill(row, col + width)) width++;
    let height = 1;
    while (isSpill(row + height, col)) height++;
    for (let r = row; r < row + height; r++) for (let c = col; c < col + width; c++) add(r, c);
  }
  return out.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/** What computing values needs of a workbook: its revision and each sheet's id, name and cells. */
export interface ValuesInput {
  revision: number;
  sheets: Pick<SheetPayload, 'id' | 'name' | 'cells'>[];
}

export function computeValues(workbook: ValuesInput): ValuesPayload {
  // The engine's default address map is dense per sheet; a sparse sheet (one cell far down) would
  // then allocate its whole bounding box, so sheets less than a tenth filled are stored sparse.
  const engine = createEngine(Object.fromEntries(workbook.sheets.map((s) => [s.name, denseSheet(s.cells)])), {
    chooseAddressMappingPolicy: new DenseSparseChooseBasedOnThreshold(0.1),
  });
  try {
    return {
      revision: workbook.revision,
      sheets: workbook.sheets.map((s) => {
        const sheet = engine.getSheetId(s.name)!;
        const values: ValueEntry[] = [];
        for (const [row, col] of candidateCells(engine, sheet, s.cells)) {
          const value = toComputed(engine.getCellValue({ sheet, row, col }));
          if (value !== null && value !== '') values.push([row, col, value]);
        }
        return { id: s.id, name: s.name, values };
      }),
    };
  } finally {
    engine.destroy();
  }
}
