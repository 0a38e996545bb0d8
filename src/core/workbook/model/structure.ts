// Inserting and deleting rows and columns. The engine moves the cells and rewrites every formula
// that refers across the change (references follow their cells; references into deleted cells
// become #REF!). The server stores cells by position, so the patch carries every input that ended
// up different: the moved cells and the rewritten formulas, on any sheet. The server refuses that
// whole patch if one of those cells is in a locked sheet or a protected range not open to me, so the
// client refuses the operation first and puts every sheet back, rather than showing what cannot be saved.
import { actionTooLargeReason, maxCellsPerAction } from '@shared/workbooks.js';
import type { CellInput } from '../save/pendingStore.js';
import { diffInputs, type InputDifference, type SheetInputs } from './sheetInputs.js';
import type { WorkbookModel } from './workbookModel.js';
import type { HistoryEntry } from './history.js';

export interface StructuralOp {
  axis: 'row' | 'col';
  action: 'insert' | 'remove';
  /** The first row/column (0-based) inserted before or removed. */
  at: number;
  count: number;
}

export class StructureError extends Error {}

/** Where a cell ends up after the operation (null if it was removed). */
export function movedPosition(row: number, col: number, op: StructuralOp): { row: number; col: number } | null {
  const index = op.axis === 'row' ? row : col;
  if (index < op.at) return { row, col };
  let next: number;
  if (op.action === 'insert') next = index + op.count;
  else if (index < op.at + op.count) return null;
  else next = index - op.count;
  return op.axis === 'row' ? { row: next, col } : { row, col: next };
}

/** Applies the operation and returns the input changes it caused (already handed to onLocalChanges). */
export function applyStructural(model: WorkbookModel, sheetId: string, op: StructuralOp, record = true): CellInput[] {
  if (model.readOnly) throw new StructureError('View only — you view this workbook.');
  const blocked = model.structureRule?.(sheetId);
  if (blocked) throw new StructureError(blocked);
  if (!Number.isInteger(op.at) || op.at < 0 || !Number.isInteger(op.count) || op.count < 1) throw new StructureError('choose at least one row or column');
  // Formulas are read from the engine to see which ones the operation rewrote: all must be live.
  model.ensureLive();
  const target = model.sheet(sheetId);
  const { engine } = model;

  // The engine's own text of every formula before the change, to see which ones it rewrote.
  const formulasBefore = new Map<string, { row: number; col: number; formula: string }[]>();
  for (const s of model.sheets) {
    const list: { row: number; col: number; formula: string }[] = [];
    for (const e of s.inputs.entries()) {
      if (e.input.startsWith('=')) list.push({ row: e.row, col: e.col, formula: engine.getCellFormula({ sheet: s.engineId, row: e.row, col: e.col }) ?? e.input });
    }
    formulasBefore.set(s.id, list);
  }

  const span: [number, number] = [op.at, op.count];
  const possible =
    op.axis === 'row'
      ? op.action === 'insert'
        ? engine.isItPossibleToAddRows(target.engineId, span)
        : engine.isItPossibleToRemoveRows(target.engineId, span)
      : op.action === 'insert'
        ? engine.isItPossibleToAddColumns(target.engineId, span)
        : engine.isItPossibleToRemoveColumns(target.engineId, span);
  if (!possible) throw new StructureError(`cannot ${op.action} ${op.count} ${op.axis === 'row' ? 'row' : 'column'}(s) there (the sheet would exceed its size or split an array formula)`);
  if (op.axis === 'row') {
    if (op.action === 'insert') engine.addRows(target.engineId, span);
    else engine.removeRows(target.engineId, span);
  } else if (op.action === 'insert') engine.addColumns(target.engineId, span);
  else engine.removeColumns(target.engineId, span);

  const before = new Map<string, SheetInputs>(model.sheets.map((s) => [s.id, s.inputs]));
  target.inputs = target.inputs.shifted(op.axis, op.at, op.action === 'insert' ? op.count : -op.count);
  for (const s of model.sheets) {
    for (const f of formulasBefore.get(s.id)!) {
      const pos = s.id === sheetId ? movedPosition(f.row, f.col, op) : { row: f.row, col: f.col };
      if (!pos) continue;
      const now = engine.getCellFormula({ sheet: s.engineId, row: pos.row, col: pos.col });
      if (now !== undefined && now !== f.formula) {
        if (s.inputs === before.get(s.id)) s.inputs = s.inputs.clone();
        s.inputs.set(pos.row, pos.col, now);
      }
    }
  }

  const differences = new Map<string, InputDifference[]>();
  const changes: CellInput[] = [];
  for (const s of model.sheets) {
    if (s.inputs === before.get(s.id)) continue;
    const d = diffInputs(before.get(s.id)!, s.inputs);
    if (d.length === 0) continue;
    differences.set(s.id, d);
    for (const x of d) changes.push({ sheetId: s.id, row: x.row, col: x.col, input: x.after });
  }
  let refusal: string | null = changes.length > maxCellsPerAction ? actionTooLargeReason(changes.length) : null;
  if (!refusal) for (const c of changes) if ((refusal = model.protectionReason(c.sheetId, c.row, c.col))) break;
  if (refusal) {
    putBack(model, before);
    throw new StructureError(refusal);
  }
  if (record) model.history.push({ kind: 'structure', sheetId, op, differences });
  model.invalidateViews();
  if (changes.length > 0) model.onLocalChanges(changes);
  return changes;
}

