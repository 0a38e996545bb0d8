// Sends cell changes to the server as patches: merged per cell, debounced, one patch in flight at a
// time, retried with growing pauses while the network or server is down, and kept in local storage
// until acknowledged. The save state it reports is derived from what is actually unacknowledged, so
// "saved" is shown only when the server holds every change. Which base revision a patch claims is
// RevisionLedger's rule: only revisions whose changes this browser has taken in. What is sent at once
// is one revision: above maxCellsPerPatch cells it goes as parts of one action, which the server
// holds until the last part and then applies together (server/services/stagedActions.ts).
import { actionPartSizes, maxCellsPerAction, maxCellsPerPatch, maxPartsPerAction, type CellConflict, type PatchPart, type PatchPartResult, type PatchResult } from '@shared/workbooks.js';
import { ApiError } from '../../../lib/api.js';
import type { CellInput, PendingStore } from './pendingStore.js';
import { cellKey, RevisionLedger } from './revisionLedger.js';

export type SaveStatus =
  | { kind: 'saved' }
  | { kind: 'saving'; waiting: number }
  | { kind: 'offline'; waiting: number; retryAt: number; reason: string }
  | { kind: 'conflict'; waiting: number; conflicts: CellConflict[] }
  | { kind: 'refused'; waiting: number; message: string };

export interface PatchTransport {
  /** A plain patch answers PatchResult; a part of an action answers PatchPartResult, its last part PatchResult. */
  send(patch: { baseRevision: number; changes: CellInput[]; part?: PatchPart }): Promise<PatchResult | PatchPartResult>;
}

export interface PatchQueueOptions {
  transport: PatchTransport;
  store: PendingStore;
  /** The revision of the workbook as loaded from the server (the engine shows exactly that). */
  baseRevision: number;
  debounceMs?: number;
  firstRetryMs?: number;
  maxRetryMs?: number;
  maxCellsPerSend?: number;
  /** Shows colleagues' inputs that were held back behind mine (the model's applyRemote). */
  showRemote?: (inputs: CellInput[]) => void;
}

/** The server no longer holds an action's earlier parts, or refused one part's place in it: send it all again. */
const lostAction = (error: unknown) => error instanceof ApiError && (error.code === 'action_expired' || error.code === 'part_refused');

/** An id for one action's parts: unique enough among one person's unfinished actions on one workbook. */
const newActionId = () => `${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 10)}`;

/** Network failures, 5xx and 429 are worth retrying; other refusals would only repeat themselves. */
function isTransient(error: unknown): boolean {
  if (!(error instanceof ApiError)) return true; // fetch rejects with a TypeError when offline
  return error.status >= 500 || error.status === 429 || error.status === 408 || error.code === 'bad_response';
}

export class PatchQueue {
  private pending = new Map<string, CellInput>();
  private inFlight: Map<string, CellInput> | null = null;
  private ledger: RevisionLedger;
  /** Some waiting cells need a later base than the one taken in so far. */
  private blocked = false;
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
  /** Asks the live feed for the revisions up to this one (set while the feed runs). */
  catchUp: ((revision: number) => void) | null = null;
  /** Shows colleagues' inputs that were held back behind mine, once mine is gone and theirs is newer. */
  private readonly showRemote: (inputs: CellInput[]) => void;

  constructor(private readonly opts: PatchQueueOptions) {
    this.ledger = new RevisionLedger(opts.baseRevision);
    this.showRemote = opts.showRemote ?? (() => {});
    this.debounceMs = opts.debounceMs ?? 300;
    this.firstRetryMs = opts.firstRetryMs ?? 1000;
    this.maxRetryMs = opts.maxRetryMs ?? 30_000;
    this.batchLimit = opts.maxCellsPerSend ?? maxCellsPerPatch;
  }

