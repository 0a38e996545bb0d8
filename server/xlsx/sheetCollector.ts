// What becomes of each cell reading, whichever reader produced it (the direct reader or exceljs):
// array-formula areas left to the engine, cells past the grid and unreadable cells listed with a
// reason, texts given an apostrophe where they would otherwise read as something else.
import { engineConfig } from '../../functions/engine.js';
import { cellName, parseRangeName, type CellRange } from '../../shared/a1.js';
import type { CellReading } from './cellInput.js';
import { asTextInput, textsNeedingApostrophe } from './textLiterals.js';
import type { CellTriple, ParsedSheet, SkippedCell } from './types.js';

const MAX_LISTED_NOTES = 50;
const maxRows = engineConfig.maxRows!;
const maxColumns = engineConfig.maxColumns!;

/** Cells handed to `onCells` at a time while reading (readSpreadsheet's streaming mode). */
export const CELLS_PER_BATCH = 8_192;

/**
 * Receives each sheet's cells in order, a batch at a time, as they are read: the caller can store one
 * batch while the next is read. `sheet` counts the sheets of the result (the provenance page skipped).
 */
export type CellBatchSink = (sheet: number, cells: CellTriple[]) => void;

interface PendingText {
  sheet: ParsedSheet;
  index: number;
  text: string;
}

/** Counts and lists over the whole workbook. */
export class ReadTally {
  cellCount = 0;
  formulas = 0;
  readonly skipped: SkippedCell[] = [];
  readonly notes: string[] = [];
  readonly pending: PendingText[] = [];

  note(text: string) {
    if (this.notes.length < MAX_LISTED_NOTES) this.notes.push(text);
  }

  /** Gives the texts read so far their apostrophe where they need one. */
  resolveTexts() {
    const pending = this.pending;
    const quote = textsNeedingApostrophe(pending.map((p) => p.text));
    pending.forEach((p, i) => (p.sheet.cells[p.index][2] = asTextInput(p.text, quote[i])));
    pending.length = 0;
  }
}

/** One sheet's cells as they are read, in row-major order. */
export class SheetCells {
  private readonly arrays: CellRange[] = [];
  private sent = 0;

  constructor(
    private readonly tally: ReadTally,
    readonly sheet: ParsedSheet,
    private readonly sheetIndex: number,
    private readonly onCells?: CellBatchSink,
  ) {}

  take(r: number, c: number, reading: CellReading): void {
    if (reading.kind === 'empty' || reading.kind === 'merged') return;
    const { arrays, tally, sheet } = this;
    // Cells inside an array formula's area are its spilled results, recomputed by the engine.
    if (arrays.length && arrays.some((a) => r >= a.top && r <= a.bottom && c >= a.left && c <= a.right && !(r === a.top && c === a.left))) return;
    if (r >= maxRows || c >= maxColumns) {
      tally.skipped.push({ sheet: sheet.name, address: cellName(r, c), reason: `outside Orbitab's grid of ${maxRows.toLocaleString('en')} rows × ${maxColumns.toLocaleString('en')} columns` });
      return;
    }
    if (reading.kind === 'skip') {
      tally.skipped.push({ sheet: sheet.name, address: cellName(r, c), reason: reading.reason });
      return;
    }
    tally.cellCount++;
    if (reading.kind === 'text') {
      tally.pending.push({ sheet, index: sheet.cells.length, text: reading.text });
      sheet.cells.push([r, c, '']);
      if (reading.note) tally.note(`${sheet.name}!${cellName(r, c)}: ${reading.note}`);
      return;
    }
    if (reading.kind === 'formula') {
      tally.formulas++;
      if (reading.arrayRef) {
        const area = parseRangeName(reading.arrayRef);
        if (area) arrays.push(area);
      }
    }
    sheet.cells.push([r, c, reading.input]);
    if (this.onCells && sheet.cells.length - this.sent >= CELLS_PER_BATCH) this.flush();
  }

  /** A batch goes out once its texts know whether they need an apostrophe. */
  flush(): void {
    if (!this.onCells) return;
    this.tally.resolveTexts();
    this.onCells(this.sheetIndex, this.sheet.cells.slice(this.sent));
    this.sent = this.sheet.cells.length;
  }
}
