// Formula text when a sheet is renamed or deleted, rewritten by its tokens (functions/formulaTokens.ts),
// never by blind search-and-replace: a sheet name inside a string literal is text the user wrote.
// Sheet names compare without case, as the engine compares them.
import { formulaTokens } from '../functions/formulaTokens.js';
import { sheetReference } from './a1.js';

export { lowercaseExponents } from '../functions/formulaTokens.js';

/** What may follow a sheet prefix: a cell or a cell range (a second corner may repeat the prefix), whole columns, whole rows. */
const REFERENCE_AFTER_PREFIX = new RegExp(
  String.raw`^(?:\$?[A-Za-z]{1,3}\$?[0-9]+(?::(?:(?:'(?:[^']|'')*'|[A-Za-z\u00C0-\u02AF0-9_]+)!)?\$?[A-Za-z]{1,3}\$?[0-9]+)?` +
    String.raw`|\$?[A-Za-z]{1,3}:\$?[A-Za-z]{1,3}|\$?[0-9]+:\$?[0-9]+)(?![A-Za-z\u00C0-\u02AF0-9_(])`,
);
const isFormula = (input: string) => input.startsWith('=') && input.length > 1;
const sameName = (a: string, b: string) => a.toLowerCase() === b.toLowerCase();

/** Whether the formula could name the sheet at all (cheap; quoted names double their apostrophes). */
function mayName(formula: string, name: string): boolean {
  if (!isFormula(formula) || !formula.includes('!')) return false;
  const text = formula.toLowerCase();
  return name
    .toLowerCase()
    .split("'")
    .every((part) => text.includes(part));
}

/** The formula with every reference to sheet `before` pointing at `after` (unchanged text when there is none). */
export function renameSheetInFormula(formula: string, before: string, after: string): string {
  if (!mayName(formula, before)) return formula;
  return formulaTokens(formula)
    .map((t) => (t.kind === 'sheet' && sameName(t.name, before) ? `${sheetReference(after)}!` : t.text))
    .join('');
}

/** The formula with every reference into sheet `name` replaced by #REF!, as a deleted sheet leaves it. */
export function removeSheetFromFormula(formula: string, name: string): string {
  if (!mayName(formula, name)) return formula;
  const parts = formulaTokens(formula);
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

