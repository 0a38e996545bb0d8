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
  | ({ id: number; kind: 'part' } & JsonPart)
  | { id: number; kind: 'end' }
  | { id: number; kind: 'failed'; status: number; statusText: string; body: unknown };

/**
 * A slice of one list. A list of cells ([row, col, x] entries, as both the workbook's cells and the
 * stored values are) travels packed: rows and columns as typed arrays (moved, not copied) and the
 * third entries as a list. Sent as 5,000 little arrays each, every entry was an object the page's
 * garbage collector copied while the answer came in (a tenth of a second and more a time); made
 * again by the page's own code, V8 soon allocates them where long-lived objects go.
 */
export type JsonPart = { sheet: number; key: string } & ({ items: unknown[] } | { rows: Int32Array; cols: Int32Array; lasts: unknown[] });

const isPlace = (x: unknown) => typeof x === 'number' && (x | 0) === x;

/** The slice packed when every entry is a [row, col, x] cell; as it is otherwise. */
function partOf(sheet: number, key: string, items: unknown[]): JsonPart {
  if (!items.every((e) => Array.isArray(e) && e.length === 3 && isPlace(e[0]) && isPlace(e[1]))) return { sheet, key, items };
  const cells = items as [number, number, unknown][];
  const rows = new Int32Array(cells.length);
  const cols = new Int32Array(cells.length);
  const lasts = new Array<unknown>(cells.length);
  cells.forEach((e, i) => {
    rows[i] = e[0];
    cols[i] = e[1];
    lasts[i] = e[2];
  });
  return { sheet, key, rows, cols, lasts };
}

/** The buffers a part moves to the page rather than copies. */
export function partTransfers(part: JsonPart): Transferable[] {
  return 'rows' in part ? [part.rows.buffer, part.cols.buffer] : [];
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
      for (let at = 0; at < value.length; at += partItems) parts.push(partOf(i, key, value.slice(at, at + partItems)));
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
      if ('items' in reply) for (const item of reply.items) list.push(item);
      else {
        const { rows, cols, lasts } = reply;
        for (let i = 0; i < rows.length; i++) list.push([rows[i], cols[i], lasts[i]]);
      }
    } else return { done: true, data: this.data };
    return { done: false };
  }
}
