// Where the extended-Hückel functions get a structure's result. By default (CLI, tests) it is computed
// here and now, synchronously, and memoised. An environment that must not compute on the calling
// thread registers a resolver instead: the browser answers from the results the server stored and
// says "pending" for the rest; the server's compute workers answer from the stored results and
// compute the rest there. The science stays in functions/chem/ and knows nothing of either.
import { TextMemo } from './chem/textMemo.js';
import { computeEhtResult, ehtKeyText, normaliseStructure, summaryOrThrow, type EhtResult, type EhtSummary } from './chem/ehtSummary.js';

/** A structure the resolver was asked about: the cell text and the optional net charge. */
export interface StructureRequest {
  structure: string;
  charge?: number;
  /** ehtKeyText(structure, charge): what the result is stored under. */
  key: string;
  /** The formula cell being evaluated (engine sheet id, row, col), when known: a waiting cell is re-evaluated when its result arrives. */
  cell?: FormulaCell;
}

export interface FormulaCell {
  sheet: number;
  row: number;
  col: number;
}

let evaluating: FormulaCell | undefined;

/** Runs `f` with `cell` as the formula being evaluated (the plugin wraps every call with it). */
export function whileEvaluating<T>(cell: FormulaCell | undefined, f: () => T): T {
  const outer = evaluating;
  evaluating = cell;
  try {
    return f();
  } finally {
    evaluating = outer;
  }
}

/** A result, or 'pending' when it is being computed elsewhere and the cell should wait. */
export type StructureResolver = (request: StructureRequest) => EhtResult | 'pending';

/** The words a waiting cell shows; the grid recognises them and draws the cell as pending, not failed. */
export const PENDING_MESSAGE = 'computing… extended Hückel results for this structure are on their way';

/** Thrown by an implementation whose structure is still being computed; the plugin turns it into a pending cell. */
export class PendingResult extends Error {
  constructor() {
    super(PENDING_MESSAGE);
    this.name = 'PendingResult';
  }
}

export function isPendingMessage(message: string | undefined): boolean {
  return message === PENDING_MESSAGE;
}

let resolver: StructureResolver | null = null;

/** Registers (or with null removes) the environment's resolver; without one results are computed here. */
export function setStructureResolver(next: StructureResolver | null) {
  resolver = next;
}

const local = new TextMemo<EhtResult>(200);

/** Results computed here since the last clear (tests: to count computations). */
export function localComputations(): number {
  return local.misses;
}

export function clearLocalResults() {
  local.clear();
  local.misses = 0;
}

/** The summary for a structure text, or throws its ChemError, or PendingResult. */
export function ehtSummaryOf(structure: string, charge?: number): EhtSummary {
  const key = ehtKeyText(structure, charge);
  if (resolver) {
    const answer = resolver({ structure: normaliseStructure(structure), charge, key, cell: evaluating });
    if (answer === 'pending') throw new PendingResult();
    return summaryOrThrow(answer);
  }
  return summaryOrThrow(local.get(key, () => computeEhtResult(structure, charge)));
}
