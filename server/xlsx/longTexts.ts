// A text value too long to send or write is replaced by a cell error before anything serialises it:
// a formula such as REPT("ab", 200000000) makes a 400-million-character text cheaply (the engine
// keeps it as a rope), but flattening it for JSON or XML needs one allocation of that size, which a
// worker's heap limit does not always catch (V8 may abort the whole process instead).
import { CellError, DetailedCellError, ErrorType, type CellValue } from 'hyperformula';
import type { ValuesPayload } from '../../shared/workbooks.js';
import type { ComputedWorkbook } from './engineValues.js';

/** The longest text a computed cell may hold in an answer or a file (xlsx cells hold 32,767; common practice). */
export const maxComputedTextChars = 1_000_000;
/** Text over all cells of one answer. */
export const maxComputedTextTotal = 50_000_000;

const tooLong = (length: number) => `the text is ${length.toLocaleString('en')} characters long; at most ${maxComputedTextChars.toLocaleString('en')} can be shown or exported`;
const overTotal = () => `the workbook's texts together pass ${maxComputedTextTotal.toLocaleString('en')} characters; this one and later ones are left out`;

/** Returns the replacement for a value, counting into `total`, or the value itself. */
function checked<T>(value: T, total: { chars: number }, asError: (message: string) => T): T {
  if (typeof value !== 'string') return value;
  if (value.length > maxComputedTextChars) return asError(tooLong(value.length));
  total.chars += value.length;
  if (total.chars > maxComputedTextTotal) return asError(overTotal());
  return value;
}

export function capValuesPayload(payload: ValuesPayload): ValuesPayload {
  const total = { chars: 0 };
  for (const sheet of payload.sheets) {
    for (const entry of sheet.values) entry[2] = checked(entry[2], total, (message) => ({ error: '#VALUE!', message }));
  }
  return payload;
}

export function capComputedWorkbook(workbook: ComputedWorkbook): ComputedWorkbook {
  const total = { chars: 0 };
  for (const sheet of workbook.sheets) {
    for (const cell of sheet.cells) {
      cell.value = checked<CellValue>(cell.value, total, (message) => new DetailedCellError(new CellError(ErrorType.VALUE, message), '#VALUE!'));
    }
  }
  return workbook;
}
