// GET requests the page's first script starts before the app's code has arrived (src/app/earlyStart.ts),
// handed over to the first call of `api`/`apiLarge` for the same path. Only a success is handed over,
// only soon after it was asked for, and only while the page has changed nothing: anything else is
// asked again, so an early answer never stands in for a later visit, for a request made after
// signing in, or for a state the page's own POST (confirming an address, an import) has changed.

/** How long after it was asked an early answer may still be used. */
const keptMs = 15_000;

const early = new Map<string, { at: number; response: Promise<Response | null> }>();

/** Starts `GET /api<path>` unless it is already under way. */
export function startEarlyGet(path: string): void {
  if (early.has(path)) return;
  early.set(path, { at: performance.now(), response: fetch(`/api${path}`, { credentials: 'same-origin' }).catch(() => null) });
}

/** The early answer for this path (once), or null when there is none to use. */
export async function takeEarlyGet(path: string): Promise<Response | null> {
  const entry = early.get(path);
  if (!entry) return null;
  early.delete(path);
  if (performance.now() - entry.at > keptMs) return null;
  const response = await entry.response;
  return response?.ok ? response : null;
}

/** Forgets every early answer not yet taken: the page is about to change something they may show. */
export function dropEarlyGets(): void {
  early.clear();
}
