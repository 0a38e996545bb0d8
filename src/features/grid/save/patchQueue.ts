// Sends cell changes to the server as patches: merged per cell, debounced, one patch in flight at a
// time, retried with growing pauses while the network or server is down, and kept in local storage
// until acknowledged. The save state it reports is derived from what is actually unacknowledged, so
// "saved" is shown only when the server holds every change.
import { maxCellsPerPatch, type CellConflict } from '../../../../shared/workbooks.js';
import { ApiError } from '../../../lib/api.js';
import type { CellInput, PendingStore } from './pendingStore.js';

export type SaveStatus =
  | { kind: 'saved' }
  | { kind: 'saving'; waiting: number }
  | { kind: 'offline'; waiting: number; retryAt: number; reason: string }
  | { kind: 'conflict'; waiting: number; conflicts: CellConflict[] }
  | { kind: 'refused'; waiting: number; message: string };

export interface PatchTransport {
  send(patch: { baseRevision: number; changes: CellInput[] }): Promise<{ revision: number }>;
}

export interface PatchQueueOptions {
  transport: PatchTransport;
  store: PendingStore;
  /** The revision of the workbook as loaded from the server. */
  baseRevision: number;
  debounceMs?: number;
  firstRetryMs?: number;
  maxRetryMs?: number;
  maxCellsPerSend?: number;
}

const cellKey = (c: { sheetId: string; row: number; col: number }) => `${c.sheetId}\u0000${c.row}\u0000${c.col}`;

/** Network failures, 5xx and 429 are worth retrying; other refusals would only repeat themselves. */
function isTransient(error: unknown): boolean {
  if (!(error instanceof ApiError)) return true; // fetch rejects with a TypeError when offline
  return error.status >= 500 || error.status === 429 || error.status === 408 || error.code === 'bad_response';
}

export class PatchQueue {
  private pending = new Map<string, CellInput>();
  private inFlight: Map<string, string> | null = null;
  private base: number;
  private timer: ReturnType<typeof setTimeout> | null = null;
  private failures = 0;
  private batchLimit: number;
  private lastBatchSize = 0;
  private current: SaveStatus = { kind: 'saved' };
  private listeners = new Set<(s: SaveStatus) => void>();
  private disposed = false;
  private readonly debounceMs: number;
  private readonly firstRetryMs: number;
  private readonly maxRetryMs: number;

  constructor(private readonly opts: PatchQueueOptions) {
    this.base = opts.baseRevision;
    this.debounceMs = opts.debounceMs ?? 300;
    this.firstRetryMs = opts.firstRetryMs ?? 1000;
    this.maxRetryMs = opts.maxRetryMs ?? 30_000;
    this.batchLimit = opts.maxCellsPerSend ?? maxCellsPerPatch;
  }

  /** Takes over changes left from an earlier visit (they keep their own base revision). */
  restore(snapshot: { baseRevision: number; changes: CellInput[] }) {
    this.base = snapshot.baseRevision;
    for (const c of snapshot.changes) this.pending.set(cellKey(c), c);
    this.persist();
    this.setStatus(this.idleStatus());
    this.schedule(0);
  }

  get baseRevision() {
    return this.base;
  }

  /**
   * A colleague's revision is now shown here (live updates): later patches build on it, so editing
   * a cell after seeing their change is not reported as a conflict. The caller advances only when
   * the revision touched none of the cells still waiting here (those must stay conflicts).
   */
  advanceBase(revision: number) {
    if (revision <= this.base) return;
    this.base = revision;
    this.persist();
  }

  /** Every change not yet acknowledged, in the order first made. */
  get waiting(): CellInput[] {
    return [...this.pending.values()];
  }

  get status(): SaveStatus {
    return this.current;
  }

