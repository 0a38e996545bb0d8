// GET /api/workbooks/:id/first-rows: the first tab's first rows and columns, and the values stored with
// the current revision for them (shared/workbooks.ts FirstRowsPayload). The page paints them while the
// whole workbook and its values are still on their way, so its first screen does not wait on answers
// that grow with the workbook. One read transaction: revision, tab, cells and values agree.
import { and, eq } from 'drizzle-orm';
import { firstColsShown, firstRowsShown, type CellEntry, type FirstRowsPayload, type ValueEntry } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { revisionValues, workbooks } from '../db/schema.js';
import type { StoredFirstRows } from '../values/storedFormat.js';
import type { WorkbookAccess } from './access.js';
import { workbookSheets } from './sheetOps.js';

const cellsSql = `select row, col, input from cells where sheet_id = ? and input != '' and row < ${firstRowsShown} and col < ${firstColsShown} order by row, col`;

export function firstRowsOf(ctx: Pick<AppContext, 'db'>, access: WorkbookAccess): FirstRowsPayload {
  const { workbook } = access;
  const cells = ctx.db.$client.prepare<[string], CellEntry>(cellsSql).raw();
  return ctx.db.transaction((tx) => {
    const revision = tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, workbook.id)).get()?.revision ?? workbook.revision;
    const first = workbookSheets(tx, workbook.id)[0];
    const stored = tx
      .select({ firstRows: revisionValues.firstRows, volatileFormulas: revisionValues.volatileFormulas })
      .from(revisionValues)
      .where(and(eq(revisionValues.workbookId, workbook.id), eq(revisionValues.revision, revision)))
      .get();
    // Values of a volatile function are recomputed on every read (store.ts servableValues): none here.
    const servable = stored && stored.volatileFormulas === 0 && stored.firstRows !== null ? stored.firstRows : null;
    const kept = servable === null ? null : (JSON.parse(servable) as StoredFirstRows);
    const values: ValueEntry[] | null = first && kept ? (kept.sheets[first.id] ?? []) : null;
    return {
      id: workbook.id,
      title: workbook.title,
      revision,
      sheet: first ? { id: first.id, name: first.name, position: first.position, settings: first.settings, cells: cells.all(first.id), createdBy: first.createdBy } : null,
      values,
      cells: kept?.cells ?? null,
    };
  });
}
