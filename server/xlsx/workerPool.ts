// Worker threads for reading uploads and writing exports, with a heap limit and a wall-clock limit,
// so no file can stall or crash the server: a worker that runs out of memory dies alone, one that
// runs too long is terminated and replaced. Workers are reused between jobs (the reader and writer
// keep nothing of a job), because starting one — loading exceljs and the engine — takes about a second.
//
// Two pools, so one kind of work cannot starve the other: `ioPool` reads uploads, `computePool` runs the
// engine (every /values and export). Each person may have only `maxJobsPerUser` jobs queued or running
// over both, so one client's burst of uploads is refused (429) rather than making everyone wait.
import { Worker } from 'node:worker_threads';
import { defaultWorkerLimits, maxJobsPerUser, recalcWorkerLimits, SpreadsheetError, type WorkerLimits } from './limits.js';

const bootUrl = new URL('./ioWorkerBoot.mjs', import.meta.url);
const entryUrl = new URL('./ioWorker.ts', import.meta.url);
const STARTUP_TIMEOUT_MS = 60_000;
const MAX_CONCURRENT = 2; // the machine's cores
const MAX_WAITING = 16;

/** Jobs queued or running per person, over every pool. */
const jobsByOwner = new Map<string, number>();

function claimOwnerSlot(owner: string | undefined, what: string) {
  if (!owner) return () => undefined;
  const n = jobsByOwner.get(owner) ?? 0;
  if (n >= maxJobsPerUser) throw new SpreadsheetError('too_many_jobs', `you already have ${n} uploads, exports or recalculations under way; ${what} can start when one of them has finished`);
  jobsByOwner.set(owner, n + 1);
  let released = false;
  return () => {
    if (released) return;
    released = true;
    const left = (jobsByOwner.get(owner) ?? 1) - 1;
    if (left <= 0) jobsByOwner.delete(owner);
    else jobsByOwner.set(owner, left);
  };
}
/** A worker is retired after this many jobs, so slow heap growth cannot build up. */
const JOBS_PER_WORKER = 50;

/** The worker's last message for a job; any other message is progress (an export's bytes). */
export interface JobDone {
  done: true;
  ok: boolean;
  result?: unknown;
  error?: { code: SpreadsheetError['code']; message: string };
  heapUsedBytes: number;
}

export interface JobOutcome<T> {
  result: T;
  elapsedMs: number;
  workerHeapUsedBytes: number;
}

interface Slot {
  worker: Worker;
  ready: Promise<void>;
  limits: WorkerLimits;
  jobs: number;
}

const sameLimits = (a: WorkerLimits, b: WorkerLimits) =>
  a.maxOldGenerationSizeMb === b.maxOldGenerationSizeMb && a.maxYoungGenerationSizeMb === b.maxYoungGenerationSizeMb;

function spawn(limits: WorkerLimits): Slot {
  const worker = new Worker(bootUrl, {
    workerData: { entry: entryUrl.href },
    resourceLimits: { maxOldGenerationSizeMb: limits.maxOldGenerationSizeMb, maxYoungGenerationSizeMb: limits.maxYoungGenerationSizeMb, stackSizeMb: 4 },
  });
  worker.unref();
  const ready = new Promise<void>((resolve, reject) => {
    const onMessage = (m: { ready?: boolean }) => {
      if (!m?.ready) return;
      worker.off('message', onMessage);
      resolve();
    };
    worker.on('message', onMessage);
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`worker exited (code ${code}) before it was ready`)));
  });
  ready.catch(() => undefined); // observed by whoever takes the slot
  return { worker, ready, limits, jobs: 0 };
}

function withTimeout<T>(promise: Promise<T>, ms: number, onTimeout: () => Error): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const timer = setTimeout(() => reject(onTimeout()), ms);
    promise.then(
      (v) => (clearTimeout(timer), resolve(v)),
      (e) => (clearTimeout(timer), reject(e)),
    );
  });
}

function outOfMemory(limits: WorkerLimits, doing = 'the work') {
  return new SpreadsheetError('parse_out_of_memory', `${doing} needed more than the ${limits.maxOldGenerationSizeMb} MB of memory ${doing.startsWith('reading') ? 'a file' : 'one calculation'} may use`);
}

export interface JobOptions {
  limits: WorkerLimits;
  /** What the work is, for the timeout message ("reading the file", "writing the export"). */
  doing: string;
  onProgress?: (message: unknown) => void;
  /** Who asked (a user id), for the per-person cap; jobs without one (benchmarks, CLI) are not counted. */
  owner?: string;
  /** Stops the job (its worker is ended); the job fails with the signal's reason when that is a SpreadsheetError. */
  signal?: AbortSignal;
  /**
   * For jobs that compute formulas: names a cell from the engine's sheet id, row and column. When a
   * memory or time limit ends the job, its message then says which cell was being computed.
   */
  describeCell?: (sheet: number, row: number, col: number) => string;
}

/** Room for the address of the formula being computed: [set, sheet, row, column]. */
const evaluatingSlots = 4;

