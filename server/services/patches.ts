// Applying a client's patch: all of it in one transaction or none of it. A cell that another revision
// wrote after the client's baseRevision, to something other than what the client sends, is a
// conflict; every conflict is reported (409) and nothing is written.
import type { CellChangeRecord, CellConflict, PatchInput, PatchResult, RevisionPatch } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { badRequest, conflict, HttpError } from '../errors.js';
import { cellAddress } from '../../shared/a1.js';
import { readCells, writeCells, type Tx } from './cellStore.js';
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

/** What a patch would do, read in a transaction: the cells it changes, and those someone else changed first. */
export interface PatchPlan {
  /** The workbook revision the reads saw. */
  readAt: number;
  writes: CellChangeRecord[];
  conflicts: CellConflict[];
}

/**
 * Reads what `changes` would write and which of them conflict with revisions after `baseRevision`.
 * Throws as a patch does for a base ahead of the workbook (400) or an unknown sheet (404).
 */
export function planPatch(ctx: AppContext, tx: Tx, workbookId: string, input: PatchInput): PatchPlan {
  const readAt = currentRevision(tx, workbookId);
  if (input.baseRevision > readAt) {
    throw badRequest(`baseRevision: ${input.baseRevision} is ahead of the workbook (revision ${readAt}); reload it`);
  }
  sheetNamesOf(tx, workbookId, input.changes);
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
  return { readAt, writes, conflicts };
}

/** The workbook's sheet names by id; a change to a sheet not among them is a 404. */
function sheetNamesOf(tx: Tx, workbookId: string, changes: PatchInput['changes']): Map<string, string> {
  const sheetNames = new Map(workbookSheets(tx, workbookId).map((s) => [s.id, s.name]));
  changes.forEach((c, i) => {
    // Another workbook's sheet is as unknown as a deleted one: no reach across workbooks.
    if (!sheetNames.has(c.sheetId)) throw new HttpError(404, 'not_found', `changes.${i}.sheetId: sheet ${c.sheetId} not found in this workbook`);
  });
  return sheetNames;
}

function refuseConflicts(conflicts: CellConflict[], baseRevision: number, sheetNames: Map<string, string>): void {
  if (conflicts.length === 0) return;
  const named = conflicts.slice(0, namedInMessage).map((k) => `${cellAddress(sheetNames.get(k.sheetId)!, k.row, k.col)} (revision ${k.revision})`);
  const more = conflicts.length > namedInMessage ? ` and ${conflicts.length - namedInMessage} more` : '';
  throw conflict(`changed by someone else after revision ${baseRevision}: ${named.join(', ')}${more}; nothing was saved`, { conflicts });
}

/** A plan's writes as JSON.stringify writes them, without the brackets (parts are joined with commas). */
export const writesText = (plan: { writes: CellChangeRecord[] }) => JSON.stringify(plan.writes).slice(1, -1);

/** An action's parts as the server holds them: each earlier part planned when it arrived, the last not yet. */
export interface PlannedParts {
  plans: PatchPlan[];
  writesJson: string[];
  unplanned: PatchInput['changes'];
}

/**
 * Applies a patch. With `planned` (the plans of its parts, read as each part arrived, and their
 * writes as JSON text) the reads are not done again when no revision landed since the first was
 * read: then every stored cell is as the plans saw it. Locks and protected ranges change without a
 * revision, so they are always checked here.
 */
export function applyPatch(ctx: AppContext, workbookId: string, authorId: string, input: PatchInput, planned?: PlannedParts): PatchResult {
  const result = ctx.db.transaction(
    (tx) => {
      const current = currentRevision(tx, workbookId);
      const sheetNames = sheetNamesOf(tx, workbookId, input.changes);
      // Locks and protected ranges, read in this transaction: refused before any conflict is looked at.
      assertMayEditCells(tx, workbookId, sheetActor(tx, workbookId, authorId), input.changes, sheetNames);
      const fresh = planned !== undefined && planned.plans.every((p) => p.readAt === current);
      const last = fresh ? planPatch(ctx, tx, workbookId, { baseRevision: input.baseRevision, changes: planned.unplanned }) : null;
      const plans = fresh ? [...planned.plans, last!] : [planPatch(ctx, tx, workbookId, input)];
      refuseConflicts(plans.flatMap((p) => p.conflicts), input.baseRevision, sheetNames);
      const writes = plans.length === 1 ? plans[0].writes : plans.flatMap((p) => p.writes);
      if (writes.length === 0) return { revision: current, applied: 0, patch: null };

      const revision = nextRevision(tx, workbookId);
      writeCells(ctx.db, revision, writes);
      const patch: RevisionPatch = { sheetOps: [], changes: writes };
      // The parts' writes were written out as JSON when they arrived; the same text JSON.stringify gives.
      const changesJson = fresh ? [...planned.writesJson, writesText(last!)].filter((j) => j !== '').join(',') : writesText({ writes });
      recordRevisionJson(ctx.db, workbookId, revision, authorId, 'edit', `{"sheetOps":[],"changes":[${changesJson}]}`);
      return { revision, applied: writes.length, patch };
    },
    { behavior: 'immediate' },
  );
  if (result.patch) ctx.events.publish(workbookId, { type: 'revision', workbookId, revision: result.revision, kind: 'edit', authorId, patch: result.patch });
  return { revision: result.revision, applied: result.applied };
}
