// Setting and lifting sheet locks and protected ranges. A lock is a case of sheet roles: the sheet
// makes everyone a viewer except the members it names editor (sheet_roles rows marked via_lock).
// Who may do it is decided in access.ts (requireLockRight); each change is audited in its own
// transaction and pushed to open clients.
import { randomUUID } from 'node:crypto';
import { and, eq, inArray } from 'drizzle-orm';
import type { ProtectedRange, Protection, SheetLock } from '../../shared/team.js';
import type { AppContext } from '../context.js';
import { protectedRanges, sheetLocks, sheetRoles, sheets, users, workbookMembers } from '../db/schema.js';
import { badRequest, notFound } from '../errors.js';
import { requireLockRight, standingOn, type WorkbookAccess } from './access.js';
import { recordAudit } from './audit.js';
import type { Tx } from './cellStore.js';
import { loadProtection } from './protection.js';

/** A sheet with hundreds of ranges is a sign of a script gone wrong; each one costs every patch a check. */
export const maxProtectedRangesPerSheet = 200;

export function sheetOf(tx: Tx, workbookId: string, sheetId: string) {
  const sheet = tx.select().from(sheets).where(and(eq(sheets.id, sheetId), eq(sheets.workbookId, workbookId))).get();
  // A sheet of another workbook is as unknown here as one that never existed.
  if (!sheet) throw notFound('sheet');
  return sheet;
}

/** The editors list: the setter first, then each named member once. Non-members are refused; a workbook viewer named here edits this sheet. */
function editorList(tx: Tx, workbookId: string, setterId: string, editors: string[]): string[] {
  const unique = [...new Set(editors)];
  const members = new Map(
    unique.length
      ? tx
          .select({ id: workbookMembers.userId, role: workbookMembers.role, name: users.name })
          .from(workbookMembers)
          .innerJoin(users, eq(users.id, workbookMembers.userId))
          .where(and(eq(workbookMembers.workbookId, workbookId), inArray(workbookMembers.userId, unique)))
          .all()
          .map((m) => [m.id, m])
      : [],
  );
  editors.forEach((id, i) => {
    const m = members.get(id);
    if (!m) throw badRequest(`editors.${i}: user ${id} is not a member of this workbook`);
  });
  return [...new Set([setterId, ...unique])];
}

export function publishProtection(ctx: AppContext, workbookId: string): Protection {
  const protection = loadProtection(ctx.db, workbookId);
  ctx.events.publish(workbookId, { type: 'protection', workbookId, protection });
  return protection;
}

/** PUT …/lock: locks the sheet, or replaces its lock (reason, editors) when the caller may change it. */
export function lockSheet(ctx: AppContext, access: WorkbookAccess, userId: string, sheetId: string, input: { reason: string; editors: string[] }): SheetLock {
  const workbookId = access.workbook.id;
  ctx.db.transaction(
    (tx) => {
      const sheet = sheetOf(tx, workbookId, sheetId);
      const existing = tx.select().from(sheetLocks).where(eq(sheetLocks.sheetId, sheetId)).get();
      requireLockRight(access, userId, sheet, existing?.lockedBy, existing ? undefined : standingOn(tx, workbookId, userId, sheetId));
      const editors = editorList(tx, workbookId, userId, input.editors);
      const createdAt = Date.now();
      const row = { lockedBy: userId, reason: input.reason, createdAt };
      tx.insert(sheetLocks).values({ sheetId, ...row }).onConflictDoUpdate({ target: sheetLocks.sheetId, set: row }).run();
      // The lock's names replace the previous lock's; roles set one by one on the sheet stay.
      tx.delete(sheetRoles).where(and(eq(sheetRoles.sheetId, sheetId), eq(sheetRoles.viaLock, true))).run();
      for (const id of editors) {
        tx.insert(sheetRoles)
          .values({ sheetId, userId: id, role: 'editor', viaLock: true, setBy: userId, createdAt })
          .onConflictDoUpdate({ target: [sheetRoles.sheetId, sheetRoles.userId], set: { role: 'editor', viaLock: true, setBy: userId, createdAt } })
          .run();
      }
      recordAudit(tx, workbookId, userId, 'sheet.locked', { sheetId, sheetName: sheet.name, reason: input.reason, editors, replaced: existing !== undefined });
    },
    { behavior: 'immediate' },
  );
  return publishProtection(ctx, workbookId).locks.find((l) => l.sheetId === sheetId)!;
}

