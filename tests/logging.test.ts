import { Writable } from 'node:stream';
import express from 'express';
import { pino } from 'pino';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createHttpLogger, redactUrl, resolveLogLevel } from '../server/logging.js';
import { makeTestApp, testPassword } from './helpers/app.js';

/** An Express app with the request logger writing JSON lines into `lines`. */
function appLoggingInto(lines: Record<string, unknown>[]) {
  const sink = new Writable({
    write(chunk, _enc, done) {
      lines.push(JSON.parse(String(chunk)));
      done();
    },
  });
  const app = express();
  app.use(createHttpLogger(pino({ level: 'info' }, sink)));
  app.use(express.json());
  app.post('/{*splat}', (_req, res) => {
    res.cookie('orbitab_session', 'session-secret-value', { httpOnly: true });
    res.status(201).json({ ok: true });
  });
  return app;
}

describe('request logging', () => {
  it('writes one line per request with an id, method, path and status, and returns the id as X-Request-Id', async () => {
    const lines: Record<string, unknown>[] = [];
    const res = await request(appLoggingInto(lines)).post('/api/auth/sign-in').send({ email: 'ada@lab.example' });
    expect(lines).toHaveLength(1);
    expect(lines[0]).toMatchObject({ req: { method: 'POST', url: '/api/auth/sign-in' }, res: { statusCode: 201 }, msg: 'request completed' });
    expect((lines[0].req as { id: string }).id).toBe(res.headers['x-request-id']);
  });

  it('never writes the body, cookies, authorization, query string or an invitation token', async () => {
    const lines: Record<string, unknown>[] = [];
    await request(appLoggingInto(lines))
      .post('/api/invitations/invite-token-123/accept?next=reset-token-456')
      .set('Cookie', 'orbitab_session=incoming-session-value')
      .set('Authorization', 'Bearer bearer-secret')
      .send({ email: 'ada@lab.example', password: testPassword });
    const written = JSON.stringify(lines);
    for (const secret of [testPassword, 'incoming-session-value', 'session-secret-value', 'bearer-secret', 'invite-token-123', 'reset-token-456']) {
      expect(written).not.toContain(secret);
    }
    expect(lines[0]).toMatchObject({ req: { url: '/api/invitations/[token]/accept' } });
  });

  it('keeps a well-formed request id from the front proxy and replaces a malformed one', async () => {
    const app = appLoggingInto([]);
    expect((await request(app).post('/x').set('X-Request-Id', 'proxy-42.a_b')).headers['x-request-id']).toBe('proxy-42.a_b');
    const injected = (await request(app).post('/x').set('X-Request-Id', 'bad id\twith spaces')).headers['x-request-id'];
    expect(injected).toMatch(/^[0-9a-f-]{36}$/);
  });

  it('gives every API response of the real app a request id', async () => {
    const res = await request(makeTestApp().app).get('/api/health');
    expect(res.headers['x-request-id']).toMatch(/^[0-9a-f-]{36}$/);
  });
});

describe('log level', () => {
  const production = { NODE_ENV: 'production' };

  it('is silent under test, whatever LOG_LEVEL says', () => {
    expect(resolveLogLevel({ LOG_LEVEL: 'debug' }, { VITEST: 'true' })).toBe('silent');
    expect(resolveLogLevel({ LOG_LEVEL: 'debug', NODE_ENV: 'test' }, {})).toBe('silent');
    // With no second argument it reads process.env, where vitest has set VITEST.
    expect(resolveLogLevel({ LOG_LEVEL: 'debug' })).toBe('silent');
  });

  it('defaults to info and follows LOG_LEVEL outside tests', () => {
    expect(resolveLogLevel(production, production)).toBe('info');
    expect(resolveLogLevel({ ...production, LOG_LEVEL: 'WARN' }, production)).toBe('warn');
  });

  it('refuses an unknown LOG_LEVEL, naming the variable', () => {
    expect(() => resolveLogLevel({ ...production, LOG_LEVEL: 'loud' }, production)).toThrow(/^configuration: LOG_LEVEL: must be one of fatal, error/);
  });
});

describe('log redaction', () => {

  it('masks only the token segment of an invitation path', () => {
    expect(redactUrl('/api/invitations/abc/accept')).toBe('/api/invitations/[token]/accept');
    expect(redactUrl('/api/auth/password-reset/abc')).toBe('/api/auth/password-reset/[token]');
    expect(redactUrl('/reset-password/abc')).toBe('/reset-password/[token]');
    expect(redactUrl('/verify-email/abc?x=1')).toBe('/verify-email/[token]');
    expect(redactUrl('/api/workbooks/w1/invitations')).toBe('/api/workbooks/w1/invitations');
    expect(redactUrl('/api/workbooks/w1?sheet=2')).toBe('/api/workbooks/w1');
  });
});
