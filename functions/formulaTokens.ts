// The engine's formula text, read token by token so rewrites never touch what the user wrote inside a
// string literal ("Sheet1!A1", "1E3"). The rules follow HyperFormula's own parser constants
// (UNQUOTED_SHEET_NAME_PATTERN, QUOTED_SHEET_NAME_PATTERN): a sheet prefix is a quoted name
// ('My sheet'!, apostrophes doubled inside) or a run of letters, digits and underscores before "!".
// Only what the rewrites need is told apart; everything else is plain text.

/** Letters the engine allows in an unquoted sheet name (its UNICODE_LETTER_PATTERN), digits, underscore. */
const NAME_CHAR = /[A-Za-z\u00C0-\u02AF0-9_]/;
const NUMBER = /^(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)[eE][+-]?[0-9]+/;

export type FormulaToken =
  | { kind: 'text'; text: string }
  /** A sheet prefix: `name` is the unquoted sheet name, `text` includes the "!". */
  | { kind: 'sheet'; text: string; name: string }
  | { kind: 'number'; text: string };

/** Splits a formula ("=…") into the tokens the rewrites care about; everything else is plain text. */
export function formulaTokens(formula: string): FormulaToken[] {
  const out: FormulaToken[] = [];
  let plain = '';
  const flush = () => {
    if (plain) out.push({ kind: 'text', text: plain });
    plain = '';
  };
  let i = 0;
  while (i < formula.length) {
    const ch = formula[i];
    if (ch === '"') {
      // A string literal, "" standing for one quote inside it; an unclosed one runs to the end.
      let j = i + 1;
      while (j < formula.length && !(formula[j] === '"' && formula[j + 1] !== '"')) j += formula[j] === '"' ? 2 : 1;
      plain += formula.slice(i, j + 1);
      i = j + 1;
    } else if (ch === "'") {
      let j = i + 1;
      while (j < formula.length && !(formula[j] === "'" && formula[j + 1] !== "'")) j += formula[j] === "'" ? 2 : 1;
      if (formula[j + 1] === '!') {
        flush();
        out.push({ kind: 'sheet', text: formula.slice(i, j + 2), name: formula.slice(i + 1, j).replace(/''/g, "'") });
        i = j + 2;
      } else {
        plain += formula.slice(i, j + 1);
        i = j + 1;
      }
    } else if (NAME_CHAR.test(ch) || ch === '.') {
      // A whole run of name characters, so "A1E3" or "Sheet1E3" is never read from its middle.
      let j = i;
      while (j < formula.length && (NAME_CHAR.test(formula[j]) || formula[j] === '.')) j++;
      const run = formula.slice(i, j);
      const number = NUMBER.exec(formula.slice(i));
      if (formula[j] === '!' && /^[A-Za-z\u00C0-\u02AF0-9_]+$/.test(run) && formula[i - 1] !== '#') {
        flush();
        out.push({ kind: 'sheet', text: `${run}!`, name: run });
        i = j + 1;
      } else if (number && /^[0-9.]/.test(ch) && !NAME_CHAR.test(formula[i + number[0].length] ?? '') && formula[i + number[0].length] !== '!') {
        flush();
        out.push({ kind: 'number', text: number[0] });
        i += number[0].length;
      } else {
        plain += run;
        i = j;
      }
    } else {
      plain += ch;
      i++;
    }
  }
  flush();
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
