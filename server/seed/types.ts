// The shape of the demo data: plain tables of cell inputs, written through the same services the API
// uses, so the demo shows nothing a team could not have typed themselves.
import type { SheetSettings } from '../../shared/workbooks.js';

export type DemoRole = 'owner' | 'editor' | 'viewer';

export interface DemoPerson {
  role: DemoRole;
  name: string;
  email: string;
  /** Printed once at first start and listed in the README: demo only. */
  password: string;
}

export interface DemoSheet {
  name: string;
  /** Cell inputs, row by row; the first row holds the column titles. */
  rows: string[][];
  settings?: SheetSettings;
  /** Locked by the owner with this reason; only the owner may change the sheet. */
  lockReason?: string;
  /** A1 ranges only the owner may edit. */
  protectedRanges?: string[];
  /** Cells (A1) that show a spreadsheet error on purpose, with the message they teach. */
  deliberateErrors?: Record<string, string>;
}

export interface DemoWorkbook {
  title: string;
  sheets: DemoSheet[];
}
