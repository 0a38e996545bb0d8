// A revision someone else committed, brought into this browser's engine and grid without a reload.
// The rule that keeps work safe: a cell with my own input still waiting to be saved is never
// overwritten by a remote change. It stays mine on screen, and my next patch meets the other input
// as a 409 conflict, where I choose (ConflictDialog). Everything else is written at once.
import { cellKey } from '@shared/a1.js';
import { removeSheetFromFormula, renameSheetInFormula } from '@shared/formulaText.js';
import type { LiveEvents } from '@shared/team.js';
import type { RevisionDetail, SheetOp } from '@shared/workbooks.js';
import { readDisplaySettings } from '../../core/workbook/model/displaySettings.js';
import { SheetInputs } from '../../core/workbook/model/sheetInputs.js';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import type { CellInput } from '../../core/workbook/save/pendingStore.js';
import type { PatchQueue } from '../../core/workbook/save/patchQueue.js';

export type RemoteRevision = LiveEvents['revision'];


/** The same shape whether a revision came over the event stream or was fetched to fill a gap. */
export function fromRevisionDetail(d: RevisionDetail): RemoteRevision {
  return {
    revision: d.number,
    kind: d.kind,
    authorId: d.author?.id ?? '',
    changes: d.patch.changes,
    sheetOps: d.patch.sheetOps,
    ...(d.patch.restoredFrom !== undefined ? { restoredFrom: d.patch.restoredFrom } : {}),
  };
}

export interface CellPlan {
  /** Inputs to write now. */
  writes: CellInput[];
  /** Remote inputs kept off screen because I have a different input waiting for that cell. */
  heldBack: CellInput[];
}

/**
 * Splits a revision's cell changes. `currentInput` gives what this browser shows now, or undefined
 * for a sheet it does not have (deleted here or never seen).
 */
export function planCellChanges(
  changes: RemoteRevision['changes'],
  waiting: readonly CellInput[],
  currentInput: (sheetId: string, row: number, col: number) => string | undefined,
): CellPlan {
  const mine = new Map(waiting.map((c) => [cellKey(c), c.input]));
  const writes: CellInput[] = [];
  const heldBack: CellInput[] = [];
  for (const c of changes) {
    const cell = { sheetId: c.sheetId, row: c.row, col: c.col, input: c.after };
    const pending = mine.get(cellKey(c));
    if (pending !== undefined) {
      // The same input from both sides is agreement, not a conflict (the server sees it so too).
      if (pending !== c.after) heldBack.push(cell);
      continue;
    }
    const shown = currentInput(c.sheetId, c.row, c.col);
    if (shown !== undefined && shown !== c.after) writes.push(cell);
  }
  return { writes, heldBack };
}

/** Tab order after moving one tab to `to` (positions count from 0 and stay dense, as on the server). */
export function reorder(order: readonly string[], sheetId: string, to: number): string[] {
  const next = order.filter((id) => id !== sheetId);
  next.splice(Math.max(0, Math.min(to, next.length)), 0, sheetId);
  return next;
}

export interface AppliedRevision extends CellPlan {
  /** My unsent inputs on tabs someone deleted: they have nowhere to go, so they are set aside. */
  orphaned: CellInput[];
  /** Whether the queue's next patch builds on this revision. */
  advanced: boolean;
}

/**
 * Applies one revision to the model. Sheet operations are idempotent (my own tab changes come back
 * over the stream too, already applied), then cell changes follow the rule above. Revisions must
 * come in order, each once (RevisionFeed sees to it).
 */
export function applyRemoteRevision(model: WorkbookModel, queue: PatchQueue, rev: RemoteRevision): AppliedRevision {
  const orphaned: CellInput[] = [];
  for (const op of rev.sheetOps as SheetOp[]) {
    const order = () => model.sheets.map((s) => s.id);
    switch (op.op) {
      case 'add':
        if (!model.hasSheet(op.sheetId)) {
          model.addSheetState({ id: op.sheetId, name: op.name, position: op.position, settings: op.settings, createdBy: rev.authorId }, SheetInputs.from(op.cells));
          model.setPositions(reorder(order(), op.sheetId, op.position));
        }
        break;
      case 'delete':
        if (model.hasSheet(op.sheetId)) {
          orphaned.push(...queue.waiting.filter((c) => c.sheetId === op.sheetId));
          queue.dropSheet(op.sheetId);
          queue.rewritePending((input) => removeSheetFromFormula(input, op.name));
          model.removeSheetState(op.sheetId);
          model.setPositions(order());
        }
        break;
      case 'rename':
        if (model.hasSheet(op.sheetId)) {
          queue.rewritePending((input) => renameSheetInFormula(input, op.before, op.after));
          model.renameSheetState(op.sheetId, op.after);
        }
        break;
      case 'move':
        if (model.hasSheet(op.sheetId)) model.setPositions(reorder(order(), op.sheetId, op.to));
        break;
      case 'settings':
        if (model.hasSheet(op.sheetId)) {
          const display = readDisplaySettings(op.after);
          // Older than display settings of mine still being saved: shown, if at all, once mine is answered.
          if (!model.displaySaves.holdBack(op.sheetId, rev.revision, display)) model.setDisplay(op.sheetId, display);
        }
        break;
    }
  }
  const plan = planCellChanges(rev.changes, queue.waiting, (sheetId, row, col) => (model.hasSheet(sheetId) ? model.input(sheetId, row, col) : undefined));
  model.applyRemote(plan.writes);
  // The queue's ledger decides whether later patches may build on this revision: not while any of it
  // is held back or an earlier revision is missing (the server must still see those cells as conflicts).
  queue.takeInRemote(rev.revision, plan.heldBack);
  return { ...plan, orphaned, advanced: queue.baseRevision >= rev.revision };
}
