// The one API client. Components never call fetch: features wrap these calls in TanStack Query
// `queryOptions`/mutations, with keys from `queryKeys` below.
import { dropEarlyGets, startEarlyGet, startEarlyRead, takeEarlyGet, takeEarlyRead } from './earlyGets.js';
import { JsonAssembly, safeJson, type JsonFetchReply, type JsonFetchRequest } from './jsonParts.js';

export class ApiError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly details?: unknown,
  ) {
    super(message);
  }
}

export async function api<T>(path: string, init: { method?: string; body?: unknown; signal?: AbortSignal } = {}): Promise<T> {
  const reads = (init.method ?? 'GET') === 'GET' && init.body === undefined;
  if (!reads) dropEarlyGets();
  const early = reads ? await takeEarlyGet(path) : null;
  if (early) return answerOf<T>(early);
  const res = await fetch(`/api${path}`, {
    method: init.method ?? 'GET',
    credentials: 'same-origin',
    headers: init.body !== undefined ? { 'content-type': 'application/json' } : undefined,
    body: init.body !== undefined ? JSON.stringify(init.body) : undefined,
    signal: init.signal,
  });
  return answerOf<T>(res);
}

async function answerOf<T>(res: Response): Promise<T> {
  const text = await res.text();
  const data = text ? safeJson(text) : null;
  if (!res.ok) {
    const err = (data as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `${res.status} ${res.statusText}`, err?.details);
  }
  return data as T;
}


/** Every query key in one place. */
export const queryKeys = {
  me: ['me'] as const,
  workbooks: ['workbooks'] as const,
  workbook: (id: string) => ['workbooks', id] as const,
  storedValues: (id: string) => ['workbooks', id, 'stored-values'] as const,
  firstRows: (id: string) => ['workbooks', id, 'first-rows'] as const,
  revisions: (id: string) => ['workbooks', id, 'revisions'] as const,
  members: (id: string) => ['workbooks', id, 'members'] as const,
  audit: (id: string) => ['workbooks', id, 'audit'] as const,
  revision: (id: string, n: number) => ['workbooks', id, 'revisions', n] as const,
  invitations: (id: string) => ['workbooks', id, 'invitations'] as const,
  protection: (id: string) => ['workbooks', id, 'protection'] as const,
  invitationLink: (token: string) => ['invitation-links', token] as const,
  adminUsers: ['admin', 'users'] as const,
  adminMail: ['admin', 'mail'] as const,
};

let jsonWorker: Worker | null = null;
let workerBroken = false;
let nextRequest = 1;
const waiting = new Map<number, { path: string; assembly: JsonAssembly; held: boolean; resolve: (v: unknown) => void; reject: (e: Error) => void }>();

/**
 * Replies to held reads (startEarlyLargeGet's, on a workbook's address) wait here, unread, until the
 * page's first screen is painted (releaseHeldAnswers): parsed or put together as they came, the
 * workbook and its values took the page's thread just as the workbook screen's code ran and drew
 * its first rows. At most `maxHoldMs`, in case nothing releases them.
 */
let holding = false;
/** Reads asked for while holding start only once released (holdAnswers({ deferReads: true })). */
let deferReads = false;
let released: Promise<void> = Promise.resolve();
let release: () => void = () => {};
let holdTimer: ReturnType<typeof setTimeout> | undefined;
const heldReplies: JsonFetchReply[] = [];
const maxHoldMs = 3_000;
let draining = false;

/** Lets the held replies through, one per task, in the order they came. */
export function releaseHeldAnswers(): void {
  holding = false;
  deferReads = false;
  release();
  clearTimeout(holdTimer);
  if (draining) return;
  draining = true;
  const next = () => {
    const reply = heldReplies.shift();
    if (!reply) {
      draining = false;
      return;
    }
    takeReply(reply);
    setTimeout(next, 0);
  };
  next();
}

export function holdAnswers(options: { deferReads?: boolean } = {}): void {
  if (options.deferReads) deferReads = true;
  if (holding) return;
  holding = true;
  released = new Promise((resolve) => (release = resolve));
  holdTimer = setTimeout(releaseHeldAnswers, maxHoldMs);
}

