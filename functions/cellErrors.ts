// One wording for each spreadsheet error code, for errors the engine raises without a message of its
// own: the grid's cell tooltip, the formula bar and the server's /values all explain a cell with it.
// Our functions' errors carry their own message ("unknown element 'Xq' in 'Xq2'"), which comes first.
import type { DetailedCellError } from 'hyperformula';

/** What each error code means, in plain words (common practice). */
export const cellErrorExplanations: Readonly<Record<string, string>> = {
  '#DIV/0!': 'division by zero',
  '#NAME?': 'unknown function or name',
  '#REF!': 'the formula refers to a cell that no longer exists',
  '#CYCLE!': 'the formula depends on itself (a circular reference)',
  '#SPILL!': 'the array result has no room to spill: clear the cells it needs',
  '#N/A': 'no value available',
  '#NUM!': 'a number is out of range',
  '#VALUE!': 'a value has the wrong type',
  '#ERROR!': 'the formula could not be read',
};

/** The engine's message when it has one, otherwise the plain explanation of the code. */
export function explainCellError(error: DetailedCellError): string {
  const message = error.message?.trim();
  return message ? message : (cellErrorExplanations[error.value] ?? error.value);
}
