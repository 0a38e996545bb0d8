// Carries out the choices made in the conflict dialog on the session's queue and model.
import type { CellConflict } from '../../../shared/workbooks.js';
import type { WorkbookModel } from '../grid/model/workbookModel.js';
import type { PatchQueue } from '../grid/save/patchQueue.js';
import { resolveConflicts, type ConflictChoice, type SetAsideInput } from './conflictResolution.js';

/**
 * Drops every conflicting cell from the queue (its base moves to the revision that beat me), shows
 * theirs where I took theirs, and queues mine again where I kept mine. Returns my inputs set aside.
 */
export function settleConflicts(
  session: { model: WorkbookModel; queue: PatchQueue },
  conflicts: readonly CellConflict[],
  choose: ConflictChoice | ((c: CellConflict) => ConflictChoice),
): SetAsideInput[] {
  const plan = resolveConflicts(conflicts, choose, session.queue.waiting);
  session.queue.takeTheirs();
  session.model.applyRemote(plan.applyLocally.filter((c) => session.model.hasSheet(c.sheetId)));
  session.queue.enqueue(plan.resend);
  return plan.setAside;
}
