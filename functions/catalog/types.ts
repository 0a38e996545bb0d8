// The shape of one cell function, declared once. The HyperFormula plugin, the in-app help,
// docs/functions.md and the example tests are all generated from these entries.

import type { Scalar, Table } from '../chem/errors.js';
export type { Scalar, Table, ErrorKind } from '../chem/errors.js';
export { ChemError } from '../chem/errors.js';
export type FunctionResult = Scalar | Table;

/** How a parameter arrives in the implementation. `range` gives a Table (a range, an inline array or a spilled result). */
export type ParamType = 'number' | 'integer' | 'string' | 'boolean' | 'range' | 'any';

export interface ParamSpec {
  name: string;
  type: ParamType;
  description: string;
  unit?: string;
  optional?: boolean;
  default?: Scalar;
  /** Allowed text values (case-insensitive), listed in the help. */
  choices?: string[];
}

export interface Example {
  formula: string;
  /** Expected value; a Table for spilled results. */
  expected: FunctionResult;
  /** Absolute tolerance for numbers (default 1e-9). */
  tolerance?: number;
  /** Where the expected value comes from, if not self-evident. */
  note?: string;
}

/** What the plugin knows about an argument before evaluation, to fix a spill size from the formula text. */
export type SpillArg =
  | { kind: 'literal'; value: Scalar }
  | { kind: 'range'; rows: number; cols: number }
  /** An argument left out between commas, e.g. the k of EHTLEVELS(s,,1). */
  | { kind: 'empty' }
  | { kind: 'other' };

export type Family = 'Diatomic' | 'LCAO' | 'Units' | 'Hückel' | 'π spectra' | 'Extended Hückel';

export interface CatalogEntry {
  name: string;
  family: Family;
  summary: string;
  params: ParamSpec[];
  returns: { description: string; unit?: string; kind: 'number' | 'text' | 'boolean' | 'array' };
  examples: Example[];
  /** The published method and its source. */
  source: string;
  /** For spilling functions: the result size, fixed from the formula text alone. */
  spill?: (args: SpillArg[]) => { rows: number; cols: number };
  /** Pure implementation. Throw ChemError for bad input; never return NaN or Infinity. */
  implementation: (...args: any[]) => FunctionResult;
}
