// Keeps each workbook's computed values up to date with its revisions, in the background: after a
// revision is committed (any revision event: edits, tab operations, imports, restores) the keeper
// brings the workbook's warm engine forward in its worker thread and stores the values with the
// revision number they belong to (store.ts). A workbook's revisions are caught up in one job when
// several land while one is computing. Cell edits are applied to the warm engine incrementally;
// tab operations, a workbook the thread no longer holds, or a long run of revisions rebuild it.
import type { Logger } from 'pino';
import type { RevisionPatch } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { eq } from 'drizzle-orm';
import type { Db } from '../db/index.js';
import { workbooks } from '../db/schema.js';
import { currentRevision, patchesAfter } from '../services/revisionLog.js';
import { loadContentInSlices } from '../services/workbookSlices.js';
import { packCellsInSlices, packedTransfer, type PackedCells } from '../xlsx/packedCells.js';
import { onStructuresSettled, requestStructures, storedStructuresOf, structuresUnderWay } from '../structures/structureService.js';
import { SpreadsheetError } from '../xlsx/limits.js';
import { runKeeperJob } from './keeperThread.js';
import type { KeeperReply } from './keeperWorker.js';
import { storeValues } from './store.js';
import type { CellChange } from './warmWorkbook.js';

const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

/** More changed cells than this since the warm revision: rebuilding costs about the same. */
const MAX_INCREMENTAL_CHANGES = 20_000;

/**
 * Workbooks with more non-empty cells than this are not kept; their values are computed on demand as
 * before. The engine takes about 0.75 KB a cell (600 MB of heap for 800,000 chemistry cells, measured
 * with bench/keeperLarge.ts), so a million cells fit the keeper thread's own heap limit
 * (keeperWorkerLimits) with room for reading the values out. ORBITAB_STORED_VALUES_MAX_CELLS sets it.
 */
export const defaultMaxKeptCells = 1_000_000;
export const maxKeptCells = (() => {
  const n = Number(process.env.ORBITAB_STORED_VALUES_MAX_CELLS);
  return Number.isFinite(n) && n >= 0 ? Math.floor(n) : defaultMaxKeptCells;
})();

export interface KeeperRun {
  workbookId: string;
  revision: number;
  mode: 'incremental' | 'rebuild';
  /** Cells whose value changed (incremental runs only). */
  changed?: [string, number, number][] | null;
  engineMs: number;
  readMs: number;
  totalMs: number;
  storedBytes: number;
  heapUsedBytes: number;
}

/** Only cell edits can be applied to a warm engine; a tab's display settings change no value. */
/** The workbook's revision, or null once it is deleted. */
const revisionOf = (db: Db, workbookId: string) => db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, workbookId)).get()?.revision ?? null;

const cellsOnly = (patch: RevisionPatch) => patch.sheetOps.every((op) => op.op === 'settings');

export class ValuesKeeper {
  /** The newest revision seen per workbook that still needs its values. */
  private wanted = new Map<string, number>();
  /** The revision the worker's warm engine holds, as far as this keeper knows. */
  private warm = new Map<string, number>();
  /** A revision that could not be computed: not tried again (reads compute it on demand). */
  private failed = new Map<string, number>();
  /** Stored extended-Hückel results the worker's warm engine was given, counted. */
  private structuresSent = new Map<string, number>();
  /** Workbooks whose last run waited on structures: run again when the structure service is done with them. */
  private awaitingStructures = new Set<string>();
  private readonly unsubscribe: () => void;
  private running: Promise<void> | null = null;
  private stopped = false;
  private idleWaiters: (() => void)[] = [];
  /** Workbooks with more non-empty cells are not kept (tests lower it). */
  maxCells = maxKeptCells;
  /** Called after each stored run (benchmarks, tests). */
  onRun: ((run: KeeperRun) => void) | null = null;

