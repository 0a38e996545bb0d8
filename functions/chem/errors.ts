// The error type of the science layer and the cell shapes it reads. The catalog re-exports these, so
// a ChemError thrown here becomes a spreadsheet error with its message (e.g. #VALUE! "unknown
// element 'Xq'") without the science importing anything from the catalog.

export type Scalar = number | string | boolean;
export type Table = Scalar[][];

export type ErrorKind = 'VALUE' | 'NUM' | 'NA' | 'DIV_BY_ZERO' | 'REF';

/** A domain error that becomes a spreadsheet error with this message. */
export class ChemError extends Error {
  constructor(message: string, readonly kind: ErrorKind = 'VALUE') {
    super(message);
    this.name = 'ChemError';
  }
}

/** What a 1-based index counts, for the out-of-range message: "level 7 is out of range: this system has 6 levels (use 1 to 6)". */
export interface IndexedItems {
  /** One item, e.g. "level". */
  item: string;
  /** Several, when not item + "s" (e.g. "heavy atoms" for "atom"). */
  items?: string;
  /** What holds them, e.g. "this system", "'C=CC=C'". */
  holder: string;
  /** Error kind, #VALUE! unless the caller keeps another. */
  kind?: ErrorKind;
}

/** The one check of a 1-based index argument: k must be a whole number from 1 to count. Returns k − 1. */
export function oneBasedIndex(k: number, count: number, what: IndexedItems): number {
  if (!Number.isInteger(k) || k < 1 || k > count)
    throw new ChemError(`${what.item} ${k} is out of range: ${what.holder} has ${count} ${what.items ?? `${what.item}s`} (use 1 to ${count})`, what.kind);
  return k - 1;
}