/** Every sheet the operation touched gets its inputs and engine content back, as before it. */
function putBack(model: WorkbookModel, before: ReadonlyMap<string, SheetInputs>) {
  model.engine.suspendEvaluation();
  try {
    for (const s of model.sheets) {
      const original = before.get(s.id)!;
      if (s.inputs === original) continue;
      s.inputs = original;
      model.engine.setSheetContent(s.engineId, original.toTable());
    }
  } finally {
    model.engine.resumeEvaluation();
  }
  model.invalidateViews();
}

/** Undoes my last edit; false when there is nothing to undo. */
export function undoLast(model: WorkbookModel): boolean {
  return replay(model, 'before');
}

/** Redoes my last undone edit; false when there is nothing to redo. */
export function redoLast(model: WorkbookModel): boolean {
  return replay(model, 'after');
}

/** Takes my last edit (undo) or my last undone edit (redo) from the history and brings the sheet to its `side`. */
function replay(model: WorkbookModel, side: 'before' | 'after'): boolean {
  const undoing = side === 'before';
  const entry = undoing ? model.history.takeUndo() : model.history.takeRedo();
  if (!entry) return false;
  try {
    bringTo(model, entry, side);
  } catch (e) {
    // Refused (a lock): the entry goes back on the stack it came from.
    if (undoing) model.history.untakeUndo();
    else model.history.untakeRedo();
    throw e;
  }
  return true;
}

/** Brings the sheets to one side of an entry (a group's steps in reverse when undoing). */
function bringTo(model: WorkbookModel, entry: HistoryEntry, side: 'before' | 'after') {
  const undoing = side === 'before';
  if (entry.kind === 'group') {
    for (const e of undoing ? [...entry.entries].reverse() : entry.entries) bringTo(model, e, side);
    return;
  }
  if (entry.kind === 'cells') {
    // All or nothing, like the action it takes back: half an undone paste would be a new state that
    // neither the screen's history nor the server has seen.
    const outcome = model.edit(
      entry.changes.filter((c) => model.hasSheet(c.sheetId)).map((c) => ({ sheetId: c.sheetId, row: c.row, col: c.col, input: c[side] })),
      { record: false, whole: true },
    );
    if (outcome.refused.length > 0) throw new StructureError(outcome.refused[0].reason);
    return;
  }
  const op: StructuralOp = undoing ? { ...entry.op, action: entry.op.action === 'insert' ? 'remove' : 'insert' } : entry.op;
  applyStructural(model, entry.sheetId, op, false);
  restore(model, entry.differences, side);
}

/** Puts back inputs the engine could not restore by itself (deleted cells, #REF! formulas, typed spellings). */
function restore(model: WorkbookModel, differences: Map<string, InputDifference[]>, side: 'before' | 'after') {
  const fixes: CellInput[] = [];
  for (const [sheetId, list] of differences) {
    if (!model.hasSheet(sheetId)) continue;
    for (const d of list) if (model.input(sheetId, d.row, d.col) !== d[side]) fixes.push({ sheetId, row: d.row, col: d.col, input: d[side] });
  }
  model.edit(fixes, { record: false });
}
