// Runs in the values keeper's worker thread (keeper.ts): holds a warm engine per recently edited
// workbook, brings it forward by each revision's cell changes, and answers with the revision's
// values ready to store. Workbooks not used for a while, or past the cell budget, are let go.
import { parentPort } from 'node:worker_threads';
import { unpackCells, type PackedCells } from '../xlsx/packedCells.js';
import { encodeValues } from './storedFormat.js';
import { WarmWorkbook, type CellChange } from './warmWorkbook.js';

export type KeeperJob =
  | { id: number; kind: 'build'; workbookId: string; revision: number; sheets: { id: string; name: string; packed: PackedCells }[] }
  | { id: number; kind: 'apply'; workbookId: string; fromRevision: number; revision: number; changes: CellChange[] }
  | { id: number; kind: 'forget'; workbookId: string };

export type KeeperReply =
  | { id: number; ok: true; stale?: false; revision: number; valuesGzip: Uint8Array; extras: string; volatileFormulas: number; cells: number; changed?: [string, number, number][] | null; engineMs: number; readMs: number; heapUsedBytes: number }
  | { id: number; ok: true; stale: true }
  | { id: number; ok: false; message: string };

/** Warm engines kept at once, and the cells over all of them (about 1 KB of engine per cell). */
const MAX_WARM = 4;
const MAX_WARM_CELLS = 400_000;

const warm = new Map<string, WarmWorkbook>(); // in order of last use, oldest first

function keep(workbookId: string, workbook: WarmWorkbook) {
  warm.delete(workbookId);
  warm.set(workbookId, workbook);
  let total = [...warm.values()].reduce((n, w) => n + w.cellCount, 0);
  for (const [id, w] of warm) {
    if (warm.size <= 1 || (warm.size <= MAX_WARM && total <= MAX_WARM_CELLS)) break;
    warm.delete(id);
    total -= w.cellCount;
    w.destroy();
  }
}

function forget(workbookId: string) {
  warm.get(workbookId)?.destroy();
  warm.delete(workbookId);
}

function run(job: KeeperJob): KeeperReply {
  if (job.kind === 'forget') {
    forget(job.workbookId);
    return { id: job.id, ok: true, stale: true };
  }
  const started = performance.now();
  let workbook: WarmWorkbook;
  let changed: [string, number, number][] | null | undefined;
  if (job.kind === 'apply') {
    const held = warm.get(job.workbookId);
    if (!held || held.revision !== job.fromRevision || !held.canApply(job.changes)) return { id: job.id, ok: true, stale: true };
    changed = held.apply(job.changes, job.revision);
    workbook = held;
  } else {
    forget(job.workbookId);
    workbook = new WarmWorkbook(
      job.sheets.map((s) => ({ id: s.id, name: s.name, cells: unpackCells(s.packed) })),
      job.revision,
    );
  }
  const engineMs = performance.now() - started;
  const snapshot = workbook.snapshot();
  const valuesGzip = encodeValues(snapshot.payload);
  keep(job.workbookId, workbook);
  return {
    id: job.id,
    ok: true,
    revision: workbook.revision,
    valuesGzip,
    extras: JSON.stringify(snapshot.extras),
    volatileFormulas: snapshot.volatileFormulas,
    cells: workbook.cellCount,
    changed,
    engineMs,
    readMs: performance.now() - started - engineMs,
    heapUsedBytes: process.memoryUsage().heapUsed,
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
