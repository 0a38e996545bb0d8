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
import { nextRevision, recordRevisionJson } from '../services/revisionLog.js';
import { workbookSheets } from '../services/sheetOps.js';
import { cellName } from '../../shared/a1.js';
import { cellInserter, importedSheetName, type ImportOutcome } from './importStore.js';
import { parseInWorker, type ParseResult } from './parseInWorker.js';
import { settingsFromParsed } from './sheetSettings.js';
import type { CellTriple, ImportSummary, ParsedWorkbook } from './types.js';

/** The title of a staging workbook; with no members it is what the start-up sweep removes. */
export const stagingTitle = 'Import in progress';
/** Cells stored per transaction when a read sheet is stored whole (a CSV, say), a turn of the event loop between. */
const CELLS_PER_STEP = 2_048;

const turn = () => new Promise<void>((resolve) => setImmediate(resolve));

export type ImportTarget = { workbookId: string } | { newWorkbook: { title: string } };

export interface StagedImportOptions {
  /** Asked between steps: an error to stop with (the server shutting down, say), or null. */
  stopReason?: () => HttpError | null;
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

interface StagedSheet {
  id: string;
  /** The cells kept, and the same as JSON array items (turned into text batch by batch, while the file is still being read). */
  cells: CellTriple[];
  json: string[];
}

/**
 * One import being stored: batches of a sheet's cells are checked and written into the staging
 * workbook as they come (`add`, one short transaction each, so the next batch can be read meanwhile),
 * then `finish` moves the sheets into their workbook as one revision.
 */
export class StagedImport {
  readonly stagingId = randomUUID();
  private readonly targetId: string;
  private readonly expectedRevision: number;
  private readonly staged: StagedSheet[] = [];
  private insert: ReturnType<typeof cellInserter> | null = null;
  private formulas = 0;
  private skipped: { sheet: number; address: string; reason: string }[] = [];
  private started = false;

