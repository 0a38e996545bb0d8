// Extended-Hückel results per workbook: answered from the structure_results table when stored, and
// otherwise computed once in the compute pool (never on this thread) in the background, stored, and
// picked up by the browser's next request. Several members asking for the same structure at once
// share one computation; a member opening the workbook later reads what is stored.
import { and, eq, inArray } from 'drizzle-orm';
import { ehtKeyText, normaliseStructure } from '../../functions/chem/ehtSummary.js';
import type { AppContext } from '../context.js';
import { structureResults } from '../db/schema.js';
import { recalcWorkerLimits, SpreadsheetError } from '../xlsx/limits.js';
import { computePool } from '../xlsx/workerPool.js';
import { structureHash } from './structureKey.js';
import type { FreshStructure, StoredStructures } from './workerResults.js';

/** What the service uses of an app: its database and its log. */
export type StructureCtx = Pick<AppContext, 'db' | 'logger'>;

/** Called when a workbook has no structure left queued or being computed (the values keeper listens). */
type SettledListener = (ctx: StructureCtx, workbookId: string) => void;
const settledListeners = new Set<SettledListener>();

export function onStructuresSettled(listener: SettledListener): () => void {
  settledListeners.add(listener);
  return () => settledListeners.delete(listener);
}

export interface StructureInput {
  structure: string;
  charge?: number;
}

/** Structures one worker job computes: small enough that results arrive steadily, large enough to amortise the trip. */
const BATCH = 2;
/** Jobs in the compute pool at once for background structures: one per core, leaving /values and exports room to queue. */
const MAX_RUNNING = 2;
/** Structures waiting over the whole server; past it a request is told to come back later. */
export const maxQueuedStructures = 20_000;
/** SQLite's bound on host parameters is 32,766; a key list is read in pieces well under it. */
const KEYS_PER_QUERY = 500;

interface Job {
  ctx: StructureCtx;
  workbookId: string;
  hash: string;
  input: StructureInput;
}

const queue: Job[] = [];
/** workbookId:hash of every structure queued or being computed. */
const underWay = new Set<string>();
let running = 0;
/** Structures computed by the background queue since start (tests count recomputations with it). */
let computed = 0;
/** Times a structure alone ran past the worker's limits; a busy machine gets a second chance before the failure is stored. */
const overLimit = new Map<string, number>();
const TRIES = 2;

export function structureComputations(): number {
  return computed;
}

function save(ctx: StructureCtx, workbookId: string, rows: FreshStructure[]) {
  if (rows.length === 0) return;
  ctx.db.transaction((tx) => {
    for (const r of rows)
      tx.insert(structureResults).values({ workbookId, key: r.hash, result: r.json, computeMs: r.computeMs }).onConflictDoNothing().run();
  });
}

function stored(ctx: StructureCtx, workbookId: string, hashes: string[]): Map<string, string> {
  const out = new Map<string, string>();
  for (let i = 0; i < hashes.length; i += KEYS_PER_QUERY) {
    const rows = ctx.db
      .select({ key: structureResults.key, result: structureResults.result })
      .from(structureResults)
      .where(and(eq(structureResults.workbookId, workbookId), inArray(structureResults.key, hashes.slice(i, i + KEYS_PER_QUERY))))
      .all();
    for (const r of rows) out.set(r.key, r.result);
  }
  return out;
}

/** Every stored result of a workbook, for a compute job (/values, exports). */
export function storedStructuresOf(ctx: StructureCtx, workbookId: string): StoredStructures {
  const out: StoredStructures = {};
  for (const r of ctx.db.select({ key: structureResults.key, result: structureResults.result }).from(structureResults).where(eq(structureResults.workbookId, workbookId)).all())
    out[r.key] = r.result;
  return out;
}

/** Stores what a /values or export job computed anew. */
export function saveFreshStructures(ctx: StructureCtx, workbookId: string, fresh: FreshStructure[] | undefined) {
  if (fresh?.length) save(ctx, workbookId, fresh);
}

