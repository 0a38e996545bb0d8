// The first screenful of a large sheet, computed on its own before the whole workbook's engine is
// built, so people see their first rows with values at once (a viewport-first load). It is used
// only when it is provably the same as the full computation: every formula in the window refers
// only to cells inside the window on the same sheet, with no dynamic references (INDIRECT, OFFSET)
// or names. The full engine replaces it a moment later; the preview is read-only.
import { CellType } from 'hyperformula';
import type { WorkbookPayload } from '@shared/workbooks.js';
import { WorkbookModel, type RowData } from './workbookModel.js';

export interface SheetPreview {
  sheetId: string;
  rows: RowData[];
  colCount: number;
  /** Made from the values stored with the revision (storedPreview.ts), not computed here. */
  stored?: boolean;
}

/** Sheets smaller than this load fast enough whole; a preview would only add work. */
export const previewThresholdCells = 20_000;

/** Formulas whose references can be read statically and stay on the sheet. */
function staticallySafe(formula: string): boolean {
  const noStrings = formula.replace(/"(?:[^"]|"")*"/g, '""');
  if (/\b(INDIRECT|OFFSET)\s*\(/i.test(noStrings)) return false;
  if (noStrings.includes('!')) return false; // another sheet
  return true;
}

export function buildPreview(payload: WorkbookPayload, windowRows = 60): SheetPreview | null {
  const sheet = [...payload.sheets].sort((a, b) => a.position - b.position)[0];
  if (!sheet || sheet.cells.length < previewThresholdCells) return null;
  const cells = sheet.cells.filter(([row]) => row < windowRows);
  if (cells.some(([, , input]) => input.startsWith('=') && !staticallySafe(input))) return null;
  const model = new WorkbookModel({ ...payload, role: 'viewer', sheets: [{ ...sheet, cells }] });
  try {
    const engineId = model.sheet(sheet.id).engineId;
    for (const [row, col, input] of cells) {
      if (!input.startsWith('=')) continue;
      for (const p of model.engine.getCellPrecedents({ sheet: engineId, row, col })) {
        const end = 'end' in p ? p.end : p;
        const start = 'start' in p ? p.start : p;
        if (start.sheet !== engineId || end.sheet !== engineId || Math.max(start.row, end.row) >= windowRows) return null;
      }
      // An array result could be blocked by cells below the window in the full sheet (#SPILL!).
      if (model.engine.getCellType({ sheet: engineId, row, col }) === CellType.ARRAYFORMULA) return null;
      // A name the engine does not know (a named expression) shows as #NAME?: the full workbook may know it.
      const v = model.view(sheet.id, row, col);
      if (v?.errorCode === '#NAME?') return null;
    }
    const rows = model.rows(sheet.id).slice(0, windowRows);
    return { sheetId: sheet.id, rows, colCount: model.sheet(sheet.id).colCount };
  } finally {
    model.dispose();
  }
}

