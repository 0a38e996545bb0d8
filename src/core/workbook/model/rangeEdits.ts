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

/** The computed values of a block, row by row (for telling a header row from data). */
export function blockValues(model: WorkbookModel, sheetId: string, r: CellRange): SortValue[][] {
  const out: SortValue[][] = [];
  for (let row = r.top; row <= r.bottom; row++) {
    const line: SortValue[] = [];
    for (let col = r.left; col <= r.right; col++) line.push(sortValue(model, sheetId, row, col));
    out.push(line);
  }
  return out;
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
 * How many times a copied block is laid down over a selection: as desktop spreadsheets do (common
 * practice), a selection that is a whole multiple of the block in both directions is tiled with it;
 * any other selection gets the block once, with the reason in words when the selection was larger.
 */
export function pasteRepeats(selection: { height: number; width: number }, block: { height: number; width: number }): { down: number; across: number; note: string | null } {
  const fits = (sel: number, b: number) => sel >= b && sel % b === 0;
  if (fits(selection.height, block.height) && fits(selection.width, block.width)) {
    return { down: selection.height / block.height, across: selection.width / block.width, note: null };
  }
  const larger = selection.height > block.height || selection.width > block.width;
  const size = (h: number, w: number) => `${h} × ${w}`;
  const note = larger
    ? `Pasted once: the selection (${size(selection.height, selection.width)} cells) is not a whole multiple of the copied block (${size(block.height, block.width)}), so it cannot be repeated evenly.`
    : null;
  return { down: 1, across: 1, note };
}

/**
 * Pastes cells copied inside this workbook with formulas re-pointed by the distance moved, so a
 * copied "=A1*2" pasted one row down reads "=A2*2". The block is laid down `down` × `across` times
 * (see pasteRepeats); `rows` are the sheet rows of the whole target, top to bottom.
 */
export function pasteCopiedCells(model: WorkbookModel, sheetId: string, rows: readonly number[], left: number, source: CopiedCells, repeats: { down: number; across: number } = { down: 1, across: 1 }): EditOutcome {
  const blockHeight = source.rows.length;
  const blockWidth = source.right - source.left + 1;
  const changes: CellInput[] = [];
  const height = Math.min(rows.length, blockHeight * repeats.down);
  for (let i = 0; i < height; i++) {
    for (let j = 0; j < blockWidth * repeats.across; j++) {
      const from = { row: source.rows[i % blockHeight], col: source.left + (j % blockWidth) };
      const to = { row: rows[i], col: left + j };
      const input = source.sheetId === sheetId ? movedInput(model, sheetId, from, to) : model.input(source.sheetId, from.row, from.col);
      changes.push({ sheetId, row: to.row, col: to.col, input });
    }
  }
  return model.edit(changes, { whole: true });
}

/** Repeats a block of text `down` × `across` times (a pasted block tiled over the selection). */
export function tileBlock(block: readonly (readonly string[])[], down: number, across: number): string[][] {
  const width = Math.max(0, ...block.map((r) => r.length));
  const out: string[][] = [];
  for (let d = 0; d < down; d++) {
    for (const line of block) {
      const padded = Array.from({ length: width }, (_, j) => line[j] ?? '');
      out.push(Array.from({ length: across }, () => padded).flat());
    }
  }
  return out;
}

/** Empties a block (the rows given, columns left..right) as one edit: one undo step, one patch. */
export function clearRange(model: WorkbookModel, sheetId: string, rows: readonly number[], left: number, right: number): EditOutcome {
  const changes: CellInput[] = [];
  for (const row of rows) for (let col = left; col <= right; col++) if (model.input(sheetId, row, col) !== '') changes.push({ sheetId, row, col, input: '' });
  return model.edit(changes);
}
