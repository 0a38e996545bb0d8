// One open workbook in the browser: one HyperFormula engine (functions/workbookEngine.ts) fed
// with the server's inputs, the typed inputs beside it, and the cell views the grid draws. Edits
// apply to the engine at once; the model reports the input changes so they can be sent as patches.
// Bulk writes run with evaluation suspended: many setCellContents calls inside HyperFormula's
// batch() grow quadratically in 3.3–3.5 (see the workbook issue), while a suspended evaluation
// recomputes once at the end.
import { ExportedCellChange, type ExportedChange, type HyperFormula } from 'hyperformula';
import { buildWorkbookEngine, engineBlocks, inTabOrder } from '@functions/workbookEngine.js';
import { engineInput } from '@functions/formulaTokens.js';
import { actionTooLargeReason, maxCellsPerAction, type SheetPayload, type ValuesPayload, type WorkbookPayload } from '@shared/workbooks.js';
import { Hydration } from './hydration.js';
import { OpenPreparation, type PreparedOpen } from './openPreparation.js';
import { allows, type AccessRole, type WorkbookAction } from '@shared/permissions.js';
import type { CellView } from './cellView.js';
import { buildSheetRows, EMPTY_ROW, groupCells, viewOfCell, withRowsReplaced, type RowData } from './sheetViews.js';
import { readDisplaySettings, type DisplaySettings } from './displaySettings.js';
import { DisplaySaves } from './displaySaves.js';
import { SheetInputs } from './sheetInputs.js';
import { removeSheetFromFormula, renameSheetInFormula } from '@shared/formulaText.js';
import { lastInputPerCell, type CellInput } from '../save/pendingStore.js';
import { History } from './history.js';

export type { RowData };

/** Rows and columns shown beyond the used area, so there is room to type. */
export const minRowsShown = 1000;
export const minColsShown = 26;
/** Rows of each sheet in the engine's first build when opening on stored values: well over a screenful. */
export const firstRowsBuilt = 300;
/** How often the grid is redrawn while formulas are put back (their values rarely change what is shown). */
export const hydrationRedrawMs = 250;

export interface SheetState {
  id: string;
  name: string;
  position: number;
  /** Who added the sheet: editors manage roles and locks only on sheets they created. */
  createdBy: string | null;
  engineId: number;
  display: DisplaySettings;
  inputs: SheetInputs;
  /** Cell views per row, built when the sheet is first shown. */
  rows: RowData[] | null;
  rowCount: number;
  colCount: number;
}

/** Why a cell may not be edited (null: it may). Issue-6 locks plug in through `setEditRule`. */
export type EditRule = (sheetId: string, row: number, col: number) => string | null;

export interface EditOutcome {
  applied: CellInput[];
  refused: { cell: CellInput; reason: string }[];
}

export class WorkbookModel {
  readonly id: string;
  title: string;
  role: AccessRole;
  /** What the user may do here, as the server decided it (all their roles together). */
  actions: WorkbookAction[];
  readonly engine: HyperFormula;
  readonly history = new History();
  private sheetsById = new Map<string, SheetState>();
  private listeners = new Set<() => void>();
  private extraRule: EditRule | null = null;
  /** Why rows and columns of a sheet may not be inserted or deleted now (a sheet lock), or null. */
  structureRule: ((sheetId: string) => string | null) | null = null;
  /** Why a lock or protected range keeps me out of this cell (the rule alone: no views needed). */
  protectionReason = (sheetId: string, row: number, col: number): string | null => this.extraRule?.(sheetId, row, col) ?? null;
  /** Called with every local change that must reach the server (the save queue's enqueue). */
  readonly onLocalChanges: (changes: CellInput[]) => void;
  version = 0;

  /** Formulas still standing in as their stored values (hydration.ts); null once the workbook is live. */
  private hydration: Hydration | null = null;
  /** Within a hydration slice: changes are counted but listeners are told once, after it. */
  private quiet = false;
  /** When listeners were last told of a change. */
  private shownAt = 0;
  /** Display settings of mine on their way to the server (live settings revisions wait for them). */
  readonly displaySaves = new DisplaySaves();

