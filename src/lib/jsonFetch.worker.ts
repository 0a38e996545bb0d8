// Fetches, reads and parses an answer that grows with the workbook off the page's thread: reading
// 13 MB of text and parsing it held the page for over a second each, and even a body read here but
// fetched by the page was carried through the page a piece at a time (a third of a second of the
// page's time at a stretch), so the page's first script asks this worker too (earlyGets.ts). A
// small answer goes back as its text, parsed by the page as any other; a large one is parsed here
// and handed back in parts: the answer with every long per-sheet list emptied first, then those
// lists a slice at a time, each slice its own message, so the page takes them in short tasks
// between frames. Only lists under `sheets[i]` are sliced: the workbook's cells and the stored
// values, the two answers that grow with the sheet.
import { partTransfers, safeJson, splitIntoParts, type JsonFetchReply, type JsonFetchRequest } from './jsonParts.js';

const scope = self as unknown as { onmessage: ((e: MessageEvent<JsonFetchRequest>) => void) | null; postMessage(m: JsonFetchReply, transfer?: Transferable[]): void };

const running = new Map<number, AbortController>();

scope.onmessage = async (e) => {
  const request = e.data;
  if (request.kind === 'abort') {
    running.get(request.id)?.abort();
    running.delete(request.id);
    return;
  }
  const { id, largeChars } = request;
  const controller = new AbortController();
  running.set(id, controller);
  let status = 0;
  let statusText = '';
  let text: string;
  try {
    const res = await fetch(request.url, { credentials: 'same-origin', signal: controller.signal });
    status = res.status;
    statusText = res.statusText;
    text = await res.text();
    if (!res.ok) {
      scope.postMessage({ id, kind: 'failed', status, statusText, body: text ? safeJson(text) : null });
      return;
    }
  } catch (err) {
    if (!controller.signal.aborted) scope.postMessage({ id, kind: 'failed', status, statusText: statusText || (err as Error).message, body: null });
    return;
  } finally {
    running.delete(id);
  }
  const receivedAt = performance.timeOrigin + performance.now();
  if (text.length <= largeChars) {
    scope.postMessage({ id, kind: 'text', text, receivedAt });
    return;
  }
  const data = text ? safeJson(text) : null;
  const parts = splitIntoParts(data);
  scope.postMessage({ id, kind: 'head', data, receivedAt });
  for (const part of parts) scope.postMessage({ id, kind: 'part', ...part }, partTransfers(part));
  scope.postMessage({ id, kind: 'end' });
};
