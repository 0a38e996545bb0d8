// GET /api/workbooks/:id/revisions/:n/snapshot ("view as of revision n") and GET …/audit. The
// snapshot is computed the way a restore computes its target, by undoing later revisions in memory,
// so what one sees is exactly what restoring n would bring back.
import { Router } from 'express';
import { auditQuerySchema, type AuditResponse, type RevisionSnapshot } from '../../shared/team.js';
import type { CellEntry } from '../../shared/workbooks.js';
import { requireUser } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { notFound, parse } from '../errors.js';
import { listAudit } from '../services/audit.js';
import { loadModel, undoLaterRevisions } from '../services/restore.js';
import { currentRevision } from '../services/revisionLog.js';
import { revisionNumberSchema, workbookAccess } from './workbookAccess.js';


function snapshotAt(ctx: AppContext, workbookId: string, n: number): RevisionSnapshot {
  return ctx.db.transaction((tx) => {
    if (n > currentRevision(tx, workbookId)) throw notFound(`revision ${n}`);
    const model = loadModel(tx, workbookId);
    undoLaterRevisions(tx, workbookId, model, n);
    return {
      revision: n,
      sheets: model.order.map((id, position) => {
        const s = model.sheets.get(id)!;
        const cells = [...s.cells].map(([key, input]): CellEntry => {
          const [row, col] = key.split(',').map(Number);
          return [row, col, input];
        });
        cells.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
        return { id, name: s.name, position, settings: s.settings, cells };
      }),
    };
  });
}

export function historyRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(requireUser);
  const access = workbookAccess(ctx);

  router.get('/:id/revisions/:n/snapshot', (req, res) => {
    const a = access(req, res, 'viewHistory');
    const n = parse(revisionNumberSchema, req.params.n, 'n');
    res.json(snapshotAt(ctx, a.workbook.id, n) satisfies RevisionSnapshot);
  });

  router.get('/:id/audit', (req, res) => {
    const a = access(req, res, 'viewAudit');
    const query = parse(auditQuerySchema, req.query, 'query');
    res.json({ entries: listAudit(ctx.db, a.workbook.id, query) } satisfies AuditResponse);
  });

  return router;
}
