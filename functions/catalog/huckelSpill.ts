// Spill sizes for the Hückel family. HyperFormula fixes an array's size from the formula text before
// any value is known, and fails if the result is larger than that size, so:
// - a literal SMILES is parsed (through the shared cache) to count its π centres;
// - a matrix range gives its size directly;
// - anything else (a cell reference, an inline array, another function) gets a fixed
//   MAX_SPILL_ROWS-row area whose unused rows stay empty;
// - and no function ever returns more than MAX_SPILL_ROWS rows: larger systems must use the index
//   argument (one value per cell), which is what a screening column wants anyway.
import { oneBasedIndex } from '../chem/errors.js';
import { ChemError, type SpillArg } from './types.js';
import { piSystemOf } from './huckelLimits.js';

export const MAX_SPILL_ROWS = 50;

const ONE_CELL = { rows: 1, cols: 1 };

/** Rows of a level list for a structure argument (SMILES or square matrix range), judged from the formula text. */
export function levelRowsFromText(arg: SpillArg | undefined): { rows: number; cols: number } {
  if (!arg) return ONE_CELL;
  if (arg.kind === 'literal') {
    if (typeof arg.value !== 'string') return ONE_CELL;
    try {
      const n = piSystemOf(arg.value).centres.length;
      return n <= MAX_SPILL_ROWS ? { rows: n, cols: 1 } : ONE_CELL;
    } catch {
      return ONE_CELL; // the implementation reports the error in the anchor cell
    }
  }
  if (arg.kind === 'range') {
    if (arg.rows === 1 && arg.cols === 1) return { rows: MAX_SPILL_ROWS, cols: 1 };
    return arg.rows === arg.cols && arg.rows <= MAX_SPILL_ROWS ? { rows: arg.rows, cols: 1 } : ONE_CELL;
  }
  return { rows: MAX_SPILL_ROWS, cols: 1 };
}

/** A spill of `n` values must fit the largest area the formula text can promise. */
export function checkSpillLength(n: number, functionName: string, indexHint: string) {
  if (n > MAX_SPILL_ROWS)
    throw new ChemError(
      `${functionName} would spill ${n} values, more than the ${MAX_SPILL_ROWS} rows a spilled list may hold; give the index argument (${indexHint}) to get one value per cell`,
    );
}

/** Picks the 1-based index k from a list, naming the valid range when it is out of bounds. */
export function pickIndex<T>(list: T[], k: number, what: string, plural: string): T {
  return list[oneBasedIndex(k, list.length, { item: what, items: plural, holder: 'this system' })];
}

export function column(values: number[]): number[][] {
  return values.map((v) => [v]);
}
