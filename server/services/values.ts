// Values computed on the server with the engine the browser builds too (functions/workbookEngine.ts), for
// integrations and export. Only non-empty values are returned, as [row, col, value] per sheet.
import { DetailedCellError, type CellValue, type HyperFormula } from 'hyperformula';
import { explainCellError } from '../../functions/cellErrors.js';
import '../../functions/openchemlibNode.js';
import { arrayAreaAt, buildWorkbookEngine } from '../../functions/workbookEngine.js';
import type { ComputedValue, SheetPayload, ValueEntry, ValuesPayload, WorkbookPayload } from '../../shared/workbooks.js';

function toComputed(value: CellValue, formula?: () => string | undefined): ComputedValue | null {
  if (value === null || value === undefined) return null;
  if (value instanceof DetailedCellError) return { error: value.value, message: explainCellError(value, formula?.()) };
  return value;
}

/**
 * The cells that can hold a value: every input cell, plus the cells an array formula spills into
 * (the area each array formula fills, functions/workbookEngine.ts arrayAreaAt).
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
  for (const [row, col] of cells) {
    add(row, col);
    const area = arrayAreaAt(engine, { sheet, row, col });
    if (area) for (let r = row; r < row + area.rows; r++) for (let c = col; c < col + area.cols; c++) add(r, c);
  }
  return out.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/** What computing values needs of a workbook: its revision and each sheet's id, name and cells. */
export interface ValuesInput {
  revision: number;
  sheets: Pick<SheetPayload, 'id' | 'name' | 'cells'>[];
}

export function computeValues(workbook: ValuesInput): ValuesPayload {
  const engine = buildWorkbookEngine(workbook.sheets);
  try {
    return {
      revision: workbook.revision,
      sheets: workbook.sheets.map((s) => {
        const sheet = engine.getSheetId(s.name)!;
        const values: ValueEntry[] = [];
        for (const [row, col] of candidateCells(engine, sheet, s.cells)) {
          const value = toComputed(engine.getCellValue({ sheet, row, col }), () => engine.getCellFormula({ sheet, row, col }));
          if (value !== null && value !== '') values.push([row, col, value]);
        }
        return { id: s.id, name: s.name, values };
      }),
    };
  } finally {
    engine.destroy();
  }
}
