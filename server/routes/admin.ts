// /api/admin/users: site admins list accounts, change site roles, disable and re-enable accounts.
// (GET /api/admin/mail, the dev inbox, is mounted by the mail feature on its own router.)
import { Router } from 'express';
import { adminUserIdSchema, adminUserPatchSchema, type AdminUser, type AdminUsersResponse } from '../../shared/admin.js';
import { currentUser, requireAdmin } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { parse } from '../errors.js';
import { listUsers, toAdminUser, updateUser } from '../services/users.js';

export function adminUsersRouter(ctx: AppContext): Router {
  const { db, lucia } = ctx;
  const router = Router();
  // Checked on the server for every route here: a member gets 403, whatever the client shows.
  router.use(requireAdmin);

  router.get('/users', (_req, res) => {
    res.json({ users: listUsers(db) } satisfies AdminUsersResponse);
  });

  router.patch('/users/:id', async (req, res) => {
    const id = parse(adminUserIdSchema, req.params.id, 'id');
    const patch = parse(adminUserPatchSchema, req.body);
    const user = updateUser(db, currentUser(res).id, id, patch);
    // A disabled account's sessions end now, not at their expiry (loadSession also refuses them).
    if (user.disabled) await lucia.invalidateUserSessions(user.id);
    res.json({ user: toAdminUser(user) } satisfies { user: AdminUser });
  });

  return router;
}
