// Opens a workbook: loads it once (TanStack Query, never refetched behind the user's back — the
// engine is built from this one load), builds the model and the save queue, and takes over any
// changes an earlier visit left unsent in local storage.
import { useQuery } from '@tanstack/react-query';
import { startTransition, useEffect, useMemo, useRef, useState, useSyncExternalStore } from 'react';
import type { ValuesPayload, WorkbookPayload } from '@shared/workbooks.js';
import { fetchStructures, firstRowsQueryOptions, sendPatch, storedValuesQueryOptions, workbookQueryOptions } from '../api.js';
import { WorkbookModel } from '../model/workbookModel.js';
import { PatchQueue, type SaveStatus } from '../save/patchQueue.js';
import { PendingStore, type KeyValueStorage } from '../save/pendingStore.js';
import { buildPreview, type SheetPreview } from '../model/windowPreview.js';
import { storedPreview } from '../model/storedPreview.js';
import { browserStorage, glanceOf } from './glance.js';
import { PendingReevaluation } from '../model/pendingCells.js';
import { installStructureStore, StructureStore } from '../structures/structureStore.js';
import { StructureInputScan } from '../structures/structureInputs.js';
import { inSlices, OpenPreparation, type PreparedOpen } from '../model/openPreparation.js';
import { inTabOrder } from '@functions/workbookEngine.js';
import { loadOpenchemlib, openchemlibLoaded } from '@functions/chem/openchemlib.js';
import { enginePrepared, prepareEngine } from './engineSetup.js';
import { releaseHeldAnswers } from '../../../lib/api.js';
import { releaseCells, releaseValues, wasReleased } from './releasedAnswers.js';

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


/** How long one slice of putting formulas back may hold the page (well inside a 250 ms stall). */
export const computeSliceMs = 25;

/**
 * With no stored values, a workbook with more formulas than this is still opened in slices (its
 * formula cells empty until their slice): built whole, a library of a thousand extended-Hückel rows
 * held the page for most of a second in one task.
 */
export const slicedOpenMinFormulas = 200;

/** How long the stored structure results may hold back the first slice: longer, and the cells ask for them as usual. */
const prefetchWaitMs = 3_000;

function formulaCount(payload: WorkbookPayload): number {
  let n = 0;
  for (const sheet of payload.sheets) for (const cell of sheet.cells) if (cell[2].charCodeAt(0) === 61 /* = */) n++;
  return n;
}

