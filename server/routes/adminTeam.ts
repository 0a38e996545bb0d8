// Site admins' view of the team features: GET /api/admin/mail, the dev inbox (every message the
// built-in fake SMTP server received, with its text and so its invitation links, newest first), and
// GET /api/admin/workbooks, every workbook on the site (admins may open and read any of them).
import { allowedActions } from '../../shared/permissions.js';
import { Router } from 'express';
import { count, desc, eq } from 'drizzle-orm';
import { z } from 'zod';
import type { AdminWorkbooksResponse, MailOutboxResponse } from '../../shared/team.js';
import { requireAdmin } from '../auth/middleware.js';
import type { AppContext } from '../context.js';
import { mailMessages, users, workbookMembers, workbooks } from '../db/schema.js';
import { parse } from '../errors.js';

const querySchema = z.object({
  limit: z.coerce.number({ error: 'must be a whole number' }).int('must be a whole number').min(1, 'must be 1 or more').max(500, 'at most 500').default(100),
});

export const hiddenLinkText = '[link hidden: mail goes through SMTP_URL]';
const withoutLinks = (text: string) => text.replace(/https?:\/\/\S+/g, hiddenLinkText);

export function adminTeamRouter(ctx: AppContext): Router {
  const router = Router();

  router.get('/mail', requireAdmin, (req, res) => {
    const { limit } = parse(querySchema, req.query, 'query');
    const rows = ctx.db.select().from(mailMessages).orderBy(desc(mailMessages.id)).limit(limit).all();
    // Links are shown only while the dev inbox is the mail transport. With a real relay the
    // messages here are leftovers, and their links belong to the people they were sent to: an
    // admin must not be able to accept an invitation, confirm an address or reset a password.
    const messages = ctx.config.smtpUrl ? rows.map((m) => ({ ...m, text: withoutLinks(m.text) })) : rows;
    res.json({ messages } satisfies MailOutboxResponse);
  });

  router.get('/workbooks', requireAdmin, (req, res) => {
    const { limit } = parse(querySchema, req.query, 'query');
    const rows = ctx.db
      .select({ id: workbooks.id, title: workbooks.title, revision: workbooks.revision, ownerId: workbooks.ownerId, ownerName: users.name, createdAt: workbooks.createdAt, updatedAt: workbooks.updatedAt, members: count(workbookMembers.userId) })
      .from(workbooks)
      .innerJoin(users, eq(users.id, workbooks.ownerId))
      .leftJoin(workbookMembers, eq(workbookMembers.workbookId, workbooks.id))
      .groupBy(workbooks.id)
      .orderBy(desc(workbooks.updatedAt))
      .limit(limit)
      .all();
    const list: AdminWorkbooksResponse['workbooks'] = rows.map((r) => ({
      id: r.id,
      title: r.title,
      revision: r.revision,
      role: 'site-admin',
      actions: allowedActions(['site-admin']),
      owner: { id: r.ownerId, name: r.ownerName },
      createdAt: r.createdAt,
      updatedAt: r.updatedAt,
      memberCount: r.members,
    }));
    res.json({ workbooks: list } satisfies AdminWorkbooksResponse);
  });

  return router;
}
