// The one worker thread that keeps warm engines (keeperWorker.ts), shared by every app in the process
// (tests mount many). It runs one job at a time, under limits of its own (server/xlsx/limits.ts
// keeperWorkerLimits): a job that runs out of memory or time ends the thread, every warm engine
// with it, and the next job starts a fresh one.
import { Worker } from 'node:worker_threads';
import { keeperWorkerLimits } from '../xlsx/limits.js';
import type { KeeperJob, KeeperReply } from './keeperWorker.js';

const bootUrl = new URL('../xlsx/ioWorkerBoot.mjs', import.meta.url);
const entryUrl = new URL('./keeperWorker.ts', import.meta.url);

type JobBody = KeeperJob extends infer J ? (J extends KeeperJob ? Omit<J, 'id'> : never) : never;

interface Thread {
  worker: Worker;
  ready: Promise<void>;
  pending: Map<number, (reply: KeeperReply) => void>;
}

let thread: Thread | null = null;
let nextId = 1;
/** Jobs run one after another: each waits for the one before it. */
let queue: Promise<unknown> = Promise.resolve();

function spawn(): Thread {
  const worker = new Worker(bootUrl, {
    workerData: { entry: entryUrl.href },
    resourceLimits: { maxOldGenerationSizeMb: keeperWorkerLimits.maxOldGenerationSizeMb, maxYoungGenerationSizeMb: keeperWorkerLimits.maxYoungGenerationSizeMb, stackSizeMb: 4 },
  });
  worker.unref();
  const pending = new Map<number, (reply: KeeperReply) => void>();
  const ready = new Promise<void>((resolve, reject) => {
    worker.on('message', (m: KeeperReply | { ready: true }) => {
      if ('ready' in m) return resolve();
      const settle = pending.get(m.id);
      pending.delete(m.id);
      settle?.(m);
    });
    worker.once('error', reject);
    worker.once('exit', (code) => reject(new Error(`the values worker stopped (code ${code})`)));
  });
  ready.catch(() => undefined);
  const ended = (message: string) => {
    if (thread?.worker === worker) thread = null;
    for (const [id, settle] of pending) settle({ id, ok: false, message });
    pending.clear();
  };
  worker.on('error', (e: Error & { code?: string }) => ended(e.code === 'ERR_WORKER_OUT_OF_MEMORY' ? `computing needed more than the ${keeperWorkerLimits.maxOldGenerationSizeMb} MB of memory one calculation may use` : e.message));
  worker.on('exit', (code) => ended(`the values worker stopped (code ${code})`));
  return { worker, ready, pending };
}

async function runNow(body: JobBody, transfer: ArrayBuffer[]): Promise<KeeperReply> {
  const id = nextId++;
  thread ??= spawn();
  const t = thread;
  try {
    await t.ready;
  } catch (e) {
    if (thread === t) thread = null;
    return { id, ok: false, message: e instanceof Error ? e.message : String(e) };
  }
  return new Promise<KeeperReply>((resolve) => {
    const timer = setTimeout(() => {
      resolve({ id, ok: false, message: `computing took longer than ${keeperWorkerLimits.timeoutMs / 1000} s and was stopped` });
      t.pending.delete(id);
      if (thread === t) thread = null;
      void t.worker.terminate();
    }, keeperWorkerLimits.timeoutMs);
    t.pending.set(id, (reply) => {
      clearTimeout(timer);
      resolve(reply);
    });
    t.worker.ref(); // a job under way keeps the process up; an idle thread does not
    t.worker.postMessage({ ...body, id }, transfer);
  }).finally(() => t.worker.unref());
}

/** Runs a job after the ones already queued. */
export function runKeeperJob(body: JobBody, transfer: ArrayBuffer[] = []): Promise<KeeperReply> {
  const run = queue.then(() => runNow(body, transfer));
  queue = run.catch(() => undefined);
  return run;
}

/** Ends the thread and its warm engines (tests, shutdown); the next job starts a new one. */
export async function stopKeeperThread(): Promise<void> {
  const t = thread;
  thread = null;
  if (t) await t.worker.terminate();
}
