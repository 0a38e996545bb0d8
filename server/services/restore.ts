// Restoring revision n: the workbook is brought back to how it was right after revision n, as a NEW
// revision (kind 'restore'), so the restore itself can be viewed and undone like any other.
//
// How: starting from the current state in memory, every later revision is undone newest first (cell
// changes back to their `before`, sheet operations inverted). The inverted sheet operations are then
// replayed on the database in the same order (so deleted tabs come back with their ids and names,
// added ones go), and finally every cell that differs from the computed state is written.
//
// Restoring one sheet computes the same state but writes only that sheet's cells and settings: the
// other tabs, and the tab list itself (names, order, added or removed tabs), stay as they are now.
import type { CellChangeRecord, RevisionPatch, SheetOp, SheetSettings } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { cellKey } from '../../shared/a1.js';
import { badRequest, notFound } from '../errors.js';
import { sheetCells, writeCells, type Tx } from './cellStore.js';
import { currentRevision, nextRevision, patchesAfter, recordRevision } from './revisionLog.js';
import { recordAudit } from './audit.js';
import type { SheetActor } from '../../shared/team.js';
import { sheetActor } from './access.js';
import { assertMayChangeSheet, assertMayEditCells } from './protection.js';
import { applySheetOp, invertSheetOp, workbookSheets } from './sheetOps.js';

export interface ModelSheet {
  id: string;
  name: string;
  settings: SheetSettings;
  /** "row,col" → non-empty input */
  cells: Map<string, string>;
}

/** The workbook's content in memory: tabs in order with their cells. */
export interface Model {
  order: string[];
  sheets: Map<string, ModelSheet>;
}

const key = (row: number, col: number) => `${row},${col}`;

/** One record per cell: the first `before`, the last `after`; a cell that ends as it began drops out. */
function mergeChanges(...lists: CellChangeRecord[][]): CellChangeRecord[] {
  const merged = new Map<string, CellChangeRecord>();
  for (const c of lists.flat()) {
    const k = cellKey(c);
    const earlier = merged.get(k);
    merged.set(k, earlier ? { ...earlier, after: c.after } : c);
  }
  return [...merged.values()].filter((c) => c.before !== c.after);
}

export function loadModel(tx: Tx, workbookId: string): Model {
  const tabs = workbookSheets(tx, workbookId);
  const sheets = new Map<string, ModelSheet>();
  for (const s of tabs) {
    sheets.set(s.id, { id: s.id, name: s.name, settings: s.settings, cells: new Map(sheetCells(tx, s.id).map(([r, c, input]) => [key(r, c), input])) });
  }
  return { order: tabs.map((s) => s.id), sheets };
}

function modelSheet(model: Model, sheetId: string): ModelSheet {
  const sheet = model.sheets.get(sheetId);
  // The history and the tables disagree: refuse rather than restore something half-right.
  if (!sheet) throw new Error(`history refers to sheet ${sheetId}, which did not exist at that point`);
  return sheet;
}

function setModelCell(model: Model, sheetId: string, row: number, col: number, input: string) {
  const cells = modelSheet(model, sheetId).cells;
  if (input === '') cells.delete(key(row, col));
  else cells.set(key(row, col), input);
}

function applyToModel(model: Model, op: SheetOp) {
  switch (op.op) {
    case 'add':
      model.order.splice(op.position, 0, op.sheetId);
      model.sheets.set(op.sheetId, { id: op.sheetId, name: op.name, settings: op.settings, cells: new Map(op.cells.map(([r, c, input]) => [key(r, c), input])) });
      return;
    case 'delete':
      model.order.splice(model.order.indexOf(op.sheetId), 1);
      model.sheets.delete(op.sheetId);
      return;
    case 'rename':
      modelSheet(model, op.sheetId).name = op.after;
      return;
    case 'move':
      model.order.splice(op.from, 1);
      model.order.splice(op.to, 0, op.sheetId);
      return;
    case 'settings':
      modelSheet(model, op.sheetId).settings = op.after;
      return;
  }
}

/**
 * Undoes every revision after `target` in memory; returns the sheet operations that did it, in order.
 * `rewrittenOnly` collects the cells whose undone changes all came from tab operations (formulas a
 * rename or delete rewrote), which the restore may put back without cell-level permission.
 */
export function undoLaterRevisions(tx: Tx, workbookId: string, model: Model, target: number, rewrittenOnly = new Set<string>()): SheetOp[] {
  const undoOps: SheetOp[] = [];
  const editedByUsers = new Set<string>();
  for (const { patch } of patchesAfter(tx, workbookId, target)) {
    // A tab revision's cell changes are only ever the formula rewrites its operations caused.
    const rewritesOnly = patch.restoredFrom === undefined && patch.sheetOps.length > 0;
    for (const c of [...patch.changes].reverse()) {
      setModelCell(model, c.sheetId, c.row, c.col, c.before);
      (rewritesOnly ? rewrittenOnly : editedByUsers).add(cellKey(c));
    }
    for (const op of [...patch.sheetOps].reverse()) {
      const inverse = invertSheetOp(op);
      applyToModel(model, inverse);
      undoOps.push(inverse);
    }
  }
  for (const k of editedByUsers) rewrittenOnly.delete(k);
  return undoOps;
}

