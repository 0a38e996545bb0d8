import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';

describe('GET /api/health', () => {
  it('reports the database reachable and every migration applied', async () => {
    const db = openDatabase(':memory:');
    const { app } = createApp({ db, config: { ...loadConfig({}), seed: false } });
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.database).toBe('ok');
    expect(res.body.migrations.current).toBe(true);
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
    return { db, ...createApp({ db, config: { ...loadConfig({}), seed: false, ...config } }) };
  };

  it('names the built-in fake SMTP server and its port once it listens, and that port answers SMTP', async () => {
    const { app, ctx } = healthApp();
    expect((await request(app).get('/api/health')).body.mail).toBe('fake smtp (starts with the first message)');
    await ctx.mail.start();
    try {
      const res = await request(app).get('/api/health');
      expect(res.status).toBe(200);
      const [, host, port] = /^fake smtp on ([\d.]+):(\d+)$/.exec(res.body.mail) ?? [];
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
    const { app, ctx } = healthApp({ smtpUrl: `smtp://127.0.0.1:${closedPort}` });
    expect((await request(app).get('/api/health')).body.mail).toBe('smtp');
    await expect(ctx.mail.send({ to: 'someone@example.com', subject: 'test', text: 'test' })).rejects.toThrow();
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.mail).toMatch(/^error: /);
    await ctx.mail.stop();
  });

  it('answers 503 "degraded" when the database cannot be reached', async () => {
    const { app, db } = healthApp();
    db.$client.close();
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body.status).toBe('degraded');
    expect(res.body.database).toMatch(/^error: .*not open/);
  });

  it('answers 503 when a migration this version ships has not been applied', async () => {
    const { app, db } = healthApp();
    db.$client.prepare('delete from __drizzle_migrations where rowid = (select max(rowid) from __drizzle_migrations)').run();
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(503);
    expect(res.body.migrations).toMatchObject({ current: false });
    expect(res.body.migrations.applied).toBe(res.body.migrations.expected - 1);
  });
});
