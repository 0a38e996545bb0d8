// One wording for each spreadsheet error code, for errors the engine raises without a message of its
// own: the grid's cell tooltip, the formula bar and the server's /values all explain a cell with it.
// Our functions' errors carry their own message ("unknown element 'Xq' in 'Xq2'"), which comes first.
import type { DetailedCellError } from 'hyperformula';
import { formulaShape } from './formulaShape.js';

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

/**
 * The engine's message when it has one, otherwise the plain explanation of the code. A parse error's
 * message (the parser's token names) is rewritten in plain words naming the position when the
 * formula text is given.
 */
export function explainCellError(error: DetailedCellError, formula?: string): string {
  const message = error.message?.trim();
  if (message?.startsWith('Parsing error')) return explainParseError(message, formula);
  return message ? message : (cellErrorExplanations[error.value] ?? error.value);
}

/** Character positions are counted from 1, the '=' included, as a person counts them on screen. */
const at = (index: number) => `character ${index + 1}`;

/** The first place `token` occurs in the formula outside string literals, or -1. */
function indexOutsideStrings(formula: string, token: string): number {
  let quoted = false;
  for (let i = 1; i < formula.length; i++) {
    if (formula[i] === '"') quoted = !quoted;
    else if (!quoted && formula.startsWith(token, i)) return i;
  }
  return -1;
}

/** What the parser's "found" token was: `but found: 'x'`, `--> 'x' <--` or `found: x`. */
function foundToken(message: string): string | null {
  const m = /but found(?::| -->) '?([^'\n]*?)'?(?: <--)?$/m.exec(message);
  return m ? m[1].trim() : null;
}

/** A parse error in plain words: what is wrong and where, from the formula text when there is one. */
export function explainParseError(message: string, formula?: string): string {
  const unexpected = /unexpected character: ->(.)<- at offset: (\d+)/.exec(message);
  if (!formula?.startsWith('=')) {
    return unexpected ? `the formula could not be read: '${unexpected[1]}' does not belong in a formula` : 'the formula could not be read';
  }
  const shape = formulaShape(formula);
  if (shape.openQuote !== null) return `the text starting at ${at(shape.openQuote)} has no closing quote`;
  if (shape.strayClose !== null) return `the ')' at ${at(shape.strayClose)} closes a bracket that was never opened`;
  if (unexpected) return `'${unexpected[1]}' at ${at(Number(unexpected[2]))} does not belong in a formula`;
  const found = foundToken(message);
  if (found === ';' && /RParen/.test(message)) return `the ';' at ${at(indexOutsideStrings(formula, ';'))} should be a ',' between arguments`;
  if (shape.openBrackets.length > 0 && (found === '' || found === null)) {
    const open = shape.openBrackets[shape.openBrackets.length - 1];
    return `the bracket opened at ${at(open)} is never closed: add ')'`;
  }
  const last = formula.trimEnd();
  if (found === '' && last.length > 1) return `the formula ends after '${last[last.length - 1]}' (${at(last.length - 1)}): a value or cell is missing`;
  if (found) {
    const where = indexOutsideStrings(formula, found);
    if (/Redundant input/.test(message)) return `'${found}'${where > 0 ? ` at ${at(where)}` : ''} follows a complete formula: an operator or ',' is missing before it`;
    return `'${found}'${where > 0 ? ` at ${at(where)}` : ''} is not expected there: a value or cell is missing before it`;
  }
  return 'the formula could not be read';
}
