// Reads and parses a large JSON answer off the page's thread (the page fetched it and hands over
// its body: reading 13 MB of text and parsing it held the page for over a second each), then hands
// it back in parts: the answer with every long per-sheet list emptied first, then those lists a
// slice at a time, each slice its own message, so the page takes them in short tasks between
// frames. Only lists under `sheets[i]` are sliced: the workbook's cells and the stored values, the
// two answers that grow with the sheet.
import { safeJson, splitIntoParts, type JsonFetchReply, type JsonFetchRequest } from './jsonParts.js';

const scope = self as unknown as { onmessage: ((e: MessageEvent<JsonFetchRequest>) => void) | null; postMessage(m: JsonFetchReply): void };

scope.onmessage = async (e) => {
  const { id, body } = e.data;
  let text: string;
  try {
    text = await new Response(body).text();
  } catch (err) {
    scope.postMessage({ id, kind: 'failed', status: 0, statusText: (err as Error).message, body: null });
    return;
  }
  const receivedAt = performance.timeOrigin + performance.now();
  const data = text ? safeJson(text) : null;
  const parts = splitIntoParts(data);
  scope.postMessage({ id, kind: 'head', data, receivedAt });
  for (const part of parts) scope.postMessage({ id, kind: 'part', ...part });
  scope.postMessage({ id, kind: 'end' });
};