/** One reply of the JSON worker, to the request waiting for it. */
function takeReply(reply: JsonFetchReply): void {
  const w = waiting.get(reply.id);
  if (!w) return; // aborted meanwhile
  if (reply.kind === 'failed') {
    waiting.delete(reply.id);
    const err = (reply.body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
    w.reject(new ApiError(reply.status, err?.code ?? 'http_error', err?.message ?? `${reply.status} ${reply.statusText}`, err?.details));
    return;
  }
  // Marked for the open benchmark (the page's resource timing does not see the worker's fetch),
  // and for tests: 'head' says the answer was parsed in the worker.
  if (reply.kind === 'head' || reply.kind === 'text') {
    performance.mark(`orbitab:json-received ${w.path}`, { startTime: Math.max(0, reply.receivedAt - performance.timeOrigin), detail: { parsedIn: reply.kind === 'head' ? 'worker' : 'page' } });
  }
  const taken = w.assembly.take(reply);
  if (taken.done) {
    waiting.delete(reply.id);
    w.resolve(taken.data);
  }
}

function workerForJson(): Worker | null {
  if (jsonWorker) return jsonWorker;
  if (typeof Worker === 'undefined' || workerBroken) return null;
  try {
    jsonWorker = new Worker(new URL('./jsonFetch.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return null;
  }
  // A worker that cannot run (its script refused or failed): what it was asked for is fetched by the page.
  jsonWorker.onerror = () => {
    workerBroken = true;
    jsonWorker = null;
    const asked = [...waiting.values()];
    waiting.clear();
    for (const w of asked) api(w.path).then(w.resolve, w.reject);
  };
  jsonWorker.onmessage = (e: MessageEvent<JsonFetchReply>) => {
    const reply = e.data;
    // Held replies keep their order, and so do those after them while the held ones go through.
    if ((holding && waiting.get(reply.id)?.held) || heldReplies.length) heldReplies.push(reply);
    else takeReply(reply);
  };
  return jsonWorker;
}

/** Answers longer than this (in characters) are parsed in the worker; smaller ones parse in the page in well under a frame's budget of stall. */
const largeAnswerChars = 4_000_000;

/**
 * The size past which answers are parsed in the worker. A page may lower it by setting
 * `window.orbitabLargeAnswerChars` before it loads (tests do, to take that path with a small
 * workbook); it changes only where the same answer is parsed.
 */
function largeAnswerLimit(): number {
  const set = (globalThis as { orbitabLargeAnswerChars?: unknown }).orbitabLargeAnswerChars;
  return typeof set === 'number' && set >= 0 ? set : largeAnswerChars;
}

/** Sends the worker one request (`ask` posts it under the given id) and resolves with the answer it hands back in parts; `signal` aborts it there too. */
function throughWorker<T>(worker: Worker, path: string, ask: (id: number) => void, signal?: AbortSignal, held = false): Promise<T> {
  const id = nextRequest++;
  return new Promise<T>((resolve, reject) => {
    if (signal?.aborted) return reject(signal.reason);
    waiting.set(id, { path, assembly: new JsonAssembly(), held, resolve: resolve as (v: unknown) => void, reject });
    signal?.addEventListener('abort', () => {
      if (!waiting.delete(id)) return;
      worker.postMessage({ id, kind: 'abort' } satisfies JsonFetchRequest);
      reject(signal.reason);
    });
    ask(id);
  });
}

/**
 * GET of an answer that grows with the workbook (its cells, its stored values), fetched and read by
 * a worker (jsonFetch.worker.ts): the page never holds the bytes, and a large answer is parsed
 * there and handed back in parts, so the page never stops for the whole answer at once. The same
 * result and errors as `api` (a failed connection is an ApiError of status 0).
 */
export async function apiLarge<T>(path: string, init: { signal?: AbortSignal } = {}): Promise<T> {
  const read = await takeEarlyRead(path);
  if (read) return read.data as T;
  // Fetched early by the page itself: only where there was no worker to read it.
  const early = await takeEarlyGet(path);
  if (early) {
    const data = await answerOf<T>(early);
    performance.mark(`orbitab:json-received ${path}`, { detail: { parsedIn: 'page' } });
    return data;
  }
  if (deferReads) await released;
  const worker = workerForJson();
  if (!worker) return api<T>(path, init);
  return readInWorker<T>(worker, path, init.signal);
}

function readInWorker<T>(worker: Worker, path: string, signal?: AbortSignal, held = false): Promise<T> {
  const url = new URL(`/api${path}`, location.href).href;
  return throughWorker<T>(worker, path, (id) => worker.postMessage({ id, kind: 'fetch', url, largeChars: largeAnswerLimit() } satisfies JsonFetchRequest), signal, held);
}

/**
 * Starts, before the app's code has arrived, a GET whose answer grows with the workbook: read by the
 * worker from the start (the page's first script asks; apiLarge takes it), or fetched by the page
 * where workers cannot run.
 */
export function startEarlyLargeGet(path: string, options: { held?: boolean } = {}): void {
  const worker = workerForJson();
  if (!worker) return startEarlyGet(path);
  if (options.held) holdAnswers();
  startEarlyRead(path, (signal) => readInWorker(worker, path, signal, options.held));
}