  constructor(
    private readonly ctx: Pick<AppContext, 'db' | 'events'> & { logger: Logger },
  ) {
    this.unsubscribe = onStructuresSettled((from, workbookId) => {
      if (from.db !== ctx.db || !this.awaitingStructures.delete(workbookId)) return;
      this.nudge(workbookId);
    });
  }

  /** A revision of the workbook was committed. */
  noteRevision(workbookId: string, revision: number) {
    if (this.stopped) return;
    if ((this.wanted.get(workbookId) ?? -1) >= revision) return;
    this.wanted.set(workbookId, revision);
    // Started after a turn of the event loop: the commit that announced the revision (an import's
    // last step, say) answers first rather than waiting on the keeper's first count and page.
    this.running ??= turn()
      .then(() => this.drain())
      .finally(() => {
        this.running = null;
        for (const w of this.idleWaiters.splice(0)) w();
      });
  }

  /** The workbook's current revision has no stored values (a read found none): compute them. */
  nudge(workbookId: string) {
    const revision = revisionOf(this.ctx.db, workbookId);
    if (revision !== null) this.noteRevision(workbookId, revision);
  }

  /** Resolves when no workbook is waiting for its values. */
  idle(): Promise<void> {
    if (!this.running) return Promise.resolve();
    return new Promise((resolve) => this.idleWaiters.push(resolve));
  }

  stop() {
    this.stopped = true;
    this.wanted.clear();
    this.unsubscribe();
  }

  private async drain() {
    while (!this.stopped && this.wanted.size > 0) {
      const [workbookId, revision] = this.wanted.entries().next().value as [string, number];
      this.wanted.delete(workbookId);
      if ((this.failed.get(workbookId) ?? -1) >= revision) continue;
      try {
        await this.bringUpToDate(workbookId);
      } catch (err) {
        // The database closed under us (a test app ending, shutdown), or the workbook was deleted.
        this.ctx.logger.warn({ err, workbookId }, 'stored values were not updated');
        this.warm.delete(workbookId);
      }
    }
  }

  /** Stored extended-Hückel results of the workbook, counted (they are only ever added). */
  private structureCount(workbookId: string): number {
    return (this.ctx.db.$client.prepare(`select count(*) as n from structure_results where workbook_id = ?`).get(workbookId) as { n: number }).n;
  }

  /**
   * Some cells wait on extended-Hückel results: values with cells still "computing…" are not final, so
   * nothing is stored for this revision (reads compute it on demand meanwhile). The missing structures
   * go to the structure service's queue — the one place they are computed — and the workbook is run
   * again, with a fresh engine (its waiting cells hold their pending answers), once the queue is done.
   */
  private awaitStructures(workbookId: string, missing: { structure: string; charge?: number }[]) {
    this.warm.delete(workbookId);
    this.awaitingStructures.add(workbookId);
    try {
      requestStructures(this.ctx, workbookId, missing);
    } catch (e) {
      if (!(e instanceof SpreadsheetError)) throw e;
      // The server's structure queue is full: the next revision or read asks again.
      this.awaitingStructures.delete(workbookId);
      return;
    }
    // Stored between this run's read and now: nothing is left to wait for.
    if (missing.length > 0 && structuresUnderWay(workbookId) === 0 && this.awaitingStructures.delete(workbookId)) this.nudge(workbookId);
  }

  /** Too large to keep: left to the on-demand path, and the worker lets go of any engine it held. */
  private async leaveTooLarge(workbookId: string) {
    if (this.warm.delete(workbookId)) await runKeeperJob({ kind: 'forget', workbookId });
    const at = revisionOf(this.ctx.db, workbookId);
    if (at !== null) this.failed.set(workbookId, at);
  }

