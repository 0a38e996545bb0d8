import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import { createUser } from '../server/services/users.js';
import type { AppContext } from '../server/context.js';

/** A session cookie of the site's first account (its admin), made without going through sign-up (which would send mail). */
async function adminCookie(ctx: AppContext): Promise<string> {
  const admin = createUser(ctx.db, { email: 'admin@lab.test', name: 'Admin', passwordHash: 'not-used' });
  const session = await ctx.lucia.createSession(admin.id, {});
  return `orbitab_session=${session.id}`;
}

describe('GET /api/health', () => {
  it('reports the database reachable and every migration applied, in detail to a site admin', async () => {
    const db = openDatabase(':memory:');
    const { app, ctx } = createApp({ db, config: { ...loadConfig({}), seed: false } });
    const res = await request(app).get('/api/health').set('Cookie', await adminCookie(ctx));
    expect(res.status).toBe(200);
    expect(res.body.details.database).toBe('ok');
    expect(res.body.details.migrations.current).toBe(true);
  });

  it('tells an anonymous caller only ok or degraded and the version, nothing of the internals', async () => {
    const db = openDatabase(':memory:');
    const { app, ctx } = createApp({ db, config: { ...loadConfig({}), seed: false } });
    await ctx.mail.start();
    try {
      const res = await request(app).get('/api/health');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ status: 'ok', version: JSON.parse(await import('node:fs').then((fs) => fs.readFileSync('package.json', 'utf8'))).version });
      expect(JSON.stringify(res.body)).not.toMatch(/smtp|\d{4,5}/i);
    } finally {
      await ctx.mail.stop();
    }
  });

  it('answers an unknown API path with the JSON error shape', async () => {
    const db = openDatabase(':memory:');
    const { app } = createApp({ db, config: loadConfig({}) });
    const res = await request(app).get('/api/nope');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});

// Operations checks: what a load balancer or an operator reads from /api/health.
describe('GET /api/health for operators', () => {
  const healthApp = (config: Partial<ReturnType<typeof loadConfig>> = {}) => {
    const db = openDatabase(':memory:');
    const made = createApp({ db, config: { ...loadConfig({}), seed: false, ...config } });
    const cookie = adminCookie(made.ctx);
    /** GET /api/health as the site admin, who sees the details. */
    const health = async () => request(made.app).get('/api/health').set('Cookie', await cookie);
    return { db, ...made, health };
  };

  it('names the built-in fake SMTP server and its port once it listens, and that port answers SMTP', async () => {
    const { ctx, health } = healthApp();
    expect((await health()).body.details.mail).toBe('fake smtp (starts with the first message)');
    await ctx.mail.start();
    try {
      const res = await health();
      expect(res.status).toBe(200);
      const [, host, port] = /^fake smtp on ([\d.]+):(\d+)$/.exec(res.body.details.mail) ?? [];
      expect(port).toBeDefined();
      const net = await import('node:net');
      const greeting = await new Promise<string>((resolve, reject) => {
        const socket = net.connect(Number(port), host, () => undefined);
        socket.once('data', (chunk) => {
          resolve(chunk.toString());
          socket.end();
        });
        socket.once('error', reject);
      });
      expect(greeting).toMatch(/^220 /); // an SMTP server's greeting (RFC 5321 §4.2)
    } finally {
      await ctx.mail.stop();
    }
  });

  it('reports a relay that refuses mail without failing the health check: the app still serves', async () => {
    // A port that was free a moment ago: nothing listens there, so the relay refuses the connection.
    const net = await import('node:net');
    const probe = net.createServer().listen(0, '127.0.0.1');
    await new Promise((r) => probe.once('listening', r));
    const closedPort = (probe.address() as { port: number }).port;
    await new Promise((r) => probe.close(r));
    const { ctx, health } = healthApp({ smtpUrl: `smtp://127.0.0.1:${closedPort}` });
    expect((await health()).body.details.mail).toBe('smtp');
    await expect(ctx.mail.send({ to: 'someone@example.com', subject: 'test', text: 'test' })).rejects.toThrow();
    const res = await health();
    expect(res.status).toBe(200);
    expect(res.body.details.mail).toMatch(/^error: /);
    await ctx.mail.stop();
  });

  it('answers 503 "degraded" when the database cannot be reached', async () => {
    const { app, db } = healthApp();
    db.$client.close();
    // Anonymous: with the database gone no session can be read, and the verdict is all a balancer needs.
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body).toMatchObject({ status: 'degraded' });
    expect(res.body.details).toBeUndefined();
  });

  it('answers 503 when a migration this version ships has not been applied', async () => {
    const { db, health } = healthApp();
    db.$client.prepare('delete from __drizzle_migrations where rowid = (select max(rowid) from __drizzle_migrations)').run();
    const res = await health();
    expect(res.status).toBe(503);
    expect(res.body.details.migrations).toMatchObject({ current: false });
    expect(res.body.details.migrations.applied).toBe(res.body.details.migrations.expected - 1);
  });
});
