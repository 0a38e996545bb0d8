// Workbooks in and out: POST /api/imports (multipart `file`, optional `workbookId`) and
// GET /api/workbooks/:id/export?format=xlsx|xlsx-values|csv&sheet=<id or name>. The reading,
// writing and limits live in server/xlsx/; this file is the HTTP edge.
import { Router, type NextFunction, type Request, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idSchema, titleSchema } from '../../shared/workbooks.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { badRequest, HttpError, parse } from '../errors.js';
import { requireWorkbook } from '../services/access.js';
import { shutdownRefusal } from '../services/shutdown.js';
import { exportInWorker, type ExportFormat } from '../xlsx/exportInWorker.js';
import { exportSource } from '../xlsx/exportSource.js';
import { importStaged } from '../xlsx/importStaged.js';
import { defaultImportLimits, formatBytes, SpreadsheetError } from '../xlsx/limits.js';
import { parseInWorker } from '../xlsx/parseInWorker.js';
import { computeRefusal } from '../xlsx/refusals.js';
import { sheetNameFromFilename } from '../xlsx/readCsv.js';
import { valuesSourceHeader } from '../values/serve.js';

const importBody = z.object({ workbookId: idSchema.optional() });
const exportQuery = z.object({
  format: z.enum(['xlsx', 'xlsx-values', 'csv'], { error: 'must be "xlsx", "xlsx-values" or "csv"' }).default('xlsx'),
  sheet: z.string().trim().min(1, 'give a sheet id or name').max(200).optional(),
});

const upload = multer({
  storage: multer.memoryStorage(),
  limits: { fileSize: defaultImportLimits.maxFileBytes, files: 1, fields: 8, fieldSize: 1024, parts: 10 },
  defParamCharset: 'utf8',
}).single('file');

/** multer's refusals as the API's JSON errors, naming the limit. */
const receiveUpload: RequestHandler = (req, res, next) => {
  upload(req, res, (err: unknown) => {
    if (!err) return next();
    if (err instanceof multer.MulterError) {
      if (err.code === 'LIMIT_FILE_SIZE') return next(new HttpError(413, 'file_too_large', `file: larger than the upload limit of ${formatBytes(defaultImportLimits.maxFileBytes)}`));
      if (err.code === 'LIMIT_UNEXPECTED_FILE') return next(badRequest(`file: send one spreadsheet, in the multipart field "file" (got "${err.field}")`));
      return next(badRequest(`upload: ${err.message}`));
    }
    next(badRequest(`upload: the multipart body could not be read (${err instanceof Error ? err.message : String(err)})`));
  });
};

function asHttp(e: unknown): unknown {
  return e instanceof SpreadsheetError ? new HttpError(e.status, e.code, `file: ${e.message}`) : e;
}

/** A download name: the title and what the file holds, without characters file systems refuse. */
function downloadName(...parts: string[]): string {
  // eslint-disable-next-line no-control-regex
  return parts.join(' ').replace(/[\u0000-\u001f\u007f<>:"/\\|?*]+/g, '_').slice(0, 180);
}

export function ioRouter(ctx: AppContext): Router {
  const router = Router();

  router.post('/imports', requireUser, receiveUpload, async (req: Request, res: Response) => {
    const user = currentUser(res);
    const { workbookId } = parse(importBody, req.body ?? {});
    const stopping = shutdownRefusal();
    if (stopping) throw stopping;
    const file = req.file;
    if (!file) throw badRequest('file: required; send the spreadsheet as multipart/form-data in the field "file"');
    // Refuse before reading when the user may not add sheets there.
    if (workbookId) requireWorkbook(ctx, user, workbookId, 'editSheets');

    const parsed = await parseInWorker(file.buffer, file.originalname || 'upload', { owner: user.id }).catch((e) => {
      throw asHttp(e);
    });

    if (workbookId) requireWorkbook(ctx, user, workbookId, 'editSheets'); // still allowed after the read
    const title = titleSchema.safeParse(sheetNameFromFilename(file.originalname || '').replace(/_/g, ' '));
    // Stored in short steps into sheets no one sees until the last one (importStaged.ts): a large
    // import neither holds the event loop nor leaves anything behind when it fails.
    const outcome = await importStaged(ctx, workbookId ? { workbookId } : { newWorkbook: { title: title.success ? title.data : 'Imported workbook' } }, user.id, parsed, {
      stopReason: shutdownRefusal,
    });
    res.status(201).json({ workbookId: outcome.workbookId, revision: outcome.revision, sheets: outcome.sheets, summary: outcome.summary });
  });

  router.get('/workbooks/:id/export', requireUser, async (req: Request, res: Response, next: NextFunction) => {
    const { id } = parse(z.object({ id: idSchema }), req.params, 'params');
    const query = parse(exportQuery, req.query, 'query');
    const access = requireWorkbook(ctx, currentUser(res), id, 'export');
    const source = await exportSource(ctx, access, currentUser(res));

    let format: ExportFormat;
    if (query.format === 'csv') {
      const index = query.sheet
        ? source.sheets.findIndex((s, i) => source.sheetIds[i] === query.sheet || s.name.toLowerCase() === query.sheet!.toLowerCase())
        : source.sheets.length === 1
          ? 0
          : -1;
      if (index < 0) {
        throw query.sheet
          ? new HttpError(404, 'not_found', `sheet: no sheet "${query.sheet}" in this workbook`)
          : badRequest(`sheet: required for CSV, which holds one sheet; give one of ${source.sheets.map((s) => `"${s.name}"`).join(', ')}`);
      }
      format = { kind: 'csv', sheetIndex: index };
      res.type('text/csv; charset=utf-8').attachment(`${downloadName(source.title, '-', source.sheets[index].name)}.csv`);
    } else {
      format = { kind: 'xlsx', mode: query.format === 'xlsx-values' ? 'values' : 'formulas' };
      res.type('application/vnd.openxmlformats-officedocument.spreadsheetml.sheet');
      res.attachment(`${downloadName(source.title, `(revision ${source.revision}${format.mode === 'values' ? ', values' : ''})`)}.xlsx`);
    }
    const { sheetIds: _ids, ...workbook } = source;
    res.setHeader(valuesSourceHeader, workbook.stored ? 'stored' : 'computed');
    try {
      // Computed and written in a worker: the engine's work on a large workbook never holds this thread.
      await exportInWorker(res, workbook, format, { owner: currentUser(res).id });
    } catch (e) {
      if (!res.headersSent) {
        res.removeHeader('Content-Disposition');
        res.removeHeader('Content-Type'); // the error is JSON, not the file
        // The workbook is already stored, so a failure here is the server's limit, not a bad request.
        if (e instanceof SpreadsheetError) return next(computeRefusal('export', e, '; try values only, or split the workbook'));
        return next(e);
      }
      // Past the first byte there is no JSON error to send; a cut-off download is the honest signal.
      ctx.logger.error({ err: e, workbookId: id }, 'export failed while streaming');
      res.destroy(e instanceof Error ? e : undefined);
    }
  });

  return router;
}