  subscribe(listener: (s: SaveStatus) => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  enqueue(changes: readonly CellInput[]) {
    if (changes.length === 0) return;
    for (const c of changes) {
      const key = cellKey(c);
      // Re-inserting moves nothing: a Map keeps the first position, later inputs win.
      this.pending.set(key, { sheetId: c.sheetId, row: c.row, col: c.col, input: c.input });
    }
    this.persist();
    if (this.current.kind === 'conflict' || this.current.kind === 'refused') {
      this.setStatus({ ...this.current, waiting: this.pending.size });
      return;
    }
    if (this.current.kind === 'offline') {
      this.setStatus({ ...this.current, waiting: this.pending.size });
      return; // the retry timer is already set
    }
    this.setStatus({ kind: 'saving', waiting: this.pending.size });
    this.schedule(this.debounceMs);
  }

  /** Sends now (skipping the debounce or a retry pause), e.g. when the browser says it is online. */
  flushNow() {
    if (this.current.kind === 'conflict') return;
    this.schedule(0);
  }

  /** After a conflict: send my inputs over the ones stored now. */
  keepMine() {
    if (this.current.kind !== 'conflict') return;
    this.base = Math.max(this.base, ...this.current.conflicts.map((c) => c.revision));
    this.persist();
    this.setStatus({ kind: 'saving', waiting: this.pending.size });
    this.schedule(0);
  }

  /** After a conflict: drop my inputs for the conflicting cells; returns the inputs now stored there. */
  takeTheirs(): CellInput[] {
    if (this.current.kind !== 'conflict') return [];
    const conflicts = this.current.conflicts;
    for (const c of conflicts) this.pending.delete(cellKey(c));
    this.base = Math.max(this.base, ...conflicts.map((c) => c.revision));
    this.persist();
    this.setStatus(this.idleStatus());
    this.schedule(0);
    return conflicts.map((c) => ({ sheetId: c.sheetId, row: c.row, col: c.col, input: c.theirs }));
  }

  /** A deleted sheet's unsent changes have nowhere to go. */
  dropSheet(sheetId: string) {
    for (const [key, c] of this.pending) if (c.sheetId === sheetId) this.pending.delete(key);
    this.persist();
    if (this.current.kind === 'saving' || this.current.kind === 'saved') this.setStatus(this.idleStatus());
  }

  /** Tries again after a refusal (for example once the user has signed in again). */
  retry() {
    if (this.current.kind === 'refused') {
      this.setStatus(this.idleStatus());
      this.schedule(0);
    }
  }

  dispose() {
    this.disposed = true;
    if (this.timer) clearTimeout(this.timer);
    this.listeners.clear();
  }

  private idleStatus(): SaveStatus {
    return this.pending.size === 0 && !this.inFlight ? { kind: 'saved' } : { kind: 'saving', waiting: this.pending.size };
  }

  private schedule(ms: number) {
    if (this.disposed) return;
    if (this.timer) clearTimeout(this.timer);
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.send();
    }, ms);
  }

  private async send() {
    if (this.disposed || this.inFlight || this.pending.size === 0) return;
    const batch = [...this.pending.values()].slice(0, this.batchLimit);
    this.inFlight = new Map(batch.map((c) => [cellKey(c), c.input]));
    this.lastBatchSize = batch.length;
    if (this.current.kind !== 'offline') this.setStatus({ kind: 'saving', waiting: this.pending.size });
    try {
      const { revision } = await this.opts.transport.send({ baseRevision: this.base, changes: batch });
      this.acknowledge(revision);
    } catch (error) {
      this.inFlight = null;
      this.handleFailure(error);
      return;
    }
    if (this.pending.size > 0) this.schedule(0);
  }

  private acknowledge(revision: number) {
    for (const [key, input] of this.inFlight!) {
      // A cell edited again while the patch was on its way keeps its newer input for the next patch.
      if (this.pending.get(key)?.input === input) this.pending.delete(key);
    }
    this.inFlight = null;
    this.base = Math.max(this.base, revision);
    this.failures = 0;
    this.persist();
    this.setStatus(this.idleStatus());
  }

  private handleFailure(error: unknown) {
    if (this.disposed) return;
    if (error instanceof ApiError && error.status === 409) {
      const conflicts = ((error.details as { conflicts?: CellConflict[] } | undefined)?.conflicts ?? []).filter(Boolean);
      // Cells that already hold my input (an earlier patch whose answer was lost) are not conflicts.
      const alreadyStored = conflicts.filter((c) => this.pending.get(cellKey(c))?.input === c.theirs);
      const real = conflicts.filter((c) => !alreadyStored.includes(c));
      if (alreadyStored.length > 0 && real.length === 0) {
        for (const c of alreadyStored) this.pending.delete(cellKey(c));
        this.base = Math.max(this.base, ...alreadyStored.map((c) => c.revision));
        this.persist();
        this.setStatus(this.idleStatus());
        this.schedule(0);
        return;
      }
      this.setStatus({ kind: 'conflict', waiting: this.pending.size, conflicts: real });
      return;
    }
    if (error instanceof ApiError && error.status === 413 && this.lastBatchSize > 1) {
      // Too large for the server (bytes or cells): send halves of what was refused.
      this.batchLimit = Math.max(1, Math.floor(this.lastBatchSize / 2));
      this.schedule(0);
      return;
    }
    if (isTransient(error)) {
      const pause = Math.min(this.maxRetryMs, this.firstRetryMs * 2 ** this.failures);
      this.failures += 1;
      const reason = error instanceof ApiError ? error.message : 'the server cannot be reached';
      this.setStatus({ kind: 'offline', waiting: this.pending.size, retryAt: Date.now() + pause, reason });
      this.schedule(pause);
      return;
    }
    const message = error instanceof ApiError ? error.message : String(error);
    this.setStatus({ kind: 'refused', waiting: this.pending.size, message });
  }

  private persist() {
    this.opts.store.save({ baseRevision: this.base, changes: [...this.pending.values()] });
  }

  private setStatus(s: SaveStatus) {
    this.current = s;
    for (const l of this.listeners) l(s);
  }
}
