// Formula text rewritten by its tokens, never by blind search-and-replace: a sheet name or a number
// inside a string literal ("Sheet1!A1", "1E3") is text the user wrote and stays as it is.
//
// The token rules follow the engine's (HyperFormula's parser constants): a sheet prefix is either a
// quoted name ('My sheet'!, apostrophes doubled inside) or a run of letters, digits and underscores
// followed by "!"; sheet names compare without case, as the engine compares them.
import { sheetReference } from './a1.js';

/** Letters the engine allows in an unquoted sheet name (its UNICODE_LETTER_PATTERN), digits, underscore. */
const NAME_CHAR = /[A-Za-z\u00C0-\u02AF0-9_]/;
/** What may follow a sheet prefix: a cell or a cell range (a second corner may repeat the prefix), whole columns, whole rows. */
const REFERENCE_AFTER_PREFIX = new RegExp(
  String.raw`^(?:\$?[A-Za-z]{1,3}\$?[0-9]+(?::(?:(?:'(?:[^']|'')*'|[A-Za-z\u00C0-\u02AF0-9_]+)!)?\$?[A-Za-z]{1,3}\$?[0-9]+)?` +
    String.raw`|\$?[A-Za-z]{1,3}:\$?[A-Za-z]{1,3}|\$?[0-9]+:\$?[0-9]+)(?![A-Za-z\u00C0-\u02AF0-9_(])`,
);
const NUMBER = /^(?:[0-9]+(?:\.[0-9]*)?|\.[0-9]+)[eE][+-]?[0-9]+/;

type Token =
  | { kind: 'text'; text: string }
  /** A sheet prefix: `name` is the unquoted sheet name, `text` includes the "!". */
  | { kind: 'sheet'; text: string; name: string }
  | { kind: 'number'; text: string };

/** Splits a formula ("=…") into the tokens the rewrites care about; everything else is plain text. */
function tokens(formula: string): Token[] {
  const out: Token[] = [];
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
const sameName = (a: string, b: string) => a.toLowerCase() === b.toLowerCase();

/** The formula with every reference to sheet `before` pointing at `after` (unchanged text when there is none). */
export function renameSheetInFormula(formula: string, before: string, after: string): string {
  if (!isFormula(formula) || !formula.includes('!')) return formula;
  return tokens(formula)
    .map((t) => (t.kind === 'sheet' && sameName(t.name, before) ? `${sheetReference(after)}!` : t.text))
    .join('');
}

/** The formula with every reference into sheet `name` replaced by #REF!, as a deleted sheet leaves it. */
export function removeSheetFromFormula(formula: string, name: string): string {
  if (!isFormula(formula) || !formula.includes('!')) return formula;
  const parts = tokens(formula);
  let out = '';
  for (let k = 0; k < parts.length; k++) {
    const t = parts[k];
    if (t.kind !== 'sheet' || !sameName(t.name, name)) {
      out += t.text;
      continue;
    }
    // The reference that follows the prefix goes with it; it may span into the next tokens
    // (a range's second corner can carry its own prefix).
    let rest = parts.slice(k + 1).map((p) => p.text).join('');
    const ref = REFERENCE_AFTER_PREFIX.exec(rest);
    out += '#REF!';
    rest = rest.slice(ref ? ref[0].length : 0);
    return out + (rest ? removeSheetFromFormula(`=${rest}`, name).slice(1) : '');
  }
  return out;
}

/**
 * The formula with exponent notation in number literals written with a lowercase "e" (1E3 → 1e3),
 * the only form the engine reads. Strings, references (E3, A1E3) and sheet names (Sheet1E3!A1) stay.
 */
export function lowercaseExponents(formula: string): string {
  if (!isFormula(formula) || !/[0-9.]E/.test(formula)) return formula;
  return tokens(formula)
    .map((t) => (t.kind === 'number' ? t.text.toLowerCase() : t.text))
    .join('');
}
