// Counts a CSV's non-empty fields and its widest row straight from the bytes, before any worker is
// given the file: a 20 MB upload of ten million one-character cells is then refused in tens of
// milliseconds instead of filling a reader's heap first. The delimiter, quote and line breaks are
// ASCII, so the count is the same for UTF-8 and Windows-1252 text (RFC 4180 quoting).
import { SpreadsheetError, type ImportLimits } from './limits.js';

export function decodeText(buffer: Uint8Array, notes: string[]): string {
  try {
    return new TextDecoder('utf-8', { fatal: true, ignoreBOM: false }).decode(buffer);
  } catch {
    notes.push('the file is not valid UTF-8; it was read as Windows-1252');
    return new TextDecoder('windows-1252').decode(buffer);
  }
}

/** The delimiter that splits the first line into the most fields (outside quotes). */
export function guessDelimiter(text: string, ext: string): string {
  if (ext === 'tsv') return '\t';
  const counts: Record<string, number> = { ',': 0, ';': 0, '\t': 0 };
  let quoted = false;
  for (const ch of text.slice(0, 64 * 1024)) {
    if (ch === '"') quoted = !quoted;
    else if (!quoted && (ch === '\n' || ch === '\r')) break;
    else if (!quoted && ch in counts) counts[ch]++;
  }
  const [best, count] = Object.entries(counts).sort((a, b) => b[1] - a[1])[0];
  return count > 0 ? best : ',';
}

/** The widest row the CSV reader (exceljs) can hold; wider rows are refused with our own message. */
export const maxCsvFieldsPerRow = 16_384;

const QUOTE = 0x22;
const CR = 0x0d;
const LF = 0x0a;

export interface CsvShape {
  /** Fields with content: what the reader would keep as cells (exact unless `stopped`). */
  cells: number;
  /** The count passed `stopAfterCells` and the scan stopped there. */
  stopped: boolean;
  widestRow: { row: number; fields: number };
}

/**
 * One pass over the bytes with no call per field; it stops once the count passes `stopAfterCells`,
 * since the answer is known by then.
 */
export function csvShape(bytes: Uint8Array, delimiter: string, stopAfterCells = Infinity): CsvShape {
  const delim = delimiter.charCodeAt(0);
  let cells = 0;
  let fields = 0; // in the current row, counting empty ones (they still move later fields right)
  let row = 0;
  let widestRow = 0;
  let widestFields = 0;
  let quoted = false;
  let content = 0; // bytes of the current field other than its enclosing quotes
  let quotes = 0;
  let lineHasAny = false;
  let stopped = false;
  const n = bytes.length;
  const bom = bytes[0] === 0xef && bytes[1] === 0xbb && bytes[2] === 0xbf ? 3 : 0;
  for (let i = bom; i < n; i++) {
    const b = bytes[i];
    if (b === QUOTE) {
      quoted = !quoted;
      quotes++;
      lineHasAny = true;
    } else if (quoted) content++;
    else if (b === delim) {
      // A field of two quotes alone is empty; four quotes are one quote character.
      if (content > 0 || quotes >= 4) cells++;
      fields++;
      content = 0;
      quotes = 0;
      lineHasAny = true;
    } else if (b === LF || b === CR) {
      if (lineHasAny || content > 0) {
        if (content > 0 || quotes >= 4) cells++;
        fields++;
        content = 0;
        quotes = 0;
      }
      if (b === CR && bytes[i + 1] === LF) i++;
      if (fields > widestFields) {
        widestFields = fields;
        widestRow = row;
      }
      fields = 0;
      row++;
      lineHasAny = false;
      if (cells > stopAfterCells) {
        stopped = true;
        break;
      }
    } else {
      content++;
      lineHasAny = true;
    }
  }
  if (!stopped && (lineHasAny || content > 0)) {
    if (content > 0 || quotes >= 4) cells++;
    fields++;
    if (fields > widestFields) {
      widestFields = fields;
      widestRow = row;
    }
  }
  return { cells, stopped, widestRow: { row: widestRow, fields: widestFields } };
}

/** Refuses a CSV with more cells than the limit or a row wider than the reader holds, naming both. */
export function checkCsvShape(bytes: Uint8Array, delimiter: string, limits: ImportLimits, gridColumns: number): void {
  // Counting stops at twice the limit: the refusal is certain by then, and a 20 MB file of tiny
  // cells is not read to its end on the server's main thread.
  const shape = csvShape(bytes, delimiter, 2 * limits.maxCells);
  if (shape.cells > limits.maxCells) {
    throw new SpreadsheetError('too_many_cells', `the file has ${shape.stopped ? 'more than ' : ''}${shape.cells.toLocaleString('en')} cells with content; the limit is ${limits.maxCells.toLocaleString('en')}`);
  }
  if (shape.widestRow.fields > maxCsvFieldsPerRow) {
    throw new SpreadsheetError(
      'too_many_columns',
      `row ${(shape.widestRow.row + 1).toLocaleString('en')} has ${shape.widestRow.fields.toLocaleString('en')} fields; Orbitab reads at most ${maxCsvFieldsPerRow.toLocaleString('en')} fields in a row of a CSV, and its grid has ${gridColumns.toLocaleString('en')} columns`,
    );
  }
}
