// Structured logs (pino) and one line per HTTP request (pino-http), with a request id and nothing
// secret: no bodies (passwords), no headers (cookies, Authorization), no query strings, and
// invitation tokens masked in paths.
import { randomUUID } from 'node:crypto';
import type { IncomingMessage, ServerResponse } from 'node:http';
import { pino, type Level, type Logger } from 'pino';
import { pinoHttp } from 'pino-http';

export type LogLevel = Level | 'silent';
const levels: readonly LogLevel[] = ['fatal', 'error', 'warn', 'info', 'debug', 'trace', 'silent'];

/**
 * LOG_LEVEL if given, else 'info'; always 'silent' under test (NODE_ENV=test or VITEST set). The test
 * check also looks at process.env, so a test that hands loadConfig a bare env stays quiet.
 */
export function resolveLogLevel(env: NodeJS.ProcessEnv, processEnv: NodeJS.ProcessEnv = process.env): LogLevel {
  const underTest = (e: NodeJS.ProcessEnv) => e.NODE_ENV === 'test' || Boolean(e.VITEST);
  if (underTest(env) || underTest(processEnv)) return 'silent';
  const wanted = env.LOG_LEVEL?.toLowerCase();
  if (wanted === undefined || wanted === '') return 'info';
  if (!levels.includes(wanted as LogLevel)) throw new Error(`configuration: LOG_LEVEL: must be one of ${levels.join(', ')}`);
  return wanted as LogLevel;
}

export function createLogger(level: LogLevel): Logger {
  return pino({ level, base: { app: 'orbitab' } });
}

/** Paths carry invitation and reset tokens (/api/invitations/:token/accept, /api/auth/password-reset/:token); the query string may carry anything. */
export function redactUrl(url: string): string {
  const path = url.split('?')[0];
  return path.replace(/(\/invitations\/)[^/]+/, '$1[token]').replace(/(\/(?:password-reset|reset-password|verify-email)\/)[^/]+/, '$1[token]');
}

// A request id from a trusted front proxy is kept when it looks like one; otherwise we make our own.
const requestIdPattern = /^[A-Za-z0-9._-]{1,64}$/;

export function createHttpLogger(logger: Logger) {
  return pinoHttp({
    logger,
    genReqId(req: IncomingMessage, res: ServerResponse) {
      const incoming = req.headers['x-request-id'];
      const id = typeof incoming === 'string' && requestIdPattern.test(incoming) ? incoming : randomUUID();
      res.setHeader('X-Request-Id', id);
      return id;
    },
    customLogLevel(_req, res, err) {
      if (err || res.statusCode >= 500) return 'error';
      if (res.statusCode >= 400) return 'warn';
      return 'info';
    },
    customProps(_req, res) {
      const user = (res as ServerResponse & { locals?: { user?: { id: string } | null } }).locals?.user;
      return user ? { userId: user.id } : {};
    },
    serializers: {
      req: (req: { id: unknown; method: string; url: string }) => ({ id: req.id, method: req.method, url: redactUrl(req.url) }),
      res: (res: { statusCode: number }) => ({ statusCode: res.statusCode }),
    },
  });
}