  constructor(
    private readonly ctx: AppContext,
    private readonly target: ImportTarget,
    private readonly userId: string,
  ) {
    this.targetId = 'workbookId' in target ? target.workbookId : this.stagingId;
    // Cells carry the revision they were written in; the import's number is known only at the end, so
    // they get the next number now (never later than the real one: no edit predates the sheet).
    this.expectedRevision =
      'workbookId' in target ? (ctx.db.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, target.workbookId)).get()?.revision ?? 0) + 1 : 1;
  }

  private sheet(index: number): StagedSheet {
    const db = this.ctx.db;
    if (!this.started) {
      db.insert(workbooks).values({ id: this.stagingId, title: stagingTitle, ownerId: this.userId }).run();
      this.started = true;
    }
    // Sheets are read in order; one with no cells still gets its staging row.
    while (this.staged.length <= index) {
      const s: StagedSheet = { id: randomUUID(), cells: [], json: [] };
      db.insert(sheets).values({ id: s.id, workbookId: this.stagingId, name: `${this.staged.length}`, position: this.staged.length, settings: {}, createdBy: this.userId }).run();
      this.staged.push(s);
    }
    return this.staged[index];
  }

  /** Checks a batch of sheet `index`'s cells (the checks a typed input meets) and stores those that pass. */
  add(index: number, cells: readonly CellTriple[]): void {
    const sheet = this.sheet(index);
    const kept: CellTriple[] = [];
    for (const cell of cells) {
      const input = cell[2];
      const problem = input.length > maxInputLength ? `longer than ${maxInputLength.toLocaleString('en')} characters` : cellInputProblem(input);
      if (problem) this.skipped.push({ sheet: index, address: cellName(cell[0], cell[1]), reason: problem });
      else {
        kept.push(cell);
        if (input.charCodeAt(0) === 61 /* = */) this.formulas++;
      }
    }
    if (kept.length === 0) return;
    this.insert ??= cellInserter(this.ctx.db.$client);
    const insert = this.insert;
    this.ctx.db.$client.transaction(() => insert(sheet.id, kept, this.expectedRevision))();
    for (const cell of kept) sheet.cells.push(cell);
    sheet.json.push(JSON.stringify(kept).slice(1, -1));
  }

  /** Adds whole sheets not already added batch by batch, with a turn of the event loop between batches. */
  async addSheets(parsed: ParsedWorkbook, done: ReadonlySet<number>, stop: () => void): Promise<void> {
    for (const [i, sheet] of parsed.sheets.entries()) {
      if (done.has(i)) continue;
      this.sheet(i);
      for (let at = 0; at < sheet.cells.length; at += CELLS_PER_STEP) {
        this.add(i, sheet.cells.slice(at, at + CELLS_PER_STEP));
        await turn();
        stop();
      }
    }
  }

  /** Moves the staged sheets into their workbook as one revision and announces it. */
  finish(parsed: ParsedWorkbook): ImportOutcome & { workbookId: string } {
    const { ctx, target, targetId, stagingId, userId } = this;
    parsed.sheets.forEach((_, i) => this.sheet(i));
    const summary: ImportSummary = { ...parsed.summary, skipped: [...parsed.summary.skipped], notes: [...parsed.summary.notes] };
    for (const s of this.skipped) summary.skipped.push({ sheet: parsed.sheets[s.sheet].name, address: s.address, reason: s.reason });
    summary.cells = this.staged.reduce((n, s) => n + s.cells.length, 0);
    summary.formulas = this.formulas;
    const outcome = ctx.db.transaction(
      (tx) => {
        if (!('workbookId' in target)) {
          tx.update(workbooks).set({ title: target.newWorkbook.title }).where(eq(workbooks.id, stagingId)).run();
          tx.insert(workbookMembers).values({ workbookId: stagingId, userId, role: 'owner' }).run();
        }
        const existing = targetId === stagingId ? [] : workbookSheets(tx, targetId);
        const taken = new Set(existing.map((s) => s.name.toLowerCase()));
        const ops: SheetOp[] = [];
        const opsJson: string[] = [];
        const added: { id: string; name: string }[] = [];
        for (const [i, s] of this.staged.entries()) {
          const parsedSheet = parsed.sheets[i];
          const name = importedSheetName(parsedSheet.name, taken);
          if (name !== parsedSheet.name) summary.notes.push(`sheet "${parsedSheet.name}" was imported as "${name}" (the workbook already has that name, or it has characters sheet names cannot hold)`);
          const position = existing.length + i;
          const settings = settingsFromParsed(parsedSheet, summary.notes);
          tx.update(sheets).set({ workbookId: targetId, name, position, settings }).where(eq(sheets.id, s.id)).run();
          const op = { op: 'add', sheetId: s.id, name, position, settings } as const;
          ops.push({ ...op, cells: s.cells });
          // The same text JSON.stringify gives the op with its cells (the last key), from the batches' JSON.
          opsJson.push(`${JSON.stringify(op).slice(0, -1)},"cells":[${s.json.join(',')}]}`);
          added.push({ id: s.id, name });
        }
        const revision = nextRevision(tx, targetId);
        const patch: RevisionPatch = { sheetOps: ops, changes: [] };
        recordRevisionJson(ctx.db, targetId, revision, userId, 'import' as RevisionKind, `{"sheetOps":[${opsJson.join(',')}],"changes":[]}`);
        if (targetId !== stagingId) tx.delete(workbooks).where(eq(workbooks.id, stagingId)).run();
        return { revision, sheets: added, patch };
      },
      { behavior: 'immediate' },
    );
    ctx.events.publish(targetId, { type: 'revision', workbookId: targetId, revision: outcome.revision, kind: 'import' as RevisionKind, authorId: userId, patch: outcome.patch });
    return { workbookId: targetId, revision: outcome.revision, sheets: outcome.sheets, summary: { ...summary, sheets: outcome.sheets.length } };
  }

  /** Removes what was staged (after a failure); a failing clean-up is left to the next start's sweep. */
  async discard(first: unknown): Promise<void> {
    // Nothing staged yet (a file refused before its first cell): nothing to remove.
    if (!this.started) return;
    // The first error is the one that matters; a failing clean-up (the same full disk) is logged beside it.
    this.ctx.logger.error({ err: first, userId: this.userId }, 'import failed; its staged cells are being removed');
    try {
      await discardStaging(this.ctx, this.stagingId);
    } catch (cleanup) {
      this.ctx.logger.error({ err: cleanup, stagingId: this.stagingId }, 'removing a failed import failed too; it is removed at the next start');
    }
  }
}

const stopper = (options: StagedImportOptions) => () => {
  const reason = options.stopReason?.();
  if (reason) throw reason;
};

/** Stores an already read workbook (tests, the CLI): its sheets in short steps, then one revision. */
export async function importStaged(ctx: AppContext, target: ImportTarget, userId: string, parsed: ParsedWorkbook, options: StagedImportOptions = {}): Promise<ImportOutcome & { workbookId: string }> {
  const stop = stopper(options);
  stop();
  const staging = new StagedImport(ctx, target, userId);
  try {
    await staging.addSheets(parsed, new Set(), stop);
    return staging.finish(parsed);
  } catch (e) {
    await staging.discard(e);
    throw e;
  }
}

/**
 * Reads an upload in a worker and stores it as it is read: each batch of an .xlsx sheet's cells is
 * written into the staging workbook while the worker reads the next, so storing overlaps reading.
 * `beforeFinish` runs once the file is read, before anything becomes visible (the access check).
 */
export async function readAndImport(
  ctx: AppContext,
  target: ImportTarget,
  userId: string,
  file: { buffer: Uint8Array; filename: string },
  options: StagedImportOptions & { owner?: string; beforeFinish?: () => void; onRead?: (parsed: ParseResult) => void } = {},
): Promise<ImportOutcome & { workbookId: string }> {
  const stop = stopper(options);
  stop();
  const staging = new StagedImport(ctx, target, userId);
  try {
    const parsed = await parseInWorker(file.buffer, file.filename, {
      owner: options.owner,
      onCells: (sheet, cells) => {
        stop();
        staging.add(sheet, cells);
      },
    });
    options.onRead?.(parsed);
    await staging.addSheets(parsed, new Set(parsed.streamedSheets), stop);
    options.beforeFinish?.();
    return staging.finish(parsed);
  } catch (e) {
    await staging.discard(e);
    throw e;
  }
}
