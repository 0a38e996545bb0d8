// Extended-Hückel results in the browser. A conformer and a solve cost from tens of milliseconds to
// seconds, so the page never computes them: the engine's EHT functions ask this store (registered as
// the structure resolver) and get either a result the server stored or "pending". Pending structures
// are asked of the server in batches; the server answers stored ones at once and computes the rest in
// its worker pool, and this store asks again until all have arrived. Each arrival is announced, and
// the model re-evaluates the waiting cells a slice at a time (workbookModel.reevaluatePending).
import { setStructureResolver, type FormulaCell, type StructureResolver } from '@functions/structureResults.js';
import { ehtKeyText, type EhtResult } from '@functions/chem/ehtSummary.js';
import { maxStructuresPerRequest, type StructuresResponse } from '@shared/structures.js';

export type StructureFetcher = (inputs: { structure: string; charge?: number }[]) => Promise<StructuresResponse<EhtResult>>;

export interface StructureProgress {
  /** Distinct structures the open workbook has asked for. */
  total: number;
  /** Of those, how many have their result. */
  done: number;
  /** The last request failed (offline, server busy): shown, and retried. */
  problem: string | null;
}

/** Results kept per open workbook: a library of 5,000 structures, each a few kilobytes. */
const MAX_RESULTS = 20_000;
/** How soon the first request goes out after a cell asks: gathers a sheet's worth of asks into one request. */
const GATHER_MS = 20;
/** How often to ask again while the server is still computing; longer after a failure. */
const POLL_MS = 500;
const RETRY_MS = 3_000;

export class StructureStore {
  private results = new Map<string, EhtResult>();
  private waiting = new Map<string, { structure: string; charge?: number }>();
  private timer: ReturnType<typeof setTimeout> | null = null;
  private busy = false;
  private closed = false;
  private listeners = new Set<() => void>();
  private arrivals = new Set<(cells: FormulaCell[]) => void>();
  /** The formula cells waiting on each structure. */
  private cellsWaiting = new Map<string, FormulaCell[]>();
  progress: StructureProgress = { total: 0, done: 0, problem: null };

  constructor(private readonly fetcher: StructureFetcher) {}

  /** The resolver the engine's EHT functions call (synchronously). */
  readonly resolve: StructureResolver = ({ structure, charge, key, cell }) => {
    const known = this.results.get(key);
    if (known) return known;
    if (cell && !this.closed) {
      const cells = this.cellsWaiting.get(key);
      if (!cells) this.cellsWaiting.set(key, [cell]);
      else if (!cells.some((c) => c.sheet === cell.sheet && c.row === cell.row && c.col === cell.col)) cells.push(cell);
    }
    if (!this.waiting.has(key) && !this.closed) {
      this.waiting.set(key, { structure, ...(charge === undefined ? {} : { charge }) });
      this.setProgress({ ...this.progress, total: this.progress.total + 1 });
      this.schedule(GATHER_MS);
    }
    return 'pending';
  };

  /** Progress changes (the status line). */
  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  /** Results arrived: the cells that waited for them can be evaluated again. */
  onArrival(listener: (cells: FormulaCell[]) => void): () => void {
    this.arrivals.add(listener);
    return () => this.arrivals.delete(listener);
  }

  /**
   * Fetches the stored results of structures the workbook is known to need before any cell asks
   * (structureInputs.ts), so cells find them at once. Ones not stored yet are left to the usual
   * asking (the server queues them on this request already). Never rejects: on failure the cells
   * simply ask as usual.
   */
  async prefetch(inputs: readonly { structure: string; charge?: number }[]): Promise<void> {
    for (let i = 0; i < inputs.length && !this.closed; i += maxStructuresPerRequest) {
      const batch = inputs.slice(i, i + maxStructuresPerRequest);
      let answer: StructuresResponse<EhtResult>;
      try {
        answer = await this.fetcher(batch);
      } catch {
        return;
      }
      if (this.closed) return;
      const keys = batch.map((b) => ehtKeyText(b.structure, b.charge));
      this.take(answer.results.map((result, k) => [keys[k], result]));
    }
  }

  /** Keeps arrived results; cells already waiting for one are announced, as after an ask. */
  private take(answers: [key: string, result: EhtResult | null][]): number {
    const ready: FormulaCell[] = [];
    let arrived = 0;
    for (const [key, result] of answers) {
      if (result === null) continue;
      if (this.results.size >= MAX_RESULTS) this.results.clear();
      this.results.set(key, result);
      if (!this.waiting.delete(key)) continue;
      ready.push(...(this.cellsWaiting.get(key) ?? []));
      this.cellsWaiting.delete(key);
      arrived++;
    }
    if (arrived > 0) {
      this.setProgress({ ...this.progress, done: this.progress.done + arrived, problem: null });
      for (const l of this.arrivals) l(ready);
    }
    return arrived;
  }

  get pending(): number {
    return this.waiting.size;
  }

  close() {
    this.closed = true;
    if (this.timer) clearTimeout(this.timer);
    this.listeners.clear();
    this.arrivals.clear();
  }

  private setProgress(next: StructureProgress) {
    this.progress = next;
    for (const l of this.listeners) l();
  }

  private schedule(ms: number) {
    if (this.timer || this.busy || this.closed) return;
    this.timer = setTimeout(() => {
      this.timer = null;
      void this.ask();
    }, ms);
  }

  private async ask() {
    if (this.waiting.size === 0 || this.closed) return;
    this.busy = true;
    const batch = [...this.waiting].slice(0, maxStructuresPerRequest);
    let next = POLL_MS;
    let answer: StructuresResponse<EhtResult> | null = null;
    try {
      answer = await this.fetcher(batch.map(([, input]) => input));
    } catch (e) {
      if (!this.closed) this.setProgress({ ...this.progress, problem: e instanceof Error ? e.message : String(e) });
      next = RETRY_MS;
    } finally {
      this.busy = false;
    }
    if (this.closed) return;
    if (answer) {
      const results = answer.results;
      if (this.take(batch.map(([key], i) => [key, results[i] ?? null])) === 0 && this.progress.problem) this.setProgress({ ...this.progress, problem: null });
      // More waiting than one request holds: ask for the next batch straight away.
      if (batch.length === maxStructuresPerRequest && this.waiting.size > 0) next = 0;
    }
    if (this.waiting.size > 0) this.schedule(next);
  }
}

// The page never computes a structure itself: with no workbook open, an EHT function waits.
const waitForAWorkbook: StructureResolver = () => 'pending';
setStructureResolver(waitForAWorkbook);

/** Makes `store` the engine's source of EHT results (one open workbook at a time); returns the undo. */
export function installStructureStore(store: StructureStore): () => void {
  setStructureResolver(store.resolve);
  return () => {
    store.close();
    setStructureResolver(waitForAWorkbook);
  };
}
