// loadWorkbook (workbookStore.ts) for work that runs in a worker afterwards (/values, exports): the
// cells are read a page at a time with a turn of the event loop between pages, so loading 500,000
// cells never holds the server for long. The pages are one consistent snapshot when the workbook's
// revision is the same before and after; when a commit slipped in between, it reads again, and the
// last try is the one-transaction read.
import { eq } from 'drizzle-orm';
import { allowedActions } from '../../shared/permissions.js';
import type { CellEntry, WorkbookPayload } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { workbooks } from '../db/schema.js';
import type { WorkbookAccess } from './access.js';
import { loadProtection } from './protection.js';
import { workbookSheets } from './sheetOps.js';
import { loadWorkbook } from './workbookStore.js';

const PAGE = 20_000;
const TRIES = 3;
const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

export interface SlicedContent {
  revision: number;
  tabs: ReturnType<typeof workbookSheets>;
  protection: ReturnType<typeof loadProtection>;
  cells: Map<string, CellEntry[]>;
}

/**
 * The workbook's tabs and non-empty cells read a page at a time, as one consistent snapshot; null
 * when the workbook is gone or a commit slipped in on every try.
 */
export async function loadContentInSlices(ctx: Pick<AppContext, 'db'>, id: string, tries = TRIES - 1): Promise<SlicedContent | null> {
  const revisionNow = () => ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision;
  // Keyset pages in the primary key's order (sheet, row, column), so each page is an index range.
  const page = ctx.db.$client
    .prepare(
      `select c.sheet_id, c.row, c.col, c.input from cells c join sheets s on s.id = c.sheet_id
       where s.workbook_id = ? and c.input != '' and (c.sheet_id, c.row, c.col) > (?, ?, ?)
       order by c.sheet_id, c.row, c.col limit ${PAGE}`,
    )
    .raw();
  for (let attempt = 0; attempt < tries; attempt++) {
    const before = ctx.db.transaction((tx) => ({ revision: tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, id)).get()?.revision, tabs: workbookSheets(tx, id), protection: loadProtection(tx, id) }));
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
    if (before.revision === undefined) return null; // deleted meanwhile
    if (revisionNow() !== before.revision) continue;
    return { revision: before.revision, tabs: before.tabs, protection: before.protection, cells: bySheet };
  }
  return null;
}

export async function loadWorkbookInSlices(ctx: AppContext, access: WorkbookAccess): Promise<WorkbookPayload> {
  const content = await loadContentInSlices(ctx, access.workbook.id);
  if (!content) return loadWorkbook(ctx, access); // the one-transaction read (or its 404)
  return {
    id: access.workbook.id,
    title: access.workbook.title,
    revision: content.revision,
    role: access.role,
    actions: allowedActions(access.roles),
    sheets: content.tabs.map((s) => ({ id: s.id, name: s.name, position: s.position, settings: s.settings, cells: content.cells.get(s.id) ?? [] })),
    ...content.protection,
  };
}
