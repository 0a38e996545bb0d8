// Workbook → .xlsx with exceljs's streaming writer, so a large workbook goes out row by row. The
// engine computes everything once; each formula is written with its value cached beside it, or
// ("values") only the values. The first sheet is the provenance page (frontSheet.ts).
import type { Writable } from 'node:stream';
import ExcelJS from 'exceljs';
import { parseRangeName, rangeArea, rangeName, type CellRange } from '../../shared/a1.js';
import { computeWorkbook, type ComputedCell, type ComputedWorkbook } from './engineValues.js';
import { directWritable, DirectRows, effectiveTypeOf, type DirectValue } from './directRows.js';
import { writeAboutSheet } from './frontSheet.js';
import { applyProtection, describeProtection, type CellProtectionPlan } from './protection.js';
import { fileLayoutOf } from './sheetSettings.js';
import { xlsxScalar } from './xlsxValues.js';
import { ABOUT_SHEET_NAME, WORKBOOK_CREATOR, type ExportMode, type ExportSheet, type ExportWorkbook } from './types.js';

export interface WriteOptions {
  mode: ExportMode;
  /** `cli recalc --no-about-sheet` leaves the provenance page out (pipelines that count sheets). */
  aboutSheet?: boolean;
  /** false: every row through exceljs's own cell objects (tests compare the two ways). */
  directRows?: boolean;
}

/** Rows written between pauses that let the event loop (and the response stream) breathe. */
const ROWS_PER_SLICE = 2_000;
const MAX_ERROR_NOTES_PER_SHEET = 1_000;
const yieldToEventLoop = () => new Promise<void>((resolve) => setImmediate(resolve));

/** Sheet names in the file: at most 31 characters, none of [ ] : * ? / \, unique ignoring case (common practice). */
export function fileSheetNames(names: string[], reserved: string[] = []): string[] {
  const taken = new Set(reserved.map((n) => n.toLowerCase()));
  return names.map((name) => {
    const base = name.replace(/[[\]:*?/\\]/g, '_').slice(0, 31) || 'Sheet';
    let candidate = base;
    for (let n = 2; taken.has(candidate.toLowerCase()); n++) candidate = `${base.slice(0, 31 - ` (${n})`.length)} (${n})`;
    taken.add(candidate.toLowerCase());
    return candidate;
  });
}

function cellValueFor(cell: ComputedCell, mode: ExportMode): { value: ExcelJS.CellValue; numFmt?: string; note?: string } {
  const scalar = xlsxScalar(cell);
  const note = scalar.errorMessage;
  if (mode === 'formulas' && cell.input?.startsWith('=')) {
    const formula: ExcelJS.CellFormulaValue & { shareType?: 'array'; ref?: string } = { formula: cell.input.slice(1), date1904: false, result: scalar.value ?? undefined } as never;
    if (cell.spill && (cell.spill.rows > 1 || cell.spill.cols > 1)) {
      formula.shareType = 'array';
      formula.ref = rangeName({ top: cell.row, left: cell.col, bottom: cell.row + cell.spill.rows - 1, right: cell.col + cell.spill.cols - 1 });
    }
    return { value: formula as ExcelJS.CellValue, numFmt: scalar.numFmt, note };
  }
  return { value: scalar.value as ExcelJS.CellValue, numFmt: scalar.numFmt, note };
}

/** Merges are kept unless an input sits in a non-anchor cell (a merge would hide it) or they overlap. */
function writableMerges(sheet: ExportSheet, merged: string[], omissions: string[], fileName: string): CellRange[] {
  const kept: CellRange[] = [];
  for (const text of merged) {
    const r = parseRangeName(String(text));
    if (!r || rangeArea(r) < 2) continue;
    const overlaps = kept.some((k) => k.top <= r.bottom && r.top <= k.bottom && k.left <= r.right && r.left <= k.right);
    const hides = sheet.cells.some(([row, col]) => row >= r.top && row <= r.bottom && col >= r.left && col <= r.right && (row !== r.top || col !== r.left));
    if (overlaps || hides) omissions.push(`${fileName}!${rangeName(r)}: merge not written (${overlaps ? 'it overlaps another merge' : 'cells inside it hold values'})`);
    else kept.push(r);
  }
  return kept;
}

/** Computes the workbook with the engine, writes it, and returns what was computed (the CLI reports errors from it). */
export async function writeWorkbookXlsx(output: Writable, data: ExportWorkbook, options: WriteOptions): Promise<ComputedWorkbook> {
  const computed = computeWorkbook(data.sheets.map((s) => ({ name: s.name, cells: s.cells })));
  await writeComputedXlsx(output, data, computed, options);
  return computed;
}

