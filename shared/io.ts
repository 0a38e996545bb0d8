// Import and export, as the API answers them and the client shows them (server/xlsx/, src/features/io/).
import { workbookPath } from './workbooks.js';

/** The upload limit of POST /api/imports; the client checks it before sending. */
export const maxUploadBytes = 20 * 1024 * 1024;
export const acceptedUploadTypes = '.xlsx,.csv,.tsv,.txt,.sdf,.sd,.mol,.xyz,application/vnd.openxmlformats-officedocument.spreadsheetml.sheet,text/csv';

export interface SkippedCell {
  sheet: string;
  /** A1 address, or a range / the whole sheet when the reason covers more than a cell. */
  address: string;
  reason: string;
}

export interface ImportSummary {
  sheets: number;
  cells: number;
  formulas: number;
  /** Every cell (or part) that could not be taken, with the reason. */
  skipped: SkippedCell[];
  /** Things taken with a loss worth knowing (a link target, an encoding guess, a renamed sheet). */
  notes: string[];
}

/** 201 from POST /api/imports. */
export interface ImportResponse {
  workbookId: string;
  revision: number;
  sheets: { id: string; name: string }[];
  summary: ImportSummary;
}

export const exportFormats = ['xlsx', 'xlsx-values', 'csv'] as const;
export type ExportFormatName = (typeof exportFormats)[number];

/** The download address of GET /api/workbooks/:id/export. */
export function exportPath(workbookId: string, format: ExportFormatName, sheet?: string): string {
  const query = new URLSearchParams({ format });
  if (sheet !== undefined) query.set('sheet', sheet);
  return `/api${workbookPath(workbookId, 'export')}?${query}`;
}