  /**
   * `stored`: the values stored with this revision, shown at once while the rest of the rows and then
   * the formulas are put back in slices; `firstRows`: how many rows of each sheet the engine is built with.
   */
  constructor(
    payload: WorkbookPayload,
    options: {
      onLocalChanges?: (changes: CellInput[]) => void;
      stored?: ValuesPayload | null;
      firstRows?: number;
      /** The inputs and placeholder tables made beforehand in slices (openPreparation.ts) for this payload and `stored`. */
      prepared?: PreparedOpen;
    } = {},
  ) {
    this.onLocalChanges = options.onLocalChanges ?? (() => {});
    this.id = payload.id;
    this.title = payload.title;
    this.role = payload.role;
    this.actions = payload.actions;
    const ordered = inTabOrder(payload.sheets);
    const stored = options.stored?.revision === payload.revision ? options.stored : null;
    let prepared = options.prepared?.revision === payload.revision ? options.prepared : null;
    if (!prepared || (stored !== null) !== (prepared.held !== null)) prepared = new OpenPreparation(payload, stored).result();
    const inputs = prepared.inputs;
    const held = prepared.held;
    // Built once from whole tables: no per-cell setCellContents on load. Undo lives in History
    // (our own, mirrored in patches), so the engine keeps no undo stack of its own.
    const firstRows = Math.max(1, options.firstRows ?? firstRowsBuilt);
    this.engine = buildWorkbookEngine(ordered.map((s, i) => ({ name: s.name, table: held ? held[i].table.slice(0, firstRows) : inputs.get(s.id)!.toTable() })), { undoLimit: 0 });
    for (const s of ordered) this.addSheetState(s, inputs.get(s.id)!);
    if (held && stored) {
      const rest = ordered.map((s, i) => ({ sheetId: s.id, table: held[i].table, next: firstRows }));
      this.hydration = new Hydration(
        held.map((h) => h.formulas),
        held.flatMap((h) => h.spilled),
        stored.revision,
        rest,
        stored.sheets.length > 0,
      );
    }
  }

  /** While the stored values are shown: how many formulas are live of how many. Null when all are. */
  get computing(): { done: number; total: number; revision: number } | null {
    const h = this.hydration;
    return h ? { done: h.done, total: h.total, revision: h.revision } : null;
  }

  /** Whether the cells not yet computed show stored values (false: they are empty until their slice). */
  get computingFromStored(): boolean {
    return this.hydration?.fromStored ?? false;
  }

  /** Puts back formulas for about `budgetMs` (the session calls it between frames); true once live. */
  computeSlice(budgetMs: number): boolean {
    if (!this.hydration) return true;
    // Listeners hear of a slice's changes at most every `hydrationRedrawMs`: each redraw of a
    // 100,000-row grid walks every row, and after every slice that came to most of the open's time.
    this.quiet = true;
    let live = false;
    try {
      live = this.sliceHydration(budgetMs);
    } finally {
      this.quiet = false;
    }
    if (live || performance.now() - this.shownAt >= hydrationRedrawMs) this.notify();
    return live;
  }

  private sliceHydration(budgetMs: number): boolean {
    const live = this.hydration!.slice(
      {
        hasSheet: (id) => this.hasSheet(id),
        engineIdOf: (id) => this.sheet(id).engineId,
        inputOf: (id, row, col) => this.input(id, row, col),
        writeEngine: (cells) => this.writeEngine(cells.map((c) => ({ engineId: this.sheet(c.sheetId).engineId, row: c.row, col: c.col, content: c.content }))),
        writeRows: (sheetId, row, block) => this.writeRows(sheetId, row, block),
      },
      budgetMs,
    );
    if (live) this.hydration = null;
    return live;
  }

  /** Finishes putting back every formula now (before work that reads formulas from the engine: structure changes, fills). */
  ensureLive() {
    while (!this.computeSlice(Number.POSITIVE_INFINITY));
  }

  private writeRows(sheetId: string, row: number, block: (string | number | boolean | null)[][]) {
    const s = this.sheet(sheetId);
    let changes: ExportedChange[] = [];
    this.engine.suspendEvaluation();
    try {
      this.engine.setCellContents({ sheet: s.engineId, row, col: 0 }, block);
    } finally {
      changes = this.engine.resumeEvaluation();
    }
    const touched: { engineId: number; row: number; col: number }[] = [];
    block.forEach((line, i) => {
      for (let col = 0; col < line.length; col++) if (line[col] !== null || s.inputs.get(row + i, col) !== '') touched.push({ engineId: s.engineId, row: row + i, col });
    });
    for (const ch of changes) if (ch instanceof ExportedCellChange) touched.push({ engineId: ch.sheet, row: ch.row, col: ch.col });
    this.refreshViews(touched);
  }

