// The shape of a formula's text as someone types it: which brackets are open, where string literals
// and quoted sheet names start and end, which function argument the caret is in. Shared by the
// grid's editor (closing brackets on commit, pointing at cells, the argument hint) and by the wording
// of parse errors (functions/cellErrors.ts), so both read the text the same way. Plain scanning, no
// engine: the text is often half typed.

export interface FormulaShape {
  /** Positions (0-based, in the whole text) of brackets still open at the end, outermost first. */
  openBrackets: number[];
  /** Position of a ')' with no '(' before it, or null. */
  strayClose: number | null;
  /** Position of a '"' (or a sheet name's "'") that is never closed, or null. */
  openQuote: number | null;
}

/** Reads `text` up to `end` (default: all of it). Only text starting with '=' is a formula. */
export function formulaShape(text: string, end = text.length): FormulaShape {
  const openBrackets: number[] = [];
  let strayClose: number | null = null;
  let openQuote: number | null = null;
  let quote: string | null = null;
  for (let i = 1; i < end; i++) {
    const ch = text[i];
    if (quote) {
      if (ch === quote) {
        // A doubled quote inside a literal is the quote character itself.
        if (text[i + 1] === quote && i + 1 < end) i++;
        else {
          quote = null;
          openQuote = null;
        }
      }
      continue;
    }
    if (ch === '"' || ch === "'") {
      quote = ch;
      openQuote = i;
    } else if (ch === '(') openBrackets.push(i);
    else if (ch === ')') {
      if (openBrackets.length > 0) openBrackets.pop();
      else strayClose ??= i;
    }
  }
  return { openBrackets, strayClose, openQuote };
}

/**
 * The formula with its open brackets closed, as a commit does when someone types `=MOCONFIG(A2`
 * and presses Enter. Left alone: text that is not a formula, an unclosed string (where the brackets
 * end is anyone's guess), and a stray ')' (the parse error then names it).
 */
export function closeBrackets(text: string): string {
  if (!text.startsWith('=')) return text;
  const shape = formulaShape(text);
  if (shape.openQuote !== null || shape.strayClose !== null || shape.openBrackets.length === 0) return text;
  return text.trimEnd() + ')'.repeat(shape.openBrackets.length);
}

/** Characters after which a cell reference may start: an operator, a bracket, a separator or '='. */
const REFERENCE_FOLLOWS = new Set(['=', '(', ',', ';', '+', '-', '*', '/', '^', '&', '<', '>', ':']);

/** True when a reference could be inserted at `caret` (a formula, outside quotes, after an operator). */
export function acceptsReference(text: string, caret: number): boolean {
  if (!text.startsWith('=') || caret < 1) return false;
  if (formulaShape(text, caret).openQuote !== null) return false;
  let i = caret - 1;
  while (i > 0 && text[i] === ' ') i--;
  return REFERENCE_FOLLOWS.has(text[i]);
}

export interface ArgumentPosition {
  /** The function whose bracket the caret is in, upper case. */
  name: string;
  /** Which argument (0-based) the caret is in. */
  index: number;
}

/** The innermost function call around the caret and the argument the caret is in, or null. */
export function argumentAt(text: string, caret: number): ArgumentPosition | null {
  if (!text.startsWith('=')) return null;
  const stack: { name: string | null; index: number }[] = [];
  let quote: string | null = null;
  let braces = 0;
  for (let i = 1; i < caret; i++) {
    const ch = text[i];
    if (quote) {
      if (ch === quote) {
        if (text[i + 1] === quote && i + 1 < caret) i++;
        else quote = null;
      }
      continue;
    }
    if (ch === '"' || ch === "'") quote = ch;
    else if (ch === '{') braces++;
    else if (ch === '}') braces = Math.max(0, braces - 1);
    else if (ch === '(') {
      const m = /([A-Za-z][A-Za-z0-9_.]*)\s*$/.exec(text.slice(0, i));
      stack.push({ name: m ? m[1].toUpperCase() : null, index: 0 });
    } else if (ch === ')') stack.pop();
    else if (ch === ',' && braces === 0 && stack.length > 0) stack[stack.length - 1].index++;
  }
  // Inside a quoted sheet name there is no argument to hint; inside a string there still is.
  if (quote === "'") return null;
  const top = stack[stack.length - 1];
  return top?.name ? { name: top.name, index: top.index } : null;
}
