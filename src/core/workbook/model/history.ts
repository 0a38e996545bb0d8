// Undo and redo across edits. We keep our own history instead of the engine's undo stack: changes
// from colleagues (live updates) also go through the engine, and Ctrl+Z must undo only my own
// edits. Each entry records the inputs before and after, so undoing is itself an edit that is
// sent to the server like any other.
import type { StructuralOp } from './structure.js';
import type { InputDifference } from './sheetInputs.js';

export interface CellEdit {
  sheetId: string;
  row: number;
  col: number;
  before: string;
  after: string;
}

export type HistoryEntry =
  | { kind: 'cells'; changes: CellEdit[] }
  /** Rows or columns inserted or deleted; `differences` are every input it changed, per sheet. */
  | { kind: 'structure'; sheetId: string; op: StructuralOp; differences: Map<string, InputDifference[]> }
  /** One user action that took several steps (cells typed and drag-filled at once): undone as one. */
  | { kind: 'group'; entries: HistoryEntry[] };

export class History {
  private undoStack: HistoryEntry[] = [];
  private redoStack: HistoryEntry[] = [];
  /** Entries pushed while an action is open, and how deeply actions are nested. */
  private open: HistoryEntry[] | null = null;
  private depth = 0;

  constructor(readonly limit = 200) {}

  /**
   * Runs one user action: whatever it pushes becomes a single undo step, so Ctrl+Z never takes back
   * half of a paste, a cleared block or a typed-and-filled change.
   */
  action<T>(run: () => T): T {
    if (this.depth === 0) this.open = [];
    this.depth += 1;
    try {
      return run();
    } finally {
      this.depth -= 1;
      if (this.depth === 0) {
        const entries = this.open ?? [];
        this.open = null;
        if (entries.length === 1) this.push(entries[0]);
        else if (entries.length > 1) this.push({ kind: 'group', entries });
      }
    }
  }

  push(entry: HistoryEntry) {
    if (this.open) {
      this.open.push(entry);
      return;
    }
    this.undoStack.push(entry);
    if (this.undoStack.length > this.limit) this.undoStack.shift();
    this.redoStack = [];
  }

  /** The step Ctrl+Z would take back now (to tell whether it is still the one just made). */
  get lastUndo(): HistoryEntry | undefined {
    return this.undoStack[this.undoStack.length - 1];
  }

  get canUndo() {
    return this.undoStack.length > 0;
  }

  get canRedo() {
    return this.redoStack.length > 0;
  }

  /** Takes the entry to undo and files it for redo. */
  takeUndo(): HistoryEntry | undefined {
    const e = this.undoStack.pop();
    if (e) this.redoStack.push(e);
    return e;
  }

  takeRedo(): HistoryEntry | undefined {
    const e = this.redoStack.pop();
    if (e) this.undoStack.push(e);
    return e;
  }

  /** The entry just taken could not be replayed (a lock refused it): it goes back where it was. */
  untakeUndo() {
    const e = this.redoStack.pop();
    if (e) this.undoStack.push(e);
  }

  untakeRedo() {
    const e = this.undoStack.pop();
    if (e) this.redoStack.push(e);
  }

  /** A deleted sheet's entries can no longer be replayed. */
  forgetSheet(sheetId: string) {
    const keep = (e: HistoryEntry): boolean =>
      e.kind === 'group' ? e.entries.every(keep) : e.kind === 'cells' ? !e.changes.some((c) => c.sheetId === sheetId) : e.sheetId !== sheetId && !e.differences.has(sheetId);
    this.undoStack = this.undoStack.filter(keep);
    this.redoStack = this.redoStack.filter(keep);
  }
}