/** One job in one worker. `reusable` is false when the worker must not serve again. */
function runJob(slot: Slot, message: unknown, transfer: ArrayBuffer[], options: JobOptions) {
  const { worker } = slot;
  return new Promise<{ done: JobDone | SpreadsheetError; reusable: boolean }>((resolve) => {
    const settle = (done: JobDone | SpreadsheetError, reusable: boolean) => {
      clearTimeout(timer);
      worker.off('message', onMessage);
      worker.off('error', onError);
      worker.off('exit', onExit);
      options.signal?.removeEventListener('abort', onAbort);
      resolve({ done, reusable });
    };
    const timer = setTimeout(() => {
      const seconds = +(options.limits.timeoutMs / 1000).toFixed(2);
      settle(new SpreadsheetError('parse_timeout', `${options.doing} took longer than ${seconds} s and was stopped (${options.doing.startsWith('reading') ? 'for example a rule or range the reader expands cell by cell' : 'for example a formula over a very large range, or a very large spill'})`), false);
    }, options.limits.timeoutMs);
    const onMessage = (m: JobDone | unknown) => {
      if ((m as JobDone)?.done === true) settle(m as JobDone, true);
      else options.onProgress?.(m);
    };
    const onError = (e: Error & { code?: string }) =>
      settle(e.code === 'ERR_WORKER_OUT_OF_MEMORY' ? outOfMemory(options.limits, options.doing) : new SpreadsheetError('damaged_file', `${options.doing} failed (${e.message})`), false);
    const onExit = (code: number) => settle(new SpreadsheetError('damaged_file', `${options.doing} failed (the worker stopped with code ${code})`), false);
    worker.on('message', onMessage);
    worker.on('error', onError);
    worker.on('exit', onExit);
    const onAbort = () => {
      const reason = options.signal?.reason;
      settle(reason instanceof SpreadsheetError ? reason : new SpreadsheetError('too_complex', `${options.doing} was stopped`), false);
    };
    options.signal?.addEventListener('abort', onAbort);
    worker.postMessage(message, transfer);
  });
}

export class WorkerPool {
  private idle: Slot[] = [];
  private running = 0;
  private waiting: (() => void)[] = [];
  private keepWarm = true;

  /** `warmLimits`: the limits of the workers kept idle between jobs (others are ended after theirs). */
  constructor(private readonly warmLimits: WorkerLimits = defaultWorkerLimits) {}

  private async acquire() {
    if (this.running < MAX_CONCURRENT) {
      this.running++;
      return;
    }
    if (this.waiting.length >= MAX_WAITING) throw new SpreadsheetError('busy', 'the server is busy with other work; try again in a minute');
    await new Promise<void>((resolve) => this.waiting.push(resolve));
  }

  private release() {
    const next = this.waiting.shift();
    if (next) next();
    else this.running--;
  }

  private take(limits: WorkerLimits): Slot {
    const i = this.idle.findIndex((s) => sameLimits(s.limits, limits));
    if (i >= 0) return this.idle.splice(i, 1)[0];
    return spawn(limits);
  }

  private giveBack(slot: Slot) {
    if (this.keepWarm && sameLimits(slot.limits, this.warmLimits) && slot.jobs < JOBS_PER_WORKER && this.idle.length < MAX_CONCURRENT) {
      slot.worker.unref();
      this.idle.push(slot);
    } else void slot.worker.terminate();
  }

  /** Starts a worker now rather than at the first job (server start, benchmarks). */
  warm() {
    this.keepWarm = true;
    if (this.idle.length > 0) return;
    const slot = spawn(this.warmLimits);
    slot.ready.catch(() => (this.idle = this.idle.filter((s) => s !== slot)));
    this.idle.push(slot);
  }

  async run<T>(message: unknown, transfer: ArrayBuffer[], options: JobOptions): Promise<JobOutcome<T>> {
    const releaseOwner = claimOwnerSlot(options.owner, options.doing);
    try {
      await this.acquire();
    } catch (e) {
      releaseOwner();
      throw e;
    }
    const started = performance.now();
    const slot = this.take(options.limits);
    slot.worker.ref();
    let reusable = false;
    try {
      await withTimeout(slot.ready, STARTUP_TIMEOUT_MS, () => new Error('worker did not start in time')).catch((e: Error & { code?: string }) => {
        throw e.code === 'ERR_WORKER_OUT_OF_MEMORY' ? outOfMemory(options.limits, options.doing) : e;
      });
      slot.jobs++;
      // Written by the worker before each formula; still readable here after a limit ended it.
      const evaluating = options.describeCell ? new Int32Array(new SharedArrayBuffer(evaluatingSlots * 4)) : null;
      const job = await runJob(slot, evaluating ? { ...(message as object), evaluating: evaluating.buffer } : message, transfer, options);
      reusable = job.reusable;
      if (job.done instanceof SpreadsheetError) {
        const limitHit = job.done.code === 'parse_timeout' || job.done.code === 'parse_out_of_memory';
        if (limitHit && evaluating && Atomics.load(evaluating, 0) === 1) {
          const where = options.describeCell!(Atomics.load(evaluating, 1), Atomics.load(evaluating, 2), Atomics.load(evaluating, 3));
          throw new SpreadsheetError(job.done.code, `${job.done.message}; the engine was at ${where}`);
        }
        throw job.done;
      }
      if (!job.done.ok) throw new SpreadsheetError(job.done.error!.code, job.done.error!.message);
      return { result: job.done.result as T, elapsedMs: performance.now() - started, workerHeapUsedBytes: job.done.heapUsedBytes };
    } finally {
      if (reusable) this.giveBack(slot);
      else {
        void slot.worker.terminate();
        // A worker ended by a limit is replaced at once: starting one takes seconds, which the next
        // request would otherwise wait for.
        if (this.keepWarm) this.warm();
      }
      this.release();
      releaseOwner();
    }
  }

  /** Stops the idle workers (tests, shutdown); later jobs start fresh workers and keep none. */
  async close() {
    this.keepWarm = false;
    const idle = this.idle;
    this.idle = [];
    await Promise.all(idle.map((s) => s.worker.terminate()));
  }
}

/** Reading uploads. */
export const ioPool = new WorkerPool(defaultWorkerLimits);
/** Running the engine: /values and exports, which people wait on, never queue behind uploads. */
export const computePool = new WorkerPool(recalcWorkerLimits);
