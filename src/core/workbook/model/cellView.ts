// What one grid cell shows: the stored input, the computed value formatted for reading, and for an
// error its message ("unknown element 'Xq'"). Pure, so display rules are tested without a browser.
import { DetailedCellError, type CellValue } from 'hyperformula';
import { explainCellError } from '@functions/cellErrors.js';
import { isPendingMessage } from '@functions/structureResults.js';
import { valueView, type CellView, type Precision } from './valueView.js';

export { formatNumber, type CellKind, type CellView, type Precision } from './valueView.js';

export function cellView(input: string, value: CellValue, precision: Precision, spilled = false): CellView | undefined {
  // Waiting for a result computed on the server: not an error, and shown as such.
  if (value instanceof DetailedCellError && isPendingMessage(value.message)) return { input, display: 'computing…', kind: 'pending', value: null, spilled };
  if (value instanceof DetailedCellError) {
    return { input, display: value.value, kind: 'error', value: value.value, errorCode: value.value, errorMessage: explainCellError(value, input), spilled };
  }
  return valueView(input, value, precision, spilled);
}
