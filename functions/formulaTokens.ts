// The engine's formula text, read token by token so rewrites never touch what the user wrote inside a
// string literal ("Sheet1!A1", "1E3"). The rules follow HyperFormula's own parser constants
// (UNQUOTED_SHEET_NAME_PATTERN, QUOTED_SHEET_NAME_PATTERN): a sheet prefix is a quoted name
// ('My sheet'!, apostrophes doubled inside) or a run of letters, digits and underscores before "!".
// Only what the rewrites need is told apart; everything else is plain text.

/** Letters the engine allows in an unquoted sheet name (its UNICODE_LETTER_PATTERN), digits, underscore. */
function isNameChar(code: number): boolean {
  return (
    (code >= 48 && code <= 57) || // 0-9
    (code >= 65 && code <= 90) || // A-Z
    (code >= 97 && code <= 122) || // a-z
    code === 95 || // _
    (code >= 0xc0 && code <= 0x2af)
  );
}
const DOT = 46;
const isDigit = (code: number) => code >= 48 && code <= 57;
/** A number literal with an exponent, read where a run of name characters starts (sticky). */
const NUMBER = /(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)[eE][+-]?[0-9]+/y;

export type FormulaToken =
  | { kind: 'text'; text: string }
  /** A sheet prefix: `name` is the unquoted sheet name, `text` includes the "!". */
  | { kind: 'sheet'; text: string; name: string }
  | { kind: 'number'; text: string };

/** Splits a formula ("=…") into the tokens the rewrites care about; everything else is plain text. */
export function formulaTokens(formula: string): FormulaToken[] {
  const out: FormulaToken[] = [];
  let plainFrom = 0;
  const token = (from: number, to: number, t: FormulaToken) => {
    if (plainFrom < from) out.push({ kind: 'text', text: formula.slice(plainFrom, from) });
    out.push(t);
    plainFrom = to;
  };
  const n = formula.length;
  let i = 0;
  while (i < n) {
    const code = formula.charCodeAt(i);
    if (code === 34 /* " */) {
      // A string literal, "" standing for one quote inside it; an unclosed one runs to the end.
      let j = i + 1;
      while (j < n && !(formula.charCodeAt(j) === 34 && formula.charCodeAt(j + 1) !== 34)) j += formula.charCodeAt(j) === 34 ? 2 : 1;
      i = j + 1;
    } else if (code === 39 /* ' */) {
      let j = i + 1;
      while (j < n && !(formula.charCodeAt(j) === 39 && formula.charCodeAt(j + 1) !== 39)) j += formula.charCodeAt(j) === 39 ? 2 : 1;
      if (formula.charCodeAt(j + 1) === 33 /* ! */) token(i, j + 2, { kind: 'sheet', text: formula.slice(i, j + 2), name: formula.slice(i + 1, j).replace(/''/g, "'") });
      i = j + (formula.charCodeAt(j + 1) === 33 ? 2 : 1);
    } else if (isNameChar(code) || code === DOT) {
      // A whole run of name characters, so "A1E3" or "Sheet1E3" is never read from its middle.
      let j = i;
      let dotted = false;
      for (let c = code; j < n && (isNameChar(c) || c === DOT); c = formula.charCodeAt(++j)) dotted ||= c === DOT;
      if (formula.charCodeAt(j) === 33 /* ! */ && !dotted && formula.charCodeAt(i - 1) !== 35 /* # */) {
        const run = formula.slice(i, j);
        token(i, j + 1, { kind: 'sheet', text: `${run}!`, name: run });
        i = j + 1;
        continue;
      }
      if (isDigit(code) || code === DOT) {
        NUMBER.lastIndex = i;
        const number = NUMBER.exec(formula);
        const after = number ? i + number[0].length : -1;
        if (number && !isNameChar(formula.charCodeAt(after)) && formula.charCodeAt(after) !== 33) {
          token(i, after, { kind: 'number', text: number[0] });
          i = after;
          continue;
        }
      }
      i = j;
    } else {
      i++;
    }
  }
  if (plainFrom < n) out.push({ kind: 'text', text: formula.slice(plainFrom) });
  return out;
}

const isFormula = (input: string) => input.startsWith('=') && input.length > 1;

/**
 * The formula with exponent notation in number literals written with a lowercase "e" (1E3 → 1e3),
 * the only form the engine reads. Strings, references (E3, A1E3) and sheet names (Sheet1E3!A1) stay.
 */
export function lowercaseExponents(formula: string): string {
  if (!isFormula(formula) || !/[0-9.]E/.test(formula)) return formula;
  return formulaTokens(formula)
    .map((t) => (t.kind === 'number' ? t.text.toLowerCase() : t.text))
    .join('');
}

/** A cell's input as the engine should read it: formulas get lowercase exponents, anything else is unchanged. */
export function engineInput<T>(input: T): T {
  return (typeof input === 'string' ? lowercaseExponents(input) : input) as T;
}