  private async bringUpToDate(workbookId: string) {
    const started = performance.now();
    const warmAt = this.warm.get(workbookId);
    let reply: KeeperReply | null = null;
    let mode: KeeperRun['mode'] = 'incremental';
    if (warmAt !== undefined) {
      const since = this.ctx.db.transaction((tx) => ({ revision: currentRevision(tx, workbookId), patches: patchesAfter(tx, workbookId, warmAt).reverse() }));
      const changes: CellChange[] = [];
      let applicable = since.patches.length === since.revision - warmAt;
      for (const p of since.patches) {
        if (!applicable || !cellsOnly(p.patch) || changes.length > MAX_INCREMENTAL_CHANGES) {
          applicable = false;
          break;
        }
        for (const c of p.patch.changes) changes.push({ sheetId: c.sheetId, row: c.row, col: c.col, input: c.after });
      }
      if (applicable) {
        const count = this.structureCount(workbookId);
        const fresher = count > (this.structuresSent.get(workbookId) ?? 0);
        if (fresher) this.structuresSent.set(workbookId, count);
        reply = await runKeeperJob({ kind: 'apply', workbookId, fromRevision: warmAt, revision: since.revision, changes, structures: fresher ? storedStructuresOf(this.ctx, workbookId) : undefined });
        if (reply.ok && reply.stale) reply = null;
      }
    }
    if (!reply) {
      mode = 'rebuild';
      // Counted while reading, page by page: a separate count of a million cells would hold the event loop.
      const tooMany = new Error('too many cells to keep');
      const content = await loadContentInSlices(this.ctx, workbookId, undefined, (cells) => {
        if (cells > this.maxCells) throw tooMany;
      }).catch((e: unknown) => {
        if (e === tooMany) return 'too many' as const;
        throw e;
      });
      if (content === 'too many') return this.leaveTooLarge(workbookId);
      if (!content) {
        this.warm.delete(workbookId);
        return; // deleted, or edited on every try: the next revision's event brings it back
      }
      const sheets: { id: string; name: string; packed: PackedCells }[] = [];
      for (const t of content.tabs) sheets.push({ id: t.id, name: t.name, packed: await packCellsInSlices(content.cells.get(t.id) ?? [], turn) });
      const structures = storedStructuresOf(this.ctx, workbookId);
      this.structuresSent.set(workbookId, Object.keys(structures).length);
      reply = await runKeeperJob({ kind: 'build', workbookId, revision: content.revision, sheets, structures }, sheets.flatMap((s) => packedTransfer(s.packed)));
    }
    if (!reply.ok) {
      this.warm.delete(workbookId);
      const at = revisionOf(this.ctx.db, workbookId);
      if (at !== null) this.failed.set(workbookId, at);
      this.ctx.logger.warn({ workbookId, revision: at, reason: reply.message }, 'values left to be computed on demand');
      return;
    }
    if (reply.stale) return;
    // A warm workbook grown past the limit by its edits.
    if (reply.cells > this.maxCells) return this.leaveTooLarge(workbookId);
    if (reply.pendingCells > 0) {
      this.awaitStructures(workbookId, reply.missingStructures);
      return;
    }
    this.warm.set(workbookId, reply.revision);
    const valuesGzip = Buffer.from(reply.valuesGzip.buffer, reply.valuesGzip.byteOffset, reply.valuesGzip.byteLength);
    const totalMs = performance.now() - started;
    storeValues(this.ctx.db, workbookId, { revision: reply.revision, valuesGzip, extras: JSON.parse(reply.extras), firstRows: reply.firstRows, volatileFormulas: reply.volatileFormulas, computedMs: totalMs });
    this.onRun?.({ workbookId, revision: reply.revision, mode, changed: reply.changed, engineMs: reply.engineMs, readMs: reply.readMs, totalMs, storedBytes: valuesGzip.byteLength, heapUsedBytes: reply.heapUsedBytes });
    // Revisions that landed while this one computed.
    const now = revisionOf(this.ctx.db, workbookId);
    if (now !== null && now > reply.revision && (this.wanted.get(workbookId) ?? -1) < now) this.wanted.set(workbookId, now);
  }
}
