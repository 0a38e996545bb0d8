// Inputs of mine that lost a conflict or whose tab was deleted by someone else, kept in this
// browser's local storage per workbook until I dismiss them, so a choice in a hurry loses nothing.
import type { KeyValueStorage } from '../../core/workbook/save/pendingStore.js';
import type { SetAsideInput } from './conflictResolution.js';

/** Enough to recover a bad afternoon; older entries go first (common practice: bounded local stores). */
export const maxSetAside = 200;

export const setAsideKey = (workbookId: string) => `orbitab.setAside.${workbookId}`;

export function loadSetAside(storage: KeyValueStorage | null, workbookId: string): SetAsideInput[] {
  try {
    const text = storage?.getItem(setAsideKey(workbookId));
    if (!text) return [];
    const data = JSON.parse(text) as unknown;
    if (!Array.isArray(data)) return [];
    return data.filter(
      (e): e is SetAsideInput =>
        !!e && typeof e.sheetId === 'string' && Number.isInteger(e.row) && Number.isInteger(e.col) && typeof e.input === 'string' && typeof e.replacedBy === 'string' && typeof e.at === 'number',
    );
  } catch {
    return [];
  }
}

export function saveSetAside(storage: KeyValueStorage | null, workbookId: string, entries: readonly SetAsideInput[]): boolean {
  if (!storage) return false;
  try {
    if (entries.length === 0) storage.removeItem(setAsideKey(workbookId));
    else storage.setItem(setAsideKey(workbookId), JSON.stringify(entries.slice(-maxSetAside)));
    return true;
  } catch {
    return false;
  }
}

/** Newest last; at most `maxSetAside`. */
export function addSetAside(existing: readonly SetAsideInput[], added: readonly SetAsideInput[]): SetAsideInput[] {
  return [...existing, ...added].slice(-maxSetAside);
}
