// The first screenful of a workbook opened on the values the server stored with its revision, shown
// as soon as the workbook and those values are in: before the engine's set-up, the model's build and
// the workspace's first render, which on a library of a thousand extended-Hückel rows took most of
// a second of a colleague's open. Read-only (PreviewGrid); the workspace replaces it once drawn.
import { maxColIndex } from '@shared/a1.js';
import { inTabOrder } from '@functions/tabOrder.js';
import { firstRowsShown } from '@shared/firstRows.js';
import type { ComputedValue, SheetPayload, ValuesPayload, WorkbookPayload } from '@shared/workbooks.js';
import { EMPTY_ROW, valueView, type CellView, type RowData } from './valueView.js';
import { readDisplaySettings } from './displaySettings.js';
import type { SheetPreview } from './windowPreview.js';

/** Columns shown at least, as the grid does (workbookModel.ts minColsShown). */
const minCols = 26;

/** What a stored value shows: the grid's own view of the same value (cellView.ts); a stored error carries its message. */
function storedView(input: string, value: ComputedValue, precision: number | null): CellView {
  const spilled = input === '';
  if (typeof value === 'object') return { input, display: value.error, kind: 'error', value: value.error, errorCode: value.error, errorMessage: value.message, spilled };
  return valueView(input, value, precision, spilled)!;
}

/**
 * The first sheet's first `windowRows` rows from the stored values, or null when they are not the
 * loaded revision's. `payload` may hold only the first tab and its first rows (GET …/first-rows).
 */
export function storedPreview(
  payload: Pick<WorkbookPayload, 'revision'> & { sheets: Pick<SheetPayload, 'id' | 'position' | 'settings' | 'cells'>[] },
  stored: ValuesPayload,
  windowRows = firstRowsShown,
): SheetPreview | null {
  if (stored.revision !== payload.revision) return null;
  const sheet = inTabOrder(payload.sheets)[0];
  if (!sheet) return null;
  const precision = readDisplaySettings(sheet.settings).precision;
  // Both lists come in reading order (SheetPayload, ValuesPayload), so only their first rows are read:
  // going through every cell of a 100,000-row sheet held the page for a tenth of a second here.
  const inputs = new Map<number, string>();
  let cols = 0;
  for (const [row, col, input] of sheet.cells) {
    if (row >= windowRows) break;
    cols = Math.max(cols, col + 1);
    inputs.set(row * (maxColIndex + 1) + col, input);
  }
  const rows: Record<number, CellView>[] = [];
  for (const [row, col, value] of stored.sheets.find((s) => s.id === sheet.id)?.values ?? []) {
    if (row >= windowRows) break;
    (rows[row] ??= {})[col] = storedView(inputs.get(row * (maxColIndex + 1) + col) ?? '', value, precision);
    cols = Math.max(cols, col + 1);
  }
  const shown: RowData[] = Array.from({ length: windowRows }, (_, r) => rows[r] ?? EMPTY_ROW);
  return { sheetId: sheet.id, rows: shown, colCount: Math.max(minCols, cols + 2), stored: true };
}
