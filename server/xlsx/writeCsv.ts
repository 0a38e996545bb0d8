// One sheet's computed values as CSV (RFC 4180: comma-separated, CRLF line ends, fields with a comma,
// quote or line break wrapped in double quotes with quotes doubled), UTF-8 with a byte-order mark so
// that spreadsheet programs detect the encoding (common practice).
//
// Formula-injection rule (after OWASP's "CSV Injection" guidance): a text value starting with
// = + - @, a tab or a carriage return gets a leading apostrophe, so no program runs it as a formula
// ("=HYPERLINK(…)" arrives as the text "'=HYPERLINK(…)"). Numbers are written as numbers: "-5" is a
// value, not a formula, and stays "-5". Booleans are TRUE/FALSE, errors their literal (#N/A), dates
// ISO text (2024-03-01, 2024-03-01T14:30:00) and times of day hh:mm:ss. Orbitab's own CSV import reads "'=x" back as the text "=x".
import type { Writable } from 'node:stream';
import type { CellValue } from 'hyperformula';
import { isEngineError, type ComputedCell } from './engineValues.js';
import { literalNumber, serialToDate } from './xlsxValues.js';
import { dateInput } from './cellInput.js';

const FORMULA_TRIGGERS = new Set(['=', '+', '-', '@', '\t', '\r']);
const ROWS_PER_CHUNK = 1_000;

export function escapeFormulaTrigger(text: string): string {
  return text.length > 0 && FORMULA_TRIGGERS.has(text[0]) ? `'${text}` : text;
}

export function csvField(text: string): string {
  return /[",\r\n]/.test(text) ? `"${text.replace(/"/g, '""')}"` : text;
}

export function csvText(cell: Pick<ComputedCell, 'value' | 'dateKind' | 'input'>): string {
  const v: CellValue = cell.value;
  if (v === null || v === undefined) return '';
  if (isEngineError(v)) return v.value;
  if (typeof v === 'boolean') return v ? 'TRUE' : 'FALSE';
  if (typeof v === 'number') {
    if (cell.dateKind) return dateInput(serialToDate(v)) ?? String(v);
    const n = literalNumber(cell.input) ?? v;
    return Object.is(n, -0) ? '0' : String(n);
  }
  return escapeFormulaTrigger(String(v));
}

function waitForDrain(out: Writable): Promise<void> {
  return new Promise((resolve, reject) => {
    const done = () => {
      out.off('drain', done);
      out.off('error', fail);
      out.off('close', done);
      resolve();
    };
    const fail = (e: Error) => {
      out.off('drain', done);
      out.off('close', done);
      reject(e);
    };
    out.once('drain', done);
    out.once('close', done);
    out.once('error', fail);
  });
}

/** Writes the sheet's values (cells sorted by row, then column) and ends the stream. */
export async function writeSheetCsv(out: Writable, cells: ComputedCell[]): Promise<void> {
  const sorted = [...cells].sort((a, b) => a.row - b.row || a.col - b.col);
  let chunk = '\uFEFF';
  let i = 0;
  let rowsInChunk = 0;
  const lastRow = sorted.length ? sorted[sorted.length - 1].row : -1;
  const width = sorted.reduce((w, c) => Math.max(w, c.col + 1), 0);
  for (let row = 0; row <= lastRow; row++) {
    const fields: string[] = new Array(width).fill('');
    for (; i < sorted.length && sorted[i].row === row; i++) fields[sorted[i].col] = csvField(csvText(sorted[i]));
    chunk += fields.join(',') + '\r\n';
    if (++rowsInChunk >= ROWS_PER_CHUNK) {
      rowsInChunk = 0;
      if (!out.write(chunk) && !out.destroyed) await waitForDrain(out);
      chunk = '';
      if (out.destroyed) return;
    }
  }
  if (chunk) out.write(chunk);
  await new Promise<void>((resolve) => out.end(resolve));
}