  private writeEngine(cells: { engineId: number; row: number; col: number; content: string | number | boolean | null }[]) {
    let changes: ExportedChange[] = [];
    this.engine.suspendEvaluation();
    try {
      for (const b of engineBlocks(cells)) {
        try {
          this.engine.setCellContents({ sheet: b.engineId, row: b.row, col: b.col }, b.rows);
        } catch (e) {
          // The engine checks a block's addresses before writing any; refused, the block goes in cell by
          // cell as before, so the cells ahead of the bad address are written and the same error is thrown.
          if (b.rows.length === 1 && b.rows[0].length === 1) throw e;
          b.rows.forEach((line, i) => line.forEach((content, j) => this.engine.setCellContents({ sheet: b.engineId, row: b.row + i, col: b.col + j }, [[content]])));
        }
      }
    } finally {
      changes = this.engine.resumeEvaluation();
    }
    const touched: { engineId: number; row: number; col: number }[] = [...cells];
    for (const ch of changes) if (ch instanceof ExportedCellChange) touched.push({ engineId: ch.sheet, row: ch.row, col: ch.col });
    this.refreshViews(touched);
  }

  // ---- reading ----

  get sheets(): SheetState[] {
    return [...this.sheetsById.values()].sort((a, b) => a.position - b.position);
  }

  sheet(sheetId: string): SheetState {
    const s = this.sheetsById.get(sheetId);
    if (!s) throw new Error(`no sheet ${sheetId} in this workbook`);
    return s;
  }

  hasSheet(sheetId: string) {
    return this.sheetsById.has(sheetId);
  }

  sheetByEngineId(engineId: number): SheetState | undefined {
    for (const s of this.sheetsById.values()) if (s.engineId === engineId) return s;
    return undefined;
  }

  get readOnly(): boolean {
    return !allows(this.actions, 'editCells');
  }

  input(sheetId: string, row: number, col: number): string {
    return this.sheet(sheetId).inputs.get(row, col);
  }

  view(sheetId: string, row: number, col: number): CellView | undefined {
    return this.rows(sheetId)[row]?.[col];
  }

  /** The rows the grid draws; the same array until something in the sheet changes. */
  rows(sheetId: string): RowData[] {
    const s = this.sheet(sheetId);
    if (!s.rows) s.rows = this.buildRows(s);
    return s.rows;
  }

  subscribe(listener: () => void): () => void {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  }

  notify() {
    this.version += 1;
    if (this.quiet) return;
    this.shownAt = performance.now();
    for (const l of this.listeners) l();
  }

  // ---- editing ----

  setEditRule(rule: EditRule | null) {
    this.extraRule = rule;
    for (const s of this.sheetsById.values()) s.rows = null;
    this.notify();
  }

  /** Why this cell cannot be edited now, or null. */
  readOnlyReason(sheetId: string, row: number, col: number): string | null {
    if (this.readOnly) return 'View only — you view this workbook.';
    const rows = this.sheetsById.get(sheetId)?.rows;
    if (rows ? rows[row]?.[col]?.spilled : this.isSpilled(sheetId, row, col)) return 'View only — filled by an array formula in another cell.';
    return this.extraRule?.(sheetId, row, col) ?? null;
  }

  private isSpilled(sheetId: string, row: number, col: number): boolean {
    const s = this.sheet(sheetId);
    return s.inputs.get(row, col) === '' && this.engine.getCellValue({ sheet: s.engineId, row, col }) !== null;
  }

