// Applying a client's patch: all of it in one transaction or none of it. A cell that another revision
// wrote after the client's baseRevision, to something other than what the client sends, is a
// conflict; every conflict is reported (409) and nothing is written.
import type { CellChangeRecord, CellConflict, PatchInput, PatchResult, RevisionPatch } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { badRequest, conflict, HttpError } from '../errors.js';
import { cellAddress } from '../../shared/a1.js';
import { readCells, writeCells } from './cellStore.js';
import { currentRevision, nextRevision, recordRevisionJson } from './revisionLog.js';
import { sheetActor } from './access.js';
import { assertMayEditCells } from './protection.js';
import { workbookSheets } from './sheetOps.js';

/** How many conflicting cells the 409 message names before "and n more" (details list them all). */
const namedInMessage = 5;

/**
 * What is stored at each changed cell, in the patch's order: one query per sheet (cellStore's
 * readCells) instead of one per cell.
 */
function storedAt(db: AppContext['db'], changes: PatchInput['changes']): ReturnType<typeof readCells> {
  const bySheet = new Map<string, number[]>();
  changes.forEach((c, i) => {
    const indices = bySheet.get(c.sheetId);
    if (indices) indices.push(i);
    else bySheet.set(c.sheetId, [i]);
  });
  const stored: ReturnType<typeof readCells> = new Array(changes.length).fill(undefined);
  for (const [sheetId, indices] of bySheet) {
    readCells(db, sheetId, indices.map((i) => changes[i])).forEach((cell, k) => (stored[indices[k]] = cell));
  }
  return stored;
}

export function applyPatch(ctx: AppContext, workbookId: string, authorId: string, input: PatchInput): PatchResult {
  const result = ctx.db.transaction(
    (tx) => {
      const current = currentRevision(tx, workbookId);
      if (input.baseRevision > current) {
        throw badRequest(`baseRevision: ${input.baseRevision} is ahead of the workbook (revision ${current}); reload it`);
      }
      const sheetNames = new Map(workbookSheets(tx, workbookId).map((s) => [s.id, s.name]));
      input.changes.forEach((c, i) => {
        // Another workbook's sheet is as unknown as a deleted one: no reach across workbooks.
        if (!sheetNames.has(c.sheetId)) throw new HttpError(404, 'not_found', `changes.${i}.sheetId: sheet ${c.sheetId} not found in this workbook`);
      });
      // Locks and protected ranges, read in this transaction: refused before any conflict is looked at.
      assertMayEditCells(tx, workbookId, sheetActor(tx, workbookId, authorId), input.changes, sheetNames);

      const conflicts: CellConflict[] = [];
      const writes: CellChangeRecord[] = [];
      const stored = storedAt(ctx.db, input.changes);
      input.changes.forEach((c, i) => {
        const cell = stored[i];
        const before = cell?.input ?? '';
        if (before === c.input) return; // already so: nothing to write, nothing to fight over
        if (cell && cell.revision > input.baseRevision) {
          conflicts.push({ sheetId: c.sheetId, row: c.row, col: c.col, theirs: before, mine: c.input, revision: cell.revision });
        } else {
          writes.push({ sheetId: c.sheetId, row: c.row, col: c.col, before, after: c.input });
        }
      });
      if (conflicts.length > 0) {
        const named = conflicts.slice(0, namedInMessage).map((k) => `${cellAddress(sheetNames.get(k.sheetId)!, k.row, k.col)} (revision ${k.revision})`);
        const more = conflicts.length > namedInMessage ? ` and ${conflicts.length - namedInMessage} more` : '';
        throw conflict(`changed by someone else after revision ${input.baseRevision}: ${named.join(', ')}${more}; nothing was saved`, { conflicts });
      }
      if (writes.length === 0) return { revision: current, applied: 0, patch: null };

      const revision = nextRevision(tx, workbookId);
      writeCells(ctx.db, revision, writes);
      const patch: RevisionPatch = { sheetOps: [], changes: writes };
      recordRevisionJson(ctx.db, workbookId, revision, authorId, 'edit', JSON.stringify(patch));
      return { revision, applied: writes.length, patch };
    },
    { behavior: 'immediate' },
  );
  if (result.patch) ctx.events.publish(workbookId, { type: 'revision', workbookId, revision: result.revision, kind: 'edit', authorId, patch: result.patch });
  return { revision: result.revision, applied: result.applied };
}
