// Workbooks in and out: POST /api/imports (multipart `file`, optional `workbookId`) and
// GET /api/workbooks/:id/export?format=xlsx|xlsx-values|csv&sheet=<id or name>. The import and the
// export are services (services/imports.ts, services/exports.ts); this file receives the upload and
// streams the download.
import { Router, type Request, type RequestHandler, type Response } from 'express';
import multer from 'multer';
import { z } from 'zod';
import { idSchema } from '../../shared/workbooks.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { badRequest, HttpError, parse } from '../errors.js';
import { exportDownload, type Download } from '../services/exports.js';
import { importUpload } from '../services/imports.js';
import { defaultImportLimits, formatBytes } from '../xlsx/limits.js';
import { accessMiddleware, accessOf } from './access.js';

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

/**
 * Sends a download. Before its first byte a failure is still a JSON error (through the error
 * handler); past it there is no JSON error to send, and a cut-off download is the honest signal.
 */
async function sendDownload(ctx: AppContext, res: Response, download: Download): Promise<void> {
  res.type(download.contentType).attachment(download.filename);
  try {
    await download.writeTo(res);
  } catch (e) {
    if (!res.headersSent) {
      res.removeHeader('Content-Disposition');
      res.removeHeader('Content-Type'); // the error is JSON, not the file
      throw e;
    }
    ctx.logger.error({ err: e, workbookId: accessOf(res).workbook.id }, 'export failed while streaming');
    res.destroy(e instanceof Error ? e : undefined);
  }
}

export function ioRouter(ctx: AppContext): Router {
  const router = Router();
  const access = accessMiddleware(ctx);
  // Refused before the file is read when the user may not add sheets to the workbook named.
  const importTarget = (req: Request) => parse(importBody, req.body ?? {}).workbookId;

  router.post('/imports', requireUser, receiveUpload, access('editSheets', { workbookId: importTarget }), async (req, res) => {
    const result = await importUpload(ctx, currentUser(res), req.file, importTarget(req));
    res.status(201).json(result);
  });

  router.get('/workbooks/:id/export', requireUser, access('export'), async (req, res) => {
    const query = parse(exportQuery, req.query, 'query');
    await sendDownload(ctx, res, await exportDownload(ctx, accessOf(res), currentUser(res), query));
  });

  return router;
}
