// Whether a person may change a cell or a sheet: their role on the sheet (workbook role, override or
// lock), then protected ranges. Built on shared/team.ts `editBlock` and `sheetStanding`, the very
// functions the server's checks call, so a greyed cell or tab and a 403 from the API never disagree.
// Every reason is written here, in one style: what stops you, then who can change it.
import type { AccessRole } from '@shared/permissions.js';
import { editBlock, editsSomeSheet, sheetStanding, type EditBlock, type Protection, type SheetActor, type SheetStanding, type UserRef } from '@shared/team.js';

export const noProtection: Protection = { locks: [], sheetRoles: [], protectedRanges: [] };

/** Me as the sheet checks see me: a site admin who is not a member has no membership role. */
export function actorOf(userId: string, role: AccessRole): SheetActor {
  return { id: userId, role: role === 'site-admin' ? null : role };
}

/** True when neither my role on the sheet nor a protected range keeps me out of this cell. */
export function isCellEditable(protection: Protection, who: SheetActor, sheetId: string, row: number, col: number): boolean {
  return editBlock(protection, who, sheetId, row, col) === null;
}

function names(people: readonly UserRef[]): string {
  return people.length ? people.map((p) => p.name).join(', ') : 'nobody';
}

/** Why a sheet is view-only for me, in words (the tab's hover, a greyed cell, a disabled control). */
export function standingReason(s: SheetStanding): string {
  if (s.source === 'lock' && s.lock) return `View only — ${s.lock.lockedBy.name} locked this sheet: “${s.lock.reason}”. Editors here: ${names(s.lock.editors)}.`;
  if (s.source === 'override' && s.override) return `View only — ${s.override.setBy.name} made you a viewer of this sheet; an owner can change that in the team panel.`;
  return 'View only — you view this workbook; an owner can open a sheet to you in the team panel.';
}

/** The sentence a greyed cell shows on hover and a refused edit reports. */
export function blockReason(block: EditBlock): string {
  if (block.kind === 'sheet') return standingReason(block.standing);
  const { range } = block;
  return `View only — ${range.range} is protected by ${range.createdBy.name}. Editors of the range: ${names(range.editors)}.`;
}

/**
 * The rule the grid model takes through `setEditRule`: a reason for each cell I may not change, or
 * null. Standing is looked up once per sheet, so the grid's per-cell calls stay cheap.
 */
export function editRuleFor(protection: Protection, who: SheetActor): ((sheetId: string, row: number, col: number) => string | null) | null {
  const nothingSet = protection.locks.length === 0 && protection.sheetRoles.length === 0 && protection.protectedRanges.length === 0;
  if (nothingSet && (who.role === 'owner' || who.role === 'editor')) return null;
  const bySheet = new Map<string, string | null>();
  return (sheetId, row, col) => {
    if (!bySheet.has(sheetId)) {
      const s = sheetStanding(protection, who, sheetId);
      bySheet.set(sheetId, s.role === 'editor' ? null : standingReason(s));
    }
    const closed = bySheet.get(sheetId);
    if (closed) return closed;
    const block = editBlock(protection, who, sheetId, row, col);
    return block ? blockReason(block) : null;
  };
}

/** Why I only view this sheet (its tab says so, and rows, columns, name and settings stay put), or null. */
export function sheetViewOnlyReason(protection: Protection, who: SheetActor, sheetId: string): string | null {
  const s = sheetStanding(protection, who, sheetId);
  return s.role === 'editor' ? null : standingReason(s);
}

/**
 * The rule the grid model takes as `structureRule`: why I may not insert or delete rows and columns
 * of a sheet (I only view it), or null. Protected ranges are checked cell by cell on what the
 * operation would change (grid/model/structure.ts).
 */
export function structureRuleFor(protection: Protection, who: SheetActor): (sheetId: string) => string | null {
  return (sheetId) => sheetViewOnlyReason(protection, who, sheetId);
}

/** Whether a sheet role lets me edit somewhere although my workbook role does not. */
export function editsThroughSheetRole(protection: Protection, who: SheetActor): boolean {
  return editsSomeSheet(protection, who);
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
