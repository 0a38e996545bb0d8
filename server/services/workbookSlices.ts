// loadWorkbook (workbookStore.ts) for work that runs in a worker afterwards (/values, exports, the
// values keeper): the cells are read a page at a time with a turn of the event loop between pages,
// so loading 500,000 cells never holds the server for long. The pages are one consistent snapshot
// when the workbook's revision is the same before and after; when a commit slipped in between, it
// reads again, and the last try is the one-transaction read.
import { eq } from 'drizzle-orm';
import type { CellEntry, WorkbookPayload } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { workbooks } from '../db/schema.js';
import type { Tx } from './cellStore.js';
import { actionsFor, mySheetRoles, type WorkbookAccess } from './access.js';
import { loadProtection } from './protection.js';
import { workbookSheets } from './sheetOps.js';
import { loadWorkbook } from './workbookStore.js';

const PAGE = 20_000;
const TRIES = 3;
const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

type Tabs = ReturnType<typeof workbookSheets>;
type Protection = ReturnType<typeof loadProtection>;

export interface SlicedContent<E> {
  revision: number;
  tabs: Tabs;
  protection: Protection;
  cells: Map<string, CellEntry[]>;
  /** Whatever `more` read in the same transaction as the tabs. */
  more: E;
}

/** One page of a sheet's cells as a reader gives it: the page, how many cells it held, the last place read. */
interface Page<P> {
  page: P;
  count: number;
  last: [row: number, col: number] | null;
}

/**
 * The workbook's tabs, with `more` read beside them, and each sheet's non-empty cells read a page at a
 * time with `readPage` (after the given place, in reading order) and a turn of the event loop between
 * pages, as one consistent snapshot; null when the workbook is gone or a commit slipped in on every try.
 */
async function readInSlices<P, E>(
  ctx: Pick<AppContext, 'db'>,
  id: string,
  readPage: (sheetId: string, after: [number, number]) => Page<P>,
  more?: (tx: Tx, tabs: Tabs, protection: Protection) => E,
  onPage?: (cellsSoFar: number) => void,
): Promise<(Omit<SlicedContent<E>, 'cells'> & { pages: Map<string, P[]> }) | null> {
  const revisionNow = () => ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision;
  for (let attempt = 0; attempt < TRIES - 1; attempt++) {
    const before = ctx.db.transaction((tx) => {
      const tabs = workbookSheets(tx, id);
      const protection = loadProtection(tx, id);
      return { revision: tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision, tabs, protection, more: (more ? more(tx, tabs, protection) : null) as E };
    });
    const pages = new Map<string, P[]>(before.tabs.map((s) => [s.id, []]));
    let read = 0;
    for (const [sheetId, list] of pages) {
      let after: [number, number] = [-1, -1];
      for (;;) {
        const { page, count, last } = readPage(sheetId, after);
        if (count > 0) list.push(page);
        read += count;
        onPage?.(read);
        if (count < PAGE || !last) break;
        after = last;
        await turn();
      }
    }
    if (before.revision === undefined) return null; // deleted meanwhile
    if (revisionNow() !== before.revision) continue;
    return { revision: before.revision, tabs: before.tabs, protection: before.protection, pages, more: before.more };
  }
  return null;
}

// Keyset pages over one sheet at a time in the primary key's order (sheet, row, column), so each
// page is an index range. (Paging the join of sheets and cells by (sheet, row, column) made SQLite
// scan and sort the rest of the sheet for every page: over a second a page at 800,000 cells.)
const pageSql = `select row, col, input from cells where sheet_id = ? and input != '' and (row, col) > (?, ?) order by row, col limit ${PAGE}`;

/**
 * The workbook's tabs and non-empty cells read a page at a time, as one consistent snapshot, with
 * `more` read beside the tabs; null when the workbook is gone or a commit slipped in on every try.
 */