export function openSession(
  payload: WorkbookPayload,
  storage: KeyValueStorage | null,
  structures = new StructureStore((inputs) => fetchStructures(payload.id, inputs)),
  stored: ValuesPayload | null = null,
  /** The model's inputs and placeholder tables, made beforehand in slices (openPreparation.ts). */
  prepared?: PreparedOpen,
): WorkbookSession {
  // Timed for the open benchmark (bench/browser-open.ts reads this measure).
  const started = performance.now();
  // The model hands every local change to the save queue; the queue shows colleagues' inputs it held
  // back. Each is given the other's method at construction, called only once both exist.
  const model: WorkbookModel = new WorkbookModel(payload, { onLocalChanges: (changes) => queue.enqueue(changes), stored, prepared });
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
  // A few kilobytes: the first rows and their stored values, painted while the answers that grow with
  // the workbook are still on their way (only until the first session is on screen).
  const firstRowsQuery = useQuery(firstRowsQueryOptions(id));
  const [glanceOver, setGlanceOver] = useState(false);
  const glance = useMemo(() => (glanceOver ? null : glanceOf(firstRowsQuery.data, browserStorage())), [firstRowsQuery.data, glanceOver]);
  // Asked at the same time as the workbook: the revision's stored values, painted before any formula is computed here.
  const storedQuery = useQuery(storedValuesQueryOptions(id));
  const stored = storedQuery.isFetched ? (storedQuery.data ?? null) : undefined;
  const [session, setSession] = useState<WorkbookSession | null>(null);
  const [openError, setOpenError] = useState<Error | null>(null);
  const [preview, setPreview] = useState<SheetPreview | null>(null);
  /** The full open, held back until the preview has been painted. */
  const deferredOpen = useRef<(() => void) | null>(null);
  /** What waits for the opened session to be on screen (openOnStoredValues). */
  const afterShown = useRef<(() => void) | null>(null);
  const payload = query.data;
  const { refetch: refetchPayload } = query;
  const { refetch: refetchStored } = storedQuery;
  const markedLoad = useRef<WorkbookPayload | null>(null);
  // Set-up that runs while the workbook is still on its way (engineSetup.ts), started once the first
  // rows are painted (below); the open waits for it.
  const [setUp, setSetUp] = useState(0);

  useEffect(() => {
    if (!payload || stored === undefined) return;
    // The lists of these answers were let go once an earlier open had its model (releasedAnswers.ts):
    // asked for afresh rather than opened empty.
    if (wasReleased(payload) || wasReleased(stored)) {
      if (wasReleased(payload)) void refetchPayload();
      if (wasReleased(stored)) void refetchStored();
      return;
    }
    // Once per load (the effect runs again when the set-up it waits for is in).
    const firstRun = markedLoad.current !== payload;
    // The page's first load, not a reload after an import or a colleague's change: those keep the
    // workspace on screen (and what it holds, such as the sheet an import should open).
    const pageOpen = markedLoad.current === null;
    if (firstRun) performance.mark('orbitab:workbook-loaded');
    markedLoad.current = payload;
    const storage = browserStorage();
    const unsent = new PendingStore(storage, payload.id).load() !== null;
    const onStored = stored !== null && stored.revision === payload.revision && !unsent;
    // The stored values' first screenful is shown at once, while the engine is set up and built.
    if (firstRun && pageOpen && onStored) setPreview(storedPreview(payload, stored));
    // For benchmarks: whether this open started from stored values (the answer may have come through the worker, out of the page's resource timing).
    if (firstRun && onStored) performance.mark('orbitab:opened-on-stored-values');
    // SMILES functions read structures with openchemlib, loaded apart from the page's code
    // (functions/chem/openchemlib.ts): no formula is computed before it is in. Stored values are
    // shown meanwhile, and it is asked for only once they are painted: its megabyte of code, compiled
    // and run while the preview waited, held a cold open's first values back by a few hundred ms. Any
    // other open waits for it. Every open waits for the engine's set-up. This effect runs again once
    // what it waits for is in.
    const toolkit = onStored && !openchemlibLoaded() ? afterNextPaint().then(loadOpenchemlib) : loadOpenchemlib();
    if (!enginePrepared() || (!onStored && !openchemlibLoaded())) {
      let cancelled = false;
      Promise.all([prepareEngine(), onStored ? null : toolkit]).then(
        () => !cancelled && setSetUp((n) => n + 1),
        (e: unknown) => !cancelled && setOpenError(setupProblem(e)),
      );
      return () => {
        cancelled = true;
      };
    }
    // Installed before the preview is built: the first screenful's EHT cells ask this store too.
    const structures = new StructureStore((inputs) => fetchStructures(payload.id, inputs));
    const uninstall = installStructureStore(structures);
    const openInSlices = (values: ValuesPayload) => {
      const show = (s: WorkbookSession | null) => {
        setSession(s);
        if (s) setPreview(null);
      };
      const close = openOnStoredValues(payload, storage, structures, values, toolkit, show, setOpenError, (shown) => (afterShown.current = shown));
      return () => {
        close();
        uninstall();
      };
    };
    // Values stored with this very revision: open at once on them, then compute in slices.
    if (stored && stored.revision === payload.revision) return openInSlices(stored);
    // A large sheet shows its first screenful first; the full engine is built after that paint.
    // Not when unsent changes are waiting: the preview would show the server's older values.
    let first: SheetPreview | null = null;
    const previewStarted = performance.now();
    try {
      first = unsent ? null : buildPreview(payload);
    } catch {
      first = null; // the full build below reports any real problem
    }
    if (first) performance.measure('orbitab:build-preview', { start: previewStarted, end: performance.now() });
    else if (formulaCount(payload) > slicedOpenMinFormulas) return openInSlices({ revision: payload.revision, sheets: [] });
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
      const opened = s;
      const show = () => {
        setSession(opened);
        setPreview(null);
      };
      // The page's first open is rendered as a transition: React draws the workspace in short tasks,
      // not in one long one. A reload (after an import, say) replaces the session at once instead, so
      // the workspace on screen, and what it holds, stays (the old session is disposed by now).
      if (pageOpen) startTransition(show);
      else show();
      window.addEventListener('online', online);
      // Only a large sheet (one shown by a preview first) is worth letting go of; this runs a frame
      // after the effect, so a development double run of the effect never gets here first.
      if (first) releaseCells(payload);
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
  }, [payload, stored, setUp, refetchPayload, refetchStored]);

  // The workspace of an open session is on screen (committed; the frame callback that follows comes
  // just before its paint).
  useEffect(() => {
    const shown = afterShown.current;
    if (!session || !shown) return;
    afterShown.current = null;
    shown();
  }, [session]);

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

  useEffect(() => {
    if (session) setGlanceOver(true);
  }, [session]);

  // The glance stands in until the open's own preview or session is there, and only for the revision loaded.
  const shownGlance = glance && !session && !preview && (!payload || payload.revision === glance.revision) ? glance : null;
  // The workbook and its values, read early, wait unread until the first rows are painted (api.ts),
  // or until it is clear there is no glance to paint; so does the engine's set-up.
  const glanceShown = shownGlance !== null;
  const firstRowsIn = firstRowsQuery.isFetched;
  useEffect(() => {
    if (!firstRowsIn) return;
    const go = () => {
      releaseHeldAnswers();
      void prepareEngine();
    };
    if (!glanceShown) return go();
    let cancelled = false;
    void afterNextPaint().then(() => !cancelled && go());
    return () => {
      cancelled = true;
    };
  }, [firstRowsIn, glanceShown]);
  const previewSheet = preview && payload?.sheets.find((s) => s.id === preview.sheetId);
  return {
    session,
    preview: preview ?? shownGlance?.preview ?? null,
    /** The title and sheet settings the preview is shown with. */
    previewFrame: preview && payload ? { title: payload.title, settings: previewSheet ? previewSheet.settings : undefined } : shownGlance ? { title: shownGlance.title, settings: shownGlance.settings } : null,
    payload,
    error: query.error ?? openError,
    isLoading: query.isLoading,
  };
}

