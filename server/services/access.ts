// The one place that decides whether a user may see or act on a workbook, and with which role on
// each sheet. Routes reach it through the access() middleware (server/routes/access.ts), services
// through requireWorkbook() and, inside their writing transaction, sheetActor(). The rules themselves
// are the table and effectiveSheetRole() in shared/permissions.ts. Sharing, roles, sheet roles and
// locks widen these checks here, never in the routes.
import { and, desc, eq } from 'drizzle-orm';
import type { User } from 'lucia';
import { accessRoles, allowedActions, canAny, refusalReason, sheetManageRefusal, type AccessRole, type SheetRole, type SheetRoleSource, type WorkbookAction, type WorkbookRole } from '../../shared/permissions.js';
import { editsSomeSheet, sheetStanding, type Protection, type SheetActor, type SheetStanding } from '../../shared/team.js';
import type { WorkbookPayload, WorkbookSummary } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { sheets, users, workbookMembers, workbooks } from '../db/schema.js';
import { forbidden, notFound } from '../errors.js';
import type { Tx } from './cellStore.js';
import { assertMayChangeSheet, loadProtection } from './protection.js';

type Reader = Pick<Tx, 'select'>;

export type WorkbookRow = typeof workbooks.$inferSelect;

export interface WorkbookAccess {
  workbook: WorkbookRow;
  /** The role the user acts with: their membership, or 'site-admin' for an admin who is not a member. */
  role: AccessRole;
  roles: AccessRole[];
  userId: string;
  /** On a route about one sheet: the user's role on it, and why. */
  sheet?: { id: string; role: SheetRole; source: SheetRoleSource };
}

type AccessUser = Pick<User, 'id' | 'siteRole'>;

/** The user's membership role in a workbook, or null. */
export function memberRole(ctx: AppContext, workbookId: string, userId: string): WorkbookRole | null {
  return memberRoleIn(ctx.db, workbookId, userId);
}

/** The same, read inside a transaction (what the writing services decide with). */
export function memberRoleIn(tx: Reader, workbookId: string, userId: string): WorkbookRole | null {
  const row = tx
    .select({ role: workbookMembers.role })
    .from(workbookMembers)
    .where(and(eq(workbookMembers.workbookId, workbookId), eq(workbookMembers.userId, userId)))
    .get();
  return row?.role ?? null;
}

/**
 * Loads a workbook for a user about to do `action` (or, given a list, any one of them; a refusal
 * names the first). Someone with no right to see the workbook at all gets 404 (its existence is not
 * revealed); someone who can see it but not do this gets 403 with why.
 */
export function requireWorkbook(ctx: AppContext, user: AccessUser, workbookId: string, action: WorkbookAction | readonly WorkbookAction[], opts: { sheetId?: string } = {}): WorkbookAccess {
  const workbook = ctx.db.select().from(workbooks).where(eq(workbooks.id, workbookId)).get();
  if (!workbook) throw notFound('workbook');
  const member = memberRole(ctx, workbookId, user.id);
  const roles = accessRoles(member, user.siteRole);
  if (!canAny(roles, 'view')) throw notFound('workbook');
  const role = roles[0];
  const actions: readonly WorkbookAction[] = typeof action === 'string' ? [action] : action;
  const who: SheetActor = { id: user.id, role: member };
  const allowed = actions.some((a) => canAny(roles, a) || (a === 'editCells' && editsThroughSheetRole(ctx.db, workbookId, who)));
  if (!allowed) throw forbidden(refusalReason(role, actions[0]));
  if (opts.sheetId === undefined) return { workbook, role, roles, userId: user.id };
  // A route about one sheet: the user's role on it decides too, in the words the service would use.
  const sheet = ctx.db.select({ id: sheets.id, name: sheets.name }).from(sheets).where(and(eq(sheets.id, opts.sheetId), eq(sheets.workbookId, workbookId))).get();
  if (!sheet) throw notFound('sheet');
  const standing = sheetStanding(loadProtection(ctx.db, workbookId), who, sheet.id);
  if (actions.some((a) => sheetScoped.includes(a))) assertMayChangeSheet(ctx.db, workbookId, who, sheet.id, sheet.name);
  return { workbook, role, roles, userId: user.id, sheet: { id: sheet.id, role: standing.role, source: standing.source } };
}

