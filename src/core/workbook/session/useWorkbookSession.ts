// Opens a workbook: loads it once (TanStack Query, never refetched behind the user's back — the
// engine is built from this one load), builds the model and the save queue, and takes over any
// changes an earlier visit left unsent in local storage.
import { useQuery } from '@tanstack/react-query';
import { useEffect, useRef, useState, useSyncExternalStore } from 'react';
import type { WorkbookPayload } from '@shared/workbooks.js';
import { fetchStructures, sendPatch, workbookQueryOptions } from '../api.js';
import { WorkbookModel } from '../model/workbookModel.js';
import { PatchQueue, type SaveStatus } from '../save/patchQueue.js';
import { PendingStore, type KeyValueStorage } from '../save/pendingStore.js';
import { buildPreview, type SheetPreview } from '../model/windowPreview.js';
import { PendingReevaluation } from '../model/pendingCells.js';
import { installStructureStore, StructureStore } from '../structures/structureStore.js';

export interface WorkbookSession {
  model: WorkbookModel;
  queue: PatchQueue;
  store: PendingStore;
  /** Unsent changes found from an earlier visit and put back on the sheet. */
  restored: number;
  /** Extended-Hückel results from the server, and the cells waiting for them. */
  structures: StructureStore;
  reevaluation: PendingReevaluation;
}

function browserStorage(): KeyValueStorage | null {
  try {
    return window.localStorage;
  } catch {
    return null; // storage disabled by the browser's settings
  }
}

export function openSession(payload: WorkbookPayload, storage: KeyValueStorage | null, structures = new StructureStore((inputs) => fetchStructures(payload.id, inputs))): WorkbookSession {
  // Timed for the open benchmark (bench/browser-open.ts reads this measure).
  const started = performance.now();
  // The model hands every local change to the save queue; the queue shows colleagues' inputs it held
  // back. Each is given the other's method at construction, called only once both exist.
  const model: WorkbookModel = new WorkbookModel(payload, { onLocalChanges: (changes) => queue.enqueue(changes) });
  const reevaluation = new PendingReevaluation(model);
  structures.onArrival((cells) => reevaluation.add(cells));
  performance.measure('orbitab:build-engine', { start: started, end: performance.now() });
  const store = new PendingStore(storage, payload.id);
  const queue: PatchQueue = new PatchQueue({
    store,
    baseRevision: payload.revision,
    transport: { send: (patch) => sendPatch(payload.id, patch) },
    showRemote: (inputs) => model.applyRemote(inputs),
  });
  let restored = 0;
  const left = store.load();
  if (left) {
    // Changes for sheets deleted since then have nowhere to go; everything else is shown and resent.
    const known = left.changes.filter((c) => model.hasSheet(c.sheetId));
    model.write(known);
    queue.restore({ baseRevision: left.baseRevision, changes: known });
    restored = known.length;
  }
  return { model, queue, store, restored, structures, reevaluation };
}

export function useWorkbookSession(id: string) {
  const query = useQuery(workbookQueryOptions(id));
  const [session, setSession] = useState<WorkbookSession | null>(null);
  const [openError, setOpenError] = useState<Error | null>(null);
  const [preview, setPreview] = useState<SheetPreview | null>(null);
  /** The full open, held back until the preview has been painted. */
  const deferredOpen = useRef<(() => void) | null>(null);
  const payload = query.data;

  useEffect(() => {
    if (!payload) return;
    performance.mark('orbitab:workbook-loaded');
    const storage = browserStorage();
    // Installed before the preview is built: the first screenful's EHT cells ask this store too.
    const structures = new StructureStore((inputs) => fetchStructures(payload.id, inputs));
    const uninstall = installStructureStore(structures);
    // A large sheet shows its first screenful first; the full engine is built after that paint.
    // Not when unsent changes are waiting: the preview would show the server's older values.
    let first: SheetPreview | null = null;
    const previewStarted = performance.now();
    try {
      first = new PendingStore(storage, payload.id).load() ? null : buildPreview(payload);
    } catch {
      first = null; // the full build below reports any real problem
    }
    if (first) performance.measure('orbitab:build-preview', { start: previewStarted, end: performance.now() });
    let s: WorkbookSession | null = null;
    let cancelled = false;
    const online = () => s?.queue.flushNow();
    const open = () => {
      deferredOpen.current = null;
      if (cancelled) return;
      try {
        s = openSession(payload, storage, structures);
      } catch (e) {
        setOpenError(e as Error);
        return;
      }
      setSession(s);
      setPreview(null);
      window.addEventListener('online', online);
    };
    if (first) {
      deferredOpen.current = open;
      setPreview(first);
    } else open();
    return () => {
      cancelled = true;
      deferredOpen.current = null;
      window.removeEventListener('online', online);
      uninstall();
      if (s) {
        s.reevaluation.stop();
        s.queue.dispose();
        s.model.dispose();
      }
      setSession(null);
    };
  }, [payload]);

  // Runs after the preview is committed: the frame callback comes just before that frame is
  // painted, and the timeout after it, so the long full build never hides the preview.
  useEffect(() => {
    if (!preview || !deferredOpen.current) return;
    let timer: ReturnType<typeof setTimeout> | undefined;
    const frame = requestAnimationFrame(() => (timer = setTimeout(() => deferredOpen.current?.(), 0)));
    return () => {
      cancelAnimationFrame(frame);
      clearTimeout(timer);
    };
  }, [preview]);

  return { session, preview, payload, error: query.error ?? openError, isLoading: query.isLoading };
}

const savedStatus: SaveStatus = { kind: 'saved' };

export function useSaveStatus(queue: PatchQueue | undefined): SaveStatus {
  return useSyncExternalStore(
    (cb) => queue?.subscribe(cb) ?? (() => {}),
    () => queue?.status ?? savedStatus,
  );
}

/** Re-renders on every model change; returns the model's version counter. */
export function useModelVersion(model: WorkbookModel | undefined): number {
  return useSyncExternalStore(
    (cb) => model?.subscribe(cb) ?? (() => {}),
    () => model?.version ?? 0,
  );
}
