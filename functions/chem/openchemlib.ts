// openchemlib reads SMILES and molfiles, perceives rings and builds conformers for functions/chem/.
// It is about a megabyte of compiled code: a page that imported it with its start-up script would
// compile and run it in the same task as the grid's first mount, holding the page for a third of a
// second. So a page's main thread loads it on its own (loadOpenchemlib, which the workbook awaits
// before its engine is built), while everywhere else (Node: server, CLI, tests; a web worker) it is
// loaded with this module, so synchronous callers always find it in place.
import type * as Ocl from 'openchemlib';
import { ChemError } from './errors.js';

export type Openchemlib = typeof Ocl;

let toolkit: Openchemlib | undefined;
let loading: Promise<Openchemlib> | undefined;

/** Loads openchemlib once; later calls get the same promise. */
export function loadOpenchemlib(): Promise<Openchemlib> {
  loading ??= import('openchemlib').then((lib) => (toolkit = lib));
  return loading;
}

/** Whether openchemlib is in place (synchronous callers may use it). */
export function openchemlibLoaded(): boolean {
  return toolkit !== undefined;
}

/** openchemlib, for synchronous callers; a page that has not loaded it yet gets a ChemError saying so. */
export function openchemlib(): Openchemlib {
  if (!toolkit) {
    void loadOpenchemlib();
    throw new ChemError('the structure toolkit is still loading; enter the formula again in a moment');
  }
  return toolkit;
}

// No document: Node or a worker, where nothing paints and callers are synchronous from the start.
if (typeof document === 'undefined') await loadOpenchemlib();
