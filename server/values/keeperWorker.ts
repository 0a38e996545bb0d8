// Runs in the values keeper's worker thread (keeper.ts): holds a warm engine per recently edited
// workbook, brings it forward by each revision's cell changes, and answers with the revision's
// values ready to store. Workbooks not used for a while, or past the cell budget, are let go.
import { parentPort } from 'node:worker_threads';
import { setStructureResolver } from '../../functions/structureResults.js';
import type { StoredStructures } from '../structures/workerResults.js';
import { structureHash } from '../structures/structureKey.js';
import { unpackCells, type PackedCells } from '../xlsx/packedCells.js';
import { encodeValues, firstRowsJson } from './storedFormat.js';
import { WarmWorkbook, type CellChange } from './warmWorkbook.js';

export type KeeperJob =
  | { id: number; kind: 'build'; workbookId: string; revision: number; sheets: { id: string; name: string; packed: PackedCells }[]; structures: StoredStructures }
  /** `structures`: the workbook's stored results when more were stored since the engine last had them. */
  | { id: number; kind: 'apply'; workbookId: string; fromRevision: number; revision: number; changes: CellChange[]; structures?: StoredStructures }
  | { id: number; kind: 'forget'; workbookId: string };

export type KeeperReply =
  | { id: number; ok: true; stale?: false; revision: number; valuesGzip: Uint8Array; extras: string; firstRows: string; volatileFormulas: number; cells: number; changed?: [string, number, number][] | null; engineMs: number; readMs: number; heapUsedBytes: number; pendingCells: number; missingStructures: MissingStructure[] }
  | { id: number; ok: true; stale: true }
  | { id: number; ok: false; message: string };

/** A structure the engine asked for that is not stored: the structure service computes it. */
export interface MissingStructure {
  structure: string;
  charge?: number;
}

/**
 * Warm engines kept at once, and the cells over all of them (about 0.75 KB of engine per cell); one
 * workbook larger than that (up to the keeper's limit, keeper.ts) is still kept, alone.
 */
const MAX_WARM = 4;
const MAX_WARM_CELLS = 400_000;

const warm = new Map<string, WarmWorkbook>(); // in order of last use, oldest first
/** Each warm workbook's stored extended-Hückel results (parsed as they are first used). */
const results = new Map<string, { stored: StoredStructures; parsed: Map<string, unknown> }>();

/**
 * While a job evaluates, extended-Hückel functions answer from the workbook's stored results and say
 * "pending" for the rest, which are gathered for the structure service: the keeper never computes a
 * structure itself, so each is computed once per workbook, in the background queue.
 */
function resolveFrom(workbookId: string, missing: Map<string, MissingStructure>) {
  const held = results.get(workbookId) ?? { stored: {} as StoredStructures, parsed: new Map<string, unknown>() };
  setStructureResolver(({ structure, charge, key }) => {
    const hash = structureHash(key);
    let result = held.parsed.get(hash);
    if (result === undefined) {
      const text = held.stored[hash];
      if (text === undefined) {
        missing.set(hash, charge === undefined ? { structure } : { structure, charge });
        return 'pending';
      }
      result = JSON.parse(text);
      held.parsed.set(hash, result);
    }
    return result as never;
  });
}

function keep(workbookId: string, workbook: WarmWorkbook) {
  warm.delete(workbookId);
  warm.set(workbookId, workbook);
  let total = [...warm.values()].reduce((n, w) => n + w.cellCount, 0);
  for (const [id, w] of warm) {
    if (warm.size <= 1 || (warm.size <= MAX_WARM && total <= MAX_WARM_CELLS)) break;
    warm.delete(id);
    results.delete(id);
    total -= w.cellCount;
    w.destroy();
  }
}

/** Lets go of the least recently used engines until `incoming` more cells fit the budget (or none is left). */
function makeRoom(incoming: number) {
  let total = [...warm.values()].reduce((n, w) => n + w.cellCount, 0);
  for (const [id, w] of warm) {
    if (total + incoming <= MAX_WARM_CELLS) break;
    forget(id);
    total -= w.cellCount;
  }
}

function forget(workbookId: string) {
  warm.get(workbookId)?.destroy();
  warm.delete(workbookId);
  results.delete(workbookId);
}

function run(job: KeeperJob): KeeperReply {
  if (job.kind === 'forget') {
    forget(job.workbookId);
    return { id: job.id, ok: true, stale: true };
  }
  const started = performance.now();
  let workbook: WarmWorkbook;
  let changed: [string, number, number][] | null | undefined;
  const missing = new Map<string, MissingStructure>();
  let snapshot;
  try {
    if (job.kind === 'apply') {
      const held = warm.get(job.workbookId);
      if (!held || held.revision !== job.fromRevision || !held.canApply(job.changes)) return { id: job.id, ok: true, stale: true };
      if (job.structures) results.set(job.workbookId, { stored: job.structures, parsed: new Map() });
      resolveFrom(job.workbookId, missing);
      changed = held.apply(job.changes, job.revision);
      workbook = held;
    } else {
      forget(job.workbookId);
      // Held engines go first when this one would not fit beside them: a million-cell build next to
      // another large engine would double the thread's peak.
      makeRoom(job.sheets.reduce((n, s) => n + s.packed.rows.length, 0));
      results.set(job.workbookId, { stored: job.structures, parsed: new Map() });
      resolveFrom(job.workbookId, missing);
      workbook = new WarmWorkbook(
        job.sheets.map((s) => ({ id: s.id, name: s.name, cells: unpackCells(s.packed) })),
        job.revision,
      );
    }
    snapshot = workbook.snapshot();
  } finally {
    setStructureResolver(null);
  }
  const engineMs = performance.now() - started;
  const valuesGzip = encodeValues(snapshot.payload);
  keep(job.workbookId, workbook);
  return {
    id: job.id,
    ok: true,
    revision: workbook.revision,
    valuesGzip,
    extras: JSON.stringify(snapshot.extras),
    firstRows: firstRowsJson(snapshot.payload, workbook.cellCount),
    volatileFormulas: snapshot.volatileFormulas,
    cells: workbook.cellCount,
    changed,
    engineMs,
    readMs: performance.now() - started - engineMs,
    heapUsedBytes: process.memoryUsage().heapUsed,
    pendingCells: snapshot.pendingCells,
    missingStructures: [...missing.values()],
  };
}

parentPort!.on('message', (job: KeeperJob) => {
  let reply: KeeperReply;
  try {
    reply = run(job);
  } catch (e) {
    // A workbook the engine cannot take whole is left to the on-demand path, which isolates bad cells.
    if (job.kind !== 'forget') forget(job.workbookId);
    reply = { id: job.id, ok: false, message: e instanceof Error ? e.message : String(e) };
  }
  parentPort!.postMessage(reply, reply.ok && !reply.stale ? [reply.valuesGzip.buffer as ArrayBuffer] : []);
});
parentPort!.postMessage({ ready: true });
