// Roles per sheet: listing a sheet's overrides with every member's effective role, and setting or
// removing one member's override. Who may change them is the lock right (access.ts
// requireLockRight): owners on any sheet; an editor on a sheet they created, and only what they set.
// Each change is audited in its transaction and pushed to open clients as a `protection` event.
import { and, eq } from 'drizzle-orm';
import { sheetStanding, type SetSheetRoleInput, type SheetRolesResponse } from '../../shared/team.js';
import type { AppContext } from '../context.js';
import { sheetRoles, users, workbookMembers } from '../db/schema.js';
import { badRequest, forbidden } from '../errors.js';
import { requireLockRight, standingOn, type WorkbookAccess } from './access.js';
import { recordAudit } from './audit.js';
import type { Tx } from './cellStore.js';
import { publishProtection, sheetOf } from './locks.js';
import { loadProtection } from './protection.js';

type Reader = Pick<Tx, 'select'>;

function membersOf(tx: Reader, workbookId: string) {
  return tx
    .select({ id: users.id, name: users.name, email: users.email, role: workbookMembers.role })
    .from(workbookMembers)
    .innerJoin(users, eq(users.id, workbookMembers.userId))
    .where(eq(workbookMembers.workbookId, workbookId))
    .orderBy(workbookMembers.createdAt, users.name)
    .all();
}

export function sheetRolesOf(tx: Reader, workbookId: string, sheetId: string): SheetRolesResponse {
  const sheet = sheetOf(tx as Tx, workbookId, sheetId);
  const protection = loadProtection(tx, workbookId);
  return {
    sheetId,
    sheetName: sheet.name,
    lock: protection.locks.find((l) => l.sheetId === sheetId) ?? null,
    overrides: protection.sheetRoles.find((s) => s.sheetId === sheetId)?.overrides ?? [],
    members: membersOf(tx, workbookId).map((m) => {
      const { role, source } = sheetStanding(protection, { id: m.id, role: m.role }, sheetId);
      return { user: { id: m.id, name: m.name, email: m.email }, workbookRole: m.role, role, source };
    }),
  };
}

/** PUT …/roles: `role` null removes the override, so the member's workbook role (or the lock) applies again. */
export function setSheetRole(ctx: AppContext, access: WorkbookAccess, userId: string, sheetId: string, input: SetSheetRoleInput): SheetRolesResponse {
  const workbookId = access.workbook.id;
  const changed = ctx.db.transaction(
    (tx) => {
      const sheet = sheetOf(tx, workbookId, sheetId);
      const target = membersOf(tx, workbookId).find((m) => m.email === input.email.toLowerCase());
      if (!target) throw badRequest(`email: ${input.email} is not a member of this workbook; invite them first`);
      const existing = tx.select().from(sheetRoles).where(and(eq(sheetRoles.sheetId, sheetId), eq(sheetRoles.userId, target.id))).get();
      requireLockRight(access, userId, sheet, existing?.setBy, standingOn(tx, workbookId, userId, sheetId));
      if (target.role === 'owner' && access.role !== 'owner') throw forbidden(`only an owner may change an owner's role on "${sheet.name}"`);
      if ((existing?.role ?? null) === input.role) return false;
      if (input.role === null) {
        tx.delete(sheetRoles).where(and(eq(sheetRoles.sheetId, sheetId), eq(sheetRoles.userId, target.id))).run();
        recordAudit(tx, workbookId, userId, 'sheet.role_removed', { sheetId, sheetName: sheet.name, userId: target.id, name: target.name, email: target.email, before: existing?.role ?? null });
        return true;
      }
      const row = { role: input.role, viaLock: false, setBy: userId, createdAt: Date.now() };
      tx.insert(sheetRoles).values({ sheetId, userId: target.id, ...row }).onConflictDoUpdate({ target: [sheetRoles.sheetId, sheetRoles.userId], set: row }).run();
      recordAudit(tx, workbookId, userId, 'sheet.role_set', { sheetId, sheetName: sheet.name, userId: target.id, name: target.name, email: target.email, role: input.role, before: existing?.role ?? null });
      return true;
    },
    { behavior: 'immediate' },
  );
  if (changed) publishProtection(ctx, workbookId);
  return sheetRolesOf(ctx.db, workbookId, sheetId);
}
