// Sheet layout between the file and Orbitab's stored sheet settings. The grid stores column widths in
// CSS pixels and a `freezeHeaderRow` flag (src/features/grid/model/displaySettings.ts); the file
// stores widths in characters of the default font and a frozen pane of rows × columns. We keep the
// grid's fields and add `frozenRows`, `frozenCols` and `merged` so an export gives back what came in.
import { maxColIndex, maxRowIndex, parseRangeName } from '../../shared/a1.js';
import { maxColumnWidthPx, maxSheetSettingsBytes, sheetSettingsSchema, type SheetSettings } from '../../shared/sheetSettings.js';
import type { ParsedSheet } from './types.js';

// Column width ↔ pixels, ECMA-376 Part 1 §18.3.1.13 (from memory): pixels =
// Truncate(((256·width + Truncate(128/MDW)) / 256) · MDW), with a maximum digit width (MDW) of 7 px
// for the default 11-point font at 96 dpi.
const MAX_DIGIT_WIDTH_PX = 7;

export function excelWidthToPx(width: number): number {
  return Math.trunc(((256 * width + Math.trunc(128 / MAX_DIGIT_WIDTH_PX)) / 256) * MAX_DIGIT_WIDTH_PX);
}

/** The inverse, rounded to the 1/256 character the format stores; excelWidthToPx gives the same pixels back. */
export function pxToExcelWidth(px: number): number {
  return Math.round((px / MAX_DIGIT_WIDTH_PX) * 256) / 256;
}

const wholeAtLeastZero = (n: unknown) => (typeof n === 'number' && Number.isInteger(n) && n > 0 ? n : 0);

/**
 * Stored settings for an imported sheet, within what the API accepts (shared/sheetSettings.ts), so
 * the grid can save them back unchanged; what did not fit is noted.
 */
export function settingsFromParsed(sheet: ParsedSheet, notes: string[]): SheetSettings {
  const columnWidths: Record<string, number> = {};
  for (const [col, width] of Object.entries(sheet.columnWidths)) {
    if (Number(col) <= maxColIndex && width > 0) columnWidths[col] = Math.min(excelWidthToPx(width), maxColumnWidthPx);
  }
  const settings: SheetSettings = { columnWidths, freezeHeaderRow: sheet.frozenRows >= 1 };
  if (sheet.frozenRows) settings.frozenRows = Math.min(sheet.frozenRows, maxRowIndex);
  if (sheet.frozenCols) settings.frozenCols = Math.min(sheet.frozenCols, maxColIndex);
  // Merges reaching past the grid cover cells the import skipped anyway.
  const inGrid = sheet.merged.filter((m) => {
    const r = parseRangeName(m);
    return r !== null && r.bottom <= maxRowIndex && r.right <= maxColIndex;
  });
  if (inGrid.length < sheet.merged.length) notes.push(`sheet "${sheet.name}": ${sheet.merged.length - inGrid.length} merged ranges reaching past Orbitab's grid were dropped`);
  if (inGrid.length) settings.merged = inGrid;
  const size = () => JSON.stringify(settings).length;
  if (size() > maxSheetSettingsBytes && Array.isArray(settings.merged)) {
    const merged = settings.merged as string[];
    while (merged.length && size() > maxSheetSettingsBytes) merged.pop();
    notes.push(`sheet "${sheet.name}": only the first ${merged.length} of ${sheet.merged.length} merged ranges were kept (settings are limited to ${maxSheetSettingsBytes} bytes)`);
  }
  if (size() > maxSheetSettingsBytes) {
    const cols = Object.keys(columnWidths).map(Number).sort((a, b) => b - a);
    for (const col of cols) {
      if (size() <= maxSheetSettingsBytes) break;
      delete columnWidths[col];
    }
    notes.push(`sheet "${sheet.name}": only the widths of the first ${Object.keys(columnWidths).length} columns were kept`);
  }
  // The reader's own limits (server/xlsx/limits.ts) keep merges within the schema's; a file that
  // still slips past keeps its cells and loses its layout rather than storing what the API refuses.
  if (!sheetSettingsSchema.safeParse(settings).success) {
    notes.push(`sheet "${sheet.name}": column widths, frozen panes and merged ranges were not kept (they exceed what a sheet may hold)`);
    return {};
  }
  return settings;
}

export interface FileLayout {
  /** Zero-based column → width in characters. */
  columnWidths: Record<number, number>;
  frozenRows: number;
  frozenCols: number;
  merged: string[];
}

/** What the writer needs from stored settings, tolerating anything malformed (it is user data). */
export function fileLayoutOf(settings: SheetSettings | undefined): FileLayout {
  const s = (settings ?? {}) as Record<string, unknown>;
  const columnWidths: Record<number, number> = {};
  if (s.columnWidths && typeof s.columnWidths === 'object') {
    for (const [k, v] of Object.entries(s.columnWidths as Record<string, unknown>)) {
      const col = Number(k);
      if (Number.isInteger(col) && col >= 0 && typeof v === 'number' && Number.isFinite(v) && v > 0) columnWidths[col] = pxToExcelWidth(v);
    }
  }
  const frozenRows = typeof s.frozenRows === 'number' ? wholeAtLeastZero(s.frozenRows) : s.freezeHeaderRow === true ? 1 : 0;
  const merged = Array.isArray(s.merged) ? s.merged.filter((m): m is string => typeof m === 'string' && parseRangeName(m) !== null) : [];
  return { columnWidths, frozenRows: s.freezeHeaderRow === false ? 0 : frozenRows, frozenCols: wholeAtLeastZero(s.frozenCols), merged };
}
