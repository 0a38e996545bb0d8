// /api/auth: proving an address (verify, resend), forgetting a password (reset by mailed link) and
// changing it while signed in. Each link is single-use, stored hashed, and built from the configured
// public origin, never from the request.
import { Router } from 'express';
import { eq } from 'drizzle-orm';
import {
  changePasswordSchema,
  passwordProblem,
  passwordResetRequestSchema,
  passwordResetSchema,
  resetTokenSchema,
  verifyEmailSchema,
  type AuthResponse,
  type PasswordResetRequested,
} from '../../shared/auth.js';
import { currentUser, requireUser, setSessionCookie } from '../auth/middleware.js';
import { hashPassword, verifyPassword } from '../auth/password.js';
import { publicLink } from '../config.js';
import type { AppContext } from '../context.js';
import { auditLog, users } from '../db/schema.js';
import { HttpError, conflict, parse } from '../errors.js';
import { findLiveToken, issueToken, resetMail, useToken, verificationMail } from '../services/accountTokens.js';
import { findUserByEmail, findUserById, markEmailVerified, toPublicUser } from '../services/users.js';

export const resetRequestedMessage = 'if an account has this address, a link to choose a new password is on its way; it works once, for 30 minutes';

export async function sendVerificationMail(ctx: AppContext, user: { id: string; email: string; name: string }): Promise<void> {
  const { token, expiresAt } = issueToken(ctx.db, user, 'verify');
  await ctx.mail.send({ to: user.email, ...verificationMail({ name: user.name, email: user.email, link: publicLink(ctx.config, `/verify-email/${token}`), expiresAt }) });
}

/** A refused new password, shaped like parse()'s 400 so forms show it beside the field. */
const weakPassword = (field: string, problem: string) => new HttpError(400, 'invalid_input', `${field}: ${problem}`, { issues: [{ field, message: problem }] });

const badLink = (what: string) => new HttpError(410, 'link_expired', `this ${what} link is used, replaced by a newer one or expired; ask for a new one`);

export function accountLinksRouter(ctx: AppContext): Router {
  const { db, lucia, config, limits } = ctx;
  const router = Router();

  // The link's token proves the mailbox on its own, so this works signed in or not.
  router.post('/verify', (req, res) => {
    const { token } = parse(verifyEmailSchema, req.body);
    const row = useToken(db, token, 'verify');
    if (!row) throw badLink('verification');
    const user = findUserById(db, row.userId);
    if (!user || user.email.toLowerCase() !== row.email.toLowerCase()) throw badLink('verification');
    res.json({ user: toPublicUser(markEmailVerified(db, user.id, config.adminEmail)) } satisfies AuthResponse);
  });

  router.post('/verify/resend', requireUser, async (_req, res) => {
    const me = currentUser(res);
    if (me.emailVerified) throw conflict(`${me.email} is already confirmed`);
    await limits.verifyMailPerUser.take(me.id, 'user', 'verification e-mails');
    try {
      await sendVerificationMail(ctx, me);
    } catch (err) {
      throw new HttpError(502, 'mail_failed', `the e-mail to ${me.email} could not be sent (${(err as Error).message}); try again later`);
    }
    res.status(202).json({ message: `a new link is on its way to ${me.email}` });
  });

  router.post('/password-reset', async (req, res) => {
    const { email } = parse(passwordResetRequestSchema, req.body);
    await limits.resetPerAddress.take(req.ip ?? 'unknown', 'address', 'password reset requests');
    // Counted for every address, known or not, so the limit itself says nothing about accounts.
    await limits.resetPerAccount.take(email, 'account', 'password reset requests');
    const user = findUserByEmail(db, email);
    if (user && !user.disabled) {
      const { token, expiresAt } = issueToken(db, user, 'reset');
      // Not awaited: the answer comes as fast for an unknown address as for a known one.
      ctx.mail
        .send({ to: user.email, ...resetMail({ name: user.name, link: publicLink(config, `/reset-password/${token}`), expiresAt }) })
        .catch((err) => ctx.logger.warn({ err, userId: user.id }, 'password reset e-mail not sent'));
    }
    res.status(202).json({ message: resetRequestedMessage } satisfies PasswordResetRequested);
  });

  router.post('/password-reset/:token', async (req, res) => {
    const token = parse(resetTokenSchema, req.params.token, 'token');
    const { password } = parse(passwordResetSchema, req.body);
    const live = findLiveToken(db, token, 'reset');
    const owner = live && findUserById(db, live.userId);
    if (!live || !owner) throw badLink('password reset');
    // A weak password is refused before the link is used up, so the person can try another.
    const problem = passwordProblem(password, owner.email);
    if (problem) throw weakPassword('password', problem);
    const passwordHash = await hashPassword(password);
    const row = useToken(db, token, 'reset');
    if (!row) throw badLink('password reset');
    db.transaction((tx) => {
      // The link reached the mailbox, so the address is proved too.
      tx.update(users).set({ passwordHash, emailVerifiedAt: owner.emailVerifiedAt ?? Date.now() }).where(eq(users.id, owner.id)).run();
      tx.insert(auditLog).values({ actorId: owner.id, action: 'site.password_reset', details: JSON.stringify({ userId: owner.id }) }).run();
    });
    markEmailVerified(db, owner.id, config.adminEmail);
    // Whoever knew the old password (or held a session) is out.
    await lucia.invalidateUserSessions(owner.id);
    await limits.signInPerAccount.forget(owner.email);
    setSessionCookie(req, res, lucia.createBlankSessionCookie());
    res.status(204).end();
  });

  router.post('/password', requireUser, async (req, res) => {
    const me = currentUser(res);
    const input = parse(changePasswordSchema, req.body);
    await limits.passwordChangePerUser.take(me.id, 'user', 'password changes');
    const row = findUserById(db, me.id)!;
    if (!(await verifyPassword(row.passwordHash, input.current))) {
      throw new HttpError(403, 'wrong_password', 'the current password is not correct');
    }
    await limits.passwordChangePerUser.giveBack(me.id);
    const problem = passwordProblem(input.next, me.email);
    if (problem) throw weakPassword('next', problem);
    const passwordHash = await hashPassword(input.next);
    db.transaction((tx) => {
      tx.update(users).set({ passwordHash }).where(eq(users.id, me.id)).run();
      tx.insert(auditLog).values({ actorId: me.id, action: 'site.password_changed', details: JSON.stringify({ userId: me.id }) }).run();
    });
    // Every session ends; this one continues under a new id.
    await lucia.invalidateUserSessions(me.id);
    const session = await lucia.createSession(me.id, {});
    setSessionCookie(req, res, lucia.createSessionCookie(session.id));
    res.status(204).end();
  });

  return router;
}
