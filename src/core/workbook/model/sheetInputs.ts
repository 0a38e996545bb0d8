// The inputs of one sheet exactly as people typed them ("1.50" stays "1.50"), kept beside the engine
// because the engine normalises what it stores. Sparse: only non-empty cells have an entry.

import { engineInput } from '@functions/formulaTokens.js';

const COLUMN_SPAN = 4096; // > the engine's 2,000 columns, so row * span + col never collides
/**
 * Rows per map: the cells are kept in one map per block of rows rather than one map for the sheet.
 * A map grows by copying itself whole into one twice the size, and one map of 800,000 cells held
 * the page for a third of a second at one step of that while a large workbook opened.
 */
const BLOCK_ROWS = 256;

export interface InputEntry {
  row: number;
  col: number;
  input: string;
}

export interface InputDifference {
  row: number;
  col: number;
  before: string;
  after: string;
}

export class SheetInputs {
  /** Per block of BLOCK_ROWS rows: row * COLUMN_SPAN + col → input. */
  private blocks: (Map<number, string> | undefined)[] = [];
  private count = 0;
  /** One past the last used row and column, kept as cells are set (a scan of 800,000 cells per ask held the page); null after a delete until asked again. */
  private bounds: { rows: number; cols: number } | null = { rows: 0, cols: 0 };

  static from(entries: Iterable<readonly [number, number, string]>): SheetInputs {
    const s = new SheetInputs();
    for (const [row, col, input] of entries) s.set(row, col, input);
    return s;
  }

  get size() {
    return this.count;
  }

  get(row: number, col: number): string {
    return this.blocks[Math.floor(row / BLOCK_ROWS)]?.get(row * COLUMN_SPAN + col) ?? '';
  }

  set(row: number, col: number, input: string) {
    const b = Math.floor(row / BLOCK_ROWS);
    let block = this.blocks[b];
    if (input === '') {
      if (block?.delete(row * COLUMN_SPAN + col)) {
        this.count--;
        if (this.bounds && (row + 1 >= this.bounds.rows || col + 1 >= this.bounds.cols)) this.bounds = null;
      }
      return;
    }
    if (!block) {
      // Filled up to here first, so the list stays a dense array however the rows arrive.
      while (this.blocks.length < b) this.blocks.push(undefined);
      this.blocks[b] = block = new Map();
    }
    const size = block.size;
    block.set(row * COLUMN_SPAN + col, input);
    this.count += block.size - size;
    if (this.bounds) {
      if (row >= this.bounds.rows) this.bounds.rows = row + 1;
      if (col >= this.bounds.cols) this.bounds.cols = col + 1;
    }
  }

  /** Every cell, a block of rows after another (within a block, in the order the cells were set). */
  *entries(): IterableIterator<InputEntry> {
    for (const block of this.blocks) {
      if (block) for (const [key, input] of block) yield { row: Math.floor(key / COLUMN_SPAN), col: key % COLUMN_SPAN, input };
    }
  }

  clone(): SheetInputs {
    const s = new SheetInputs();
    s.blocks = this.blocks.map((b) => b && new Map(b));
    s.count = this.count;
    s.bounds = this.bounds && { ...this.bounds };
    return s;
  }

  /** Rows (or columns) from `at` on move by `delta`; a negative delta first drops the rows it covers. */
  shifted(axis: 'row' | 'col', at: number, delta: number): SheetInputs {
    const s = new SheetInputs();
    for (const { row, col, input } of this.entries()) {
      const index = axis === 'row' ? row : col;
      if (index < at) s.set(row, col, input);
      else if (delta < 0 && index < at - delta) continue; // removed
      else if (axis === 'row') s.set(row + delta, col, input);
      else s.set(row, col + delta, input);
    }
    return s;
  }

  /** One past the last used row and column (0 × 0 for an empty sheet). */
  extent(): { rows: number; cols: number } {
    if (!this.bounds) {
      let rows = 0;
      let cols = 0;
      for (const block of this.blocks) {
        if (!block) continue;
        for (const key of block.keys()) {
          rows = Math.max(rows, Math.floor(key / COLUMN_SPAN) + 1);
          cols = Math.max(cols, (key % COLUMN_SPAN) + 1);
        }
      }
      this.bounds = { rows, cols };
    }
    return { ...this.bounds };
  }

  /** A dense table for the engine (null for empty cells), in the text the engine reads (engineInput). */
  toTable(): (string | null)[][] {
    const { rows, cols } = this.extent();
    const table: (string | null)[][] = Array.from({ length: rows }, () => new Array<string | null>(cols).fill(null));
    for (const { row, col, input } of this.entries()) table[row][col] = engineInput(input);
    return table;
  }
}

/** Every cell whose input differs between two states of a sheet. */
export function diffInputs(before: SheetInputs, after: SheetInputs): InputDifference[] {
  const out: InputDifference[] = [];
  for (const { row, col, input } of before.entries()) {
    const next = after.get(row, col);
    if (next !== input) out.push({ row, col, before: input, after: next });
  }
  for (const { row, col, input } of after.entries()) {
    if (before.get(row, col) === '') out.push({ row, col, before: '', after: input });
  }
  return out;
}
