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
