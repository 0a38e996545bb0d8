// Stores an import without holding the event loop: the cells go in many short transactions, with a
// turn of the event loop between them, into sheets of a staging workbook that no one is a member of
// (so no one sees it). One final short transaction moves those sheets into their workbook and records
// the revision; until then nothing of the import is visible, and on failure the staging workbook is
// deleted, again in short steps. A staging workbook left by a crash is swept at the next start.
import { randomUUID } from 'node:crypto';
import { and, eq, notExists } from 'drizzle-orm';
import { cellInputProblem } from '../../shared/cellInput.js';
import { maxInputLength, type RevisionKind, type RevisionPatch, type SheetOp } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { sheets, workbookMembers, workbooks } from '../db/schema.js';
import { HttpError } from '../errors.js';
import { nextRevision, recordRevision } from '../services/revisionLog.js';
import { workbookSheets } from '../services/sheetOps.js';
import { cellName } from '../../shared/a1.js';
import { cellInserter, importedSheetName, type ImportOutcome } from './importStore.js';
import { settingsFromParsed } from './sheetSettings.js';
import type { CellTriple, ImportSummary, ParsedWorkbook } from './types.js';

/** The title of a staging workbook; with no members it is what the start-up sweep removes. */
export const stagingTitle = 'Import in progress';
/** Longest stretch of inserting before the event loop gets a turn. */
const sliceMs = 40;
const CELLS_PER_STEP = 1_000;

const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

export type ImportTarget = { workbookId: string } | { newWorkbook: { title: string } };

export interface StagedImportOptions {
  /** Asked between steps: an error to stop with (the server shutting down, say), or null. */
  stopReason?: () => HttpError | null;
}

/** The cells each sheet keeps, and the summary, with the checks a typed input meets. */
async function checkedSheets(parsed: ParsedWorkbook, summary: ImportSummary) {
  let imported = 0;
  let formulas = 0;
  let since = performance.now();
  const out: { sheet: ParsedWorkbook['sheets'][number]; cells: CellTriple[] }[] = [];
  for (const sheet of parsed.sheets) {
    const cells: CellTriple[] = [];
    for (const cell of sheet.cells) {
      const input = cell[2];
      const problem = input.length > maxInputLength ? `longer than ${maxInputLength.toLocaleString('en')} characters` : cellInputProblem(input);
      if (problem) summary.skipped.push({ sheet: sheet.name, address: cellName(cell[0], cell[1]), reason: problem });
      else {
        cells.push(cell);
        if (input.charCodeAt(0) === 61 /* = */) formulas++;
      }
      if ((cells.length & 4095) === 0 && performance.now() - since > sliceMs) {
        await turn();
        since = performance.now();
      }
    }
    imported += cells.length;
    out.push({ sheet, cells });
  }
  summary.cells = imported;
  summary.formulas = formulas;
  return out;
}

/** Deletes a staging workbook, its cells a slice at a time. */
export async function discardStaging(ctx: AppContext, stagingId: string): Promise<void> {
  const sqlite = ctx.db.$client;
  // cells has no rowid (its key is sheet, row, column), so a slice is chosen by that key.
  const step = sqlite.prepare(
    'delete from cells where (sheet_id, row, col) in (select c.sheet_id, c.row, c.col from cells c join sheets s on s.id = c.sheet_id where s.workbook_id = ? limit 20000)',
  );
  while (step.run(stagingId).changes > 0) await turn();
  ctx.db.delete(workbooks).where(eq(workbooks.id, stagingId)).run();
}

/** Removes staging workbooks left by an import that never finished (a crash, a full disk). */
export async function sweepStagedImports(ctx: AppContext): Promise<number> {
  const left = ctx.db
    .select({ id: workbooks.id })
    .from(workbooks)
    .where(and(eq(workbooks.title, stagingTitle), notExists(ctx.db.select().from(workbookMembers).where(eq(workbookMembers.workbookId, workbooks.id)))))
    .all();
  for (const w of left) await discardStaging(ctx, w.id);
  return left.length;
}

