// Checks on what a cell may hold beyond its length, found by fuzzing (tests/fuzz-cells.test.ts):
// inputs the database or the formula engine cannot take as they are. The patch schema and the
// importers refuse them with these messages instead of storing something else or failing later.
import { evaluationLimits, formulaSizeProblem } from '../functions/limits.js';

/**
 * Deepest nesting of parentheses and array braces a formula may have. The engine's parser recurses
 * once per level and overflows the stack somewhere between 100 and 150 levels (measured on Node 20);
 * 64 nested levels is the usual spreadsheet limit (common practice), well inside that.
 */
export const maxFormulaNesting = 64;

/** The deepest level of ( and { in a formula, not counting those inside "string literals". */
export function formulaNestingDepth(formula: string): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (const ch of formula) {
    if (ch === '"') inString = !inString; // a doubled "" inside a string toggles twice: still inside
    else if (inString) continue;
    else if (ch === '(' || ch === '{') deepest = Math.max(deepest, ++depth);
    else if ((ch === ')' || ch === '}') && depth > 0) depth--;
  }
  return deepest;
}

/** A UTF-16 surrogate without its partner: not a character, and SQLite (UTF-8) cannot keep it. */
const unpairedSurrogate = /[\ud800-\udbff](?![\udc00-\udfff])|(?<![\ud800-\udbff])[\udc00-\udfff]/;

/**
 * A plain number as the engine reads one. Past ±1.8e308 (the largest IEEE 754 double) the engine
 * turns such an input into NaN, which JSON carries as null: the cell would look empty. Found by fuzzing.
 */
const numberLiteral = /^\s*[+-]?(\d+\.?\d*|\.\d+)(e[+-]?\d+)?\s*%?\s*$/i;

/** Why a cell input cannot be stored as it is, or null when it can. */
export function cellInputProblem(input: string): string | null {
  const lone = unpairedSurrogate.exec(input);
  if (lone) {
    const code = lone[0].charCodeAt(0).toString(16).toUpperCase();
    return `contains an unpaired surrogate (U+${code} at character ${lone.index + 1}), which is not valid Unicode text`;
  }
  if (numberLiteral.test(input) && !Number.isFinite(Number(input.trim().replace(/%$/, '')))) {
    return 'is a number beyond the largest a cell can hold (about 1.8e308); start it with an apostrophe to keep it as text';
  }
  // A formula this short can neither nest too deep nor chain too many operators (each takes a character).
  if (input.startsWith('=') && input.length > Math.min(maxFormulaNesting, evaluationLimits.maxFormulaOperators)) {
    const depth = formulaNestingDepth(input);
    if (depth > maxFormulaNesting) return `the formula nests ${depth} levels of parentheses; at most ${maxFormulaNesting} are allowed`;
    const size = formulaSizeProblem(input);
    if (size) return size;
  }
  return null;
}
