import type { Request, RequestHandler, Response } from 'express';
import type { Cookie, Session, User } from 'lucia';
import type { AppConfig } from '../config.js';
import { forbidden, HttpError, unauthorized } from '../errors.js';
import type { OrbitabLucia } from './lucia.js';

export type SessionUser = User;

/**
 * Writes lucia's session cookie through Express: httpOnly, SameSite=Lax, and Secure exactly when the
 * request came over https (req.secure, which trusts X-Forwarded-Proto only from a loopback proxy).
 */
export function setSessionCookie(req: Request, res: Response, cookie: Cookie) {
  const a = cookie.attributes;
  res.cookie(cookie.name, cookie.value, {
    httpOnly: true,
    sameSite: 'lax',
    secure: req.secure,
    path: a.path ?? '/',
    ...(a.maxAge !== undefined ? { maxAge: a.maxAge * 1000 } : {}),
  });
}

/** Reads the session cookie, validates it, refreshes it when lucia says so, and puts the user on res.locals. */
export function loadSession(lucia: OrbitabLucia): RequestHandler {
  return async (req, res, next) => {
    try {
      const id = lucia.readSessionCookie(req.headers.cookie ?? '');
      res.locals.user = null;
      res.locals.session = null;
      if (!id) return next();
      const { session, user } = await lucia.validateSession(id);
      if (!session) {
        setSessionCookie(req, res, lucia.createBlankSessionCookie());
        return next();
      }
      if (user.disabled) {
        await lucia.invalidateUserSessions(user.id);
        setSessionCookie(req, res, lucia.createBlankSessionCookie());
        return next();
      }
      if (session.fresh) setSessionCookie(req, res, lucia.createSessionCookie(session.id));
      res.locals.user = user;
      res.locals.session = session;
      next();
    } catch (e) {
      next(e);
    }
  };
}

const loopbackNames = new Set(['localhost', '127.0.0.1', '[::1]']);

/** Whether `origin` (an Origin header) is the app's public origin: same scheme, host and port. */
export function isAppOrigin(origin: string, config: Pick<AppConfig, 'origin' | 'originConfigured'>): boolean {
  let got: URL;
  try {
    got = new URL(origin);
  } catch {
    return false;
  }
  const want = new URL(config.origin);
  if (got.origin === want.origin) return true;
  // Unconfigured, the origin is http://localhost:PORT; the same server opened as 127.0.0.1 or [::1]
  // is the same machine and port, so it passes too. A configured origin admits nothing else.
  return !config.originConfigured && loopbackNames.has(want.hostname) && loopbackNames.has(got.hostname) && got.protocol === want.protocol && got.port === want.port;
}

/** Refuses state-changing requests whose Origin is not the app's configured public origin (CSRF). */
export function checkOrigin(config: Pick<AppConfig, 'origin' | 'originConfigured'>): RequestHandler {
  return (req, _res, next) => {
    if (req.method === 'GET' || req.method === 'HEAD' || req.method === 'OPTIONS') return next();
    const origin = req.get('origin');
    if (!origin || !isAppOrigin(origin, config)) {
      return next(new HttpError(403, 'bad_origin', origin ? `request origin ${origin} is not this server's` : 'request has no Origin header; state-changing requests must come from the app'));
    }
    next();
  };
}

export function currentUser(res: Response): SessionUser {
  const user = res.locals.user as SessionUser | null;
  if (!user) throw unauthorized();
  return user;
}

export function currentSession(res: Response): Session {
  const session = res.locals.session as Session | null;
  if (!session) throw unauthorized();
  return session;
}

export const requireUser: RequestHandler = (_req, res, next) => {
  if (!res.locals.user) return next(unauthorized());
  next();
};

export const requireAdmin: RequestHandler = (_req, res, next) => {
  const user = res.locals.user as SessionUser | null;
  if (!user) return next(unauthorized());
  if (user.siteRole !== 'admin') return next(forbidden('site admins only'));
  next();
};