/** The cell writes that turn the database's sheet into the model's. */
function cellDifferences(tx: Tx, sheet: ModelSheet): CellChangeRecord[] {
  const stored = new Map(sheetCells(tx, sheet.id).map(([r, c, input]) => [key(r, c), input]));
  const keys = new Set([...stored.keys(), ...sheet.cells.keys()]);
  const changes: CellChangeRecord[] = [];
  for (const k of keys) {
    const before = stored.get(k) ?? '';
    const after = sheet.cells.get(k) ?? '';
    if (before === after) continue;
    const [row, col] = k.split(',').map(Number);
    changes.push({ sheetId: sheet.id, row, col, before, after });
  }
  return changes.sort((a, b) => a.row - b.row || a.col - b.col);
}

export function restoreRevision(ctx: AppContext, workbookId: string, authorId: string, target: number, sheetId?: string): { revision: number; changeCount: number } {
  const result = ctx.db.transaction(
    (tx) => {
      const current = currentRevision(tx, workbookId);
      if (target > current) throw notFound(`revision ${target}`);
      if (target === current) throw badRequest(`revision ${target} is the current revision; there is nothing to restore`);

      const model = loadModel(tx, workbookId);
      const rewrittenOnly = new Set<string>();
      const undoOps = undoLaterRevisions(tx, workbookId, model, target, rewrittenOnly);
      // A restore is an edit like any other: sheet roles, locks and protected ranges hold against it too.
      // Decided with the author's role on each sheet: a restore that would change a sheet they only
      // view is refused whole, naming the sheet, rather than applied in part.
      const actor = sheetActor(tx, workbookId, authorId);
      if (sheetId !== undefined) return restoreOneSheet(ctx, tx, workbookId, actor, target, model, sheetId, rewrittenOnly);
      const namesNow = new Map(workbookSheets(tx, workbookId).map((s) => [s.id, s.name]));
      for (const op of undoOps) {
        if (op.op !== 'add' && namesNow.has(op.sheetId)) assertMayChangeSheet(tx, workbookId, actor, op.sheetId, namesNow.get(op.sheetId)!, { deleting: op.op === 'delete' });
      }

      const revision = nextRevision(tx, workbookId);
      // Tabs first, in the order history undid them (each step was once a valid state, so names
      // never collide on the way); a re-created tab starts empty and gets its cells below.
      // Renames and deletes replayed here rewrite formulas again (rename back, or references to a
      // re-created tab restored below from the model); those rewrites are part of this revision too.
      const rewrites: CellChangeRecord[] = [];
      const sheetOps = undoOps.map((op) => applySheetOp(tx, workbookId, op.op === 'add' ? { ...op, cells: [] } : op, revision, authorId, rewrites));
      const differences = model.order.flatMap((id) => cellDifferences(tx, model.sheets.get(id)!));
      const userLevel = differences.filter((c) => !rewrittenOnly.has(cellKey(c)));
      assertMayEditCells(tx, workbookId, actor, userLevel, new Map(workbookSheets(tx, workbookId).map((s) => [s.id, s.name])));
      writeCells(ctx.db, revision, differences);
      const changes = mergeChanges(rewrites, differences);

      const patch: RevisionPatch = { sheetOps, changes, restoredFrom: target };
      recordRevision(tx, workbookId, revision, authorId, 'restore', patch);
      recordAudit(tx, workbookId, authorId, 'revision.restored', { restoredFrom: target, revision, changeCount: changes.length + sheetOps.length });
      return { revision, patch };
    },
    { behavior: 'immediate' },
  );
  ctx.events.publish(workbookId, { type: 'revision', workbookId, revision: result.revision, kind: 'restore', authorId, patch: result.patch });
  return { revision: result.revision, changeCount: result.patch.changes.length + result.patch.sheetOps.length };
}

/** One sheet back to its state in `model` (the workbook as of `target`); the rest is left alone. */
function restoreOneSheet(ctx: AppContext, tx: Tx, workbookId: string, actor: SheetActor, target: number, model: Model, sheetId: string, rewrittenOnly: Set<string>): { revision: number; patch: RevisionPatch } {
  const now = workbookSheets(tx, workbookId).find((s) => s.id === sheetId);
  if (!now) throw notFound('sheet');
  const then = model.sheets.get(sheetId);
  if (!then) throw badRequest(`sheet “${now.name}” did not exist after revision ${target}; bring back the whole workbook instead`);
  const differences = cellDifferences(tx, then);
  const settingsChanged = JSON.stringify(now.settings) !== JSON.stringify(then.settings);
  if (differences.length === 0 && !settingsChanged) throw badRequest(`sheet “${now.name}” is already as it was after revision ${target}; there is nothing to restore`);
  const names = new Map(workbookSheets(tx, workbookId).map((s) => [s.id, s.name]));
  const authorId = actor.id;
  if (settingsChanged) assertMayChangeSheet(tx, workbookId, actor, sheetId, now.name);
  assertMayEditCells(tx, workbookId, actor, differences.filter((c) => !rewrittenOnly.has(cellKey(c))), names);

  const revision = nextRevision(tx, workbookId);
  const rewrites: CellChangeRecord[] = [];
  const sheetOps = settingsChanged ? [applySheetOp(tx, workbookId, { op: 'settings', sheetId, before: now.settings, after: then.settings }, revision, authorId, rewrites)] : [];
  writeCells(ctx.db, revision, differences);
  const changes = mergeChanges(rewrites, differences);
  const patch: RevisionPatch = { sheetOps, changes, restoredFrom: target, restoredSheetId: sheetId };
  recordRevision(tx, workbookId, revision, authorId, 'restore', patch);
  recordAudit(tx, workbookId, authorId, 'revision.restored', { restoredFrom: target, sheetId, sheetName: now.name, revision, changeCount: changes.length + sheetOps.length });
  return { revision, patch };
}
