// The one place that decides whether a user may see or act on a workbook. Routes reach it through
// the access() middleware (server/routes/access.ts), services through requireWorkbook(); the rules
// themselves are the table in shared/permissions.ts. Sharing, roles and locks widen these checks
// here, never in the routes.
import { and, desc, eq } from 'drizzle-orm';
import type { User } from 'lucia';
import { accessRoles, allowedActions, canAny, refusalReason, type AccessRole, type WorkbookAction, type WorkbookRole } from '../../shared/permissions.js';
import type { WorkbookSummary } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { users, workbookMembers, workbooks } from '../db/schema.js';
import { forbidden, notFound } from '../errors.js';

export type WorkbookRow = typeof workbooks.$inferSelect;

export interface WorkbookAccess {
  workbook: WorkbookRow;
  /** The role the user acts with: their membership, or 'site-admin' for an admin who is not a member. */
  role: AccessRole;
  roles: AccessRole[];
}

type AccessUser = Pick<User, 'id' | 'siteRole'>;

/** The user's membership role in a workbook, or null. */
export function memberRole(ctx: AppContext, workbookId: string, userId: string): WorkbookRole | null {
  const row = ctx.db
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
export function requireWorkbook(ctx: AppContext, user: AccessUser, workbookId: string, action: WorkbookAction | readonly WorkbookAction[]): WorkbookAccess {
  const workbook = ctx.db.select().from(workbooks).where(eq(workbooks.id, workbookId)).get();
  if (!workbook) throw notFound('workbook');
  const roles = accessRoles(memberRole(ctx, workbookId, user.id), user.siteRole);
  if (!canAny(roles, 'view')) throw notFound('workbook');
  const role = roles[0];
  const actions: readonly WorkbookAction[] = typeof action === 'string' ? [action] : action;
  if (!actions.some((a) => canAny(roles, a))) throw forbidden(refusalReason(role, actions[0]));
  return { workbook, role, roles };
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
      actions: allowedActions(accessRoles(r.role, user.siteRole)),
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
export function requireLockRight(access: WorkbookAccess, userId: string, sheet?: { name: string; createdBy: string | null }, setBy?: string): void {
  if (canAny(access.roles, 'lockAnySheet')) return;
  if (!canAny(access.roles, 'lockOwnSheet')) throw forbidden(refusalReason(access.role, 'lockAnySheet'));
  if (!sheet) return;
  if (sheet.createdBy !== userId) throw forbidden(`as an editor you can lock or protect only sheets you created, and "${sheet.name}" is someone else's; ask an owner`);
  if (setBy !== undefined && setBy !== userId) throw forbidden(`as an editor you cannot change or lift what someone else set on "${sheet.name}"; ask them or an owner`);
}