export async function importStaged(ctx: AppContext, target: ImportTarget, userId: string, parsed: ParsedWorkbook, options: StagedImportOptions = {}): Promise<ImportOutcome & { workbookId: string }> {
  const summary: ImportSummary = { ...parsed.summary, skipped: [...parsed.summary.skipped], notes: [...parsed.summary.notes] };
  const checked = await checkedSheets(parsed, summary);
  const stop = () => {
    const reason = options.stopReason?.();
    if (reason) throw reason;
  };
  stop();

  const stagingId = randomUUID();
  const targetId = 'workbookId' in target ? target.workbookId : stagingId;
  // Cells carry the revision they were written in; the import's number is known only at the end, so
  // they get the next number now (never later than the real one: no edit predates the sheet).
  const expectedRevision = 'workbookId' in target ? (ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, target.workbookId)).get()?.revision ?? 0) + 1 : 1;
  const staged = checked.map((c, i) => ({ ...c, id: randomUUID(), stagingName: `${i}` }));
  try {
    ctx.db.transaction((tx) => {
      tx.insert(workbooks).values({ id: stagingId, title: stagingTitle, ownerId: userId }).run();
      for (const [i, s] of staged.entries()) {
        tx.insert(sheets).values({ id: s.id, workbookId: stagingId, name: s.stagingName, position: i, settings: settingsFromParsed(s.sheet, []), createdBy: userId }).run();
      }
    });
    const insert = cellInserter(ctx.db.$client);
    const slice = ctx.db.$client.transaction((sheetId: string, cells: readonly CellTriple[], from: number) => {
      const started = performance.now();
      let at = from;
      while (at < cells.length && performance.now() - started < sliceMs) {
        insert(sheetId, cells.slice(at, at + CELLS_PER_STEP), expectedRevision);
        at += CELLS_PER_STEP;
      }
      return at;
    });
    for (const s of staged) {
      for (let at = 0; at < s.cells.length; ) {
        at = slice(s.id, s.cells, at);
        await turn();
        stop();
      }
    }

    const outcome = ctx.db.transaction(
      (tx) => {
        if (!('workbookId' in target)) {
          tx.update(workbooks).set({ title: target.newWorkbook.title }).where(eq(workbooks.id, stagingId)).run();
          tx.insert(workbookMembers).values({ workbookId: stagingId, userId, role: 'owner' }).run();
        }
        const existing = targetId === stagingId ? [] : workbookSheets(tx, targetId);
        const taken = new Set(existing.map((s) => s.name.toLowerCase()));
        const ops: SheetOp[] = [];
        const added: { id: string; name: string }[] = [];
        for (const [i, s] of staged.entries()) {
          const name = importedSheetName(s.sheet.name, taken);
          if (name !== s.sheet.name) summary.notes.push(`sheet "${s.sheet.name}" was imported as "${name}" (the workbook already has that name, or it has characters sheet names cannot hold)`);
          const position = existing.length + i;
          tx.update(sheets).set({ workbookId: targetId, name, position }).where(eq(sheets.id, s.id)).run();
          ops.push({ op: 'add', sheetId: s.id, name, position, settings: settingsFromParsed(s.sheet, summary.notes), cells: s.cells });
          added.push({ id: s.id, name });
        }
        const revision = nextRevision(tx, targetId);
        const patch: RevisionPatch = { sheetOps: ops, changes: [] };
        recordRevision(tx, targetId, revision, userId, 'import' as RevisionKind, patch);
        if (targetId !== stagingId) tx.delete(workbooks).where(eq(workbooks.id, stagingId)).run();
        return { revision, sheets: added, patch };
      },
      { behavior: 'immediate' },
    );
    ctx.events.publish(targetId, { type: 'revision', workbookId: targetId, revision: outcome.revision, kind: 'import' as RevisionKind, authorId: userId, patch: outcome.patch });
    return { workbookId: targetId, revision: outcome.revision, sheets: outcome.sheets, summary: { ...summary, sheets: outcome.sheets.length } };
  } catch (first) {
    // The first error is the one that matters; a failing clean-up (the same full disk) is logged
    // beside it and left to the next start's sweep.
    ctx.logger.error({ err: first, userId }, 'import failed; its staged cells are being removed');
    try {
      await discardStaging(ctx, stagingId);
    } catch (cleanup) {
      ctx.logger.error({ err: cleanup, stagingId }, 'removing a failed import failed too; it is removed at the next start');
    }
    throw first;
  }
}
