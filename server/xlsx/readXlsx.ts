// .xlsx → sheets of cell inputs, after the zip guard has passed the file.
import ExcelJS from 'exceljs';
import { engineConfig } from '../../functions/engine.js';
import { cellName, parseRangeName, type CellRange } from '../../shared/a1.js';
import { readCell } from './cellInput.js';
import { SpreadsheetError, type ImportLimits } from './limits.js';
import { asTextInput, textsNeedingApostrophe } from './textLiterals.js';
import { ABOUT_SHEET_MARK, ABOUT_SHEET_NAME, WORKBOOK_CREATOR, type CellTriple, type ParsedSheet, type ParsedWorkbook, type SkippedCell } from './types.js';
import { inspectXlsxZip } from './zipGuard.js';

// Parts Orbitab does not import. Skipping them also keeps exceljs from expanding a data-validation
// rule cell by cell (a whole-sheet rule is 17 billion cells).
const IGNORED_NODES = ['dataValidations', 'conditionalFormatting', 'extLst', 'drawing', 'legacyDrawing', 'picture', 'tableParts', 'rowBreaks', 'colBreaks', 'headerFooter'];

const MAX_LISTED_NOTES = 50;
const maxRows = engineConfig.maxRows!;
const maxColumns = engineConfig.maxColumns!;

interface PendingText {
  sheet: ParsedSheet;
  index: number;
  text: string;
}

/** Cells handed to `onCells` at a time while reading (readSpreadsheet's streaming mode). */
export const CELLS_PER_BATCH = 8_192;

/**
 * Receives each sheet's cells in order, a batch at a time, as they are read: the caller can store one
 * batch while the next is read. `sheet` counts the sheets of the result (the provenance page skipped).
 */
export type CellBatchSink = (sheet: number, cells: CellTriple[]) => void;

export async function readXlsx(buffer: Buffer, limits: ImportLimits, onCells?: CellBatchSink): Promise<ParsedWorkbook> {
  const started = performance.now();
  await inspectXlsxZip(buffer, limits);
  const guardedAt = performance.now();
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.load(buffer as unknown as ArrayBuffer, { ignoreNodes: IGNORED_NODES } as never);
  } catch (e) {
    throw new SpreadsheetError('damaged_file', `the workbook's XML could not be read (${e instanceof Error ? e.message : String(e)})`);
  }

  const loadedAt = performance.now();
  const sheets: ParsedSheet[] = [];
  const skipped: SkippedCell[] = [];
  const notes: string[] = [];
  const pending: PendingText[] = [];
  let cellCount = 0;
  let formulas = 0;

  for (const ws of workbook.worksheets) {
    if (isOrbitabAboutSheet(workbook, ws)) {
      notes.push(`sheet "${ws.name}" is the provenance page of an Orbitab export and was not imported as data`);
      continue;
    }
    if (ws.state && ws.state !== 'visible') notes.push(`sheet "${ws.name}" was hidden in the file; it is imported visible`);
    const sheet: ParsedSheet = { name: ws.name, cells: [], columnWidths: columnWidthsOf(ws), ...frozenPaneOf(ws), merged: mergedRangesOf(ws) };
    const arrays: CellRange[] = [];
    const sheetIndex = sheets.length;
    let sent = 0;
    // A batch goes out once its texts know whether they need an apostrophe.
    const flush = () => {
      resolveTexts(pending);
      pending.length = 0;
      onCells!(sheetIndex, sheet.cells.slice(sent));
      sent = sheet.cells.length;
    };

    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      row.eachCell({ includeEmpty: false }, (cell, colNumber) => {
        const r = rowNumber - 1;
        const c = colNumber - 1;
        const reading = readCell(cell);
        if (reading.kind === 'empty' || reading.kind === 'merged') return;
        // Cells inside an array formula's area are its spilled results, recomputed by the engine.
        if (arrays.length && arrays.some((a) => r >= a.top && r <= a.bottom && c >= a.left && c <= a.right && !(r === a.top && c === a.left))) return;
        if (r >= maxRows || c >= maxColumns) {
          skipped.push({ sheet: ws.name, address: cellName(r, c), reason: `outside Orbitab's grid of ${maxRows.toLocaleString('en')} rows × ${maxColumns.toLocaleString('en')} columns` });
          return;
        }
        if (reading.kind === 'skip') {
          skipped.push({ sheet: ws.name, address: cellName(r, c), reason: reading.reason });
          return;
        }
        cellCount++;
        if (reading.kind === 'text') {
          pending.push({ sheet, index: sheet.cells.length, text: reading.text });
          sheet.cells.push([r, c, '']);
          if (reading.note && notes.length < MAX_LISTED_NOTES) notes.push(`${ws.name}!${cellName(r, c)}: ${reading.note}`);
          return;
        }
        if (reading.kind === 'formula') {
          formulas++;
          if (reading.arrayRef) {
            const area = parseRangeName(reading.arrayRef);
            if (area) arrays.push(area);
          }
        }
        sheet.cells.push([r, c, reading.input]);
        if (onCells && sheet.cells.length - sent >= CELLS_PER_BATCH) flush();
      });
    });
    if (onCells) flush();
    sheets.push(sheet);
  }

  if (cellCount > limits.maxCells) {
    throw new SpreadsheetError('too_many_cells', `the workbook has ${cellCount.toLocaleString('en')} cells with content; the limit is ${limits.maxCells.toLocaleString('en')}`);
  }
  resolveTexts(pending);

  const timing = { guardMs: guardedAt - started, loadMs: loadedAt - guardedAt, cellsMs: performance.now() - loadedAt };
  return { sheets, summary: { sheets: sheets.length, cells: cellCount, formulas, skipped, notes }, timing };
}

function resolveTexts(pending: PendingText[]) {
  const quote = textsNeedingApostrophe(pending.map((p) => p.text));
  pending.forEach((p, i) => (p.sheet.cells[p.index][2] = asTextInput(p.text, quote[i])));
}

function isOrbitabAboutSheet(workbook: ExcelJS.Workbook, ws: ExcelJS.Worksheet): boolean {
  return workbook.creator === WORKBOOK_CREATOR && ws.name.startsWith(ABOUT_SHEET_NAME) && ws.getCell('A1').text === ABOUT_SHEET_MARK;
}

function columnWidthsOf(ws: ExcelJS.Worksheet): Record<number, number> {
  const widths: Record<number, number> = {};
  const columns = (ws.columns ?? []) as ExcelJS.Column[];
  columns.forEach((column, i) => {
    if (typeof column?.width === 'number' && Number.isFinite(column.width) && column.width > 0 && i < maxColumns) widths[i] = column.width;
  });
  return widths;
}

function frozenPaneOf(ws: ExcelJS.Worksheet): { frozenRows: number; frozenCols: number } {
  const view = ws.views?.find((v) => v.state === 'frozen') as { xSplit?: number; ySplit?: number } | undefined;
  const whole = (n: unknown) => (typeof n === 'number' && Number.isInteger(n) && n > 0 ? n : 0);
  return { frozenRows: whole(view?.ySplit), frozenCols: whole(view?.xSplit) };
}

function mergedRangesOf(ws: ExcelJS.Worksheet): string[] {
  // exceljs keeps merges in a private map keyed by master address; its public `model` getter would
  // serialise every row to reach them.
  const merges = (ws as unknown as { _merges?: Record<string, { range?: string }> })._merges ?? {};
  return Object.values(merges)
    .map((m) => m?.range)
    .filter((r): r is string => typeof r === 'string' && parseRangeName(r) !== null);
}
