// POST /api/workbooks/:id/structures { inputs: [{ structure, charge? }] } → { results, underWay }:
// extended-Hückel results stored for the workbook, null for those being computed in the background.
// Anyone who may view the workbook may ask: a viewer opening a library needs its values too.
import { Router } from 'express';
import { structuresRequestSchema } from '../../shared/structures.js';
import { requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { structuresAnswer } from '../structures/structureService.js';
import { accessMiddleware, accessOf } from './access.js';

export function structuresRouter(ctx: AppContext): Router {
  const router = Router();
  const access = accessMiddleware(ctx);
  router.post('/:id/structures', requireUser, access('view'), (req, res) => {
    const { inputs } = parse(structuresRequestSchema, req.body ?? {});
    res.type('application/json').send(structuresAnswer(ctx, accessOf(res).workbook.id, inputs));
  });
  return router;
}
