// /api/workbooks: workbooks, tabs, patches, history and computed values. Every route under /:id
// starts with access(action) (routes/access.ts), then validates its params and body with zod and
// calls one service.
import { Router, type Request } from 'express';
import { z } from 'zod';
import {
  createSheetSchema,
  createWorkbookSchema,
  idSchema,
  patchPartBodySchema,
  patchSchema,
  renameWorkbookSchema,
  restoreBodySchema,
  revisionListQuerySchema,
  updateSheetSchema,
} from '../../shared/workbooks.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { listVisibleWorkbooks } from '../services/access.js';
import { firstRowsOf } from '../services/firstRows.js';
import { applyPatch } from '../services/patches.js';
import { takePatchPart } from '../services/stagedActions.js';
import { plainPatch } from '../../shared/plainPatch.js';
import { restoreRevision } from '../services/restore.js';
import { getRevision, listRevisions } from '../services/revisionLog.js';
import { addSheet, deleteSheet, updateSheet } from '../services/sheetStore.js';
import { workbookValues } from '../services/valuesInWorker.js';
import { createWorkbookFor, deleteWorkbook, renameWorkbook, summarizeWorkbook } from '../services/workbookStore.js';
import { workbookJsonInSlices } from '../services/workbookSlices.js';
import { sendStoredValues, valuesSourceHeader } from '../values/serve.js';
import { servableValues } from '../values/store.js';
import { accessMiddleware, accessOf, idParam, revisionNumberSchema } from './access.js';

const sheetParams = z.object({ id: idSchema, sheetId: idSchema });
const revisionParams = z.object({ id: idSchema, n: revisionNumberSchema });
/** `stored=only`: answer 204 rather than compute when the revision's values are not stored yet. */
const valuesQuery = z.object({ stored: z.enum(['only'], { error: 'must be "only" when given' }).optional() });

export function workbooksRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = accessMiddleware(ctx);
  // A tab's own routes: the workbook editor role, and the editor role on that sheet.
  const onSheet = { sheet: (req: Request) => idParam(req, 'sheetId') };

  router.get('/', (_req, res) => {
    res.json({ workbooks: listVisibleWorkbooks(ctx, currentUser(res)) });
  });

  router.post('/', (req, res) => {
    const { title } = parse(createWorkbookSchema, req.body);
    res.status(201).json({ workbook: createWorkbookFor(ctx, currentUser(res), title) });
  });

  router.get('/:id', access('view'), async (_req, res) => {
    res.type('application/json').send(await workbookJsonInSlices(ctx, accessOf(res)));
  });

  router.patch('/:id', access('rename'), (req, res) => {
    const { title } = parse(renameWorkbookSchema, req.body);
    renameWorkbook(ctx, accessOf(res).workbook.id, title);
    res.json({ workbook: summarizeWorkbook(ctx, accessOf(res)) });
  });

  router.delete('/:id', access('delete'), (_req, res) => {
    deleteWorkbook(ctx, accessOf(res).workbook.id);
    res.status(204).end();
  });

  router.post('/:id/sheets', access('editSheets'), (req, res) => {
    const body = parse(createSheetSchema, req.body ?? {});
    res.status(201).json(addSheet(ctx, accessOf(res).workbook.id, currentUser(res).id, body));
  });

  router.patch('/:id/sheets/:sheetId', access('editSheets', onSheet), (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    const body = parse(updateSheetSchema, req.body);
    res.json(updateSheet(ctx, accessOf(res).workbook.id, sheetId, currentUser(res).id, body));
  });

  router.delete('/:id/sheets/:sheetId', access('editSheets', onSheet), (req, res) => {
    const { sheetId } = parse(sheetParams, req.params, 'params');
    res.json(deleteSheet(ctx, accessOf(res).workbook.id, sheetId, currentUser(res).id));
  });

  router.post('/:id/patches', access('editCells'), (req, res) => {
    // The usual patch is checked without zod's per-object walk; anything else gets patchSchema's refusal.
    const patch = plainPatch(req.body) ?? parse(patchSchema, req.body);
    // A part of an action larger than one patch: held until its last part, which applies them all.
    const { part } = parse(patchPartBodySchema, req.body);
    if (!part) return res.json(applyPatch(ctx, accessOf(res).workbook.id, currentUser(res).id, patch));
    const result = takePatchPart(ctx, accessOf(res).workbook.id, currentUser(res).id, patch, part);
    res.status('staged' in result ? 202 : 200).json(result);
  });

  router.get('/:id/revisions', access('viewHistory'), (req, res) => {
    const { workbook } = accessOf(res);
    const query = parse(revisionListQuerySchema, req.query, 'query');
    res.json({ revision: workbook.revision, revisions: listRevisions(ctx.db, workbook.id, query) });
  });

  router.get('/:id/revisions/:n', access('viewHistory'), (req, res) => {
    const { n } = parse(revisionParams, req.params, 'params');
    res.json(getRevision(ctx.db, accessOf(res).workbook.id, n));
  });

  router.post('/:id/revisions/:n/restore', access('restore'), (req, res) => {
    const { n } = parse(revisionParams, req.params, 'params');
    const { sheetId } = parse(restoreBodySchema, req.body ?? {}, 'body');
    res.json(restoreRevision(ctx, accessOf(res).workbook.id, currentUser(res).id, n, sheetId));
  });

  // What the page paints first: a few kilobytes however large the workbook (services/firstRows.ts).
  router.get('/:id/first-rows', access('view'), (_req, res) => {
    res.json(firstRowsOf(ctx, accessOf(res)));
  });

  router.get('/:id/values', access('view'), async (req, res) => {
    const { stored: storedOnly } = parse(valuesQuery, req.query, 'query');
    const { workbook } = accessOf(res);
    // The revision's values as kept after its commit (server/values/); otherwise computed now.
    const stored = servableValues(ctx.db, workbook.id);
    if (stored) return sendStoredValues(req, res, stored);
    ctx.values.nudge(workbook.id);
    if (storedOnly) return res.status(204).end(); // the client computes them itself meanwhile
    const body = await workbookValues(ctx, accessOf(res), currentUser(res).id);
    res.setHeader(valuesSourceHeader, 'computed');
    res.type('application/json').send(body);
  });

  return router;
}
