// The glance: a workbook's first rows, drawn from GET …/first-rows and the values stored with its
// revision, before anything else of the workbook is in. Drawn first by the page's first script
// (src/app/earlyGlance.ts), then by the workbook screen (useWorkbookSession.ts), by the same rule.
// Imports nothing of the formula engine's, so the page's first script stays small.
import type { FirstRowsPayload, SheetSettings } from '@shared/workbooks.js';
import { PendingStore, type KeyValueStorage } from '../save/pendingStore.js';
import { storedPreview } from '../model/storedPreview.js';
import type { SheetPreview } from '../model/windowPreview.js';

export interface Glance {
  preview: SheetPreview;
  title: string;
  settings: SheetSettings;
  revision: number;
}

/** The browser's local storage, or null where the browser refuses it. */
export function browserStorage(): KeyValueStorage | null {
  try {
    return window.localStorage;
  } catch {
    return null; // storage disabled by the browser's settings
  }
}

/** What the page shows first, from GET …/first-rows: null without stored values or with unsent changes (it would show older values). */
export function glanceOf(first: FirstRowsPayload | null | undefined, storage: KeyValueStorage | null): Glance | null {
  if (!first?.sheet || !first.values) return null;
  if (new PendingStore(storage, first.id).load() !== null) return null;
  const preview = storedPreview({ revision: first.revision, sheets: [first.sheet] }, { revision: first.revision, sheets: [{ id: first.sheet.id, name: first.sheet.name, values: first.values }] });
  return preview && { preview, title: first.title, settings: first.sheet.settings, revision: first.revision };
}