  /**
   * Applies local edits: to the engine at once, to the undo history, and out to the server.
   * Cells that may not be edited are left alone and reported; with `whole`, one such cell refuses
   * them all (a sort, fill or paste half applied would scramble the block).
   */
  edit(changes: readonly CellInput[], options: { record?: boolean; whole?: boolean } = {}): EditOutcome {
    const refused: EditOutcome['refused'] = [];
    const allowed: CellInput[] = [];
    for (const c of lastInputPerCell(changes)) {
      const reason = this.readOnlyReason(c.sheetId, c.row, c.col);
      if (reason) refused.push({ cell: c, reason });
      else if (this.input(c.sheetId, c.row, c.col) !== c.input) allowed.push(c);
    }
    if (options.whole && refused.length > 0) return { applied: [], refused };
    // Saved as one revision or not at all (save/patchQueue.ts): past the limit nothing is applied.
    if (allowed.length > maxCellsPerAction) {
      const reason = actionTooLargeReason(allowed.length);
      return { applied: [], refused: [...refused, ...allowed.map((cell) => ({ cell, reason }))] };
    }
    const before = allowed.map((c) => this.input(c.sheetId, c.row, c.col));
    const applied = this.write(allowed);
    if (options.record !== false && applied.length > 0) {
      this.history.push({ kind: 'cells', changes: allowed.map((c, i) => ({ ...c, before: before[i], after: c.input })) });
    }
    if (applied.length > 0) this.onLocalChanges(applied);
    return { applied, refused };
  }

  /** Changes made elsewhere (another client, a conflict resolution): applied but not sent back. */
  applyRemote(changes: readonly CellInput[]) {
    this.write(lastInputPerCell(changes).filter((c) => this.hasSheet(c.sheetId)));
  }

  /** Writes inputs to the engine and the views; returns the changes actually written. */
  write(changes: readonly CellInput[]): CellInput[] {
    if (changes.length === 0) return [];
    const bulk = changes.length > 1;
    const written: CellInput[] = [];
    let engineChanges: ExportedChange[] = [];
    if (bulk) this.engine.suspendEvaluation();
    try {
      for (const c of changes) {
        const s = this.sheet(c.sheetId);
        const result = this.engine.setCellContents({ sheet: s.engineId, row: c.row, col: c.col }, [[c.input === '' ? null : engineInput(c.input)]]);
        if (!bulk) engineChanges = result;
        s.inputs.set(c.row, c.col, c.input);
        this.hydration?.forget(c.sheetId, c.row, c.col);
        written.push(c);
      }
    } finally {
      if (bulk) engineChanges = this.engine.resumeEvaluation();
    }
    const touched: { engineId: number; row: number; col: number }[] = written.map((c) => ({ engineId: this.sheet(c.sheetId).engineId, row: c.row, col: c.col }));
    for (const ch of engineChanges) if (ch instanceof ExportedCellChange) touched.push({ engineId: ch.sheet, row: ch.row, col: ch.col });
    this.refreshViews(touched);
    return written;
  }

  /** Evaluates formula cells again with their own input (their extended-Hückel results have arrived). */
  reevaluate(cells: readonly { sheet: number; row: number; col: number }[]) {
    const touched: { engineId: number; row: number; col: number }[] = [];
    let engineChanges: ExportedChange[] = [];
    this.engine.suspendEvaluation();
    try {
      for (const c of cells) {
        const input = this.sheetByEngineId(c.sheet)?.inputs.get(c.row, c.col);
        if (!input?.startsWith('=')) continue; // edited since it asked
        this.engine.setCellContents({ sheet: c.sheet, row: c.row, col: c.col }, [[engineInput(input)]]);
        touched.push({ engineId: c.sheet, row: c.row, col: c.col });
      }
    } finally {
      engineChanges = this.engine.resumeEvaluation();
    }
    for (const ch of engineChanges) if (ch instanceof ExportedCellChange) touched.push({ engineId: ch.sheet, row: ch.row, col: ch.col });
    this.refreshViews(touched);
  }

  /** Recomputes the views of the given cells, replacing only the rows they are in. */
  refreshViews(cells: readonly { engineId: number; row: number; col: number }[]) {
    for (const [engineId, fixes] of groupCells(cells)) {
      const s = this.sheetByEngineId(engineId);
      if (!s) continue;
      for (const [row, cols] of fixes) for (const col of cols) this.growToFit(s, row, col);
      // Not yet shown: built on first show, from the engine as it is then.
      if (s.rows) s.rows = withRowsReplaced(s.rows, s.rowCount, fixes, (row, col) => this.computeView(s, row, col));
    }
    this.notify();
  }

  /** Rebuilds every view (after structural changes or a new edit rule). */
  invalidateViews() {
    for (const s of this.sheetsById.values()) {
      const { rows, cols } = s.inputs.extent();
      s.rowCount = Math.max(s.rowCount, rows + 100);
      s.colCount = Math.max(s.colCount, cols + 2);
      s.rows = null;
    }
    this.notify();
  }

