// Sharing by e-mail. An invitation stores only the SHA-256 of a random 32-byte token; the token itself
// exists in the e-mailed link alone, so a copy of the database cannot accept anything. A link works
// once, for 7 days, and only for a signed-in account with the invited address (so a forwarded or
// leaked link does not let someone else in). A newer invitation to the same address replaces the older.
import { createHash, randomBytes, randomUUID } from 'node:crypto';
import { and, asc, eq, gt, isNull, type SQL } from 'drizzle-orm';
import type { AcceptInvitationResponse, GrantableRole, Invitation, InvitationPreview, InvitationStatus } from '../../shared/team.js';
import type { AppContext } from '../context.js';
import { invitations, users, workbookMembers, workbooks } from '../db/schema.js';
import { conflict, HttpError, notFound } from '../errors.js';
import { recordAudit } from './audit.js';
import { joinByInvitation } from './members.js';
import { sameEmail } from './users.js';
import type { Tx } from './cellStore.js';

export const invitationLifetimeMs = 7 * 24 * 60 * 60 * 1000;

export const hashInvitationToken = (token: string) => createHash('sha256').update(token).digest('hex');

type InvitationRow = typeof invitations.$inferSelect;

function statusOf(row: Pick<InvitationRow, 'acceptedAt' | 'revokedAt' | 'expiresAt'>, now = Date.now()): InvitationStatus {
  if (row.acceptedAt !== null) return 'accepted';
  if (row.revokedAt !== null) return 'revoked';
  return row.expiresAt <= now ? 'expired' : 'pending';
}

const invitationColumns = {
  id: invitations.id,
  email: invitations.email,
  role: invitations.role,
  createdAt: invitations.createdAt,
  expiresAt: invitations.expiresAt,
  acceptedAt: invitations.acceptedAt,
  revokedAt: invitations.revokedAt,
  inviterId: users.id,
  inviterName: users.name,
};
interface InvitationListRow {
  id: string;
  email: string;
  role: GrantableRole;
  createdAt: number;
  expiresAt: number;
  acceptedAt: number | null;
  revokedAt: number | null;
  inviterId: string;
  inviterName: string;
}

const toInvitation = (r: InvitationListRow): Invitation => ({
  id: r.id,
  email: r.email,
  role: r.role,
  invitedBy: { id: r.inviterId, name: r.inviterName },
  createdAt: r.createdAt,
  expiresAt: r.expiresAt,
  status: statusOf(r),
});

function findInvitation(ctx: AppContext, where: SQL): Invitation | undefined {
  const row = ctx.db.select(invitationColumns).from(invitations).innerJoin(users, eq(users.id, invitations.invitedBy)).where(where).get();
  return row ? toInvitation(row) : undefined;
}

export function listPendingInvitations(ctx: AppContext, workbookId: string): Invitation[] {
  return ctx.db
    .select(invitationColumns)
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .where(and(eq(invitations.workbookId, workbookId), isNull(invitations.acceptedAt), isNull(invitations.revokedAt), gt(invitations.expiresAt, Date.now())))
    .orderBy(asc(invitations.createdAt))
    .all()
    .map(toInvitation);
}

function invitationMail(o: { inviter: { name: string; email: string }; title: string; role: GrantableRole; email: string; link: string; expiresAt: number }) {
  const what = o.role === 'editor' ? 'an editor (you may change cells and sheets)' : 'a viewer (you may read and export it)';
  const expires = new Date(o.expiresAt).toISOString().replace('T', ' ').slice(0, 16);
  return {
    subject: `${o.inviter.name} invited you to "${o.title}" on Orbitab`,
    text: [
      `${o.inviter.name} (${o.inviter.email}) invited you to the workbook "${o.title}" on Orbitab as ${what}.`,
      '',
      `To accept, open this link and sign up or sign in with ${o.email}:`,
      o.link,
      '',
      `The link works once and expires on ${expires} UTC. If you did not expect this message, you can ignore it.`,
    ].join('\n'),
  };
}

/**
 * Creates an invitation and e-mails its link `${origin}/invitations/<token>`. The mail goes out
 * before the row is stored: when the mail server refuses it, nothing is saved (502) and any earlier
 * invitation to that address still works.
 */
