// Engine values → exceljs cell values. Errors outside the seven the file format defines are mapped
// to the nearest of those seven (ECMA-376 Part 1, §18.17.7.8 "error" literals — from memory).
import type ExcelJS from 'exceljs';
import { isoDateText } from './cellInput.js';
import { isEngineError, type ComputedCell } from './engineValues.js';

const FILE_ERRORS = new Set(['#NULL!', '#DIV/0!', '#VALUE!', '#REF!', '#NAME?', '#NUM!', '#N/A']);
const ENGINE_ONLY_ERRORS: Record<string, string> = {
  '#ERROR!': '#NAME?', // a formula the engine could not parse
  '#SPILL!': '#REF!', // an array result blocked by other cells
  '#CYCLE!': '#REF!', // a circular reference
  '#LIC!': '#VALUE!',
};

export function fileErrorLiteral(engineLiteral: string): string {
  return FILE_ERRORS.has(engineLiteral) ? engineLiteral : (ENGINE_ONLY_ERRORS[engineLiteral] ?? '#VALUE!');
}

// Serial day 25569 is 1970-01-01 in the 1900 date system used by the engine and by .xlsx (serials
// count from 1899-12-30 once past February 1900 — common practice, the "1900 leap-year" rule).
const UNIX_EPOCH_SERIAL = 25569;
const MS_PER_DAY = 86_400_000;
const FIRST_SAFE_DATE_MS = Date.UTC(1900, 2, 1);

export function serialToDate(serial: number): Date {
  return new Date(Math.round((serial - UNIX_EPOCH_SERIAL) * MS_PER_DAY));
}

const ISO_DATE = /^\d{4}-\d{2}-\d{2}(?:T\d{2}:\d{2}:\d{2}(?:\.\d{3})?)?$/;

/** ISO-8601 text as the importer writes it ("2024-03-01", "2024-03-01T14:30:00") → a Date, else null. */
export function isoTextToDate(text: string): Date | null {
  if (!ISO_DATE.test(text)) return null;
  const date = new Date(text.length === 10 ? `${text}T00:00:00Z` : `${text}Z`);
  if (Number.isNaN(date.getTime()) || date.getTime() < FIRST_SAFE_DATE_MS) return null;
  return isoDateText(date) === text ? date : null; // refuses 2024-02-30 and the like
}

export function dateFormatFor(date: Date, kind: 'date' | 'time' | 'datetime' = 'datetime'): string {
  if (kind === 'time') return 'hh:mm:ss';
  const ms = date.getUTCMilliseconds();
  const midnight = date.getUTCHours() === 0 && date.getUTCMinutes() === 0 && date.getUTCSeconds() === 0 && ms === 0;
  if (kind === 'date' || midnight) return 'yyyy-mm-dd';
  return ms ? 'yyyy-mm-dd hh:mm:ss.000' : 'yyyy-mm-dd hh:mm:ss';
}

const PLAIN_NUMBER = /^\s*[+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?\s*$/;

/**
 * The number a typed literal denotes. The engine's own text-to-number parse can land one unit in the
 * last place away ("6.02214076e+23" → 6.0221407600000005e+23), so files carry the exact double.
 */
export function literalNumber(input: string | undefined): number | null {
  if (input === undefined || !PLAIN_NUMBER.test(input)) return null;
  const n = Number(input);
  return Number.isFinite(n) ? n : null;
}

export interface XlsxScalar {
  value: number | string | boolean | Date | ExcelJS.CellErrorValue | null;
  numFmt?: string;
  /** The engine's explanation of an error, kept as a cell note. */
  errorMessage?: string;
}

/** A computed value as a plain (non-formula) xlsx value. */
export function xlsxScalar(cell: ComputedCell): XlsxScalar {
  const v = cell.value;
  if (v === null || v === undefined) return { value: null };
  if (isEngineError(v)) return { value: { error: fileErrorLiteral(v.value) as ExcelJS.ErrorValue }, errorMessage: v.message || undefined };
  if (typeof v === 'number') {
    if (cell.dateKind) {
      const date = serialToDate(v);
      return { value: date, numFmt: dateFormatFor(date, cell.dateKind) };
    }
    return { value: literalNumber(cell.input) ?? v };
  }
  if (typeof v === 'string') {
    const date = isoTextToDate(v);
    if (date) return { value: date, numFmt: dateFormatFor(date) };
    return { value: v };
  }
  if (typeof v === 'boolean') return { value: v };
  return { value: String(v) };
}
