// What the extended-Hückel cell functions and the structure panel read of one solved structure,
// small enough to store once per structure and send to every browser that opens the workbook: the
// levels, the frontier energies, Mulliken charges and overlap populations, and each level's largest
// contributions, instead of the basis, overlap and coefficient matrices (hundreds of kilobytes for a
// 30-atom molecule). Every place that answers an EHT function — browser, server workers, CLI — reads
// this same summary, so the numbers are identical wherever they were computed.
import { ChemError, type ErrorKind } from './errors.js';
import {
  describeComposition,
  frontier,
  homoIndex,
  levelComposition,
  mullikenCharge,
  oneElectronEnergy,
  overlapPopulation,
  solveEht,
  type EhtModel,
} from './eht.js';
import { readGeometry, type Geometry3d, type GeometrySource } from './geometry3d.js';

/**
 * Changes whenever a change to the method, parameters or geometry handling would change a stored
 * number; stored results are keyed by it, so an upgrade recomputes rather than serving stale values.
 */
export const EHT_METHOD_VERSION = 'eht-2';

/** A result that failed for a reason of the structure itself (it fails the same way every time). */
export interface EhtFailure {
  error: { kind: ErrorKind; message: string };
}

export interface EhtSummary {
  version: string;
  atoms: number;
  elements: string[];
  source: GeometrySource;
  forceFieldTidied?: boolean;
  charge: number;
  /** [energy eV, electrons] per level, lowest first. */
  levels: [number, number][];
  /** Frontier energies, or the reason there are none ("every orbital is filled"). */
  frontier: { homoEv: number; lumoEv: number } | { error: string };
  oneElectronEnergyEv: number;
  /** Mulliken net charge per atom. */
  charges: number[];
  /** Overlap populations of pairs i < j, row by row (i = 0: j = 1…n−1, then i = 1 …), rounded to 1e-6 e. */
  overlapPopulations: number[];
  homoMakeup: string | { error: string };
  /** Each level's largest contributions, as EHTHOMOMAKEUP words them (structure panel). */
  levelMakeups: string[];
}

export type EhtResult = EhtSummary | EhtFailure;

export function isEhtFailure(r: EhtResult): r is EhtFailure {
  return 'error' in r;
}

/** 1e-6 e is below any digit a population is read to; rounding keeps the stored summary small. */
const round6 = (x: number) => Math.round(x * 1e6) / 1e6 || 0;

function attempt<T>(f: () => T): T | { error: string } {
  try {
    return f();
  } catch (e) {
    if (e instanceof ChemError) return { error: e.message };
    throw e;
  }
}

export function summariseEht(model: EhtModel): EhtSummary {
  const g: Geometry3d = model.geometry;
  const n = g.elements.length;
  const charges: number[] = [];
  for (let a = 1; a <= n; a++) charges.push(mullikenCharge(model, a));
  const overlapPopulations: number[] = [];
  for (let i = 1; i <= n; i++) for (let j = i + 1; j <= n; j++) overlapPopulations.push(round6(overlapPopulation(model, i, j)));
  return {
    version: EHT_METHOD_VERSION,
    atoms: n,
    elements: g.elements,
    source: g.source,
    ...(g.forceFieldTidied === undefined ? {} : { forceFieldTidied: g.forceFieldTidied }),
    charge: model.charge,
    levels: model.levels.map((l) => [l.energyEv, l.occupancy]),
    frontier: attempt(() => frontier(model)),
    oneElectronEnergyEv: oneElectronEnergy(model),
    charges,
    overlapPopulations,
    homoMakeup: attempt(() => describeComposition(levelComposition(model, homoIndex(model)))),
    levelMakeups: model.levels.map((_, k) => describeComposition(levelComposition(model, k))),
  };
}

/** Geometry, solve and summary of one structure text; a ChemError becomes a stored failure. */
export function computeEhtResult(text: string, charge?: number): EhtResult {
  try {
    return summariseEht(solveEht(readGeometry(text), charge));
  } catch (e) {
    if (e instanceof ChemError) return { error: { kind: e.kind, message: e.message } };
    throw e;
  }
}

/** The text a structure is known by: the same structure typed with other line ends or margins is one entry. */
export function normaliseStructure(text: string): string {
  return text.replace(/\r\n?/g, '\n').trim();
}

/** The stored-result key text of a structure and charge (hashed by the server). */
export function ehtKeyText(text: string, charge?: number): string {
  return `${EHT_METHOD_VERSION}\u0000${charge ?? ''}\u0000${normaliseStructure(text)}`;
}

// Readers: the same checks and messages as the full model's (eht.ts), on the summary.

function fail(message: string): never {
  throw new ChemError(message);
}

export function summaryAtom(s: EhtSummary, atom: number, name: string): number {
  if (!Number.isInteger(atom) || atom < 1 || atom > s.atoms) fail(`${name} ${atom} is out of range: the structure has ${s.atoms} atoms (use 1 to ${s.atoms})`);
  return atom - 1;
}

export function summaryFrontier(s: EhtSummary): { homoEv: number; lumoEv: number } {
  if ('error' in s.frontier) fail(s.frontier.error);
  return s.frontier;
}

export function summaryCharge(s: EhtSummary, atom: number): number {
  return s.charges[summaryAtom(s, atom, 'atom')];
}

export function summaryOverlapPopulation(s: EhtSummary, atomA: number, atomB: number): number {
  const a = summaryAtom(s, atomA, 'atom i');
  const b = summaryAtom(s, atomB, 'atom j');
  if (a === b) fail(`i and j are both atom ${atomA}: an overlap population needs two different atoms`);
  const [i, j] = a < b ? [a, b] : [b, a];
  // Pairs before row i: Σ_{r<i} (n−1−r).
  return s.overlapPopulations[i * (s.atoms - 1) - (i * (i - 1)) / 2 + (j - i - 1)];
}

export function summaryHomoMakeup(s: EhtSummary): string {
  if (typeof s.homoMakeup !== 'string') fail(s.homoMakeup.error);
  return s.homoMakeup;
}

/** Throws the stored failure as the error it was, or gives the summary. */
export function summaryOrThrow(r: EhtResult): EhtSummary {
  if (isEhtFailure(r)) throw new ChemError(r.error.message, r.error.kind);
  return r;
}
