// Inside a compute worker: extended-Hückel results for a job come from the workbook's stored results
// (handed in with the job), and a structure not stored yet is computed here, in the worker, and handed
// back to be stored. So /values and exports never recompute what a browser's request already computed,
// and what they compute is kept for everyone.
import { computeEhtResult } from '../../functions/chem/ehtSummary.js';
import { setStructureResolver } from '../../functions/structureResults.js';
import { structureHash } from './structureKey.js';

/** key hash → EhtResult JSON. */
export type StoredStructures = Record<string, string>;
export interface FreshStructure {
  hash: string;
  json: string;
  computeMs: number;
}

export interface StructureSession {
  fresh: FreshStructure[];
}

/**
 * Registers a resolver for one job; call the returned `end` when the job is done. Each structure
 * computed anew is handed to `post` at once (the parent stores it), so a job stopped at its time
 * limit still keeps what it finished, and asking again goes further.
 */
export function useStructures(stored: StoredStructures | undefined, post?: (fresh: FreshStructure) => void): StructureSession & { end: () => void } {
  const session: StructureSession = { fresh: [] };
  const parsed = new Map<string, ReturnType<typeof computeEhtResult>>();
  setStructureResolver(({ structure, charge, key }) => {
    const hash = structureHash(key);
    const known = parsed.get(hash);
    if (known) return known;
    const text = stored?.[hash];
    let result;
    if (text !== undefined) result = JSON.parse(text);
    else {
      const started = performance.now();
      result = computeEhtResult(structure, charge);
      const fresh = { hash, json: JSON.stringify(result), computeMs: Math.round(performance.now() - started) };
      if (post) post(fresh);
      else session.fresh.push(fresh);
    }
    parsed.set(hash, result);
    return result;
  });
  return { ...session, end: () => setStructureResolver(null) };
}

/** The 'structures' job: compute each structure (not already stored) and give back its JSON. */
export function computeStructures(inputs: { structure: string; charge?: number }[]): { json: string; computeMs: number }[] {
  return inputs.map(({ structure, charge }) => {
    const started = performance.now();
    const json = JSON.stringify(computeEhtResult(structure, charge));
    return { json, computeMs: Math.round(performance.now() - started) };
  });
}
