// Fetches and parses a large JSON answer off the page's thread (reading 13 MB of text and parsing it
// held the page for over a second each), then hands it over in parts: the answer with every long
// per-sheet list emptied first, then those lists a slice at a time, each slice its own message, so
// the page takes them in short tasks between frames. Only lists under `sheets[i]` are sliced: the
// workbook's cells and the stored values, the two answers that grow with the sheet.
import { partItems, type JsonFetchReply, type JsonFetchRequest } from './jsonParts.js';

const scope = self as unknown as { onmessage: ((e: MessageEvent<JsonFetchRequest>) => void) | null; postMessage(m: JsonFetchReply): void };

scope.onmessage = async (e) => {
  const { id, url } = e.data;
  let res: Response;
  let text: string;
  let receivedAt: number;
  try {
    res = await fetch(url, { credentials: 'same-origin' });
    text = await res.text();
    receivedAt = performance.timeOrigin + performance.now();
  } catch (err) {
    scope.postMessage({ id, kind: 'failed', status: 0, statusText: (err as Error).message, body: null });
    return;
  }
  let data: unknown = null;
  try {
    data = text ? JSON.parse(text) : null;
  } catch {
    data = { error: { code: 'bad_response', message: text.slice(0, 200) } };
  }
  if (!res.ok) {
    scope.postMessage({ id, kind: 'failed', status: res.status, statusText: res.statusText, body: data });
    return;
  }
  const sheets = (data as { sheets?: unknown } | null)?.sheets;
  const parts: { sheet: number; key: string; list: unknown[] }[] = [];
  if (Array.isArray(sheets)) {
    sheets.forEach((sheet: Record<string, unknown>, i) => {
      for (const [key, value] of Object.entries(sheet ?? {})) {
        if (!Array.isArray(value) || value.length <= partItems) continue;
        parts.push({ sheet: i, key, list: value });
        sheet[key] = [];
      }
    });
  }
  scope.postMessage({ id, kind: 'head', data, receivedAt });
  for (const { sheet, key, list } of parts) {
    for (let at = 0; at < list.length; at += partItems) scope.postMessage({ id, kind: 'part', sheet, key, items: list.slice(at, at + partItems) });
  }
  scope.postMessage({ id, kind: 'end' });
};
