// A workbook's engine kept between revisions: built once, then brought forward patch by patch (the
// engine recomputes only what depends on the changed cells), and read into what is stored with each
// revision: the /values answer and what an export needs beyond it (storedFormat.ts).
import { DetailedCellError, ErrorType, type ExportedChange, ExportedCellChange, type HyperFormula } from 'hyperformula';
import { explainCellError } from '../../functions/cellErrors.js';
import { engineInput } from '../../functions/formulaTokens.js';
import { isPendingMessage } from '../../functions/structureResults.js';
import '../../functions/openchemlibNode.js';
import { callsVolatileFunction } from '../../functions/volatile.js';
import { buildWorkbookEngine } from '../../functions/workbookEngine.js';
import type { CellTriple } from '../xlsx/types.js';
import type { StoredValueExtras, ValueEntry, ValuesPayload } from '../../shared/workbooks.js';
import { computeSheet, functionsUsedIn, isEngineError } from '../xlsx/engineValues.js';
import { capValuesPayload } from '../xlsx/longTexts.js';

/** Cell keys as numbers: a row never has more than the engine's 2,000 columns (functions/engine.ts). */
const key = (row: number, col: number) => row * 4096 + col;

export interface WarmSheetInput {
  id: string;
  name: string;
  cells: readonly CellTriple[];
}

export interface CellChange {
  sheetId: string;
  row: number;
  col: number;
  /** The new input; '' clears the cell. */
  input: string;
}

export interface ValuesSnapshot {
  payload: ValuesPayload;
  extras: StoredValueExtras;
  /** Formulas calling a function of the clock or of chance. */
  volatileFormulas: number;
  /** Cells waiting for an extended-Hückel result: such values are not final and are not stored. */
  pendingCells: number;
}

interface WarmSheet {
  id: string;
  name: string;
  engineId: number;
  inputs: Map<number, string>;
}

export class WarmWorkbook {
  engine: HyperFormula;
  private readonly sheets: WarmSheet[];
  private volatileCount = 0;
  /** Cells showing #CYCLE! at the last snapshot. */
  private cycles = 0;
  /** Times the engine was built again from the inputs rather than patched (tests, benchmarks). */
  rebuilds = 0;

  constructor(
    sheets: readonly WarmSheetInput[],
    public revision: number,
  ) {
    this.engine = buildWorkbookEngine(sheets.map((s) => ({ name: s.name, cells: s.cells })), { undoLimit: 0 });
    this.sheets = sheets.map((s) => {
      const inputs = new Map<number, string>();
      for (const [row, col, input] of s.cells) {
        if (input === '') continue;
        inputs.set(key(row, col), input);
        if (callsVolatileFunction(input)) this.volatileCount++;
      }
      return { id: s.id, name: s.name, engineId: this.engine.getSheetId(s.name)!, inputs };
    });
  }

  get cellCount(): number {
    return this.sheets.reduce((n, s) => n + s.inputs.size, 0);
  }

  /** Whether every change is to a sheet this engine holds (otherwise it must be built again). */
  canApply(changes: readonly CellChange[]): boolean {
    return changes.every((c) => this.sheets.some((s) => s.id === c.sheetId));
  }

  /**
   * Writes the changes with evaluation suspended (one recomputation of their dependents at the end)
   * and returns the cells whose value changed, as [sheet id, row, col]; null when the engine was
   * built again instead (cycles).
   */
  apply(changes: readonly CellChange[], revision: number): [string, number, number][] | null {
    const byId = new Map(this.sheets.map((s) => [s.id, s]));
    this.engine.suspendEvaluation();
    let changed: ExportedChange[];
    try {
      for (const c of changes) {
        const sheet = byId.get(c.sheetId)!;
        const k = key(c.row, c.col);
        const before = sheet.inputs.get(k);
        if (before !== undefined && callsVolatileFunction(before)) this.volatileCount--;
        if (c.input === '') sheet.inputs.delete(k);
        else {
          sheet.inputs.set(k, c.input);
          if (callsVolatileFunction(c.input)) this.volatileCount++;
        }
        this.engine.setCellContents({ sheet: sheet.engineId, row: c.row, col: c.col }, c.input === '' ? null : engineInput(c.input));
      }
    } finally {
      changed = this.engine.resumeEvaluation();
    }
    this.revision = revision;
    const cells = changed.filter((c): c is ExportedCellChange => c instanceof ExportedCellChange);
    // The engine's cycle detection patched in place can mark fewer cells of a cycle than a fresh
    // build does (found by the stored-values property test), so a patch that makes, touches or may
    // break a cycle is answered by building the engine again from the inputs.
    if (this.cycles > 0 || cells.some((c) => c.value instanceof DetailedCellError && c.value.type === ErrorType.CYCLE)) {
      this.rebuild();
      return null;
    }
    const byEngineId = new Map(this.sheets.map((s) => [s.engineId, s.id]));
    return cells.map((c) => [byEngineId.get(c.address.sheet)!, c.address.row, c.address.col]);
  }

  private rebuild() {
    this.engine.destroy();
    this.rebuilds++;
    this.engine = buildWorkbookEngine(
      this.sheets.map((s) => ({ name: s.name, cells: [...s.inputs].map(([k, input]) => [Math.floor(k / 4096), k % 4096, input] as CellTriple).sort((a, b) => a[0] - b[0] || a[1] - b[1]) })),
      { undoLimit: 0 },
    );
    for (const s of this.sheets) s.engineId = this.engine.getSheetId(s.name)!;
  }

  /** The values of the current revision, read from the engine. */
  snapshot(): ValuesSnapshot {
    const extras: StoredValueExtras = { sheets: {} };
    let cycles = 0;
    let pendingCells = 0;
    const payload: ValuesPayload = {
      revision: this.revision,
      sheets: this.sheets.map((s) => {
        const cells: CellTriple[] = [];
        for (const [k, input] of s.inputs) cells.push([Math.floor(k / 4096), k % 4096, input]);
        cells.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
        const computed = computeSheet(this.engine, s.engineId, s.name, cells);
        const values: ValueEntry[] = [];
        const more: StoredValueExtras['sheets'][string] = {};
        for (const cell of computed.cells) {
          const v = cell.value;
          if (cell.dateKind) (more.dates ??= []).push([cell.row, cell.col, cell.dateKind]);
          if (cell.spill) (more.spills ??= []).push([cell.row, cell.col, cell.spill.rows, cell.spill.cols]);
          if (v === null || v === undefined) continue;
          if (v === '') {
            (more.emptyTexts ??= []).push([cell.row, cell.col]);
            continue;
          }
          if (isEngineError(v)) {
            if (v.type === ErrorType.CYCLE) cycles++;
            if (isPendingMessage(v.message)) pendingCells++;
            if (!v.message?.trim()) (more.bareErrors ??= []).push([cell.row, cell.col]);
            values.push([cell.row, cell.col, { error: v.value, message: explainCellError(v) }]);
          } else values.push([cell.row, cell.col, v]);
        }
        if (Object.keys(more).length > 0) extras.sheets[s.id] = more;
        return { id: s.id, name: s.name, values };
      }),
    };
    extras.functionsUsed = functionsUsedIn(this.sheets.map((s) => ({ cells: [...s.inputs.values()].map((input) => [0, 0, input] as CellTriple) })));
    this.cycles = cycles;
    return { payload: capValuesPayload(payload), extras, volatileFormulas: this.volatileCount, pendingCells };
  }

  destroy() {
    this.engine.destroy();
  }
}
