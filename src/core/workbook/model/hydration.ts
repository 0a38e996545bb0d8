// Opening a workbook at once from the values stored with its revision: the engine is first built
// with every formula replaced by its stored value (as cheap as a sheet of plain numbers), so the
// grid shows the revision's values and takes edits immediately; then the formulas are put back a
// slice at a time between frames, each slice computed by the engine, until the workbook is live.
// A cell edited meanwhile keeps the edit (its stored placeholder is forgotten); whatever depends on
// a not-yet-live formula catches up when that formula's slice comes.
import type { ValuesPayload } from '@shared/workbooks.js';
import { engineInput } from '@functions/formulaTokens.js';
import type { SheetInputs } from './sheetInputs.js';

type Constant = string | number | boolean | null;

export interface PendingCell {
  sheetId: string;
  row: number;
  col: number;
}

const cellKey = (sheetId: string, row: number, col: number) => `${sheetId}:${row}:${col}`;

/** A stored value as engine input that reads back as that same value (text is quoted, never parsed). */
function constantOf(value: ValuesPayload['sheets'][number]['values'][number][2] | undefined): Constant {
  if (value === undefined) return null;
  if (typeof value === 'object') return value.error; // the engine reads an error literal as that error
  if (typeof value === 'string') return `'${value}`;
  return value;
}

/**
 * The engine's table for one sheet with formulas replaced by their stored values, the formula
 * cells to put back, and the cells only an array formula fills (cleared before formulas return).
 */
export function placeholderTable(sheetId: string, inputs: SheetInputs, stored: ValuesPayload['sheets'][number] | undefined) {
  const table: Constant[][] = inputs.toTable();
  const formulas: PendingCell[] = [];
  const spilled: PendingCell[] = [];
  for (const { row, col, input } of inputs.entries()) {
    if (!input.startsWith('=')) continue;
    table[row][col] = null; // an empty result is left out of the stored values
    formulas.push({ sheetId, row, col });
  }
  for (const [row, col, value] of stored?.values ?? []) {
    const input = inputs.get(row, col);
    if (input === '') {
      while (table.length <= row) table.push([]);
      while (table[row].length < col) table[row].push(null);
      spilled.push({ sheetId, row, col });
    } else if (!input.startsWith('=')) continue;
    table[row][col] = constantOf(value);
  }
  formulas.sort((a, b) => a.row - b.row || a.col - b.col);
  return { table, formulas, spilled };
}

/** The engine calls a slice needs; the model provides them (workbookModel.ts). */
export interface HydrationTarget {
  hasSheet(sheetId: string): boolean;
  engineIdOf(sheetId: string): number;
  inputOf(sheetId: string, row: number, col: number): string;
  /** Writes the cells with evaluation suspended, then refreshes the views of what changed. */
  writeEngine(cells: { sheetId: string; row: number; col: number; content: Constant }[]): void;
}

export class Hydration {
  private at = 0;
  private spillsCleared = false;
  private readonly edited = new Set<string>();
  /** Formula cells per slice, tuned to the time a slice may take. */
  private chunk = 200;
  readonly total: number;

  constructor(
    /** Formula cells to put back, in tab order then row by row (the first screen comes first). */
    private readonly formulas: PendingCell[],
    private readonly spilled: PendingCell[],
    /** The revision whose stored values are shown until the engine is live. */
    readonly revision: number,
    /** False when nothing was stored: formulas show empty until their slice (a large first open, built in slices rather than in one long task). */
    readonly fromStored = true,
  ) {
    this.total = formulas.length;
  }

  get done(): number {
    return Math.min(this.at, this.total);
  }

  get finished(): boolean {
    return this.at >= this.total && this.spillsCleared;
  }

  /** A cell written since the open (an edit, a colleague's change): its stored placeholder is gone. */
  forget(sheetId: string, row: number, col: number) {
    this.edited.add(cellKey(sheetId, row, col));
  }

  /** Puts back formulas for about `budgetMs`; returns whether the workbook is now live. */
  slice(target: HydrationTarget, budgetMs: number): boolean {
    const started = performance.now();
    const cells: { sheetId: string; row: number; col: number; content: Constant }[] = [];
    if (!this.spillsCleared) {
      // Cells an array formula filled hold its stored values until it returns; cleared first, so
      // the returning formula finds room to spill.
      for (const c of this.spilled) if (target.hasSheet(c.sheetId) && !this.edited.has(cellKey(c.sheetId, c.row, c.col)) && target.inputOf(c.sheetId, c.row, c.col) === '') cells.push({ ...c, content: null });
      this.spillsCleared = true;
    }
    const end = Math.min(this.total, this.at + this.chunk);
    for (; this.at < end; this.at++) {
      const c = this.formulas[this.at];
      if (!target.hasSheet(c.sheetId) || this.edited.has(cellKey(c.sheetId, c.row, c.col))) continue;
      const input = target.inputOf(c.sheetId, c.row, c.col);
      if (input.startsWith('=')) cells.push({ ...c, content: engineInput(input) });
    }
    if (cells.length > 0) target.writeEngine(cells);
    const perCell = (performance.now() - started) / Math.max(1, cells.length);
    this.chunk = Math.max(20, Math.min(20_000, Math.floor(budgetMs / Math.max(perCell, 0.001))));
    return this.finished;
  }
}
