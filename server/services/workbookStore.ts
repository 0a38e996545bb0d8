// Workbooks as wholes: create (with one empty first sheet), load everything the client's engine needs,
// rename, delete. Access is decided before these are called (services/access.ts).
import { randomUUID } from 'node:crypto';
import { and, asc, eq, ne } from 'drizzle-orm';
import type { User } from 'lucia';
import { defaultSheetName, type CellEntry, type WorkbookPayload, type WorkbookSummary } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { cells, sheets, users, workbookMembers, workbooks } from '../db/schema.js';
import { actionsFor, mySheetRoles, requireWorkbook, type WorkbookAccess } from './access.js';
import { loadProtection } from './protection.js';
import { workbookSheets } from './sheetOps.js';

export function createWorkbook(ctx: AppContext, user: Pick<User, 'id'>, title: string): string {
  const id = randomUUID();
  ctx.db.transaction((tx) => {
    tx.insert(workbooks).values({ id, title, ownerId: user.id }).run();
    // The creator's owner row is what access checks read; ownerId alone grants nothing.
    tx.insert(workbookMembers).values({ workbookId: id, userId: user.id, role: 'owner' }).run();
    tx.insert(sheets).values({ id: randomUUID(), workbookId: id, name: defaultSheetName(1), position: 0, createdBy: user.id }).run();
  });
  return id;
}

/** Creates a workbook and answers with its list entry, as its new owner sees it. */
export function createWorkbookFor(ctx: AppContext, user: Pick<User, 'id' | 'siteRole'>, title: string): WorkbookSummary {
  const id = createWorkbook(ctx, user, title);
  return summarizeWorkbook(ctx, requireWorkbook(ctx, user, id, 'view'));
}

export function loadWorkbook(ctx: AppContext, access: WorkbookAccess): WorkbookPayload {
  const { workbook } = access;
  // One read transaction, so sheets, cells and revision are one consistent snapshot.
  return ctx.db.transaction((tx) => {
    const revision = tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, workbook.id)).get()?.revision ?? workbook.revision;
    const tabs = workbookSheets(tx, workbook.id);
    const bySheet = new Map<string, CellEntry[]>(tabs.map((s) => [s.id, []]));
    const rows = tx
      .select({ sheetId: cells.sheetId, row: cells.row, col: cells.col, input: cells.input })
      .from(cells)
      .innerJoin(sheets, eq(sheets.id, cells.sheetId))
      .where(and(eq(sheets.workbookId, workbook.id), ne(cells.input, '')))
      .orderBy(asc(cells.sheetId), asc(cells.row), asc(cells.col))
      .all();
    for (const c of rows) bySheet.get(c.sheetId)?.push([c.row, c.col, c.input]);
    const protection = loadProtection(tx, workbook.id);
    return {
      id: workbook.id,
      title: workbook.title,
      revision,
      role: access.role,
      actions: actionsFor(tx, workbook.id, access.userId, access.roles),
      sheets: tabs.map((s) => ({ id: s.id, name: s.name, position: s.position, settings: s.settings, cells: bySheet.get(s.id) ?? [], createdBy: s.createdBy })),
      ...protection,
      mySheetRoles: mySheetRoles(tx, workbook.id, access.userId, protection, tabs),
    };
  });
}

/** The list entry for one workbook, as the acting user sees it. */
export function summarizeWorkbook(ctx: AppContext, access: WorkbookAccess): WorkbookSummary {
  const w = ctx.db
    .select({ id: workbooks.id, title: workbooks.title, revision: workbooks.revision, ownerId: workbooks.ownerId, ownerName: users.name, createdAt: workbooks.createdAt, updatedAt: workbooks.updatedAt })
    .from(workbooks)
    .innerJoin(users, eq(users.id, workbooks.ownerId))
    .where(eq(workbooks.id, access.workbook.id))
    .get()!;
  return { id: w.id, title: w.title, revision: w.revision, role: access.role, actions: actionsFor(ctx.db, w.id, access.userId, access.roles), owner: { id: w.ownerId, name: w.ownerName }, createdAt: w.createdAt, updatedAt: w.updatedAt };
}

/** A new title is not a content change: the revision stays as it is. */
export function renameWorkbook(ctx: AppContext, workbookId: string, title: string): void {
  ctx.db.update(workbooks).set({ title, updatedAt: Date.now() }).where(eq(workbooks.id, workbookId)).run();
  ctx.events.publish(workbookId, { type: 'renamed', workbookId, title });
}

/** Deletes the workbook with its sheets, cells, members and history (foreign keys cascade). */
export function deleteWorkbook(ctx: AppContext, workbookId: string): void {
  ctx.db.delete(workbooks).where(eq(workbooks.id, workbookId)).run();
  ctx.events.publish(workbookId, { type: 'deleted', workbookId });
}
