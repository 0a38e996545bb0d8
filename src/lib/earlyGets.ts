// GET requests the page's first script starts before the app's code has arrived (src/app/earlyStart.ts),
// handed over to the first call of `api`/`apiLarge` for the same path. Only a success is handed over,
// only soon after it was asked for, and only while the page has changed nothing: anything else is
// asked again, so an early answer never stands in for a later visit, for a request made after
// signing in, or for a state the page's own POST (confirming an address, an import) has changed.
// Two kinds: a small answer fetched by the page (its Response is handed over), and an answer that
// grows with the workbook, fetched and read by the JSON worker from the start (its data is handed
// over), so its many megabytes never pass through the page's thread.

/** How long after it was asked an early answer may still be used. */
const keptMs = 15_000;

interface Early<T> {
  at: number;
  /** The answer to hand over, or null (a failure is never handed over). */
  answer: Promise<T | null>;
  abort?: AbortController;
}

const early = new Map<string, Early<Response>>();
const earlyData = new Map<string, Early<{ data: unknown }>>();

/** Starts `GET /api<path>` unless it is already under way. */
export function startEarlyGet(path: string): void {
  if (early.has(path)) return;
  const response = fetch(`/api${path}`, { credentials: 'same-origin' });
  early.set(path, { at: performance.now(), answer: response.then((r) => (r.ok ? r : null), () => null) });
}

/** Starts reading `path` with `read` (the worker's fetch, parse included) unless it is already under way. */
export function startEarlyRead(path: string, read: (signal: AbortSignal) => Promise<unknown>): void {
  if (earlyData.has(path)) return;
  const abort = new AbortController();
  earlyData.set(path, { at: performance.now(), abort, answer: read(abort.signal).then((data) => ({ data }), () => null) });
}

/** The early answer for this path from `from` (once), or null when there is none to use. */
async function take<T>(from: Map<string, Early<T>>, path: string): Promise<T | null> {
  const entry = from.get(path);
  if (!entry) return null;
  from.delete(path);
  if (performance.now() - entry.at > keptMs) {
    entry.abort?.abort();
    return null;
  }
  return entry.answer;
}

/** A copy of the early answer for this path, leaving it to be taken; null when there is none. */
export function peekEarlyGet(path: string): Promise<Response | null> {
  const entry = early.get(path);
  return entry ? entry.answer.then((r) => r?.clone() ?? null) : Promise.resolve(null);
}

/** The early answer for this path (once), or null when there is none to use. */
export const takeEarlyGet = (path: string): Promise<Response | null> => take(early, path);

/** The early read data for this path (once, wrapped), or null when there is none to use. */
export const takeEarlyRead = (path: string): Promise<{ data: unknown } | null> => take(earlyData, path);

/** Forgets every early answer not yet taken (and stops the reads under way): the page is about to change something they may show. */
export function dropEarlyGets(): void {
  for (const entry of earlyData.values()) entry.abort?.abort();
  early.clear();
  earlyData.clear();
}
