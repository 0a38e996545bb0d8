// Reading a workbook's sheet roles (locks and overrides) and protected ranges, and refusing changes
// they forbid. The checks run inside the transaction that writes (patches, tab changes, restores,
// imports), on the rows that transaction sees, and decide with the same function the grid uses to
// grey cells (shared/team.ts, on the rule in shared/permissions.ts).
import { eq, inArray } from 'drizzle-orm';
import { parseCellRange } from '../../shared/cellRange.js';
import { sheetRefusalReason } from '../../shared/permissions.js';
import { sheetClosedTo, sheetEditBlocker, type EditBlock, type Protection, type SheetActor, type SheetStanding, type UserRef } from '../../shared/team.js';
import { protectedRanges, sheetLocks, sheetRoles, sheets, users } from '../db/schema.js';
import { HttpError } from '../errors.js';
import { cellAddress, sheetReference } from '../../shared/a1.js';
import type { Tx } from './cellStore.js';

type Reader = Pick<Tx, 'select'>;

export function loadProtection(tx: Reader, workbookId: string): Protection {
  const lockRows = tx
    .select({ sheetId: sheetLocks.sheetId, lockedBy: sheetLocks.lockedBy, reason: sheetLocks.reason, createdAt: sheetLocks.createdAt })
    .from(sheetLocks)
    .innerJoin(sheets, eq(sheets.id, sheetLocks.sheetId))
    .where(eq(sheets.workbookId, workbookId))
    .orderBy(sheets.position)
    .all();
  const rangeRows = tx
    .select({ id: protectedRanges.id, sheetId: protectedRanges.sheetId, range: protectedRanges.range, editors: protectedRanges.editors, createdBy: protectedRanges.createdBy, createdAt: protectedRanges.createdAt })
    .from(protectedRanges)
    .innerJoin(sheets, eq(sheets.id, protectedRanges.sheetId))
    .where(eq(sheets.workbookId, workbookId))
    .orderBy(sheets.position, protectedRanges.createdAt, protectedRanges.id)
    .all();

  const roleRows = tx
    .select({ sheetId: sheetRoles.sheetId, userId: sheetRoles.userId, role: sheetRoles.role, viaLock: sheetRoles.viaLock, setBy: sheetRoles.setBy, createdAt: sheetRoles.createdAt })
    .from(sheetRoles)
    .innerJoin(sheets, eq(sheets.id, sheetRoles.sheetId))
    .where(eq(sheets.workbookId, workbookId))
    .orderBy(sheets.position, sheetRoles.createdAt, sheetRoles.userId)
    .all();

  const ids = new Set<string>();
  for (const l of lockRows) ids.add(l.lockedBy);
  for (const r of roleRows) [r.userId, r.setBy].forEach((id) => ids.add(id));
  for (const r of rangeRows) [r.createdBy, ...r.editors].forEach((id) => ids.add(id));
  const names = new Map(ids.size ? tx.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, [...ids])).all().map((u) => [u.id, u.name]) : []);
  const ref = (id: string): UserRef => ({ id, name: names.get(id) ?? 'a former account' });

  const bySheet = new Map<string, Protection['sheetRoles'][number]>();
  for (const r of roleRows) {
    const entry = bySheet.get(r.sheetId) ?? { sheetId: r.sheetId, overrides: [] };
    entry.overrides.push({ user: ref(r.userId), role: r.role, setBy: ref(r.setBy), viaLock: r.viaLock, since: r.createdAt });
    bySheet.set(r.sheetId, entry);
  }
  // The locker first, then the others in the order they were named (rows of one lock share a
  // timestamp, so ties fall back to the name, never to the random account id).
  const editorsOf = (sheetId: string, lockedBy: string) =>
    (bySheet.get(sheetId)?.overrides ?? [])
      .filter((o) => o.role === 'editor')
      .sort((a, b) => Number(b.user.id === lockedBy) - Number(a.user.id === lockedBy) || a.since - b.since || a.user.name.localeCompare(b.user.name))
      .map((o) => o.user);

  return {
    locks: lockRows.map((l) => ({ sheetId: l.sheetId, lockedBy: ref(l.lockedBy), reason: l.reason, editors: editorsOf(l.sheetId, l.lockedBy), createdAt: l.createdAt })),
    sheetRoles: [...bySheet.values()],
    protectedRanges: rangeRows.map((r) => ({
      id: r.id,
      sheetId: r.sheetId,
      range: r.range,
      // Stored ranges were validated on the way in; a row that no longer parses protects nothing rather than everything.
      bounds: parseCellRange(r.range) ?? { top: 1, left: 1, bottom: 0, right: 0 },
      editors: r.editors.map(ref),
      createdBy: ref(r.createdBy),
      createdAt: r.createdAt,
    })),
  };
}

