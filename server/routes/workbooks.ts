// /api/workbooks: workbooks, tabs, patches, history and computed values. Every route validates its
// params and body with zod and asks services/access.ts before touching anything.
import { Router, type Request, type Response } from 'express';
import { z } from 'zod';
import { revisionNumberSchema } from './workbookAccess.js';
import {
  createSheetSchema,
  createWorkbookSchema,
  idSchema,
  patchSchema,
  renameWorkbookSchema,
  restoreBodySchema,
  revisionListQuerySchema,
  updateSheetSchema,
} from '../../shared/workbooks.js';
import type { WorkbookAction } from '../../shared/permissions.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { HttpError, parse } from '../errors.js';
import { listVisibleWorkbooks, requireWorkbook } from '../services/access.js';
import { applyPatch } from '../services/patches.js';
import { restoreRevision } from '../services/restore.js';
import { getRevision, listRevisions } from '../services/revisionLog.js';
import { addSheet, deleteSheet, updateSheet } from '../services/sheetStore.js';
import { valuesFor, type ValuesBody } from '../services/valuesInWorker.js';
import { loadWorkbookInSlices } from '../services/workbookSlices.js';
import { SpreadsheetError } from '../xlsx/limits.js';
import { computeRefusal } from '../xlsx/refusals.js';
import { createWorkbook, deleteWorkbook, loadWorkbook, renameWorkbook, summarizeWorkbook } from '../services/workbookStore.js';

const workbookParams = z.object({ id: idSchema });
const sheetParams = z.object({ id: idSchema, sheetId: idSchema });
const revisionParams = z.object({ id: idSchema, n: revisionNumberSchema });

export function workbooksRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);

  /** Validates :id and checks that the signed-in user may do `action` on that workbook. */
  const access = (req: Request, res: Response, action: WorkbookAction) => {
    const { id } = parse(workbookParams, req.params, 'params');
    return requireWorkbook(ctx, currentUser(res), id, action);
  };

  router.get('/', (_req, res) => {
    res.json({ workbooks: listVisibleWorkbooks(ctx, currentUser(res)) });
  });

  router.post('/', (req, res) => {
    const { title } = parse(createWorkbookSchema, req.body);
    const user = currentUser(res);
    const id = createWorkbook(ctx, user, title);
    res.status(201).json({ workbook: summarizeWorkbook(ctx, requireWorkbook(ctx, user, id, 'view')) });
  });

  router.get('/:id', (req, res) => {
    res.json(loadWorkbook(ctx, access(req, res, 'view')));
  });

  router.patch('/:id', (req, res) => {
    const a = access(req, res, 'rename');
    const { title } = parse(renameWorkbookSchema, req.body);
    renameWorkbook(ctx, a.workbook.id, title);
    res.json({ workbook: summarizeWorkbook(ctx, a) });
  });

  router.delete('/:id', (req, res) => {
    deleteWorkbook(ctx, access(req, res, 'delete').workbook.id);
    res.status(204).end();
  });

  router.post('/:id/sheets', (req, res) => {
    const a = access(req, res, 'editSheets');
    const body = parse(createSheetSchema, req.body ?? {});
    res.status(201).json(addSheet(ctx, a.workbook.id, currentUser(res).id, body));
  });

  router.patch('/:id/sheets/:sheetId', (req, res) => {
    const a = access(req, res, 'editSheets');
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const body = parse(updateSheetSchema, req.body);
    res.json(updateSheet(ctx, a.workbook.id, sheetId, currentUser(res).id, body));
  });

  router.delete('/:id/sheets/:sheetId', (req, res) => {
    const a = access(req, res, 'editSheets');
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json(deleteSheet(ctx, a.workbook.id, sheetId, currentUser(res).id));
  });

  router.post('/:id/patches', (req, res) => {
    const a = access(req, res, 'editCells');
    const patch = parse(patchSchema, req.body);
    res.json(applyPatch(ctx, a.workbook.id, currentUser(res).id, patch));
  });

  router.get('/:id/revisions', (req, res) => {
    const a = access(req, res, 'viewHistory');
    const query = parse(revisionListQuerySchema, req.query, 'query');
    res.json({ revision: a.workbook.revision, revisions: listRevisions(ctx.db, a.workbook.id, query) });
  });

  router.get('/:id/revisions/:n', (req, res) => {
    const a = access(req, res, 'viewHistory');
    const { n } = parse(revisionParams, req.params, 'params');
    res.json(getRevision(ctx.db, a.workbook.id, n));
  });

  router.post('/:id/revisions/:n/restore', (req, res) => {
    const a = access(req, res, 'restore');
    const { n } = parse(revisionParams, req.params, 'params');
    const { sheetId } = parse(restoreBodySchema, req.body ?? {}, 'body');
    res.json(restoreRevision(ctx, a.workbook.id, currentUser(res).id, n, sheetId));
  });

  router.get('/:id/values', async (req, res) => {
    const workbook = await loadWorkbookInSlices(ctx, access(req, res, 'view'));
    let body: ValuesBody;
    try {
      body = await valuesFor(workbook, currentUser(res).id);
    } catch (e) {
      if (e instanceof SpreadsheetError) throw computeRefusal('values', e);
      throw e;
    }
    res.type('application/json').send(Buffer.from(body.bytes.buffer, body.bytes.byteOffset, body.bytes.byteLength));
  });

  return router;
}
