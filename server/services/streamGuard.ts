// Whether an open live-update stream may go on: the session that opened it still exists and has not
// expired, its user is not disabled, and the user may still view the workbook (a demoted site admin
// who is no member loses it). Read straight from the database, synchronously, so the live route can
// ask before every event and on a timer without hooks in the routes that sign out, disable or demote.
import { eq } from 'drizzle-orm';
import type { AppContext } from '../context.js';
import { sessions, users, workbooks } from '../db/schema.js';
import { requireWorkbook } from './access.js';

export type StreamVerdict = { ok: true; role: ReturnType<typeof requireWorkbook>['role']; roles: ReturnType<typeof requireWorkbook>['roles'] } | { ok: false; reason: 'signed_out' | 'access_removed' | 'deleted' };

export function streamVerdict(ctx: AppContext, sessionId: string, workbookId: string): StreamVerdict {
  const row = ctx.db
    .select({ userId: users.id, siteRole: users.siteRole, disabled: users.disabled, expiresAt: sessions.expiresAt })
    .from(sessions)
    .innerJoin(users, eq(users.id, sessions.userId))
    .where(eq(sessions.id, sessionId))
    .get();
  // lucia keeps expires_at in seconds since the epoch.
  if (!row || row.disabled || row.expiresAt * 1000 <= Date.now()) return { ok: false, reason: 'signed_out' };
  try {
    const access = requireWorkbook(ctx, { id: row.userId, siteRole: row.siteRole }, workbookId, 'view');
    return { ok: true, role: access.role, roles: access.roles };
  } catch {
    // requireWorkbook answers 404 both for a deleted workbook and for one the user may not see.
    const exists = ctx.db.select({ id: workbooks.id }).from(workbooks).where(eq(workbooks.id, workbookId)).get();
    return { ok: false, reason: exists ? 'access_removed' : 'deleted' };
  }
}