/** The writing half: `computed` must come from computeWorkbook over `data.sheets`, in order. */
export async function writeComputedXlsx(output: Writable, data: ExportWorkbook, computed: ComputedWorkbook, options: WriteOptions): Promise<void> {
  const { mode } = options;
  const withAbout = options.aboutSheet !== false;
  const names = fileSheetNames(
    data.sheets.map((s) => s.name),
    withAbout ? [ABOUT_SHEET_NAME] : [],
  );

  const wb = new ExcelJS.stream.xlsx.WorkbookWriter({ stream: output, useStyles: true, useSharedStrings: true } as Partial<ExcelJS.stream.xlsx.WorkbookWriterOptions>);
  wb.creator = WORKBOOK_CREATOR;
  wb.lastModifiedBy = data.exportedBy;
  wb.created = data.exportedAt;
  wb.modified = data.exportedAt;

  const styles = new SharedStyles();
  const omissions: string[] = [];
  const protection = data.sheets.flatMap((s, i) => describeProtection(names[i], s));
  if (withAbout) {
    const about = wb.addWorksheet(ABOUT_SHEET_NAME);
    await writeAboutSheet(about, {
      workbook: data,
      mode,
      functionsUsed: computed.functionsUsed,
      sheets: data.sheets.map((s, i) => ({ name: names[i], originalName: s.name, cells: computed.sheets[i].cells.length })),
      protection,
      omissions,
    });
  }

  for (let i = 0; i < data.sheets.length; i++) {
    const sheet = data.sheets[i];
    const { columnWidths: widths, frozenRows, frozenCols, merged } = fileLayoutOf(sheet.settings);
    const ws = wb.addWorksheet(names[i], {
      views: frozenRows || frozenCols ? [{ state: 'frozen', xSplit: frozenCols, ySplit: frozenRows }] : [],
    });
    const plan: CellProtectionPlan = await applyProtection(ws, sheet);
    const lastWidthCol = Math.max(-1, ...Object.keys(widths).map(Number));
    if (lastWidthCol >= 0 || plan.columnLocks.length) {
      ws.columns = Array.from({ length: Math.max(lastWidthCol + 1, plan.columnLocks.length) }, (_, c) => {
        const column: Partial<ExcelJS.Column> = {};
        if (widths[c] > 0) column.width = widths[c];
        if (plan.columnLocks.length) column.style = { protection: { locked: plan.columnLocks[c] ?? true } };
        return column;
      });
    }
    for (const m of writableMerges(sheet, merged, omissions, names[i])) ws.mergeCells(m.top + 1, m.left + 1, m.bottom + 1, m.right + 1);

    // Rows go straight into the sheet's XML (directRows.ts) unless they carry a note, exceljs still
    // holds rows of a merge, or the sheet has column styles (its cells take them per cell).
    const direct = options.directRows !== false && plan.columnLocks.length === 0 ? DirectRows.for(ws) : null;
    let notes = 0;
    let rowsInSlice = 0;
    const cells = plan.extraLockedCells.length ? mergeLockedCells(computed.sheets[i].cells, plan.extraLockedCells) : computed.sheets[i].cells;
    const rowValues: ReturnType<typeof cellValueFor>[] = [];
    for (let start = 0; start < cells.length; ) {
      const rowIndex = cells[start].row;
      let end = start;
      while (end < cells.length && cells[end].row === rowIndex) end++;
      if (++rowsInSlice >= ROWS_PER_SLICE) {
        rowsInSlice = 0;
        await yieldToEventLoop();
      }
      rowValues.length = 0;
      let straight = direct?.ready ?? false;
      for (let k = start; k < end; k++) {
        const v = cellValueFor(cells[k], mode);
        rowValues.push(v);
        if (straight && ((v.note && notes < MAX_ERROR_NOTES_PER_SHEET) || !directWritable(v.value))) straight = false;
      }
      if (straight) {
        for (let k = start; k < end; k++) {
          const cell = cells[k];
          const { value, numFmt } = rowValues[k - start];
          const locked = plan.isLocked ? plan.isLocked(cell.row, cell.col) : undefined;
          direct!.cell(cell.col + 1, value as DirectValue, styles.get(numFmt, locked, effectiveTypeOf(value as DirectValue)));
        }
        direct!.endRow(rowIndex + 1);
      } else {
        const row = ws.getRow(rowIndex + 1);
        for (let k = start; k < end; k++) {
          const cell = cells[k];
          const target = row.getCell(cell.col + 1);
          const { value, numFmt, note } = rowValues[k - start];
          target.value = value;
          const locked = plan.isLocked ? plan.isLocked(cell.row, cell.col) : undefined;
          if (isPlainStyle(target.style)) target.style = styles.get(numFmt, locked, target.effectiveType);
          else {
            if (numFmt) target.numFmt = numFmt;
            if (locked !== undefined) target.protection = { locked };
          }
          if (note && notes < MAX_ERROR_NOTES_PER_SHEET) {
            target.note = note;
            notes++;
          }
        }
        row.commit();
      }
      start = end;
    }
    await ws.commit();
  }
  await wb.commit();
}

/**
 * One style object per distinct (number format, locked, value type). exceljs gives every new cell
 * its own empty style object and, when writing, turns each style object it has not seen into XML to
 * find its index — for 100,000 cells that was a quarter of the writer's time. Shared objects hit its
 * cache. The value type is part of the key because exceljs picks a default format by type the first
 * time it sees an object. The objects are never mutated (cells only ever get a whole one assigned).
 */
class SharedStyles {
  private byKey = new Map<string, Partial<ExcelJS.Style>>();
  get(numFmt: string | undefined, locked: boolean | undefined, type: ExcelJS.ValueType | number): Partial<ExcelJS.Style> {
    const key = `${numFmt ?? ''}\u0000${locked ?? ''}\u0000${type}`;
    let style = this.byKey.get(key);
    if (!style) {
      style = {};
      if (numFmt) style.numFmt = numFmt;
      if (locked !== undefined) style.protection = { locked };
      this.byKey.set(key, Object.freeze(style));
    }
    return style;
  }
}

/** A cell that took no row or column style: the shared objects above can stand in for its style. */
function isPlainStyle(style: Partial<ExcelJS.Style> | undefined): boolean {
  if (!style) return true;
  for (const _ in style) return false;
  return true;
}

/** Empty cells inside protected ranges must exist in the file to carry their "locked" flag. */
function mergeLockedCells(cells: ComputedCell[], extra: { row: number; col: number }[]): ComputedCell[] {
  const have = new Set(cells.map((c) => `${c.row},${c.col}`));
  const empties = extra.filter((e) => !have.has(`${e.row},${e.col}`)).map((e): ComputedCell => ({ row: e.row, col: e.col, value: null }));
  return [...cells, ...empties].sort((a, b) => a.row - b.row || a.col - b.col);
}