export async function createInvitation(
  ctx: AppContext,
  workbookId: string,
  inviter: { id: string; name: string; email: string },
  input: { email: string; role: GrantableRole },
  origin: string,
): Promise<Invitation> {
  const workbook = ctx.db.select({ title: workbooks.title }).from(workbooks).where(eq(workbooks.id, workbookId)).get();
  if (!workbook) throw notFound('workbook');
  const member = ctx.db
    .select({ role: workbookMembers.role })
    .from(workbookMembers)
    .innerJoin(users, eq(users.id, workbookMembers.userId))
    .where(and(eq(workbookMembers.workbookId, workbookId), sameEmail(users.email, input.email)))
    .get();
  if (member) throw conflict(`${input.email} is already a member (${member.role}); change their role instead`);

  const token = randomBytes(32).toString('base64url');
  const id = randomUUID();
  const expiresAt = Date.now() + invitationLifetimeMs;
  const mail = invitationMail({ inviter, title: workbook.title, role: input.role, email: input.email, link: `${origin.replace(/\/+$/, '')}/invitations/${token}`, expiresAt });
  try {
    await ctx.mail.send({ to: input.email, ...mail });
  } catch (err) {
    throw new HttpError(502, 'mail_failed', `the invitation e-mail to ${input.email} could not be sent (${(err as Error).message}); nothing was saved, try again later`);
  }

  ctx.db.transaction(
    (tx) => {
      const replaced = tx
        .update(invitations)
        .set({ revokedAt: Date.now() })
        .where(and(eq(invitations.workbookId, workbookId), sameEmail(invitations.email, input.email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
        .returning({ id: invitations.id })
        .all();
      tx.insert(invitations).values({ id, workbookId, email: input.email, role: input.role, tokenHash: hashInvitationToken(token), invitedBy: inviter.id, expiresAt }).run();
      recordAudit(tx, workbookId, inviter.id, 'invitation.created', { invitationId: id, email: input.email, role: input.role, replaced: replaced.map((r) => r.id) });
    },
    { behavior: 'immediate' },
  );
  return findInvitation(ctx, eq(invitations.id, id))!;
}

/** Revokes a pending invitation of this workbook; revoking one twice is fine, an accepted one is not. */
export function revokeInvitation(ctx: AppContext, workbookId: string, actorId: string, invitationId: string): void {
  ctx.db.transaction(
    (tx) => {
      const row = tx.select().from(invitations).where(and(eq(invitations.id, invitationId), eq(invitations.workbookId, workbookId))).get();
      if (!row) throw notFound('invitation');
      if (row.acceptedAt !== null) throw conflict(`the invitation to ${row.email} was already accepted; remove the member instead`);
      if (row.revokedAt !== null) return;
      tx.update(invitations).set({ revokedAt: Date.now() }).where(eq(invitations.id, invitationId)).run();
      recordAudit(tx, workbookId, actorId, 'invitation.revoked', { invitationId, email: row.email, role: row.role });
    },
    { behavior: 'immediate' },
  );
}

const unknownToken = () => new HttpError(404, 'not_found', 'invitation not found: the link may be incomplete; open it again from the e-mail');

/** What a link offers, for the page that asks the invitee to accept (no sign-in needed). */
export function previewInvitation(ctx: AppContext, token: string): InvitationPreview {
  const row = ctx.db
    .select({ ...invitationColumns, workbookId: workbooks.id, title: workbooks.title })
    .from(invitations)
    .innerJoin(users, eq(users.id, invitations.invitedBy))
    .innerJoin(workbooks, eq(workbooks.id, invitations.workbookId))
    .where(eq(invitations.tokenHash, hashInvitationToken(token)))
    .get();
  if (!row) throw unknownToken();
  const { id: _id, createdAt: _c, ...rest } = toInvitation(row);
  return { workbook: { id: row.workbookId, title: row.title }, ...rest };
}

const refusals: Record<Exclude<InvitationStatus, 'pending'>, [code: string, message: string]> = {
  accepted: ['invitation_used', 'this invitation has already been used; each link works once. Ask the owner for a new one if you still need access'],
  revoked: ['invitation_revoked', 'this invitation was withdrawn by the workbook owner (or replaced by a newer one)'],
  expired: ['invitation_expired', 'this invitation has expired; ask the owner to send a new one'],
};

/**
 * Revokes every pending invitation to `email` in this workbook, inside the caller's transaction: a
 * direct add, a removal or a role change settles that person's access, and an older link must not
 * undo it (a removed member coming back, a viewer accepting an editor link sent before).
 */
export function revokePendingFor(tx: Tx, workbookId: string, actorId: string, email: string, why: string): void {
  const revoked = tx
    .update(invitations)
    .set({ revokedAt: Date.now() })
    .where(and(eq(invitations.workbookId, workbookId), sameEmail(invitations.email, email), isNull(invitations.acceptedAt), isNull(invitations.revokedAt)))
    .returning({ id: invitations.id, role: invitations.role })
    .all();
  for (const r of revoked) recordAudit(tx, workbookId, actorId, 'invitation.revoked', { invitationId: r.id, email, role: r.role, because: why });
}

/** The pending invitation a link names, when it was sent to `email` (sign-up from a link proves that mailbox). */
export function pendingInvitationFor(ctx: AppContext, token: string, email: string): boolean {
  const row = ctx.db.select().from(invitations).where(eq(invitations.tokenHash, hashInvitationToken(token))).get();
  return !!row && statusOf(row) === 'pending' && row.email.toLowerCase() === email.toLowerCase();
}

/**
 * Accepts a link for the signed-in user: membership and the used mark are written together, once.
 * Only a verified account with the invited address may: the link alone proves nothing about who
 * holds it (a site admin reading the dev inbox, a forwarded mail).
 */
export function acceptInvitation(ctx: AppContext, user: { id: string; email: string; emailVerified: boolean }, token: string): AcceptInvitationResponse {
  const result = ctx.db.transaction(
    (tx) => {
      const row = tx.select().from(invitations).where(eq(invitations.tokenHash, hashInvitationToken(token))).get();
      if (!row) throw unknownToken();
      const status = statusOf(row);
      if (status !== 'pending') throw new HttpError(410, ...refusals[status]);
      if (row.email.toLowerCase() !== user.email.toLowerCase()) {
        throw new HttpError(403, 'invitation_for_another_email', `this invitation was sent to ${row.email}, but you are signed in as ${user.email}; sign in with ${row.email} to accept it`);
      }
      if (!user.emailVerified) {
        throw new HttpError(403, 'email_not_verified', `confirm ${user.email} first: open the link in the verification e-mail (or ask for a new one), then accept the invitation`);
      }
      const role = joinByInvitation(tx, row.workbookId, user.id, row.role);
      tx.update(invitations).set({ acceptedAt: Date.now() }).where(eq(invitations.id, row.id)).run();
      recordAudit(tx, row.workbookId, user.id, 'invitation.accepted', { invitationId: row.id, email: row.email, invitedRole: row.role, role });
      return { workbookId: row.workbookId, role };
    },
    { behavior: 'immediate' },
  );
  ctx.events.publish(result.workbookId, { type: 'members', workbookId: result.workbookId });
  return result;
}
