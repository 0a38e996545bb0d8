// loadWorkbook (workbookStore.ts) for work that runs in a worker afterwards (/values, exports): the
// cells are read a page at a time with a turn of the event loop between pages, so loading 500,000
// cells never holds the server for long. The pages are one consistent snapshot when the workbook's
// revision is the same before and after; when a commit slipped in between, it reads again, and the
// last try is the one-transaction read.
import { eq } from 'drizzle-orm';
import type { CellEntry, WorkbookPayload } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { workbooks } from '../db/schema.js';
import { actionsFor, mySheetRoles, type WorkbookAccess } from './access.js';
import { loadProtection } from './protection.js';
import { workbookSheets } from './sheetOps.js';
import { loadWorkbook } from './workbookStore.js';

const PAGE = 20_000;
const TRIES = 3;
const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

export async function loadWorkbookInSlices(ctx: AppContext, access: WorkbookAccess): Promise<WorkbookPayload> {
  const id = access.workbook.id;
  const revisionNow = () => ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision;
  // Keyset pages in the primary key's order (sheet, row, column), so each page is an index range.
  const page = ctx.db.$client
    .prepare(
      `select c.sheet_id, c.row, c.col, c.input from cells c join sheets s on s.id = c.sheet_id
       where s.workbook_id = ? and c.input != '' and (c.sheet_id, c.row, c.col) > (?, ?, ?)
       order by c.sheet_id, c.row, c.col limit ${PAGE}`,
    )
    .raw();
  for (let attempt = 0; attempt < TRIES - 1; attempt++) {
    const before = ctx.db.transaction((tx) => {
      const tabs = workbookSheets(tx, id);
      const protection = loadProtection(tx, id);
      return {
        revision: tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision,
        tabs,
        protection,
        actions: actionsFor(tx, id, access.userId, access.roles),
        mySheetRoles: mySheetRoles(tx, id, access.userId, protection, tabs),
      };
    });
    const bySheet = new Map<string, CellEntry[]>(before.tabs.map((s) => [s.id, []]));
    let after: [string, number, number] = ['', -1, -1];
    for (;;) {
      const rows = page.all(id, ...after) as [string, number, number, string][];
      for (const [sheetId, row, col, input] of rows) bySheet.get(sheetId)?.push([row, col, input]);
      if (rows.length < PAGE) break;
      const last = rows[rows.length - 1];
      after = [last[0], last[1], last[2]];
      await turn();
    }
    if (before.revision === undefined) break; // deleted meanwhile: the plain read answers 404
    if (revisionNow() !== before.revision) continue;
    return {
      id,
      title: access.workbook.title,
      revision: before.revision,
      role: access.role,
      actions: before.actions,
      sheets: before.tabs.map((s) => ({ id: s.id, name: s.name, position: s.position, settings: s.settings, cells: bySheet.get(s.id) ?? [], createdBy: s.createdBy })),
      ...before.protection,
      mySheetRoles: before.mySheetRoles,
    };
  }
  return loadWorkbook(ctx, access);
}
