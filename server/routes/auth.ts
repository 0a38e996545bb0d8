// /api/auth: sign-up, sign-in, sign-out and "who am I". Verification, resets and password changes
// are in accountLinks.ts, on the same path.
import { Router, type Request, type Response } from 'express';
import { signInSchema, signUpSchema, type AuthResponse } from '../../shared/auth.js';
import { currentUser, setSessionCookie } from '../auth/middleware.js';
import { hashPassword, verifyAgainstDecoy, verifyPassword } from '../auth/password.js';
import type { AppContext } from '../context.js';
import { HttpError, forbidden, parse } from '../errors.js';
import { pendingInvitationFor } from '../services/invitations.js';
import { createUser, findUserByEmail, promoteOperatorAdmin, toPublicUser } from '../services/users.js';
import { accountLinksRouter, sendVerificationMail } from './accountLinks.js';

/** One message for an unknown email and a wrong password, so sign-in does not reveal who has an account. */
export const wrongCredentialsMessage = 'email or password is not correct';

/** Ends any session the request came with and starts a fresh one (no session fixation). */
export async function startSession(ctx: AppContext, req: Request, res: Response, userId: string) {
  const previous = res.locals.session as { id: string } | null;
  if (previous) await ctx.lucia.invalidateSession(previous.id);
  const session = await ctx.lucia.createSession(userId, {});
  setSessionCookie(req, res, ctx.lucia.createSessionCookie(session.id));
}

export function authRouter(ctx: AppContext): Router {
  const { db, config, limits } = ctx;
  const router = Router();

  router.post('/sign-up', async (req, res) => {
    const input = parse(signUpSchema, req.body);
    await limits.signUpPerAddress.take(req.ip ?? 'unknown', 'address', 'sign-ups');
    const passwordHash = await hashPassword(input.password);
    // A link from an invitation mail to this very address proves the mailbox as well as our own mail would.
    const verified = input.invitationToken !== undefined && pendingInvitationFor(ctx, input.invitationToken, input.email);
    const user = createUser(db, { email: input.email, name: input.name, passwordHash, verified }, config.adminEmail);
    await startSession(ctx, req, res, user.id);
    if (!verified) {
      // The account exists either way; a relay that refuses now is reported in the log and the
      // person can ask for another mail from the app.
      await sendVerificationMail(ctx, user).catch((err) => ctx.logger.warn({ err, userId: user.id }, 'verification e-mail not sent'));
    }
    res.status(201).json({ user: toPublicUser(user) } satisfies AuthResponse);
  });

  router.post('/sign-in', async (req, res) => {
    const input = parse(signInSchema, req.body);
    const address = req.ip ?? 'unknown';
    // Both attempts are taken before the password is hashed, so concurrent guesses are counted one
    // by one; a right password gives them back, so only failures add up.
    await limits.signInPerAddress.take(address, 'address', 'sign-in attempts');
    try {
      await limits.signInPerAccount.take(input.email, 'account', 'sign-in attempts');
    } catch (e) {
      await limits.signInPerAddress.giveBack(address);
      throw e;
    }

    const found = findUserByEmail(db, input.email);
    const passwordOk = found ? await verifyPassword(found.passwordHash, input.password) : await verifyAgainstDecoy(input.password);
    if (!found || !passwordOk) throw new HttpError(401, 'wrong_credentials', wrongCredentialsMessage);
    await limits.signInPerAddress.giveBack(address);
    await limits.signInPerAccount.forget(input.email);
    // Told only to someone who knows the password, so it reveals nothing to a guesser.
    if (found.disabled) throw forbidden('this account is disabled; ask a site admin to enable it');

    const user = promoteOperatorAdmin(db, found, config.adminEmail);
    await startSession(ctx, req, res, user.id);
    res.json({ user: toPublicUser(user) } satisfies AuthResponse);
  });

  router.post('/sign-out', async (req, res) => {
    const session = res.locals.session as { id: string } | null;
    if (session) await ctx.lucia.invalidateSession(session.id);
    setSessionCookie(req, res, ctx.lucia.createBlankSessionCookie());
    res.status(204).end();
  });

  router.get('/me', (_req, res) => {
    res.json({ user: toPublicUser(currentUser(res)) } satisfies AuthResponse);
  });

  router.use(accountLinksRouter(ctx));
  return router;
}
