// /api/auth: sign-up, sign-in, sign-out and "who am I".
import { Router, type Request, type Response } from 'express';
import { signInSchema, signUpSchema, type AuthResponse, type RateLimitDetails } from '../../shared/auth.js';
import { currentUser, setSessionCookie } from '../auth/middleware.js';
import { hashPassword, verifyAgainstDecoy, verifyPassword } from '../auth/password.js';
import type { AttemptLimiter } from '../auth/rateLimit.js';
import type { AppContext } from '../context.js';
import { HttpError, forbidden, parse } from '../errors.js';
import { createUser, findUserByEmail, promoteOperatorAdmin, toPublicUser } from '../services/users.js';

/** One message for an unknown email and a wrong password, so sign-in does not reveal who has an account. */
export const wrongCredentialsMessage = 'email or password is not correct';

export function authRouter(ctx: AppContext): Router {
  const { db, lucia, config, signInLimits } = ctx;
  const router = Router();

  /** Ends any session the request came with and starts a fresh one (no session fixation). */
  async function startSession(req: Request, res: Response, userId: string) {
    const previous = res.locals.session as { id: string } | null;
    if (previous) await lucia.invalidateSession(previous.id);
    const session = await lucia.createSession(userId, {});
    setSessionCookie(req, res, lucia.createSessionCookie(session.id));
  }

  router.post('/sign-up', async (req, res) => {
    const input = parse(signUpSchema, req.body);
    const address = req.ip ?? 'unknown';
    refuseIfLimited(signInLimits.signUpPerAddress, address, 'address', 'sign-ups');
    signInLimits.signUpPerAddress.record(address);
    const passwordHash = await hashPassword(input.password);
    const user = createUser(db, { email: input.email, name: input.name, passwordHash }, config.adminEmail);
    await startSession(req, res, user.id);
    res.status(201).json({ user: toPublicUser(user) } satisfies AuthResponse);
  });

  router.post('/sign-in', async (req, res) => {
    const input = parse(signInSchema, req.body);
    const address = req.ip ?? 'unknown';
    refuseIfLimited(signInLimits.perAddress, address, 'address');
    refuseIfLimited(signInLimits.perAccount, input.email, 'account');
    signInLimits.perAddress.record(address);

    const found = findUserByEmail(db, input.email);
    const passwordOk = found ? await verifyPassword(found.passwordHash, input.password) : await verifyAgainstDecoy(input.password);
    if (!found || !passwordOk) {
      signInLimits.perAccount.record(input.email);
      throw new HttpError(401, 'wrong_credentials', wrongCredentialsMessage);
    }
    signInLimits.perAccount.reset(input.email);
    // Told only to someone who knows the password, so it reveals nothing to a guesser.
    if (found.disabled) throw forbidden('this account is disabled; ask a site admin to enable it');

    const user = promoteOperatorAdmin(db, found, config.adminEmail);
    await startSession(req, res, user.id);
    res.json({ user: toPublicUser(user) } satisfies AuthResponse);
  });

  router.post('/sign-out', async (req, res) => {
    const session = res.locals.session as { id: string } | null;
    if (session) await lucia.invalidateSession(session.id);
    setSessionCookie(req, res, lucia.createBlankSessionCookie());
    res.status(204).end();
  });

  router.get('/me', (_req, res) => {
    res.json({ user: toPublicUser(currentUser(res)) } satisfies AuthResponse);
  });

  return router;
}

function refuseIfLimited(limiter: AttemptLimiter, key: string, scope: RateLimitDetails['scope'], what = 'sign-in attempts') {
  const check = limiter.check(key);
  if (check.allowed) return;
  const retryAfterSeconds = Math.max(1, Math.ceil(check.retryAfterMs / 1000));
  const minutes = Math.ceil(retryAfterSeconds / 60);
  const who = scope === 'account' ? 'this account' : 'your address';
  throw new HttpError(
    429,
    'rate_limited',
    `too many ${what} for ${who}; try again in ${minutes} minute${minutes === 1 ? '' : 's'}`,
    { retryAfterSeconds, retryAt: new Date(Date.now() + retryAfterSeconds * 1000).toISOString(), scope } satisfies RateLimitDetails,
    { 'Retry-After': String(retryAfterSeconds) },
  );
}