/** DELETE …/lock: the locker (still an editor) or an owner lifts it. */
export function unlockSheet(ctx: AppContext, access: WorkbookAccess, userId: string, sheetId: string): void {
  const workbookId = access.workbook.id;
  ctx.db.transaction(
    (tx) => {
      const sheet = sheetOf(tx, workbookId, sheetId);
      const lock = tx.select().from(sheetLocks).where(eq(sheetLocks.sheetId, sheetId)).get();
      if (!lock) throw notFound(`lock on sheet "${sheet.name}"`);
      requireLockRight(access, userId, sheet, lock.lockedBy);
      tx.delete(sheetLocks).where(eq(sheetLocks.sheetId, sheetId)).run();
      tx.delete(sheetRoles).where(and(eq(sheetRoles.sheetId, sheetId), eq(sheetRoles.viaLock, true))).run();
      recordAudit(tx, workbookId, userId, 'sheet.unlocked', { sheetId, sheetName: sheet.name, lockedBy: lock.lockedBy, reason: lock.reason });
    },
    { behavior: 'immediate' },
  );
  publishProtection(ctx, workbookId);
}

/** POST …/protected-ranges: `range` arrives validated and in canonical A1 form (shared/team.ts). */
export function protectRange(ctx: AppContext, access: WorkbookAccess, userId: string, sheetId: string, input: { range: string; editors: string[] }): ProtectedRange {
  const workbookId = access.workbook.id;
  const id = randomUUID();
  ctx.db.transaction(
    (tx) => {
      const sheet = sheetOf(tx, workbookId, sheetId);
      requireLockRight(access, userId, sheet, undefined, standingOn(tx, workbookId, userId, sheetId));
      const count = tx.select({ id: protectedRanges.id }).from(protectedRanges).where(eq(protectedRanges.sheetId, sheetId)).all().length;
      if (count >= maxProtectedRangesPerSheet) throw badRequest(`sheet "${sheet.name}" already has ${maxProtectedRangesPerSheet} protected ranges, the most it may have; lock the sheet or remove some`);
      const editors = editorList(tx, workbookId, userId, input.editors);
      tx.insert(protectedRanges).values({ id, sheetId, range: input.range, editors, createdBy: userId, createdAt: Date.now() }).run();
      recordAudit(tx, workbookId, userId, 'range.protected', { rangeId: id, sheetId, sheetName: sheet.name, range: input.range, editors });
    },
    { behavior: 'immediate' },
  );
  return publishProtection(ctx, workbookId).protectedRanges.find((r) => r.id === id)!;
}

/** DELETE …/protected-ranges/:rangeId: its creator (still an editor) or an owner. */
export function unprotectRange(ctx: AppContext, access: WorkbookAccess, userId: string, sheetId: string, rangeId: string): void {
  const workbookId = access.workbook.id;
  ctx.db.transaction(
    (tx) => {
      const sheet = sheetOf(tx, workbookId, sheetId);
      const range = tx.select().from(protectedRanges).where(and(eq(protectedRanges.id, rangeId), eq(protectedRanges.sheetId, sheetId))).get();
      if (!range) throw notFound('protected range');
      requireLockRight(access, userId, sheet, range.createdBy);
      tx.delete(protectedRanges).where(eq(protectedRanges.id, rangeId)).run();
      recordAudit(tx, workbookId, userId, 'range.unprotected', { rangeId, sheetId, sheetName: sheet.name, range: range.range });
    },
    { behavior: 'immediate' },
  );
  publishProtection(ctx, workbookId);
}

/** Takes a departing member off every sheet role, lock and range of the workbook, so re-joining later grants nothing old. */
export function dropFromEditorLists(tx: Tx, workbookId: string, userId: string): void {
  const without = (ids: string[]) => ids.filter((id) => id !== userId);
  const sheetIds = tx.select({ id: sheets.id }).from(sheets).where(eq(sheets.workbookId, workbookId)).all().map((s) => s.id);
  if (sheetIds.length === 0) return;
  tx.delete(sheetRoles).where(and(inArray(sheetRoles.sheetId, sheetIds), eq(sheetRoles.userId, userId))).run();
  for (const r of tx.select().from(protectedRanges).where(inArray(protectedRanges.sheetId, sheetIds)).all()) {
    tx.update(protectedRanges).set({ editors: without(r.editors) }).where(eq(protectedRanges.id, r.id)).run();
  }
}

/** Takes a member off the editor names of every lock in the workbook (they were made a viewer). */
export function dropLockNamesOf(tx: Tx, workbookId: string, userId: string): void {
  const sheetIds = tx.select({ id: sheets.id }).from(sheets).where(eq(sheets.workbookId, workbookId)).all().map((s) => s.id);
  if (sheetIds.length === 0) return;
  tx.delete(sheetRoles).where(and(inArray(sheetRoles.sheetId, sheetIds), eq(sheetRoles.userId, userId), eq(sheetRoles.viaLock, true))).run();
}
