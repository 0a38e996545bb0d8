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
  const revisionNow = () => ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision;
  // Keyset pages over one sheet at a time in the primary key's order (sheet, row, column), so each
  // page is an index range. (Paging the join of sheets and cells by (sheet, row, column) made SQLite
  // scan and sort the rest of the sheet for every page: over a second a page at 800,000 cells.)
  const page = ctx.db.$client.prepare(`select row, col, input from cells where sheet_id = ? and input != '' and (row, col) > (?, ?) order by row, col limit ${PAGE}`).raw();
  for (let attempt = 0; attempt < TRIES - 1; attempt++) {
    const before = ctx.db.transaction((tx) => {
      const tabs = workbookSheets(tx, id);
      const protection = loadProtection(tx, id);
      return { revision: tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision, tabs, protection, more: (more ? more(tx, tabs, protection) : null) as E };
    });
    const bySheet = new Map<string, CellEntry[]>(before.tabs.map((s) => [s.id, []]));
    let read = 0;
    for (const [sheetId, cells] of bySheet) {
      let after: [number, number] = [-1, -1];
      for (;;) {
        const rows = page.all(sheetId, ...after) as CellEntry[];
        for (const cell of rows) cells.push(cell);
        read += rows.length;
        onPage?.(read);
        if (rows.length < PAGE) break;
        const last = rows[rows.length - 1];
        after = [last[0], last[1]];
        await turn();
      }
    }
    if (before.revision === undefined) return null; // deleted meanwhile
    if (revisionNow() !== before.revision) continue;
    return { revision: before.revision, tabs: before.tabs, protection: before.protection, cells: bySheet, more: before.more };
  }
  return null;
}

export async function loadWorkbookInSlices(ctx: AppContext, access: WorkbookAccess): Promise<WorkbookPayload> {
  const id = access.workbook.id;
  const content = await loadContentInSlices(ctx, id, (tx, tabs, protection) => ({
    actions: actionsFor(tx, id, access.userId, access.roles),
    mySheetRoles: mySheetRoles(tx, id, access.userId, protection, tabs),
  }));
  if (!content) return loadWorkbook(ctx, access); // the one-transaction read (or its 404)
  return {
    id,
    title: access.workbook.title,
    revision: content.revision,
    role: access.role,
    actions: content.more.actions,
    sheets: content.tabs.map((s) => ({ id: s.id, name: s.name, position: s.position, settings: s.settings, cells: content.cells.get(s.id) ?? [], createdBy: s.createdBy })),
    ...content.protection,
    mySheetRoles: content.more.mySheetRoles,
  };
}
