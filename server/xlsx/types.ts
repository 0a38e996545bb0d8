// Shapes shared by the reader, the writer, the worker and the routes. Cells are sparse triples
// [row, col, input] with zero-based row/col and `input` exactly as a user would type it in Orbitab.
import type { CellTriple } from '../../functions/workbookEngine.js';
import type { ImportSummary } from '../../shared/io.js';
import type { SheetSettings, StoredValueExtras } from '../../shared/workbooks.js';

export type { ImportSummary, SkippedCell } from '../../shared/io.js';

export type { CellTriple };

export interface ParsedSheet {
  name: string;
  cells: CellTriple[];
  /** Column widths in Excel character units (the unit the file stores), keyed by zero-based column. */
  columnWidths: Record<number, number>;
  frozenRows: number;
  frozenCols: number;
  /** Merged ranges in A1 notation; the value is kept at the top-left (master) cell only. */
  merged: string[];
}

export interface ParsedWorkbook {
  sheets: ParsedSheet[];
  summary: ImportSummary;
  /**
   * Where the reading time went (benchmarks): the zip guard (which inflates every part), then for the
   * direct reader the workbook-wide parts and the sheets, for exceljs its load and our pass over its
   * cells. `fallback`: why the direct reader handed the file to exceljs.
   */
  timing?: { guardMs: number; loadMs: number; cellsMs: number; reader: 'direct' | 'exceljs'; fallback?: string };
}

/** A sheet's stored settings (sheets.settings JSON): see sheetSettings.ts for the fields we read. */
export type { SheetSettings };

export interface ExportLock {
  lockedByName: string;
  reason: string;
  editorNames: string[];
}

/** Roles set on the sheet one by one (a lock's own names are in ExportLock). */
export interface ExportSheetRoles {
  editorNames: string[];
  viewerNames: string[];
}

export interface ExportProtectedRange {
  range: string;
  editorNames: string[];
}

export interface ExportSheet {
  name: string;
  cells: CellTriple[];
  settings: SheetSettings;
  lock?: ExportLock | null;
  sheetRoles?: ExportSheetRoles | null;
  protectedRanges?: ExportProtectedRange[];
}

export interface ExportWorkbook {
  title: string;
  /** The Orbitab revision exported; null for a file recalculated outside the database (`cli recalc`). */
  revision: number | null;
  exportedBy: string;
  exportedAt: Date;
  sheets: ExportSheet[];
  /** The revision's stored values (server/values/), read instead of running the engine; absent: computed. */
  stored?: { sheetIds: string[]; valuesGzip: Uint8Array; extras: StoredValueExtras };
}

export type ExportMode = 'formulas' | 'values';

/** The provenance sheet our exports start with; the importer recognises and skips it. */
export const ABOUT_SHEET_NAME = 'About this export';
export const ABOUT_SHEET_MARK = 'Orbitab export — about this file';
export const WORKBOOK_CREATOR = 'Orbitab';
