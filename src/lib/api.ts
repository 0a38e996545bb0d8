// The one API client. Components never call fetch: features wrap these calls in TanStack Query
// `queryOptions`/mutations, with keys from `queryKeys` below.
import { takeEarlyGet } from './earlyGets.js';
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
  const early = (init.method ?? 'GET') === 'GET' && init.body === undefined ? await takeEarlyGet(path) : null;
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
let nextRequest = 1;
const waiting = new Map<number, { path: string; assembly: JsonAssembly; resolve: (v: unknown) => void; reject: (e: Error) => void }>();

function workerForJson(): Worker | null {
  if (jsonWorker) return jsonWorker;
  if (typeof Worker === 'undefined') return null;
  try {
    jsonWorker = new Worker(new URL('./jsonFetch.worker.ts', import.meta.url), { type: 'module' });
  } catch {
    return null;
  }
  jsonWorker.onmessage = (e: MessageEvent<JsonFetchReply>) => {
    const reply = e.data;
    const w = waiting.get(reply.id);
    if (!w) return; // aborted meanwhile
    if (reply.kind === 'failed') {
      waiting.delete(reply.id);
      const err = (reply.body as { error?: { code?: string; message?: string; details?: unknown } } | null)?.error;
      w.reject(new ApiError(reply.status, err?.code ?? 'http_error', err?.message ?? `${reply.status} ${reply.statusText}`, err?.details));
      return;
    }
    // Marked for the open benchmark, as a resource entry would show it had the page fetched it.
    if (reply.kind === 'head') performance.mark(`orbitab:json-received ${w.path}`, { startTime: Math.max(0, reply.receivedAt - performance.timeOrigin) });
    const taken = w.assembly.take(reply);
    if (taken.done) {
      waiting.delete(reply.id);
      w.resolve(taken.data);
    }
  };
  return jsonWorker;
}

/** Answers larger than this (uncompressed, as far as the headers tell) are read in the worker; smaller ones parse in the page in well under a frame's budget of stall. */
const largeAnswerBytes = 4_000_000;
/** A compressed answer's length times this is taken as its size (JSON of cells packs about tenfold). */
const packedRatio = 10;

/**
 * GET of an answer that grows with the workbook (its cells, its stored values). Fetched by the page;
 * when the headers say it is large, its body is handed to a worker that reads and parses it and
 * hands the result back in parts (jsonFetch.worker.ts), so the page never stops for the whole answer
 * at once. The same result and errors as `api`.
 */
export async function apiLarge<T>(path: string, init: { signal?: AbortSignal } = {}): Promise<T> {
  const res = (await takeEarlyGet(path)) ?? (await fetch(`/api${path}`, { credentials: 'same-origin', signal: init.signal }));
  const length = Number(res.headers.get('content-length') ?? Number.NaN);
  const size = res.headers.has('content-encoding') ? length * packedRatio : length;
  const worker = res.ok && res.body && !(size <= largeAnswerBytes) ? workerForJson() : null;
  if (!worker) return answerOf<T>(res);
  const id = nextRequest++;
  return new Promise<T>((resolve, reject) => {
    if (init.signal?.aborted) return reject(init.signal.reason);
    waiting.set(id, { path, assembly: new JsonAssembly(), resolve: resolve as (v: unknown) => void, reject });
    init.signal?.addEventListener('abort', () => {
      if (waiting.delete(id)) reject(init.signal!.reason);
    });
    const body = res.body!;
    worker.postMessage({ id, body } satisfies JsonFetchRequest, [body as unknown as Transferable]);
  });
}
