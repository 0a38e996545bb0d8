// Reading a workbook's sheet locks and protected ranges, and refusing changes they forbid. The checks
// run inside the transaction that writes (patches, tab changes, restores), on the rows that
// transaction sees, and decide with the same function the grid uses to grey cells (shared/team.ts).
import { eq, inArray } from 'drizzle-orm';
import { parseCellRange } from '../../shared/cellRange.js';
import { editBlock, sheetLockedAgainst, type EditBlock, type Protection, type UserRef } from '../../shared/team.js';
import { protectedRanges, sheetLocks, sheets, users } from '../db/schema.js';
import { HttpError } from '../errors.js';
import { cellAddress, sheetReference } from '../../shared/a1.js';
import type { Tx } from './cellStore.js';

type Reader = Pick<Tx, 'select'>;

export function loadProtection(tx: Reader, workbookId: string): Protection {
  const lockRows = tx
    .select({ sheetId: sheetLocks.sheetId, lockedBy: sheetLocks.lockedBy, reason: sheetLocks.reason, editors: sheetLocks.editors, createdAt: sheetLocks.createdAt })
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

  const ids = new Set<string>();
  const editorIds = (json: string) => JSON.parse(json) as string[];
  for (const l of lockRows) [l.lockedBy, ...editorIds(l.editors)].forEach((id) => ids.add(id));
  for (const r of rangeRows) [r.createdBy, ...editorIds(r.editors)].forEach((id) => ids.add(id));
  const names = new Map(ids.size ? tx.select({ id: users.id, name: users.name }).from(users).where(inArray(users.id, [...ids])).all().map((u) => [u.id, u.name]) : []);
  const ref = (id: string): UserRef => ({ id, name: names.get(id) ?? 'a former account' });

  return {
    locks: lockRows.map((l) => ({ sheetId: l.sheetId, lockedBy: ref(l.lockedBy), reason: l.reason, editors: editorIds(l.editors).map(ref), createdAt: l.createdAt })),
    protectedRanges: rangeRows.map((r) => ({
      id: r.id,
      sheetId: r.sheetId,
      range: r.range,
      // Stored ranges were validated on the way in; a row that no longer parses protects nothing rather than everything.
      bounds: parseCellRange(r.range) ?? { top: 1, left: 1, bottom: 0, right: 0 },
      editors: editorIds(r.editors).map(ref),
      createdBy: ref(r.createdBy),
      createdAt: r.createdAt,
    })),
  };
}

const listNames = (people: UserRef[]) => (people.length ? people.map((p) => p.name).join(', ') : 'nobody');
const isoDay = (ms: number) => new Date(ms).toISOString().slice(0, 10);
/** A sheet name as formulas write it: quoted unless it is letters, digits and underscores. */

function blockMessage(where: string, block: EditBlock, sheetName: string): string {
  if (block.kind === 'lock') {
    const l = block.lock;
    return `${where} is on sheet "${sheetName}", locked by ${l.lockedBy.name} on ${isoDay(l.createdAt)} ("${l.reason}"); only ${listNames(l.editors)} may change it`;
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
export function assertMayEditCells(tx: Reader, workbookId: string, userId: string, changes: readonly { sheetId: string; row: number; col: number }[], sheetNames: ReadonlyMap<string, string>): void {
  const protection = loadProtection(tx, workbookId);
  if (protection.locks.length === 0 && protection.protectedRanges.length === 0) return;
  const refused: { sheetId: string; row: number; col: number; message: string; lockedSheet?: string; rangeId?: string }[] = [];
  for (const c of changes) {
    const block = editBlock(protection, userId, c.sheetId, c.row, c.col);
    if (!block) continue;
    const name = sheetNames.get(c.sheetId) ?? c.sheetId;
    refused.push({
      sheetId: c.sheetId,
      row: c.row,
      col: c.col,
      message: blockMessage(cellAddress(name, c.row, c.col), block, name),
      ...(block.kind === 'lock' ? { lockedSheet: block.lock.sheetId } : { rangeId: block.range.id }),
    });
  }
  if (refused.length === 0) return;
  const more = refused.length > namedInMessage ? `; and ${refused.length - namedInMessage} more protected cells` : '';
  throw new HttpError(403, 'protected', `${refused.slice(0, namedInMessage).map((r) => r.message).join('; ')}${more}; nothing was saved`, { cells: refused });
}

/**
 * Refuses (403 'locked') renaming, moving, re-configuring or deleting a sheet locked against the
 * user; deleting also needs the right to edit every protected range on it (403 'protected').
 */
export function assertMayChangeSheet(tx: Reader, workbookId: string, userId: string, sheetId: string, sheetName: string, opts: { deleting?: boolean } = {}): void {
  const protection = loadProtection(tx, workbookId);
  const lock = sheetLockedAgainst(protection, userId, sheetId);
  if (!lock) {
    const range = opts.deleting && protection.protectedRanges.find((r) => r.sheetId === sheetId && !r.editors.some((e) => e.id === userId));
    if (!range) return;
    throw new HttpError(403, 'protected', `sheet "${sheetName}" holds the protected range ${sheetReference(sheetName)}!${range.range}, set by ${range.createdBy.name}; only ${listNames(range.editors)} may edit it, so the sheet cannot be deleted`, { sheetId, rangeId: range.id });
  }
  throw new HttpError(403, 'locked', `sheet "${sheetName}" is locked by ${lock.lockedBy.name} since ${isoDay(lock.createdAt)} ("${lock.reason}"); only ${listNames(lock.editors)} may change it`, {
    sheetId,
    lockedBy: lock.lockedBy,
    reason: lock.reason,
  });
}
