// Opening a workbook at once from the values stored with its revision: the engine is first built
// from the first rows of each sheet only, with every formula replaced by its stored value, so the
// grid shows the first screenful and takes edits immediately; then, a slice at a time between
// frames, the rest of the rows' constants and stored values go in (building 100,000 cells at once
// holds the page for seconds), and after them the formulas are put back, each slice computed by
// the engine, until the workbook is live. Constants come first so that no formula is ever
// computed against rows not yet loaded.
// A cell edited meanwhile keeps the edit (its stored placeholder is forgotten); whatever depends on
// a not-yet-live formula catches up when that formula's slice comes.
import { engineInput } from '@functions/formulaTokens.js';

type Constant = string | number | boolean | null;

export interface PendingCell {
  sheetId: string;
  row: number;
  col: number;
}

/**
 * One sheet's formula cells still to put back, as two parallel lists of numbers rather than an object
 * per cell: a 100,000-row sheet has 700,000 of them, and as objects they were a good part of what the
 * page's garbage collector walked over and over while the workbook opened.
 */
export interface PendingFormulas {
  sheetId: string;
  rows: number[];
  cols: number[];
}

const cellKey = (sheetId: string, row: number, col: number) => `${sheetId}:${row}:${col}`;

/** The engine calls a slice needs; the model provides them (workbookModel.ts). */
export interface HydrationTarget {
  hasSheet(sheetId: string): boolean;
  engineIdOf(sheetId: string): number;
  inputOf(sheetId: string, row: number, col: number): string;
  /** Writes the cells with evaluation suspended, then refreshes the views of what changed. */
  writeEngine(cells: { sheetId: string; row: number; col: number; content: Constant }[]): void;
  /** Writes a block of rows from `row` on (column A first) and shows them. */
  writeRows(sheetId: string, row: number, block: Constant[][]): void;
}

/** Rows of one sheet's placeholder table still to be written to the engine, from `next` on. */
export interface PendingRows {
  sheetId: string;
  table: Constant[][];
  next: number;
}

const released: Constant[] = [];

export class Hydration {
  /** Formulas put back so far (or passed over), over all sheets. */
  private at = 0;
  /** The sheet of `formulas` being put back, and the place in it. */
  private sheetAt = 0;
  private cellAt = 0;
  /** Sheets whose later rows are not in the engine yet, in tab order. */
  private readonly rest: PendingRows[];
  /** Rows per constant slice, tuned like `chunk`. */
  private rowChunk = 100;
  private spillsCleared = false;
  private readonly edited = new Set<string>();
  /**
   * Formula cells per slice, tuned to the time a slice may take. The first slice is small: it runs the
   * functions' code for the first time (compiled then), and 200 extended-Hückel formulas held the
   * page for well over the budget.
   */
  private chunk = 20;
  readonly total: number;

  constructor(
    /** Formula cells to put back, per sheet in tab order, each row by row (the first screen comes first). */
    private readonly formulas: PendingFormulas[],
    private readonly spilled: PendingCell[],
    /** The revision whose stored values are shown until the engine is live. */
    readonly revision: number,
    rest: PendingRows[] = [],
    /** False when nothing was stored: formulas show empty until their slice (a large first open, built in slices rather than in one long task). */
    readonly fromStored = true,
  ) {
    this.total = formulas.reduce((n, f) => n + f.rows.length, 0);
    this.rest = rest.filter((r) => r.next < r.table.length);
  }

