// .xlsx → sheets of cell inputs, after the zip guard has passed the file. The direct reader
// (readXlsxDirect.ts) reads the parts the guard inflated; a file it does not read — an unusual
// layout, a namespace prefix, a feature exceljs reads its own way (see NotDirect's uses) — is read
// by exceljs as before, with the same result shape, notes and refusals.
import ExcelJS from 'exceljs';
import { engineConfig } from '../../functions/engine.js';
import { parseRangeName } from '../../shared/a1.js';
import { readCell } from './cellInput.js';
import { SpreadsheetError, type ImportLimits } from './limits.js';
import { readXlsxDirect, type DirectRead } from './readXlsxDirect.js';
import { CELLS_PER_BATCH, ReadTally, SheetCells, type CellBatchSink } from './sheetCollector.js';
import { ABOUT_SHEET_MARK, ABOUT_SHEET_NAME, WORKBOOK_CREATOR, type ParsedSheet, type ParsedWorkbook } from './types.js';
import { NotDirect } from './xmlText.js';
import { inspectXlsxZip } from './zipGuard.js';

export { CELLS_PER_BATCH, type CellBatchSink };

// Parts Orbitab does not import. Skipping them also keeps exceljs from expanding a data-validation
// rule cell by cell (a whole-sheet rule is 17 billion cells).
const IGNORED_NODES = ['dataValidations', 'conditionalFormatting', 'extLst', 'drawing', 'legacyDrawing', 'picture', 'tableParts', 'rowBreaks', 'colBreaks', 'headerFooter'];

const maxColumns = engineConfig.maxColumns!;

export type XlsxReader = 'direct' | 'exceljs';

export interface XlsxReadOptions {
  /** Tests: read with exceljs even when the direct reader could. */
  reader?: XlsxReader;
}

export async function readXlsx(buffer: Buffer, limits: ImportLimits, onCells?: CellBatchSink, options: XlsxReadOptions = {}): Promise<ParsedWorkbook> {
  const started = performance.now();
  const inspection = await inspectXlsxZip(buffer, limits);
  const guardedAt = performance.now();
  let fallback: string | undefined;
  let read: DirectRead | null = null;
  if (options.reader !== 'exceljs' && inspection.parts) {
    try {
      read = readXlsxDirect(inspection.parts);
    } catch (e) {
      // NotDirect: a file it does not read. Anything else it threw is a shape it did not foresee;
      // exceljs reads the file as it always has (or refuses it in its own words).
      if (e instanceof SpreadsheetError) throw e;
      fallback = e instanceof NotDirect ? e.message : `unexpected: ${e instanceof Error ? e.message : String(e)}`;
    }
  }
  inspection.parts = null;
  if (read) {
    checkCellCount(read.tally, limits);
    // Handed on only now that the whole file has been read.
    if (onCells) {
      read.tally.resolveTexts();
      read.sheets.forEach((sheet, i) => {
        for (let at = 0; at < sheet.cells.length || at === 0; at += CELLS_PER_BATCH) onCells(i, sheet.cells.slice(at, at + CELLS_PER_BATCH));
      });
    }
    return finish(read.sheets, read.tally, limits, { guardMs: guardedAt - started, loadMs: read.partsMs, cellsMs: read.sheetsMs, reader: 'direct' });
  }
  return readWithExceljs(buffer, limits, onCells, guardedAt - started, fallback);
}

function checkCellCount(tally: ReadTally, limits: ImportLimits) {
  if (tally.cellCount > limits.maxCells) {
    throw new SpreadsheetError('too_many_cells', `the workbook has ${tally.cellCount.toLocaleString('en')} cells with content; the limit is ${limits.maxCells.toLocaleString('en')}`);
  }
}

function finish(sheets: ParsedSheet[], tally: ReadTally, limits: ImportLimits, timing: NonNullable<ParsedWorkbook['timing']>): ParsedWorkbook {
  checkCellCount(tally, limits);
  tally.resolveTexts();
  return { sheets, summary: { sheets: sheets.length, cells: tally.cellCount, formulas: tally.formulas, skipped: tally.skipped, notes: tally.notes }, timing };
}

async function readWithExceljs(buffer: Buffer, limits: ImportLimits, onCells: CellBatchSink | undefined, guardMs: number, fallback?: string): Promise<ParsedWorkbook> {
  const loadStart = performance.now();
  const workbook = new ExcelJS.Workbook();
  try {
    await workbook.xlsx.load(buffer as unknown as ArrayBuffer, { ignoreNodes: IGNORED_NODES } as never);
  } catch (e) {
    throw new SpreadsheetError('damaged_file', `the workbook's XML could not be read (${e instanceof Error ? e.message : String(e)})`);
  }

  const loadedAt = performance.now();
  const sheets: ParsedSheet[] = [];
  const tally = new ReadTally();
  for (const ws of workbook.worksheets) {
    if (isOrbitabAboutSheet(workbook, ws)) {
      tally.notes.push(`sheet "${ws.name}" is the provenance page of an Orbitab export and was not imported as data`);
      continue;
    }
    if (ws.state && ws.state !== 'visible') tally.notes.push(`sheet "${ws.name}" was hidden in the file; it is imported visible`);
    const sheet: ParsedSheet = { name: ws.name, cells: [], columnWidths: columnWidthsOf(ws), ...frozenPaneOf(ws), merged: mergedRangesOf(ws) };
    const collector = new SheetCells(tally, sheet, sheets.length, onCells);
    ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
      row.eachCell({ includeEmpty: false }, (cell, colNumber) => collector.take(rowNumber - 1, colNumber - 1, readCell(cell)));
    });
    collector.flush();
    sheets.push(sheet);
  }
  return finish(sheets, tally, limits, { guardMs, loadMs: loadedAt - loadStart, cellsMs: performance.now() - loadedAt, reader: 'exceljs', fallback });
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
