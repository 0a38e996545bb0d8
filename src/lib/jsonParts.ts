// The messages between the page and jsonFetch.worker.ts, and the page's side: put the parts back
// together into the answer the server sent, one short task per message.

/** An answer's text as JSON; text that is not JSON becomes a `bad_response` error body naming its start. */
export function safeJson(text: string): unknown {
  try {
    return JSON.parse(text);
  } catch {
    return { error: { code: 'bad_response', message: text.slice(0, 200) } };
  }
}

/** Entries per part: the page takes one in a few milliseconds (20,000 took over 250 ms on a busy machine). */
export const partItems = 5_000;

export type JsonFetchRequest =
  /** A GET of `url`; an answer longer than `largeChars` characters is parsed in the worker and sent in parts. */
  | { id: number; kind: 'fetch'; url: string; largeChars: number }
  | { id: number; kind: 'abort' };

export type JsonFetchReply =
  /** A small answer's text, for the page to parse. */
  | { id: number; kind: 'text'; text: string; receivedAt: number }
  | { id: number; kind: 'head'; data: unknown; /** When the whole answer had arrived, on the clock of performance.timeOrigin (ms since the epoch). */ receivedAt: number }
  | { id: number; kind: 'part'; sheet: number; key: string; items: unknown[] }
  | { id: number; kind: 'end' }
  | { id: number; kind: 'failed'; status: number; statusText: string; body: unknown };

export interface JsonPart {
  sheet: number;
  key: string;
  items: unknown[];
}

/**
 * Splits an answer for sending: every list longer than `partItems` directly under `sheets[i]` is
 * emptied in the answer (changed in place) and returned as parts of at most `partItems` entries.
 */
export function splitIntoParts(data: unknown): JsonPart[] {
  const sheets = (data as { sheets?: unknown } | null)?.sheets;
  const parts: JsonPart[] = [];
  if (!Array.isArray(sheets)) return parts;
  sheets.forEach((sheet: Record<string, unknown> | null, i) => {
    if (!sheet || typeof sheet !== 'object') return;
    for (const [key, value] of Object.entries(sheet)) {
      if (!Array.isArray(value) || value.length <= partItems) continue;
      for (let at = 0; at < value.length; at += partItems) parts.push({ sheet: i, key, items: value.slice(at, at + partItems) });
      sheet[key] = [];
    }
  });
  return parts;
}

/** Reassembles one answer from its messages; `take` returns the answer once the last part is in. */
export class JsonAssembly {
  private data: unknown = null;

  take(reply: Exclude<JsonFetchReply, { kind: 'failed' }>): { done: true; data: unknown } | { done: false } {
    if (reply.kind === 'text') return { done: true, data: reply.text ? safeJson(reply.text) : null };
    if (reply.kind === 'head') this.data = reply.data;
    else if (reply.kind === 'part') {
      const list = (this.data as { sheets: Record<string, unknown[]>[] }).sheets[reply.sheet][reply.key];
      for (const item of reply.items) list.push(item);
    } else return { done: true, data: this.data };
    return { done: false };
  }
}
