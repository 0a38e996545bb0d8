// Carries out the choices made in the conflict dialog on the session's queue and model.
import type { CellConflict } from '../../../shared/workbooks.js';
import type { WorkbookModel } from '../../core/workbook/model/workbookModel.js';
import type { PatchQueue } from '../../core/workbook/save/patchQueue.js';
import { resolveConflicts, type ConflictChoice, type SetAsideInput } from './conflictResolution.js';

/**
 * Keeps mine where I kept mine (the queue sends it again on top of the revision that beat it) and
 * shows theirs where I took theirs. Returns my inputs set aside.
 */
export function settleConflicts(
  session: { model: WorkbookModel; queue: PatchQueue },
  conflicts: readonly CellConflict[],
  choose: ConflictChoice | ((c: CellConflict) => ConflictChoice),
): SetAsideInput[] {
  const pick = typeof choose === 'function' ? choose : () => choose;
  const plan = resolveConflicts(conflicts, pick, session.queue.waiting);
  const shown = session.queue.resolveConflicts(pick);
  session.model.applyRemote(shown.filter((c) => session.model.hasSheet(c.sheetId)));
  return plan.setAside;
}
