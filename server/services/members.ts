// Who belongs to a workbook and with which role. A workbook always has exactly one owner: ownership
// moves only by transfer (the new owner in, the old one becomes an editor), so the owner can be
// neither removed nor demoted. Every change is audited and announced to open clients.
import { and, asc, eq, sql } from 'drizzle-orm';
import type { GrantableRole, Member } from '../../shared/team.js';
import type { WorkbookRole } from '../../shared/permissions.js';
import type { AppContext } from '../context.js';
import { users, workbookMembers, workbooks } from '../db/schema.js';
import { conflict, notFound } from '../errors.js';
import { recordAudit } from './audit.js';
import type { Tx } from './cellStore.js';
import { dropFromEditorLists, dropLockNamesOf, publishProtection } from './locks.js';
import { revokePendingFor } from './invitations.js';

const roleOrder = sql`case ${workbookMembers.role} when 'owner' then 0 when 'editor' then 1 else 2 end`;

const memberColumns = { id: users.id, name: users.name, email: users.email, role: workbookMembers.role, since: workbookMembers.createdAt };
const toMember = (r: { id: string; name: string; email: string; role: WorkbookRole; since: number }): Member => ({ user: { id: r.id, name: r.name, email: r.email }, role: r.role, since: r.since });

export function listMembers(db: Pick<Tx, 'select'>, workbookId: string): Member[] {
  return db
    .select(memberColumns)
    .from(workbookMembers)
    .innerJoin(users, eq(users.id, workbookMembers.userId))
    .where(eq(workbookMembers.workbookId, workbookId))
    .orderBy(roleOrder, asc(users.name), asc(users.email))
    .all()
    .map(toMember);
}

function memberOf(tx: Pick<Tx, 'select'>, workbookId: string, userId: string): Member | undefined {
  const row = tx
    .select(memberColumns)
    .from(workbookMembers)
    .innerJoin(users, eq(users.id, workbookMembers.userId))
    .where(and(eq(workbookMembers.workbookId, workbookId), eq(workbookMembers.userId, userId)))
    .get();
  return row ? toMember(row) : undefined;
}

function requireMember(tx: Pick<Tx, 'select'>, workbookId: string, userId: string): Member {
  const m = memberOf(tx, workbookId, userId);
  if (!m) throw notFound('member');
  return m;
}

const setRole = (tx: Tx, workbookId: string, userId: string, role: WorkbookRole) =>
  tx.update(workbookMembers).set({ role }).where(and(eq(workbookMembers.workbookId, workbookId), eq(workbookMembers.userId, userId))).run();

const announce = (ctx: AppContext, workbookId: string) => ctx.events.publish(workbookId, { type: 'members', workbookId });

/** Adds an existing account at once; 409 when they already belong to the workbook. */
export function addMember(ctx: AppContext, workbookId: string, actorId: string, user: { id: string; email: string }, role: GrantableRole): Member {
  const member = ctx.db.transaction(
    (tx) => {
      const existing = memberOf(tx, workbookId, user.id);
      if (existing) throw conflict(`${user.email} is already a member (${existing.role}); change their role instead`);
      tx.insert(workbookMembers).values({ workbookId, userId: user.id, role }).run();
      revokePendingFor(tx, workbookId, actorId, user.email, 'member.added');
      recordAudit(tx, workbookId, actorId, 'member.added', { userId: user.id, email: user.email, role });
      return requireMember(tx, workbookId, user.id);
    },
    { behavior: 'immediate' },
  );
  announce(ctx, workbookId);
  return member;
}

/**
 * Changes a member's role. Role 'owner' transfers ownership from the caller (the owner) to the
 * target, and the caller becomes an editor. The owner's own role cannot be lowered any other way.
 */
export function changeMemberRole(ctx: AppContext, workbookId: string, actorId: string, targetId: string, role: WorkbookRole): { member: Member; previousOwner?: Member } {
  const result = ctx.db.transaction(
    (tx) => {
      const target = requireMember(tx, workbookId, targetId);
      if (target.role === role) return { member: target, changed: false };
      if (target.role === 'owner') {
        throw conflict(`${target.user.name} is the owner; to hand the workbook over, make another member owner (the owner then becomes an editor)`);
      }
      if (role === 'owner') {
        setRole(tx, workbookId, targetId, 'owner');
        setRole(tx, workbookId, actorId, 'editor');
        tx.update(workbooks).set({ ownerId: targetId }).where(eq(workbooks.id, workbookId)).run();
        recordAudit(tx, workbookId, actorId, 'ownership.transferred', { from: actorId, to: targetId, previousRoleOfNewOwner: target.role });
        return { member: requireMember(tx, workbookId, targetId), previousOwner: requireMember(tx, workbookId, actorId), changed: true };
      }
      setRole(tx, workbookId, targetId, role);
      // Named on a lock as one of the editors who may still edit: a member made viewer no longer
      // is (as before sheet roles). Roles set on a sheet one by one stay: they were set to differ.
      if (role === 'viewer') dropLockNamesOf(tx, workbookId, targetId);
      revokePendingFor(tx, workbookId, actorId, target.user.email, 'member.role_changed');
      recordAudit(tx, workbookId, actorId, 'member.role_changed', { userId: targetId, from: target.role, to: role });
      return { member: requireMember(tx, workbookId, targetId), changed: true };
    },
    { behavior: 'immediate' },
  );
  if (result.changed) {
    announce(ctx, workbookId);
    publishProtection(ctx, workbookId);
  }
  return { member: result.member, ...(result.previousOwner ? { previousOwner: result.previousOwner } : {}) };
}

/** Removes a member (or lets one leave). The owner must transfer ownership first. */
export function removeMember(ctx: AppContext, workbookId: string, actorId: string, targetId: string): void {
  ctx.db.transaction(
    (tx) => {
      const target = requireMember(tx, workbookId, targetId);
      if (target.role === 'owner') throw conflict(`${target.user.name} is the owner and cannot be removed; transfer ownership to another member first`);
      tx.delete(workbookMembers).where(and(eq(workbookMembers.workbookId, workbookId), eq(workbookMembers.userId, targetId))).run();
      dropFromEditorLists(tx, workbookId, targetId);
      revokePendingFor(tx, workbookId, actorId, target.user.email, 'member.removed');
      recordAudit(tx, workbookId, actorId, 'member.removed', { userId: targetId, email: target.user.email, role: target.role, left: actorId === targetId });
    },
    { behavior: 'immediate' },
  );
  announce(ctx, workbookId);
}

/** Joins through an invitation inside the accepting transaction: a member keeps their role unless the invitation gives more. */
export function joinByInvitation(tx: Tx, workbookId: string, userId: string, role: GrantableRole): WorkbookRole {
  const existing = memberOf(tx, workbookId, userId);
  if (!existing) {
    tx.insert(workbookMembers).values({ workbookId, userId, role }).run();
    return role;
  }
  if (existing.role === 'viewer' && role === 'editor') {
    setRole(tx, workbookId, userId, 'editor');
    return 'editor';
  }
  return existing.role;
}