/** Actions that, on a route about one sheet, also need the editor role on that sheet. */
const sheetScoped: readonly WorkbookAction[] = ['editCells', 'editSheets'];

/**
 * A workbook viewer whom some sheet names editor may send cell changes: which cells is decided
 * sheet by sheet in the writing transaction (assertMayEditCells).
 */
function editsThroughSheetRole(tx: Reader, workbookId: string, who: SheetActor): boolean {
  return who.role !== null && editsSomeSheet(loadProtection(tx, workbookId), who);
}

/** Everything the user may do, with 'editCells' when a sheet role lets a workbook viewer edit somewhere. */
export function actionsFor(tx: Reader, workbookId: string, userId: string, roles: readonly AccessRole[]): WorkbookAction[] {
  const actions = allowedActions(roles);
  if (!actions.includes('editCells') && editsThroughSheetRole(tx, workbookId, { id: userId, role: memberRoleIn(tx, workbookId, userId) })) actions.push('editCells');
  return actions;
}

/** Who is writing, as the sheet checks need them: read in the writing transaction. */
export function sheetActor(tx: Reader, workbookId: string, userId: string): SheetActor {
  return { id: userId, role: memberRoleIn(tx, workbookId, userId) };
}

/** The user's role on each sheet, in tab order: part of GET /api/workbooks/:id. */
export function mySheetRoles(tx: Reader, workbookId: string, userId: string, protection: Protection, tabs: readonly { id: string }[]): NonNullable<WorkbookPayload['mySheetRoles']> {
  const who = sheetActor(tx, workbookId, userId);
  return tabs.map((t) => {
    const { role, source } = sheetStanding(protection, who, t.id);
    return { sheetId: t.id, role, source };
  });
}

/** The user's role on one sheet, and why: the lookup every sheet check and the workbook payload use. */
export function standingOn(tx: Reader, workbookId: string, userId: string, sheetId: string): SheetStanding {
  return sheetStanding(loadProtection(tx, workbookId), sheetActor(tx, workbookId, userId), sheetId);
}

/** The workbooks a user is a member of, most recently changed first. */
export function listVisibleWorkbooks(ctx: AppContext, user: AccessUser): WorkbookSummary[] {
  return ctx.db
    .select({
      id: workbooks.id,
      title: workbooks.title,
      revision: workbooks.revision,
      role: workbookMembers.role,
      ownerId: workbooks.ownerId,
      ownerName: users.name,
      createdAt: workbooks.createdAt,
      updatedAt: workbooks.updatedAt,
    })
    .from(workbookMembers)
    .innerJoin(workbooks, eq(workbooks.id, workbookMembers.workbookId))
    .innerJoin(users, eq(users.id, workbooks.ownerId))
    .where(eq(workbookMembers.userId, user.id))
    .orderBy(desc(workbooks.updatedAt), desc(workbooks.createdAt))
    .all()
    .map((r) => ({
      id: r.id,
      title: r.title,
      revision: r.revision,
      role: r.role,
      actions: actionsFor(ctx.db, r.id, user.id, accessRoles(r.role, user.siteRole)),
      owner: { id: r.ownerId, name: r.ownerName },
      createdAt: r.createdAt,
      updatedAt: r.updatedAt,
    }));
}

/**
 * Sheet locks and protected ranges: owners on any sheet; editors only on sheets they created, and
 * only what they set themselves (`setBy`, for replacing or lifting). Called without a sheet, checks
 * the role alone (before a request body is read).
 */
export function requireLockRight(access: WorkbookAccess, userId: string, sheet?: { name: string; createdBy: string | null }, setBy?: string, standing?: SheetStanding): void {
  const refusal = sheetManageRefusal(access.roles, userId, sheet, { setBy, myRoleOnSheet: standing?.role });
  if (refusal) throw forbidden(refusal);
}