async function runBatch(queued: Job[]) {
  const { ctx, workbookId } = queued[0];
  // A /values or export job may have computed and stored some while these waited.
  const already = stored(ctx, workbookId, queued.map((j) => j.hash));
  const batch = queued.filter((j) => !already.has(j.hash));
  if (batch.length === 0) return;
  try {
    const outcome = await computePool.run<{ json: string; computeMs: number }[]>({ kind: 'structures', inputs: batch.map((j) => j.input) }, [], {
      limits: recalcWorkerLimits,
      doing: 'computing extended-Hückel results',
    });
    save(ctx, workbookId, outcome.result.map((r, i) => ({ hash: batch[i].hash, ...r })));
    computed += batch.length;
  } catch (e) {
    if (!(e instanceof SpreadsheetError)) ctx.logger.error({ err: e, workbookId }, 'structure batch failed');
    if (batch.length > 1) {
      // One structure past the worker's limits must not take the others with it: each alone.
      for (const job of batch) await runBatch([job]);
      return;
    }
    const hash = batch[0].hash;
    const tries = (overLimit.get(hash) ?? 0) + 1;
    // Busy or slow for now: not stored, so the next request queues it again.
    if (e instanceof SpreadsheetError && e.code !== 'parse_out_of_memory' && tries < TRIES) {
      overLimit.set(hash, tries);
      return;
    }
    overLimit.delete(hash);
    const message = e instanceof SpreadsheetError ? `the structure could not be computed within the server's limits (${e.message})` : 'the structure could not be computed';
    save(ctx, workbookId, [{ hash, json: JSON.stringify({ error: { kind: 'VALUE', message } }), computeMs: 0 }]);
    computed++;
  }
}

function drain() {
  while (running < MAX_RUNNING && queue.length > 0) {
    const first = queue[0];
    // A batch holds one workbook's structures, so its results are saved under that workbook.
    const batch: Job[] = [];
    for (let i = 0; i < queue.length && batch.length < BATCH; ) {
      if (queue[i].workbookId === first.workbookId && queue[i].ctx === first.ctx) batch.push(queue.splice(i, 1)[0]);
      else i++;
    }
    running++;
    void runBatch(batch).finally(() => {
      for (const j of batch) underWay.delete(`${j.workbookId}:${j.hash}`);
      running--;
      drain();
      const { ctx, workbookId } = batch[0];
      if (structuresUnderWay(workbookId) === 0) for (const listener of settledListeners) listener(ctx, workbookId);
    });
  }
}

/**
 * The answer to POST /api/workbooks/:id/structures: for each input its stored result (JSON text, sent
 * as it is) or null while it is being computed. Missing ones are queued once.
 */
export function requestStructures(ctx: StructureCtx, workbookId: string, inputs: StructureInput[]): { results: (string | null)[]; queued: number } {
  const hashes = inputs.map((i) => structureHash(ehtKeyText(i.structure, i.charge)));
  const found = stored(ctx, workbookId, [...new Set(hashes)]);
  let queued = 0;
  const results = inputs.map((input, i) => {
    const hash = hashes[i];
    const json = found.get(hash);
    if (json !== undefined) return json;
    const id = `${workbookId}:${hash}`;
    if (!underWay.has(id)) {
      if (queue.length >= maxQueuedStructures) throw new SpreadsheetError('busy', 'the server has many structures to compute; the rest will be asked for again shortly');
      underWay.add(id);
      queue.push({ ctx, workbookId, hash, input: { structure: normaliseStructure(input.structure), charge: input.charge } });
      queued++;
    }
    return null;
  });
  if (queued > 0) drain();
  return { results, queued };
}

/** Structures waiting or being computed for a workbook (its progress line). */
export function structuresUnderWay(workbookId: string): number {
  let n = 0;
  for (const id of underWay) if (id.startsWith(`${workbookId}:`)) n++;
  return n;
}

/** What a compute job (/values, an export) takes along: the stored results, and where to keep new ones. */
export interface JobStructures {
  stored: StoredStructures;
  save: (fresh: FreshStructure[] | undefined) => void;
}

export function jobStructures(ctx: StructureCtx, workbookId: string): JobStructures {
  return { stored: storedStructuresOf(ctx, workbookId), save: (fresh) => saveFreshStructures(ctx, workbookId, fresh) };
}

/** The JSON body of POST /structures; stored results are JSON text already, joined rather than parsed and serialised again. */
export function structuresAnswer(ctx: StructureCtx, workbookId: string, inputs: StructureInput[]): string {
  const { results } = requestStructures(ctx, workbookId, inputs);
  return `{"results":[${results.map((r) => r ?? 'null').join(',')}],"underWay":${structuresUnderWay(workbookId)}}`;
}