  /** Rows of the sheet the engine holds so far (every row once its constants are in). */
  rowsLoaded(sheetId: string): number {
    const r = this.rest.find((x) => x.sheetId === sheetId);
    return r ? r.next : Number.POSITIVE_INFINITY;
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

  /**
   * Puts back formulas for about `budgetMs`; returns whether the workbook is now live. The slice is
   * written in steps sized to a quarter of the budget, with a look at the clock after each: a step
   * that runs long (the garbage collector's marking lands in whatever allocates while it runs, and
   * doubled one slice's time) ends the slice instead of sizing a longer one.
   */
  slice(target: HydrationTarget, budgetMs: number): boolean {
    if (this.rest.length > 0) {
      const started = performance.now();
      do this.loadRows(target, budgetMs / 4);
      while (this.rest.length > 0 && performance.now() - started < budgetMs);
      return false;
    }
    const started = performance.now();
    do this.putBack(target, budgetMs / 4);
    while (this.at < this.total && performance.now() - started < budgetMs);
    return this.finished;
  }

  /** Puts back the next step of formulas, sized to take about `stepMs`. */
  private putBack(target: HydrationTarget, stepMs: number) {
    const started = performance.now();
    const cells: { sheetId: string; row: number; col: number; content: Constant }[] = [];
    if (!this.spillsCleared) {
      // Cells an array formula filled hold its stored values until it returns; cleared first, so
      // the returning formula finds room to spill.
      for (const c of this.spilled) if (target.hasSheet(c.sheetId) && !this.edited.has(cellKey(c.sheetId, c.row, c.col)) && target.inputOf(c.sheetId, c.row, c.col) === '') cells.push({ ...c, content: null });
      this.spillsCleared = true;
    }
    const end = Math.min(this.total, this.at + this.chunk);
    while (this.at < end) {
      const list = this.formulas[this.sheetAt];
      if (this.cellAt >= list.rows.length) {
        this.sheetAt++;
        this.cellAt = 0;
        continue;
      }
      const sheetId = list.sheetId;
      const row = list.rows[this.cellAt];
      const col = list.cols[this.cellAt];
      this.cellAt++;
      this.at++;
      if (!target.hasSheet(sheetId) || (this.edited.size > 0 && this.edited.has(cellKey(sheetId, row, col)))) continue;
      const input = target.inputOf(sheetId, row, col);
      if (input.startsWith('=')) cells.push({ sheetId, row, col, content: engineInput(input) });
    }
    if (cells.length > 0) target.writeEngine(cells);
    const perCell = (performance.now() - started) / Math.max(1, cells.length);
    // Grows at most fourfold a step: one quick step (formulas waiting on results) must not size the next.
    this.chunk = Math.max(20, Math.min(20_000, 4 * this.chunk, Math.floor(stepMs / Math.max(perCell, 0.001))));
  }

  /** Writes the next rows of placeholder constants (about `stepMs` of work); a cell written since the open keeps what was written. */
  private loadRows(target: HydrationTarget, stepMs: number) {
    const started = performance.now();
    const pending = this.rest[0];
    if (!target.hasSheet(pending.sheetId)) {
      this.rest.shift(); // removed meanwhile: nothing of it to load
      return;
    }
    const from = pending.next;
    const to = Math.min(pending.table.length, from + this.rowChunk);
    const block = pending.table.slice(from, to);
    for (const key of this.edited) {
      const [, sheetId, r, c] = /^(.*):(\d+):(\d+)$/.exec(key)!;
      const row = Number(r);
      if (sheetId !== pending.sheetId || row < from || row >= to) continue;
      const col = Number(c);
      const input = target.inputOf(sheetId, row, col);
      const line = (block[row - from] = [...(block[row - from] ?? [])]);
      while (line.length < col) line.push(null);
      line[col] = input === '' ? null : engineInput(input);
    }
    target.writeRows(pending.sheetId, from, block);
    // The engine holds these rows now: let their placeholders go (a large sheet's table is a good part of the page's memory).
    pending.table.fill(released, from, to);
    pending.next = to;
    if (to >= pending.table.length) this.rest.shift();
    const perRow = (performance.now() - started) / Math.max(1, to - from);
    // Grows at most fourfold a slice, like `chunk`: one quick slice must not size a long one.
    this.rowChunk = Math.max(10, Math.min(50_000, 4 * this.rowChunk, Math.floor(stepMs / Math.max(perRow, 0.001))));
  }
}
