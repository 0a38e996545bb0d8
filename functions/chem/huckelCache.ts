// One solve per structure: a screening column references the same molecule from several functions
// and often repeats molecules, so parsed π systems and solved models are kept in small LRU maps keyed
// by the SMILES text (and parameter set) or the matrix values. Failures are cached too, so a column
// of one bad SMILES reports its message without re-parsing.
import { ChemError, type Table } from './errors.js';
import { modelFromMatrix, modelFromPiSystem, type HuckelModel } from './huckel.js';
import { parseParameterSet, type ParameterSetName } from './huckelParams.js';
import { readSymmetricMatrix } from './matrixInput.js';
import { findPiSystem, type PiSystem } from './piSystem.js';

/** Entries per cache; a 40-centre model holds ~26 kB, so the worst case stays near 26 MB. */
const CACHE_CAPACITY = 1000;

type Cached<T> = { ok: true; value: T } | { ok: false; error: ChemError };

class LruCache<T> {
  private readonly entries = new Map<string, Cached<T>>();
  constructor(private readonly capacity: number) {}
  get(key: string): Cached<T> | undefined {
    const hit = this.entries.get(key);
    if (hit) {
      this.entries.delete(key);
      this.entries.set(key, hit);
    }
    return hit;
  }
  set(key: string, value: Cached<T>) {
    this.entries.set(key, value);
    if (this.entries.size > this.capacity) this.entries.delete(this.entries.keys().next().value!);
  }
  clear() {
    this.entries.clear();
  }
}

const piSystems = new LruCache<PiSystem>(CACHE_CAPACITY);
const models = new LruCache<HuckelModel>(CACHE_CAPACITY);
let enabled = true;
const stats = { piSystemBuilds: 0, modelSolves: 0, hits: 0 };

/** Turns the per-structure cache on or off (the benchmark measures both); turning it off empties it. */
export function setHuckelCacheEnabled(on: boolean) {
  enabled = on;
  if (!on) clearHuckelCache();
}

export function clearHuckelCache() {
  piSystems.clear();
  models.clear();
  stats.piSystemBuilds = stats.modelSolves = stats.hits = 0;
}

/** How many π systems were built and models solved since the last clear (tests and benchmark). */
export function huckelCacheStats() {
  return { ...stats };
}

function memo<T>(cache: LruCache<T>, key: string, build: () => T, counter: 'piSystemBuilds' | 'modelSolves'): T {
  const hit = enabled ? cache.get(key) : undefined;
  if (hit) {
    stats.hits++;
    if (hit.ok) return hit.value;
    throw hit.error;
  }
  stats[counter]++;
  try {
    const value = build();
    if (enabled) cache.set(key, { ok: true, value });
    return value;
  } catch (e) {
    if (e instanceof ChemError && enabled) cache.set(key, { ok: false, error: e });
    throw e;
  }
}

/** The π system of a SMILES string (cached). */
export function piSystemOf(smiles: string): PiSystem {
  return memo(piSystems, smiles.trim(), () => findPiSystem(smiles), 'piSystemBuilds');
}

/** A structure argument: SMILES text in one cell, or a square range holding the Hückel matrix. */
export function structureText(structure: Table): string | undefined {
  if (structure.length === 1 && structure[0].length === 1 && typeof structure[0][0] !== 'number') {
    const cell = structure[0][0];
    if (typeof cell === 'boolean') throw new ChemError(`the structure must be SMILES text or a square matrix range, got ${String(cell).toUpperCase()}`);
    return cell;
  }
  return undefined;
}

/** Resolves a structure argument to a solved Hückel model (cached per SMILES + parameter set, or per matrix). */
export function huckelModelOf(structure: Table, params?: string): HuckelModel {
  const smiles = structureText(structure);
  if (smiles !== undefined) {
    const set: ParameterSetName = parseParameterSet(params);
    const pi = piSystemOf(smiles);
    return memo(models, `${set}\u0000${smiles.trim()}`, () => modelFromPiSystem(pi, set), 'modelSolves');
  }
  if (params !== undefined && params.trim() !== '')
    throw new ChemError('the params argument applies to SMILES input; a matrix range already holds h and k');
  const matrix = readSymmetricMatrix(structure, 'the Hückel matrix range');
  return memo(models, `matrix\u0000${matrix.map((row) => row.join(',')).join(';')}`, () => modelFromMatrix(matrix), 'modelSolves');
}

/** The π system behind a structure argument, which must be SMILES (for functions that need atoms and rings). */
export function requireSmiles(structure: Table, functionName: string): PiSystem {
  const smiles = structureText(structure);
  if (smiles === undefined) throw new ChemError(`${functionName} needs a SMILES structure: a matrix range carries no atoms, bonds or rings`);
  return piSystemOf(smiles);
}
