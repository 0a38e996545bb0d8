// GET /api/workbooks/:id/revisions/:n/snapshot ("view as of revision n", services/revisionSnapshot.ts)
// and GET …/audit.
import { Router } from 'express';
import { auditQuerySchema, type AuditResponse, type RevisionSnapshot } from '../../shared/team.js';
import { requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { listAudit } from '../services/audit.js';
import { snapshotAt } from '../services/revisionSnapshot.js';
import { accessMiddleware, accessOf, revisionNumberSchema } from './access.js';

export function historyRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = accessMiddleware(ctx);

  router.get('/:id/revisions/:n/snapshot', access('viewHistory'), (req, res) => {
    const n = parse(revisionNumberSchema, req.params.n, 'n');
    res.json(snapshotAt(ctx, accessOf(res).workbook.id, n) satisfies RevisionSnapshot);
  });

  router.get('/:id/audit', access('viewAudit'), (req, res) => {
    const query = parse(auditQuerySchema, req.query, 'query');
    res.json({ entries: listAudit(ctx.db, accessOf(res).workbook.id, query) } satisfies AuditResponse);
  });

  return router;
}
