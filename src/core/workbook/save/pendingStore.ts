// Unsent cell changes kept in the browser's local storage, one entry per workbook, so that a reload,
// a crash or a closed laptop lid loses nothing typed. The entry is rewritten on every change and
// removed only when the server has acknowledged every change in it.
import { cellKey } from '../../../../shared/a1.js';

export interface CellInput {
  sheetId: string;
  row: number;
  col: number;
  /** What the user typed; '' clears the cell. */
  input: string;
}

/** One input per cell: when a cell appears twice, the later input wins (and takes the later place). */
export function lastInputPerCell(changes: readonly CellInput[]): CellInput[] {
  const map = new Map<string, CellInput>();
  for (const c of changes) {
    const key = cellKey(c);
    map.delete(key);
    map.set(key, c);
  }
  return [...map.values()];
}

export interface PendingSnapshot {
  /** The workbook revision these changes were made on top of (the patch's baseRevision). */
  baseRevision: number;
  changes: CellInput[];
}

/** The part of the Web Storage API we use; tests pass an in-memory fake. */
export interface KeyValueStorage {
  getItem(key: string): string | null;
  setItem(key: string, value: string): void;
  removeItem(key: string): void;
}

export function pendingKey(workbookId: string): string {
  return `orbitab.pending.${workbookId}`;
}

export class PendingStore {
  /** False after the browser refused to store (quota, private mode): the UI must say so. */
  storageWorks = true;

  constructor(
    private readonly storage: KeyValueStorage | null,
    readonly workbookId: string,
  ) {}

  load(): PendingSnapshot | null {
    if (!this.storage) return null;
    let text: string | null;
    try {
      text = this.storage.getItem(pendingKey(this.workbookId));
    } catch {
      this.storageWorks = false;
      return null;
    }
    if (!text) return null;
    const parsed = parseSnapshot(text);
    // A damaged entry is left in place (not deleted) so nobody loses the chance to recover it by hand.
    return parsed && parsed.changes.length > 0 ? parsed : null;
  }

  save(snapshot: PendingSnapshot): void {
    if (!this.storage) {
      this.storageWorks = false;
      return;
    }
    try {
      if (snapshot.changes.length === 0) this.storage.removeItem(pendingKey(this.workbookId));
      else this.storage.setItem(pendingKey(this.workbookId), JSON.stringify({ v: 1, ...snapshot }));
      this.storageWorks = true;
    } catch {
      this.storageWorks = false;
    }
  }
}

function parseSnapshot(text: string): PendingSnapshot | null {
  let data: unknown;
  try {
    data = JSON.parse(text);
  } catch {
    return null;
  }
  if (!data || typeof data !== 'object') return null;
  const { baseRevision, changes } = data as { baseRevision?: unknown; changes?: unknown };
  if (!Number.isInteger(baseRevision) || (baseRevision as number) < 0 || !Array.isArray(changes)) return null;
  const valid = changes.filter(
    (c): c is CellInput =>
      !!c &&
      typeof c.sheetId === 'string' &&
      Number.isInteger(c.row) &&
      c.row >= 0 &&
      Number.isInteger(c.col) &&
      c.col >= 0 &&
      typeof c.input === 'string',
  );
  return { baseRevision: baseRevision as number, changes: valid };
}
