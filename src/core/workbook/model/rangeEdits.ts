// Edits that write a block of cells at once: fill down/right, sort, paste and clear. Formulas that
// move are rewritten by the engine's own fill logic (getFillRangeData), so relative references
// shift as in any desktop spreadsheet and absolute ($A$1) ones stay. Plain values keep the exact
// text that was typed. Fill, sort and paste change all their cells or none: one locked, protected or
// spilled cell refuses the lot, since half a sort or half a paste would scramble the block.
import type { SimpleCellRange } from 'hyperformula';
import type { CellInput } from '../save/pendingStore.js';
import type { CellRange } from '@shared/a1.js';
import { sortPermutation, type SortDirection, type SortValue } from './sortFilter.js';
import type { EditOutcome, WorkbookModel } from './workbookModel.js';

/** The input a cell's content gets when copied from `from` to `to` (formulas re-pointed). */
export function movedInput(model: WorkbookModel, sheetId: string, from: { row: number; col: number }, to: { row: number; col: number }): string {
  const input = model.input(sheetId, from.row, from.col);
  if (!input.startsWith('=')) return input;
  model.ensureLive(); // the engine must hold the formula itself, not its stored value, to re-point it
  const engineId = model.sheet(sheetId).engineId;
  const source: SimpleCellRange = { start: { sheet: engineId, ...from }, end: { sheet: engineId, ...from } };
  const target: SimpleCellRange = { start: { sheet: engineId, ...to }, end: { sheet: engineId, ...to } };
  const [[content]] = model.engine.getFillRangeData(source, target);
  return content === null || content === undefined ? '' : String(content);
}

/** Ctrl+D: the top row of the block copied into every row below it. */
export function fillDown(model: WorkbookModel, sheetId: string, r: CellRange): EditOutcome {
  const changes: CellInput[] = [];
  for (let row = r.top + 1; row <= r.bottom; row++) {
    for (let col = r.left; col <= r.right; col++) changes.push({ sheetId, row, col, input: movedInput(model, sheetId, { row: r.top, col }, { row, col }) });
  }
  return model.edit(changes, { whole: true });
}

/** Ctrl+R: the left column of the block copied into every column to its right. */
export function fillRight(model: WorkbookModel, sheetId: string, r: CellRange): EditOutcome {
  const changes: CellInput[] = [];
  for (let col = r.left + 1; col <= r.right; col++) {
    for (let row = r.top; row <= r.bottom; row++) changes.push({ sheetId, row, col, input: movedInput(model, sheetId, { row, col: r.left }, { row, col }) });
  }
  return model.edit(changes, { whole: true });
}

/** Copies each source cell to its target (the grid's drag-fill handle), formulas re-pointed. */
export function fillPairs(model: WorkbookModel, sheetId: string, pairs: { from: { row: number; col: number }; to: { row: number; col: number } }[]): EditOutcome {
  return model.edit(pairs.map(({ from, to }) => ({ sheetId, row: to.row, col: to.col, input: movedInput(model, sheetId, from, to) })), { whole: true });
}

function sortValue(model: WorkbookModel, sheetId: string, row: number, col: number): SortValue {
  const v = model.engine.getCellValue({ sheet: model.sheet(sheetId).engineId, row, col });
  if (v === null || typeof v === 'number' || typeof v === 'string' || typeof v === 'boolean') return v;
  return { error: v.value };
}

/** Reorders the rows of the block by the values in one of its columns. */
export function sortRange(model: WorkbookModel, sheetId: string, r: CellRange, keyCol: number, direction: SortDirection): EditOutcome {
  const keys: SortValue[] = [];
  for (let row = r.top; row <= r.bottom; row++) keys.push(sortValue(model, sheetId, row, keyCol));
  const order = sortPermutation(keys, direction);
  const changes: CellInput[] = [];
  order.forEach((sourceOffset, targetOffset) => {
    if (sourceOffset === targetOffset) return;
    for (let col = r.left; col <= r.right; col++) {
      changes.push({ sheetId, row: r.top + targetOffset, col, input: movedInput(model, sheetId, { row: r.top + sourceOffset, col }, { row: r.top + targetOffset, col }) });
    }
  });
  return model.edit(changes, { whole: true });
}

/**
 * Pastes a block of inputs: row i of the block goes to sheet row `rows[i]` (the visible rows from
 * the paste point, so a filtered view pastes into what it shows), starting at column `left`.
 */
export function pasteBlock(model: WorkbookModel, sheetId: string, rows: readonly number[], left: number, block: readonly (readonly string[])[]): EditOutcome {
  const changes: CellInput[] = [];
  const { maxColumns } = model.engine.getConfig();
  block.forEach((line, i) => {
    if (rows[i] === undefined) return;
    line.forEach((input, j) => {
      if (left + j < maxColumns) changes.push({ sheetId, row: rows[i], col: left + j, input });
    });
  });
  return model.edit(changes, { whole: true });
}

export interface CopiedCells {
  sheetId: string;
  /** Sheet rows copied (the visible rows of the selection), and the column span. */
  rows: number[];
  left: number;
  right: number;
}

/**
 * Pastes cells copied inside this workbook with formulas re-pointed by the distance moved, so a
 * copied "=A1*2" pasted one row down reads "=A2*2". A single copied cell fills every target cell.
 */
export function pasteCopiedCells(model: WorkbookModel, sheetId: string, rows: readonly number[], left: number, width: number, source: CopiedCells): EditOutcome {
  const single = source.rows.length === 1 && source.left === source.right;
  const height = single ? rows.length : Math.min(rows.length, source.rows.length);
  const cols = single ? width : source.right - source.left + 1;
  const changes: CellInput[] = [];
  for (let i = 0; i < height; i++) {
    for (let j = 0; j < cols; j++) {
      const from = { row: source.rows[single ? 0 : i], col: source.left + (single ? 0 : j) };
      const to = { row: rows[i], col: left + j };
      const input = source.sheetId === sheetId ? movedInput(model, sheetId, from, to) : model.input(source.sheetId, from.row, from.col);
      changes.push({ sheetId, row: to.row, col: to.col, input });
    }
  }
  return model.edit(changes, { whole: true });
}

export function clearRange(model: WorkbookModel, sheetId: string, r: CellRange): EditOutcome {
  const changes: CellInput[] = [];
  for (let row = r.top; row <= r.bottom; row++) for (let col = r.left; col <= r.right; col++) if (model.input(sheetId, row, col) !== '') changes.push({ sheetId, row, col, input: '' });
  return model.edit(changes);
}
