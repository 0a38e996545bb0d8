// POST /api/workbooks/:id/structures { inputs: [{ structure, charge? }] } → { results, underWay }:
// extended-Hückel results stored for the workbook, null for those being computed in the background.
// Anyone who may view the workbook may ask: a viewer opening a library needs its values too.
import { Router } from 'express';
import { z } from 'zod';
import { idSchema } from '../../shared/workbooks.js';
import { structuresRequestSchema } from '../../shared/structures.js';
import { currentUser, requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { HttpError, parse } from '../errors.js';
import { requireWorkbook } from '../services/access.js';
import { SpreadsheetError } from '../xlsx/limits.js';
import { requestStructures, structuresUnderWay } from '../structures/structureService.js';

export function structuresRouter(ctx: AppContext): Router {
  const router = Router();
  router.post('/:id/structures', requireUser, (req, res) => {
    const { id } = parse(z.object({ id: idSchema }), req.params, 'params');
    const access = requireWorkbook(ctx, currentUser(res), id, 'view');
    const { inputs } = parse(structuresRequestSchema, req.body ?? {});
    let answer;
    try {
      answer = requestStructures(ctx, access.workbook.id, inputs);
    } catch (e) {
      if (e instanceof SpreadsheetError) throw new HttpError(503, e.code, e.message);
      throw e;
    }
    // Stored results are JSON text already: joined, not parsed and serialised again on this thread.
    res.type('application/json').send(`{"results":[${answer.results.map((r) => r ?? 'null').join(',')}],"underWay":${structuresUnderWay(access.workbook.id)}}`);
  });
  return router;
}