/** Resolves after the next frame has been painted (its frame callback, then a task after it). */
const afterNextPaint = () => new Promise<void>((resolve) => requestAnimationFrame(() => setTimeout(resolve, 0)));

function setupProblem(e: unknown): Error {
  return new Error(`The page could not get ready to compute (${e instanceof Error ? e.message : String(e)}); reload the page to try again.`);
}

/**
 * Opens on the values stored with the loaded revision (none: formula cells empty), then puts the
 * formulas back a slice at a time after each paint until the workbook is live. The model's inputs
 * and placeholder tables are made first, in slices too (openPreparation.ts), so no step of the open
 * holds the page long however large the workbook. Edits in the meantime (and unsent ones from an
 * earlier visit) go to the engine and the save queue as usual; what depends on a formula not yet
 * back is brought up to date when its slice comes. After the first paint the formulas are read for
 * the structures they name, and the first slice waits (briefly) for those stored extended-Hückel
 * results, so those cells go from stored value to computed value without showing "computing…".
 * Returns the clean-up.
 */
function openOnStoredValues(
  payload: WorkbookPayload,
  storage: KeyValueStorage | null,
  structures: StructureStore,
  stored: ValuesPayload | null,
  toolkit: Promise<unknown>,
  setSession: (s: WorkbookSession | null) => void,
  setOpenError: (e: Error) => void,
  /** Registers what runs once the session's workspace is committed. */
  whenShown: (shown: () => void) => void,
): () => void {
  let s: WorkbookSession | null = null;
  let timer: ReturnType<typeof setTimeout> | undefined;
  let waitTimer: ReturnType<typeof setTimeout> | undefined;
  let rowsTimer: ReturnType<typeof setTimeout> | undefined;
  let frame = 0;
  let cancelled = false;
  const isCancelled = () => cancelled;
  const online = () => s?.queue.flushNow();
  // Let go once its result is taken: this scope lives as long as the session (its clean-up below).
  let preparation: OpenPreparation | null = new OpenPreparation(payload, stored);
  const opening = inSlices((ms) => preparation!.step(ms), computeSliceMs, isCancelled);
  void opening.then((ready) => {
    if (!ready) return;
    const prepared = preparation!.result();
    preparation = null;
    let session: WorkbookSession;
    try {
      session = s = openSession(payload, storage, structures, stored, prepared);
    } catch (e) {
      setOpenError(e as Error);
      return;
    }
    const opened = performance.now();
    // The model holds the stored values now (as placeholders put back in slices): the answer's copy can go.
    if (stored) releaseValues(stored);
    // The first sheet's cell views are made in a task of their own (for a library of a thousand rows
    // they were most of the workspace's first render), then the workspace is rendered as a
    // transition: React draws it in short tasks, and nothing below starts before it is committed.
    rowsTimer = setTimeout(() => {
      if (cancelled) return;
      const first = session.model.sheets[0];
      if (first) session.model.rows(first.id);
      startTransition(() => setSession(session));
    }, 0);
    window.addEventListener('online', online);
    const step = () => {
      if (cancelled) return;
      if (session.model.computeSlice(computeSliceMs)) performance.measure('orbitab:live', { start: opened, end: performance.now() });
      else timer = setTimeout(step, 0);
    };
    // The first slice waits for the first paint of the stored values, for the stored structure results
    // and for the structure toolkit.
    let painted = false;
    let fetched = false;
    let toolkitIn = openchemlibLoaded();
    const begin = () => {
      if (cancelled || !painted || !fetched || !toolkitIn || timer !== undefined) return;
      clearTimeout(waitTimer);
      timer = setTimeout(step, 0);
    };
    const fetchedNow = () => {
      fetched = true;
      begin();
    };
    waitTimer = setTimeout(fetchedNow, prefetchWaitMs);
    toolkit.then(
      () => {
        toolkitIn = true;
        begin();
      },
      (e: unknown) => !cancelled && setOpenError(setupProblem(e)),
    );
    whenShown(() => {
      frame = requestAnimationFrame(() => {
        painted = true;
        // The structures the formulas name, read after the first paint (a pass over every formula).
        const scan = new StructureInputScan((sheetId, row, col) => prepared.inputs.get(sheetId)?.get(row, col));
        const sheets = inTabOrder(payload.sheets);
        timer = setTimeout(() => {
          timer = undefined;
          void inSlices((ms) => scan.step(sheets, ms), computeSliceMs, isCancelled)
            .then((read) => {
              if (!read) return undefined;
              // The last reader of the answer's list of cells: the model holds every input.
              releaseCells(payload);
              return structures.prefetch(scan.result());
            })
            .then(fetchedNow);
        }, 0);
      });
    });
  });
  return () => {
    cancelled = true;
    cancelAnimationFrame(frame);
    clearTimeout(timer);
    clearTimeout(waitTimer);
    clearTimeout(rowsTimer);
    window.removeEventListener('online', online);
    if (s) {
      s.reevaluation.stop();
      s.queue.dispose();
      s.model.dispose();
    }
    setSession(null);
  };
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
