// The team features under /api/workbooks/:id: members and invitations, locks and protected ranges,
// live updates and presence, history snapshots and the audit log. Mounted beside workbooksRouter.
import { Router } from 'express';
import type { AppContext } from '../context.js';
import { historyRouter } from './history.js';
import { liveRouter } from './live.js';
import { locksRouter } from './locks.js';
import { membersRouter } from './members.js';

export function teamRouter(ctx: AppContext): Router {
  const router = Router();
  router.use(membersRouter(ctx), locksRouter(ctx), liveRouter(ctx), historyRouter(ctx));
  return router;
}
