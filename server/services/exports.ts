// A workbook as a download: xlsx (formulas, or values only) or one sheet as CSV. What goes in is
// gathered here (server/xlsx/exportSource.ts); the file is computed and written in a worker of the
// compute pool (server/xlsx/exportInWorker.ts), so a large workbook never holds the event loop.
import type { Writable } from 'node:stream';
import type { User } from 'lucia';
import type { AppContext } from '../context.js';
import { badRequest, HttpError } from '../errors.js';
import { exportInWorker, type ExportFormat } from '../xlsx/exportInWorker.js';
import { jobStructures } from '../structures/structureService.js';
import { exportSource } from '../xlsx/exportSource.js';
import { refusalAbout } from '../xlsx/limits.js';
import type { WorkbookAccess } from './access.js';

export interface ExportRequest {
  format: 'xlsx' | 'xlsx-values' | 'csv';
  /** A sheet id or name (any case); required for CSV when the workbook has more than one sheet. */
  sheet?: string;
}

export interface Download {
  contentType: string;
  filename: string;
  /** Streams the file into `output` and ends it; a refusal before the first byte is a SpreadsheetError about the export. */
  writeTo(output: Writable): Promise<void>;
}

/** A download name: the title and what the file holds, without characters file systems refuse. */
function downloadName(...parts: string[]): string {
  // eslint-disable-next-line no-control-regex
  return parts.join(' ').replace(/[\u0000-\u001f\u007f<>:"/\\|?*]+/g, '_').slice(0, 180);
}

export async function exportDownload(ctx: AppContext, access: WorkbookAccess, user: Pick<User, 'id' | 'name' | 'email'>, request: ExportRequest): Promise<Download> {
  const source = await exportSource(ctx, access, user);
  const { sheetIds, ...workbook } = source;
  let format: ExportFormat;
  let contentType: string;
  let filename: string;
  if (request.format === 'csv') {
    const wanted = request.sheet;
    const index = wanted ? source.sheets.findIndex((s, i) => sheetIds[i] === wanted || s.name.toLowerCase() === wanted.toLowerCase()) : source.sheets.length === 1 ? 0 : -1;
    if (index < 0) {
      throw wanted
        ? new HttpError(404, 'not_found', `sheet: no sheet "${wanted}" in this workbook`)
        : badRequest(`sheet: required for CSV, which holds one sheet; give one of ${source.sheets.map((s) => `"${s.name}"`).join(', ')}`);
    }
    format = { kind: 'csv', sheetIndex: index };
    contentType = 'text/csv; charset=utf-8';
    filename = `${downloadName(source.title, '-', source.sheets[index].name)}.csv`;
  } else {
    format = { kind: 'xlsx', mode: request.format === 'xlsx-values' ? 'values' : 'formulas' };
    contentType = 'application/vnd.openxmlformats-officedocument.spreadsheetml.sheet';
    filename = `${downloadName(source.title, `(revision ${source.revision}${format.mode === 'values' ? ', values' : ''})`)}.xlsx`;
  }
  return {
    contentType,
    filename,
    // The workbook is already stored, so a failure here is the server's limit, not a bad request.
    writeTo: (output) => exportInWorker(output, workbook, format, { owner: user.id, structures: jobStructures(ctx, access.workbook.id) }).then(() => undefined, refusalAbout('export', '; try values only, or split the workbook')),
  };
}