const listNames = (people: UserRef[]) => (people.length ? people.map((p) => p.name).join(', ') : 'nobody');
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);
/** A sheet name as formulas write it: quoted unless it is letters, digits and underscores. */

/** Why a sheet is view-only for someone, in words: the lock with its reason, the override and who set it, or the workbook role. */
export function standingMessage(sheetName: string, s: SheetStanding): string {
  if (s.source === 'lock' && s.lock) {
    const l = s.lock;
    return `sheet "${sheetName}" is locked by ${l.lockedBy.name} since ${isoDay(l.createdAt)} ("${l.reason}"); only ${listNames(l.editors)} may change it`;
  }
  if (s.source === 'override' && s.override) return `${s.override.setBy.name} made you a viewer of sheet "${sheetName}"; ask them or an owner`;
  return sheetRefusalReason(sheetName, s, 'editCells');
}

function blockMessage(where: string, block: EditBlock, sheetName: string): string {
  if (block.kind === 'sheet') {
    const { lock, source } = block.standing;
    if (source === 'lock' && lock) return `${where} is on sheet "${sheetName}", locked by ${lock.lockedBy.name} on ${isoDay(lock.createdAt)} ("${lock.reason}"); only ${listNames(lock.editors)} may change it`;
    return `${where} is on sheet "${sheetName}": ${standingMessage(sheetName, block.standing)}`;
  }
  const r = block.range;
  return `${where} is in the protected range ${sheetReference(sheetName)}!${r.range}, set by ${r.createdBy.name}; only ${listNames(r.editors)} may edit it`;
}

/** How many refused cells the 403 message names before "and n more" (details list them all). */
const namedInMessage = 3;

/**
 * Refuses (403 'protected') a set of cell changes when any falls in a sheet locked against the user
 * or in a protected range that does not list them. Names the cells, who locked them and why.
 */
export function assertMayEditCells(tx: Reader, workbookId: string, who: SheetActor, changes: readonly { sheetId: string; row: number; col: number }[], sheetNames: ReadonlyMap<string, string>): void {
  const protection = loadProtection(tx, workbookId);
  const refused: { sheetId: string; row: number; col: number; message: string; lockedSheet?: string; viewOnlySheet?: string; rangeId?: string }[] = [];
  const blockers = new Map<string, ReturnType<typeof sheetEditBlocker>>();
  for (const c of changes) {
    let blocker = blockers.get(c.sheetId);
    if (blocker === undefined) blockers.set(c.sheetId, (blocker = sheetEditBlocker(protection, who, c.sheetId)));
    const block = blocker?.(c.row, c.col);
    if (!block) continue;
    const name = sheetNames.get(c.sheetId) ?? c.sheetId;
    refused.push({
      sheetId: c.sheetId,
      row: c.row,
      col: c.col,
      message: blockMessage(cellAddress(name, c.row, c.col), block, name),
      ...(block.kind === 'sheet' ? (block.standing.source === 'lock' ? { lockedSheet: block.sheetId } : { viewOnlySheet: block.sheetId }) : { rangeId: block.range.id }),
    });
  }
  if (refused.length === 0) return;
  const more = refused.length > namedInMessage ? `; and ${refused.length - namedInMessage} more protected cells` : '';
  throw new HttpError(403, 'protected', `${refused.slice(0, namedInMessage).map((r) => r.message).join('; ')}${more}; nothing was saved`, { cells: refused });
}

/**
 * Refuses renaming, moving, re-configuring or deleting a sheet the user only views: 403 'locked'
 * when a lock makes them a viewer, 403 'view_only' otherwise. Deleting also needs the right to edit
 * every protected range on it (403 'protected').
 */
export function assertMayChangeSheet(tx: Reader, workbookId: string, who: SheetActor, sheetId: string, sheetName: string, opts: { deleting?: boolean } = {}): void {
  const protection = loadProtection(tx, workbookId);
  const closed = sheetClosedTo(protection, who, sheetId);
  if (!closed) {
    const range = opts.deleting && protection.protectedRanges.find((r) => r.sheetId === sheetId && !r.editors.some((e) => e.id === who.id));
    if (!range) return;
    throw new HttpError(403, 'protected', `sheet "${sheetName}" holds the protected range ${sheetReference(sheetName)}!${range.range}, set by ${range.createdBy.name}; only ${listNames(range.editors)} may edit it, so the sheet cannot be deleted`, { sheetId, rangeId: range.id });
  }
  if (closed.source === 'lock' && closed.lock) {
    throw new HttpError(403, 'locked', standingMessage(sheetName, closed), { sheetId, lockedBy: closed.lock.lockedBy, reason: closed.lock.reason });
  }
  throw new HttpError(403, 'view_only', closed.source === 'override' ? standingMessage(sheetName, closed) : sheetRefusalReason(sheetName, closed, 'changeSheet'), { sheetId });
}