export async function loadContentInSlices<E = null>(
  ctx: Pick<AppContext, 'db'>,
  id: string,
  more?: (tx: Tx, tabs: Tabs, protection: Protection) => E,
  /** Told the cells read so far after each page; may throw to stop reading (a workbook too large for the caller). */
  onPage?: (cellsSoFar: number) => void,
): Promise<SlicedContent<E> | null> {
  const page = ctx.db.$client.prepare(pageSql).raw();
  const read = await readInSlices(
    ctx,
    id,
    (sheetId, after) => {
      const rows = page.all(sheetId, ...after) as CellEntry[];
      const last = rows[rows.length - 1];
      return { page: rows, count: rows.length, last: last ? [last[0], last[1]] : null };
    },
    more,
    onPage,
  );
  if (!read) return null;
  const cells = new Map<string, CellEntry[]>();
  for (const [sheetId, pages] of read.pages) cells.set(sheetId, pages.length === 1 ? pages[0] : pages.flat());
  return { revision: read.revision, tabs: read.tabs, protection: read.protection, cells, more: read.more };
}

/**
 * GET /api/workbooks/:id as JSON text, its cells read a page at a time (a turn of the event loop
 * between pages) and each page written as JSON by SQLite itself: read in one transaction and written
 * with JSON.stringify, a 100,000 × 8 workbook held the server for about four seconds. Parses to what
 * loadWorkbook gives (keys in another order).
 */
export async function workbookJsonInSlices(ctx: AppContext, access: WorkbookAccess): Promise<string> {
  const id = access.workbook.id;
  const page = ctx.db.$client.prepare<[string, number, number], [string, number, number | null]>(
    `select json_group_array(json_array(row, col, input) order by row, col), count(*), max(row * 2048 + col) from (${pageSql})`,
  ).raw();
  const content = await readInSlices(
    ctx,
    id,
    (sheetId, after) => {
      const [json, count, last] = page.get(sheetId, ...after)!;
      return { page: json.slice(1, -1), count, last: last === null ? null : [Math.floor(last / 2048), last % 2048] };
    },
    viewerPart(access),
  );
  if (!content) return JSON.stringify(loadWorkbook(ctx, access)); // the one-transaction read (or its 404)
  const sheets = content.tabs.map((s) => {
    const meta = JSON.stringify(sheetPart(s));
    return `${meta.slice(0, -1)},"cells":[${(content.pages.get(s.id) ?? []).join(',')}]}`;
  });
  return `${JSON.stringify(payloadHead(access, content)).slice(0, -1)},"sheets":[${sheets.join(',')}]}`;
}

export async function loadWorkbookInSlices(ctx: AppContext, access: WorkbookAccess): Promise<WorkbookPayload> {
  const content = await loadContentInSlices(ctx, access.workbook.id, viewerPart(access));
  if (!content) return loadWorkbook(ctx, access); // the one-transaction read (or its 404)
  return { ...payloadHead(access, content), sheets: content.tabs.map((s) => ({ ...sheetPart(s), cells: content.cells.get(s.id) ?? [] })) };
}

type ViewerPart = Pick<WorkbookPayload, 'actions' | 'mySheetRoles'>;

/** What of the workbook answer depends on who asks, read beside the tabs. */
const viewerPart =
  (access: WorkbookAccess) =>
  (tx: Tx, tabs: Tabs, protection: Protection): ViewerPart => ({
    actions: actionsFor(tx, access.workbook.id, access.userId, access.roles),
    mySheetRoles: mySheetRoles(tx, access.workbook.id, access.userId, protection, tabs),
  });

/** The workbook answer without its sheets, as loadWorkbook gives it. */
function payloadHead(access: WorkbookAccess, content: { revision: number; protection: Protection; more: ViewerPart }): Omit<WorkbookPayload, 'sheets'> {
  return { id: access.workbook.id, title: access.workbook.title, revision: content.revision, role: access.role, actions: content.more.actions, ...content.protection, mySheetRoles: content.more.mySheetRoles };
}

/** A tab of the workbook answer without its cells. */
const sheetPart = (s: Tabs[number]) => ({ id: s.id, name: s.name, position: s.position, settings: s.settings, createdBy: s.createdBy });