  /** More rows at the bottom of a sheet (the grid shows a fixed number at a time). */
  addDisplayRows(sheetId: string, count: number) {
    const s = this.sheet(sheetId);
    s.rowCount = Math.min(this.engine.getConfig().maxRows, s.rowCount + count);
    if (s.rows) s.rows = s.rows.concat(new Array<RowData>(Math.max(0, s.rowCount - s.rows.length)).fill(EMPTY_ROW));
    this.notify();
  }

  private growToFit(s: SheetState, row: number, col: number) {
    if (row >= s.rowCount - 20) s.rowCount = Math.min(this.engine.getConfig().maxRows, row + 200);
    if (col >= s.colCount - 1) s.colCount = Math.min(this.engine.getConfig().maxColumns, col + 3);
  }

  computeView(s: SheetState, row: number, col: number): CellView | undefined {
    return viewOfCell(this.engine, s, row, col, this.readOnlyLabel(s.id));
  }

  private buildRows(s: SheetState): RowData[] {
    return buildSheetRows(this.engine, s, this.readOnlyLabel(s.id), this.hydration?.rowsLoaded(s.id));
  }

  /** The per-cell read-only marking the views carry (the role, or the extra rule). */
  private readOnlyLabel(sheetId: string): (row: number, col: number) => string | null | undefined {
    if (this.readOnly) return () => 'read-only';
    const rule = this.extraRule;
    return rule ? (row, col) => rule(sheetId, row, col) : () => null;
  }

  // ---- sheets ----

  addSheetState(p: Pick<SheetPayload, 'id' | 'name' | 'position' | 'settings' | 'createdBy'>, inputs = new SheetInputs()) {
    let engineId = this.engine.getSheetId(p.name);
    if (engineId === undefined) {
      this.engine.addSheet(p.name);
      engineId = this.engine.getSheetId(p.name)!;
      if (inputs.size > 0) this.engine.setSheetContent(engineId, inputs.toTable());
    }
    const { rows, cols } = inputs.extent();
    this.sheetsById.set(p.id, {
      id: p.id,
      name: p.name,
      position: p.position,
      createdBy: p.createdBy ?? null,
      engineId,
      display: readDisplaySettings(p.settings),
      inputs,
      rows: null,
      rowCount: Math.max(minRowsShown, rows + 100),
      colCount: Math.max(minColsShown, cols + 2),
    });
    this.notify();
  }

  renameSheetState(sheetId: string, name: string) {
    const s = this.sheet(sheetId);
    if (s.name === name) return;
    this.engine.renameSheet(s.engineId, name);
    // The engine has re-pointed its formulas already; the typed text follows, as the server
    // rewrites the stored text in the same revision (shared/formulaText.ts).
    const before = s.name;
    s.name = name;
    this.rewriteFormulaText((input) => renameSheetInFormula(input, before, name));
    this.invalidateViews(); // formulas naming the sheet now show the new name
  }

  /** Rewrites formula text in every sheet's inputs (the engine already holds the same formulas). */
  private rewriteFormulaText(rewrite: (input: string) => string) {
    for (const sheet of this.sheetsById.values()) {
      for (const { row, col, input } of [...sheet.inputs.entries()]) {
        if (input.startsWith('=')) sheet.inputs.set(row, col, rewrite(input));
      }
    }
  }

  removeSheetState(sheetId: string) {
    const s = this.sheetsById.get(sheetId);
    if (!s) return;
    this.engine.removeSheet(s.engineId);
    this.sheetsById.delete(sheetId);
    // The engine now reads references to the sheet as #REF!; the text says so too, as on the server.
    this.rewriteFormulaText((input) => removeSheetFromFormula(input, s.name));
    this.history.forgetSheet(sheetId);
    this.invalidateViews();
  }

  setPositions(order: readonly string[]) {
    order.forEach((id, position) => {
      const s = this.sheetsById.get(id);
      if (s) s.position = position;
    });
    this.notify();
  }

  setDisplay(sheetId: string, display: DisplaySettings) {
    const s = this.sheet(sheetId);
    const precisionChanged = s.display.precision !== display.precision;
    s.display = display;
    if (precisionChanged) s.rows = null;
    this.notify();
  }

  dispose() {
    this.listeners.clear();
    this.engine.destroy();
  }
}
