// Whether a person may change a cell, as far as sheet locks and protected ranges go (roles are the
// grid model's own check). Built on shared/team.ts `editBlock`, the very function the server's patch
// check calls, so a greyed cell in the grid and a 403 from the API can never disagree.
import { editBlock, sheetLockedAgainst, type EditBlock, type Protection, type UserRef } from '../../../shared/team.js';

export const noProtection: Protection = { locks: [], protectedRanges: [] };

/** True when neither a sheet lock nor a protected range keeps `userId` out of this cell. */
export function isCellEditable(protection: Protection, userId: string, sheetId: string, row: number, col: number): boolean {
  return editBlock(protection, userId, sheetId, row, col) === null;
}

function names(people: readonly UserRef[]): string {
  return people.map((p) => p.name).join(', ');
}

/** The sentence a greyed cell shows on hover and a refused edit reports. */
export function blockReason(block: EditBlock): string {
  if (block.kind === 'lock') {
    const { lock } = block;
    return `Sheet locked by ${lock.lockedBy.name}: ${lock.reason}. Only ${names(lock.editors)} may change it.`;
  }
  const { range } = block;
  return `Protected range ${range.range}: only ${names(range.editors)} may change it.`;
}

/**
 * The rule the grid model takes through `setEditRule`: a reason for each cell `userId` may not
 * change, or null. Looks up locks by sheet once, so the grid's per-cell calls stay cheap.
 */
export function editRuleFor(protection: Protection, userId: string): ((sheetId: string, row: number, col: number) => string | null) | null {
  if (protection.locks.length === 0 && protection.protectedRanges.length === 0) return null;
  return (sheetId, row, col) => {
    const block = editBlock(protection, userId, sheetId, row, col);
    return block ? blockReason(block) : null;
  };
}

/**
 * The rule the grid model takes as `structureRule`: why `userId` may not insert or delete rows and
 * columns of a sheet (it is locked against them), or null. Protected ranges are checked cell by cell
 * on what the operation would change (grid/model/structure.ts).
 */
export function structureRuleFor(protection: Protection, userId: string): ((sheetId: string) => string | null) | null {
  if (protection.locks.length === 0) return null;
  return (sheetId) => {
    const lock = sheetLockedAgainst(protection, userId, sheetId);
    return lock ? blockReason({ kind: 'lock', lock }) : null;
  };
}

/** Protection after a live `protection` event or a lock/range call answered. */
export function withLock(protection: Protection, lock: Protection['locks'][number]): Protection {
  return { ...protection, locks: [...protection.locks.filter((l) => l.sheetId !== lock.sheetId), lock] };
}
export function withoutLock(protection: Protection, sheetId: string): Protection {
  return { ...protection, locks: protection.locks.filter((l) => l.sheetId !== sheetId) };
}
export function withRange(protection: Protection, range: Protection['protectedRanges'][number]): Protection {
  return { ...protection, protectedRanges: [...protection.protectedRanges.filter((r) => r.id !== range.id), range] };
}
export function withoutRange(protection: Protection, rangeId: string): Protection {
  return { ...protection, protectedRanges: protection.protectedRanges.filter((r) => r.id !== rangeId) };
}