  /**
   * Takes over changes left from an earlier visit, already written over the loaded inputs: they keep
   * their own base revision, so a colleague's change to one of those cells since then is a conflict.
   */
  restore(snapshot: { baseRevision: number; changes: CellInput[] }) {
    this.ledger.restore(snapshot.baseRevision, snapshot.changes);
    for (const c of snapshot.changes) this.pending.set(cellKey(c), c);
    this.persist();
    this.setStatus(this.idleStatus());
    this.schedule(0);
  }

  get baseRevision() {
    return this.ledger.base;
  }

  /**
   * A revision from the live feed is now shown here, except `heldBack`: its inputs for cells where an
   * input of mine still waits (those must stay conflicts). Later patches build on it once every
   * earlier revision is in too, so editing a cell after seeing a colleague's change is no conflict.
   */
  takeInRemote(revision: number, heldBack: readonly CellInput[]) {
    const before = this.ledger.base;
    this.ledger.takeIn(revision, heldBack);
    if (this.ledger.base === before) return;
    this.persist();
    if (this.blocked && this.current.kind === 'saving' && !this.inFlight) this.schedule(0);
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

  /**
   * After a conflict, per refused cell: keep my input (sent again once this browser has taken in the
   * revision that beat it, so it goes on top of that) or take theirs (my input dropped from the queue).
   * Returns the inputs to show for the cells where I took theirs.
   */
  resolveConflicts(choose: (c: CellConflict) => 'mine' | 'theirs'): CellInput[] {
    if (this.current.kind !== 'conflict') return [];
    const conflicts = this.current.conflicts;
    const theirs = conflicts.filter((c) => choose(c) === 'theirs');
    for (const c of theirs) this.pending.delete(cellKey(c));
    const newer = this.ledger.settle(conflicts.map((c) => ({ cell: c, revision: c.revision, mineStillWaiting: this.pending.has(cellKey(c)) })));
    this.persist();
    this.setStatus(this.idleStatus());
    this.schedule(0);
    // A colleague may have changed a cell again since the 409: then that newer input is the one to show.
    const shown = new Map(theirs.map((c) => [cellKey(c), { sheetId: c.sheetId, row: c.row, col: c.col, input: c.theirs }]));
    for (const n of newer) shown.set(cellKey(n), n);
    return [...shown.values()];
  }

  /** After a conflict: my input in every refused cell, or theirs (returned, to be shown). */
  keepMine = () => void this.resolveConflicts(() => 'mine');
  takeTheirs = (): CellInput[] => this.resolveConflicts(() => 'theirs');

  /**
   * Unsent formulas follow a renamed or deleted sheet as stored ones do (shared/formulaText.ts); one
   * already on its way is sent again with the new text once acknowledged.
   */
  rewritePending(rewrite: (input: string) => string) {
    let changed = false;
    for (const [key, c] of this.pending) {
      const input = rewrite(c.input);
      if (input !== c.input) {
        this.pending.set(key, { ...c, input });
        changed = true;
      }
    }
    if (changed) this.persist();
  }

  /** A deleted sheet's unsent changes have nowhere to go. */
  dropSheet(sheetId: string) {
    for (const [key, c] of this.pending) if (c.sheetId === sheetId) this.pending.delete(key);
    this.ledger.dropSheet(sheetId);
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

  /** The waiting cells a patch on the current base may carry, and the base the others need. */
  private readyCells(): { ready: CellInput[]; needed: number } {
    const base = this.ledger.base;
    const ready: CellInput[] = [];
    let needed = base;
    for (const c of this.pending.values()) {
      const floor = this.ledger.floor(c);
      if (floor <= base) ready.push(c);
      else needed = Math.max(needed, floor);
    }
    return { ready, needed };
  }

  private async send() {
    if (this.disposed || this.inFlight || this.pending.size === 0) return;
    let { ready, needed } = this.readyCells();
    if (needed > this.ledger.base && this.catchUp) {
      this.catchUp(needed);
      ({ ready, needed } = this.readyCells());
    }
    this.blocked = needed > this.ledger.base;
    if (ready.length === 0) {
      // Waiting for the live feed to bring the missing revisions; ask again now and then.
      if (this.blocked) this.schedule(this.firstRetryMs);
      return;
    }
    // The grid refuses a single action over maxCellsPerAction; more waiting than that is several
    // actions (made offline, say), saved as several revisions.
    const batch = ready.slice(0, maxCellsPerAction);
    const baseRevision = this.ledger.base;
    this.inFlight = new Map(batch.map((c) => [cellKey(c), c]));
    if (this.current.kind !== 'offline') this.setStatus({ kind: 'saving', waiting: this.pending.size });
    try {
      this.acknowledge(await this.sendAction(baseRevision, batch));
    } catch (error) {
      this.inFlight = null;
      this.handleFailure(error);
      return;
    }
    if (this.pending.size > 0) this.schedule(0);
  }

  /**
   * One patch, or parts of one action (each at most batchLimit cells, the last a short one) whose
   * last part answers as the patch would. If the server lost the earlier parts (expired, restarted) the action is sent again
   * from its first part, once; a second loss is reported.
   */
  private async sendAction(baseRevision: number, batch: CellInput[], again = true): Promise<PatchResult> {
    const size = Math.max(this.batchLimit, Math.ceil(batch.length / maxPartsPerAction));
    if (batch.length <= size) {
      this.lastBatchSize = batch.length;
      return this.opts.transport.send({ baseRevision, changes: batch }) as Promise<PatchResult>;
    }
    const actionId = newActionId();
    const sizes = actionPartSizes(batch.length, size);
    const count = sizes.length;
    for (let index = 0, from = 0; index < count; from += sizes[index], index++) {
      const changes = batch.slice(from, from + sizes[index]);
      this.lastBatchSize = changes.length;
      let answer: PatchResult | PatchPartResult;
      try {
        answer = await this.opts.transport.send({ baseRevision, changes, part: { actionId, index, count } });
      } catch (error) {
        if (again && !this.disposed && lostAction(error)) return this.sendAction(baseRevision, batch, false);
        throw error;
      }
      if (!('staged' in answer)) return answer;
    }
    throw new ApiError(0, 'bad_response', 'the server held every part of the action without applying it');
  }

  private acknowledge({ revision, applied }: PatchResult) {
    const sent = [...this.inFlight!.entries()];
    for (const [key, c] of sent) {
      // A cell edited again while the patch was on its way keeps its newer input for the next patch.
      if (this.pending.get(key)?.input === c.input) this.pending.delete(key);
    }
    this.inFlight = null;
    // Each cell sent now holds my input on the server as of `revision`. The base itself moves only
    // if that revision is mine and every revision before it is in (a patch that changed nothing
    // answers with the workbook's current revision, which is not mine).
    const newer = this.ledger.settle(sent.map(([key, c]) => ({ cell: c, revision, mineStillWaiting: this.pending.has(key) })));
    if (applied > 0) this.ledger.own(revision);
    this.failures = 0;
    this.persist();
    if (newer.length > 0) this.showRemote(newer);
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
        const newer = this.ledger.settle(alreadyStored.map((c) => ({ cell: c, revision: c.revision, mineStillWaiting: false })));
        this.persist();
        if (newer.length > 0) this.showRemote(newer);
        this.setStatus(this.idleStatus());
        this.schedule(0);
        return;
      }
      this.setStatus({ kind: 'conflict', waiting: this.pending.size, conflicts: real });
      return;
    }
    if (error instanceof ApiError && error.status === 413 && error.code !== 'action_too_large' && this.lastBatchSize > 1) {
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
    this.opts.store.save({ baseRevision: this.ledger.base, changes: [...this.pending.values()] });
  }

  private setStatus(s: SaveStatus) {
    this.current = s;
    for (const l of this.listeners) l(s);
  }
}
