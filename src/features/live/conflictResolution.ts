// Settling a 409: for each refused cell the user keeps their own input (sent again on top of the
// revision that beat it) or takes the other (shown here, their own input dropped from the queue).
// Nothing is lost either way: a replaced colleague's input stays in the revision history, and my
// own dropped input is set aside where I can still read and copy it.
import { cellKey } from '../../../shared/a1.js';
import type { CellConflict } from '../../../shared/workbooks.js';
import type { CellInput } from '../../core/workbook/save/pendingStore.js';

export type ConflictChoice = 'mine' | 'theirs';

export const conflictKey = cellKey;

/** An input of mine that lost to someone else's, kept so it can still be copied. */
export interface SetAsideInput extends CellInput {
  /** What the cell holds instead. */
  replacedBy: string;
  at: number;
}

export interface ConflictResolution {
  /** Their inputs, to show here without sending them back. */
  applyLocally: CellInput[];
  /** My inputs, to send again on top of the newer revision. */
  resend: CellInput[];
  setAside: SetAsideInput[];
}

/**
 * `waiting` is the queue's unsent inputs now: if I typed in a conflicting cell again while the
 * dialog was open, that newer input is the one kept or set aside, not the one the server refused.
 */
export function resolveConflicts(
  conflicts: readonly CellConflict[],
  choose: ConflictChoice | ((c: CellConflict) => ConflictChoice),
  waiting: readonly CellInput[],
  now = Date.now(),
): ConflictResolution {
  const latest = new Map(waiting.map((c) => [conflictKey(c), c.input]));
  const out: ConflictResolution = { applyLocally: [], resend: [], setAside: [] };
  for (const c of conflicts) {
    const cell = { sheetId: c.sheetId, row: c.row, col: c.col };
    const mine = latest.get(conflictKey(c)) ?? c.mine;
    const choice = typeof choose === 'function' ? choose(c) : choose;
    if (choice === 'mine') {
      out.resend.push({ ...cell, input: mine });
    } else {
      out.applyLocally.push({ ...cell, input: c.theirs });
      if (mine !== c.theirs) out.setAside.push({ ...cell, input: mine, replacedBy: c.theirs, at: now });
    }
  }
  return out;
}

/** How a conflicting input reads in the dialog: an empty input means the cell was cleared. */
export function describeInput(input: string): string {
  return input === '' ? '(empty: cleared)' : input;
}
