// What the model needs before its first build, made a slice at a time: each sheet's typed inputs
// and, when opening on stored values, its placeholder table (hydration.ts). Made in one go these
// held the page for seconds on a 100,000-row workbook; here `step` does about `budgetMs` of work and
// is called again after the page has had its turn, until the model can be built (WorkbookModel's
// `prepared` option) without touching every cell again.
import { inTabOrder } from '@functions/workbookEngine.js';
import { engineInput } from '@functions/formulaTokens.js';
import type { SheetPayload, ValuesPayload, WorkbookPayload } from '@shared/workbooks.js';
import type { PendingCell, PendingFormulas } from './hydration.js';
import { SheetInputs } from './sheetInputs.js';

type Constant = string | number | boolean | null;
type StoredSheet = ValuesPayload['sheets'][number];

export interface HeldSheet {
  table: Constant[][];
  formulas: PendingFormulas;
  spilled: PendingCell[];
}

export interface PreparedOpen {
  /** The revision the preparation was made for (the model checks it against the payload's). */
  revision: number;
  inputs: Map<string, SheetInputs>;
  /** Per sheet, in tab order; null when not opening on stored values. */
  held: HeldSheet[] | null;
}

/** A stored value as engine input that reads back as that same value (text is quoted, never parsed). */
function constantOf(value: StoredSheet['values'][number][2] | undefined): Constant {
  if (value === undefined) return null;
  if (typeof value === 'object') return value.error; // the engine reads an error literal as that error
  if (typeof value === 'string') return `'${value}`;
  return value;
}

/** Cells handled between two looks at the clock. */
const STRIDE = 2_000;

type Phase = 'inputs' | 'rows' | 'cells' | 'stored' | 'order';

export class OpenPreparation {
  private readonly sheets: SheetPayload[];
  private readonly storedSheets: (StoredSheet | undefined)[] | null;
  private readonly inputs = new Map<string, SheetInputs>();
  private readonly held: HeldSheet[] | null;
  private sheet = 0;
  private phase: Phase = 'inputs';
  private at = 0;
  private ordered = true;
  private cols = 0;
  private done = false;

  /** `stored`: the values stored with the payload's revision, or null to prepare the inputs only. */
  constructor(
    private readonly payload: WorkbookPayload,
    stored: ValuesPayload | null,
  ) {
    this.sheets = inTabOrder(payload.sheets);
    const usable = stored?.revision === payload.revision ? stored : null;
    this.storedSheets = usable ? this.sheets.map((s) => usable.sheets.find((x) => x.id === s.id)) : null;
    this.held = usable ? this.sheets.map((s) => ({ table: [], formulas: { sheetId: s.id, rows: [], cols: [] }, spilled: [] })) : null;
  }

  /** About `budgetMs` of work; true once everything is prepared. */
  step(budgetMs: number): boolean {
    const started = performance.now();
    do this.advance();
    while (!this.done && performance.now() - started < budgetMs);
    return this.done;
  }

  result(): PreparedOpen {
    while (!this.done) this.advance();
    return { revision: this.payload.revision, inputs: this.inputs, held: this.held };
  }

  private advance() {
    const sheet = this.sheets[this.sheet];
    if (!sheet) {
      this.done = true;
      return;
    }
    const cells = sheet.cells;
    let inputs = this.inputs.get(sheet.id);
    if (!inputs) this.inputs.set(sheet.id, (inputs = new SheetInputs()));
    const held = this.held?.[this.sheet];
    const end = (n: number) => Math.min(n, this.at + STRIDE);
    switch (this.phase) {
      case 'inputs': {
        const to = end(cells.length);
        for (let i = this.at; i < to; i++) inputs.set(cells[i][0], cells[i][1], cells[i][2]);
        this.at = to;
        if (to < cells.length) return;
        if (!held) return this.nextSheet();
        this.cols = inputs.extent().cols;
        return this.enter('rows');
      }
      case 'rows': {
        // Built here rather than by inputs.toTable(): formulas are never translated for the engine
        // (their stored values stand in), which on a large sheet is most of the cost of the first build.
        const rows = inputs.extent().rows;
        const to = end(rows);
        for (let r = this.at; r < to; r++) held!.table.push(new Array<Constant>(this.cols).fill(null));
        this.at = to;
        return to < rows ? undefined : this.enter('cells');
      }
      case 'cells': {
        const to = end(cells.length);
        for (let i = this.at; i < to; i++) {
          const [row, col] = cells[i];
          const input = cells[i][2];
          if (inputs.get(row, col) !== input) continue; // a cell listed twice: the later entry is the one kept
          if (!input.startsWith('=')) {
            held!.table[row][col] = engineInput(input);
            continue;
          }
          // Left empty: an empty result is left out of the stored values.
          const { rows, cols } = held!.formulas;
          const n = rows.length;
          if (n > 0 && (rows[n - 1] > row || (rows[n - 1] === row && cols[n - 1] > col))) this.ordered = false;
          rows.push(row);
          cols.push(col);
        }
        this.at = to;
        return to < cells.length ? undefined : this.enter('stored');
      }
      case 'stored': {
        const values = this.storedSheets![this.sheet]?.values ?? [];
        const to = end(values.length);
        const table = held!.table;
        for (let i = this.at; i < to; i++) {
          const [row, col, value] = values[i];
          const input = inputs.get(row, col);
          if (input === '') {
            while (table.length <= row) table.push([]);
            while (table[row].length < col) table[row].push(null);
            held!.spilled.push({ sheetId: sheet.id, row, col });
          } else if (!input.startsWith('=')) continue;
          table[row][col] = constantOf(value);
        }
        this.at = to;
        return to < values.length ? undefined : this.enter('order');
      }
      case 'order':
        if (!this.ordered) sortByPlace(held!.formulas);
        return this.nextSheet();
    }
  }

  private enter(phase: Phase) {
    this.phase = phase;
    this.at = 0;
  }

  private nextSheet() {
    this.sheet++;
    this.ordered = true;
    this.enter('inputs');
  }
}

/** Puts the cells in row order, then column order (the payload lists them so already, as a rule). */
function sortByPlace(f: PendingFormulas) {
  const order = f.rows.map((_, i) => i).sort((a, b) => f.rows[a] - f.rows[b] || f.cols[a] - f.cols[b]);
  const rows = order.map((i) => f.rows[i]);
  const cols = order.map((i) => f.cols[i]);
  f.rows = rows;
  f.cols = cols;
}

/**
 * Runs `step` (about `budgetMs` of work, true when finished) again and again with the page's turn in
 * between; resolves true when finished, false when cancelled first.
 */
export function inSlices(step: (budgetMs: number) => boolean, budgetMs: number, isCancelled: () => boolean): Promise<boolean> {
  return new Promise((resolve) => {
    const tick = () => {
      if (isCancelled()) return resolve(false);
      if (step(budgetMs)) resolve(true);
      else setTimeout(tick, 0);
    };
    tick();
  });
}
