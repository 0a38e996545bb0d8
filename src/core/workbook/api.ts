// Every request the open workbook makes: loading it, sending a patch of cell inputs, and tab
// operations. Tab operations go straight to the server (they are rare and must not be lost or
// reordered with cell patches), then to the engine once the server has accepted them.
import { queryOptions, type QueryClient } from '@tanstack/react-query';
import { workbookPath, type FirstRowsPayload, type PatchInput, type PatchPart, type PatchPartResult, type PatchResult, type SheetMutationResult, type ValuesPayload, type WorkbookPayload } from '@shared/workbooks.js';
import { removeSheetFromFormula, renameSheetInFormula } from '@shared/formulaText.js';
import type { StructuresRequest, StructuresResponse } from '@shared/structures.js';
import type { EhtResult } from '@functions/chem/ehtSummary.js';
import { api, apiLarge, queryKeys } from '../../lib/api.js';
import { writeDisplaySettings, type DisplaySettings } from './model/displaySettings.js';
import type { WorkbookSession } from './session/useWorkbookSession.js';

export const workbookQueryOptions = (id: string) =>
  queryOptions({
    queryKey: queryKeys.workbook(id),
    queryFn: ({ signal }) => apiLarge<WorkbookPayload>(workbookPath(id), { signal }),
    // Each visit loads afresh; while open, the engine is the source of truth.
    staleTime: Infinity,
    gcTime: 0,
  });

/** POST /api/workbooks/:id/structures: stored extended-Hückel results, null for those still being computed. */
export const fetchStructures = (workbookId: string, inputs: StructuresRequest['inputs']) =>
  api<StructuresResponse<EhtResult>>(workbookPath(workbookId, 'structures'), { method: 'POST', body: { inputs } });

/**
 * The values the server stored with the workbook's current revision (GET …/values?stored=only), or
 * null while they are not stored (the server answers 204 rather than computing them). Failing to
 * fetch them is no failure to open: the workbook is then computed here as before.
 */
export const storedValuesQueryOptions = (id: string) =>
  queryOptions({
    queryKey: queryKeys.storedValues(id),
    queryFn: ({ signal }) => apiLarge<ValuesPayload | null>(`${workbookPath(id, 'values')}?stored=only`, { signal }).catch(() => null),
    staleTime: Infinity,
    gcTime: 0,
    retry: false,
  });

/**
 * The first tab's first rows and the values stored for them (GET …/first-rows): a few kilobytes the
 * page paints while the workbook and its values are still on their way. Failing to fetch it is no
 * failure to open: the page then waits for the whole answers as before.
 */
export const firstRowsQueryOptions = (id: string) =>
  queryOptions({
    queryKey: queryKeys.firstRows(id),
    queryFn: ({ signal }) => api<FirstRowsPayload>(workbookPath(id, 'first-rows'), { signal }).catch(() => null),
    staleTime: Infinity,
    gcTime: 0,
    retry: false,
  });

/** How long a load started before the page's code arrived is kept for it (the page's own query keeps none). */
const earlyLoadKeptMs = 60_000;

/**
 * Starts loading the workbook and its stored values as soon as the route is known, while the page's
 * code is still downloading (the route's loader calls it): the page's queries then find the loads
 * under way instead of starting them after the code has run. A load nobody is showing is dropped
 * first, so every visit still loads afresh.
 */
export function startWorkbookLoad(client: QueryClient, id: string) {
  for (const options of [workbookQueryOptions(id), storedValuesQueryOptions(id), firstRowsQueryOptions(id)] as const) {
    const cached = client.getQueryCache().find({ queryKey: options.queryKey, exact: true });
    if (cached && cached.getObserversCount() === 0) client.removeQueries({ queryKey: options.queryKey, exact: true });
  }
  void client.prefetchQuery({ ...firstRowsQueryOptions(id), gcTime: earlyLoadKeptMs });
  void client.prefetchQuery({ ...workbookQueryOptions(id), gcTime: earlyLoadKeptMs });
  void client.prefetchQuery({ ...storedValuesQueryOptions(id), gcTime: earlyLoadKeptMs });
}

/** POST /api/workbooks/:id/patches: the save queue's one way to the server. */
export const sendPatch = (workbookId: string, patch: PatchInput & { part?: PatchPart }) =>
  api<PatchResult | PatchPartResult>(workbookPath(workbookId, 'patches'), { method: 'POST', body: patch });

const sheetsPath = (s: WorkbookSession, ...rest: string[]) => workbookPath(s.model.id, 'sheets', ...rest);

export async function addSheet(s: WorkbookSession): Promise<string> {
  const { sheet } = await api<SheetMutationResult>(sheetsPath(s), { method: 'POST', body: {} });
  s.model.addSheetState(sheet);
  return sheet.id;
}

export async function renameSheet(s: WorkbookSession, sheetId: string, name: string): Promise<void> {
  const before = s.model.sheet(sheetId).name;
  const { sheet } = await api<SheetMutationResult>(sheetsPath(s, sheetId), { method: 'PATCH', body: { name } });
  // The server rewrote stored formulas naming the sheet; unsent ones and the shown text follow.
  s.queue.rewritePending((input) => renameSheetInFormula(input, before, sheet.name));
  s.model.renameSheetState(sheetId, sheet.name);
}

export async function deleteSheet(s: WorkbookSession, sheetId: string): Promise<void> {
  const name = s.model.sheet(sheetId).name;
  await api(sheetsPath(s, sheetId), { method: 'DELETE' });
  s.queue.dropSheet(sheetId);
  s.queue.rewritePending((input) => removeSheetFromFormula(input, name));
  s.model.removeSheetState(sheetId);
  // The server keeps positions dense (0, 1, 2…): close the gap the same way.
  s.model.setPositions(s.model.sheets.map((x) => x.id));
}

export async function moveSheet(s: WorkbookSession, sheetId: string, position: number): Promise<void> {
  await api<SheetMutationResult>(sheetsPath(s, sheetId), { method: 'PATCH', body: { position } });
  const order = s.model.sheets.map((x) => x.id).filter((id) => id !== sheetId);
  order.splice(position, 0, sheetId);
  s.model.setPositions(order);
}

/** Saves a sheet's display settings; resolves to the workbook's revision after the save. */
export async function saveDisplaySettings(s: WorkbookSession, sheetId: string, display: DisplaySettings): Promise<number> {
  return (await api<SheetMutationResult>(sheetsPath(s, sheetId), { method: 'PATCH', body: { settings: writeDisplaySettings(display) } })).revision;
}
