// A browser workbook session in Node for client tests: the real grid model (engine and cell
// functions) and the real save queue over in-memory storage, on a one-sheet workbook at revision 4.
import { allowedActions } from '../../shared/permissions.js';
import type { WorkbookPayload } from '../../shared/workbooks.js';
import { WorkbookModel } from '../../src/core/workbook/model/workbookModel.js';
import { PatchQueue, type PatchTransport } from '../../src/core/workbook/save/patchQueue.js';
import { PendingStore, type KeyValueStorage } from '../../src/core/workbook/save/pendingStore.js';

export function memoryStorage(): KeyValueStorage {
  const data = new Map<string, string>();
  return { getItem: (k) => data.get(k) ?? null, setItem: (k, v) => void data.set(k, v), removeItem: (k) => void data.delete(k) };
}

export function onePayload(cells: [number, number, string][]): WorkbookPayload {
  return { id: 'wb', title: 'Screening', revision: 4, role: 'editor', actions: allowedActions(['editor']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells }] };
}

/** By default the transport never answers (nothing leaves the queue). */
export function session(cells: [number, number, string][], transport: PatchTransport = { send: () => new Promise(() => {}) }) {
  const model: WorkbookModel = new WorkbookModel(onePayload(cells), { onLocalChanges: (c) => queue.enqueue(c) });
  const queue: PatchQueue = new PatchQueue({ transport, store: new PendingStore(memoryStorage(), 'wb'), baseRevision: 4, debounceMs: 300, showRemote: (inputs) => model.applyRemote(inputs) });
  return { model, queue };
}
