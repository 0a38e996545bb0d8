import { eq } from 'drizzle-orm';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { sessions, users } from '../server/db/schema.js';
import { wrongCredentialsMessage } from '../server/routes/auth.js';
import { makeTestApp, sessionCookieOf, testOrigin, testPassword } from './helpers/app.js';

const fourteenDaysSeconds = 14 * 24 * 3600;

describe('sign-up', () => {
  it('creates an account, signs it in and answers who am I', async () => {
    const t = makeTestApp();
    const client = t.agent();
    const res = await client.post('/api/auth/sign-up').send({ email: 'ada@lab.example', password: testPassword, name: 'Ada' });
    expect(res.status).toBe(201);
    expect(res.body.user).toEqual({ id: expect.any(String), email: 'ada@lab.example', name: 'Ada', siteRole: 'admin', emailVerified: false });
    const me = await client.get('/api/auth/me');
    expect(me.status).toBe(200);
    expect(me.body.user).toEqual(res.body.user);
  });

  it('stores the email lower-cased and an argon2id hash (m=19456, t=2, p=1), never the password', async () => {
    const t = makeTestApp();
    await t.agent().post('/api/auth/sign-up').send({ email: '  Ada@Lab.Example ', password: testPassword, name: 'Ada' }).expect(201);
    const row = t.db.select().from(users).get()!;
    expect(row.email).toBe('ada@lab.example');
    expect(row.passwordHash).toMatch(/^\$argon2id\$v=19\$m=19456,t=2,p=1\$/);
    expect(row.passwordHash).not.toContain(testPassword);
  });

  it('refuses a second account for the same email, whatever its case, with 409', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const res = await t.agent().post('/api/auth/sign-up').send({ email: 'ADA@lab.example', password: testPassword, name: 'Other Ada' });
    expect(res.status).toBe(409);
    expect(res.body.error).toMatchObject({ code: 'conflict', message: expect.stringContaining('already exists') });
  });

  it('makes the first account on an empty database admin and later ones members', async () => {
    const t = makeTestApp();
    expect((await t.signUp('first@lab.example')).user.siteRole).toBe('admin');
    expect((await t.signUp('second@lab.example')).user.siteRole).toBe('member');
  });

  it('makes the account named by ORBITAB_ADMIN_EMAIL admin even when it is not the first', async () => {
    const t = makeTestApp({ adminEmail: 'Boss@Lab.Example' });
    await t.signUp('first@lab.example');
    expect((await t.signUp('someone@lab.example')).user.siteRole).toBe('member');
    expect((await t.signUp('boss@lab.example')).user.siteRole).toBe('admin');
  });

  it.each([
    [{ password: testPassword, name: 'Ada' }, 'email: required'],
    [{ email: 'not-an-address', password: testPassword, name: 'Ada' }, 'email: not a valid email address'],
    [{ email: 'ada@lab.example', password: 'short', name: 'Ada' }, 'password: at least 10 characters'],
    [{ email: 'ada@lab.example', password: 'x'.repeat(201), name: 'Ada' }, 'password: at most 200 characters'],
    [{ email: 'ada@lab.example', password: testPassword, name: '   ' }, 'name: required'],
    [{ email: 'ada@lab.example', password: 12345678901, name: 'Ada' }, 'password: must be text'],
  ])('answers the malformed body %j with 400 naming the field', async (body, message) => {
    const res = await makeTestApp().agent().post('/api/auth/sign-up').send(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
  });

  it('answers a body that is not JSON with 400', async () => {
    const res = await makeTestApp().agent().post('/api/auth/sign-up').set('Content-Type', 'application/json').send('{"email": "ada@lab');
    expect(res.status).toBe(400);
    expect(res.body.error).toEqual({ code: 'invalid_json', message: 'body: not valid JSON' });
  });
});

describe('sign-in', () => {
  it('signs in with the right password, the email typed in any case', async () => {
    const t = makeTestApp();
    const { user } = await t.signUp('ada@lab.example');
    const client = t.agent();
    const res = await client.post('/api/auth/sign-in').send({ email: 'Ada@LAB.example', password: testPassword });
    expect(res.status).toBe(200);
    expect(res.body.user).toEqual(user);
    expect((await client.get('/api/auth/me')).body.user.id).toBe(user.id);
  });

  it('answers a wrong password and an unknown email with the same 401, so accounts cannot be discovered', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.example');
    const wrong = await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: 'not the password' });
    const unknown = await t.agent().post('/api/auth/sign-in').send({ email: 'nobody@lab.example', password: 'not the password' });
    for (const res of [wrong, unknown]) {
      expect(res.status).toBe(401);
      expect(res.body.error).toEqual({ code: 'wrong_credentials', message: wrongCredentialsMessage });
      expect(sessionCookieOf(res)).toBeUndefined();
    }
  });

  it('refuses a disabled account with 403 "this account is disabled"', async () => {
    const t = makeTestApp();
    const admin = await t.signUp('admin@lab.example');
    const { user } = await t.signUp('ada@lab.example');
    await admin.agent.patch(`/api/admin/users/${user.id}`).send({ disabled: true }).expect(200);
    const res = await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/^this account is disabled/);
  });

  it('answers a sign-in body without a password with 400 naming password', async () => {
    const res = await makeTestApp().agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('password: required');
  });
});

describe('sessions', () => {
  it('answers who am I with 401 when signed out', async () => {
    const res = await request(makeTestApp().app).get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(res.body.error.code).toBe('unauthorized');
  });

  it('ends the session on sign-out: a later request with the old cookie gets 401', async () => {
    const t = makeTestApp();
    const client = t.agent();
    const signUp = await client.post('/api/auth/sign-up').send({ email: 'ada@lab.example', password: testPassword, name: 'Ada' });
    const oldCookie = sessionCookieOf(signUp)!.split(';')[0];
    const out = await client.post('/api/auth/sign-out');
    expect(out.status).toBe(204);
    expect(sessionCookieOf(out)).toMatch(/^orbitab_session=;.*Max-Age=0/);
    const replay = await request(t.app).get('/api/auth/me').set('Cookie', oldCookie);
    expect(replay.status).toBe(401);
    expect(t.db.select().from(sessions).all()).toHaveLength(0);
  });

  it('sets the session cookie HttpOnly, SameSite=Lax, Path=/, for 14 days, and not Secure over plain http', async () => {
    const res = await makeTestApp().agent().post('/api/auth/sign-up').send({ email: 'ada@lab.example', password: testPassword, name: 'Ada' });
    const cookie = sessionCookieOf(res)!;
    expect(cookie).toMatch(/; HttpOnly/);
    expect(cookie).toMatch(/; SameSite=Lax/);
    expect(cookie).toMatch(/; Path=\//);
    expect(cookie).toContain(`Max-Age=${fourteenDaysSeconds}`);
    expect(cookie).not.toMatch(/; Secure/);
  });

  it('marks the session cookie Secure behind an https proxy on loopback (X-Forwarded-Proto)', async () => {
    const res = await makeTestApp()
      .agent()
      .post('/api/auth/sign-up')
      .set('X-Forwarded-Proto', 'https')
      .send({ email: 'ada@lab.example', password: testPassword, name: 'Ada' });
    expect(sessionCookieOf(res)).toMatch(/; Secure/);
  });

  it('replaces the session a sign-in request came with (no session fixation)', async () => {
    const t = makeTestApp();
    const { agent: client, user } = await t.signUp('ada@lab.example');
    const before = t.db.select().from(sessions).where(eq(sessions.userId, user.id)).all();
    await client.post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword }).expect(200);
    const after = t.db.select().from(sessions).where(eq(sessions.userId, user.id)).all();
    expect(after).toHaveLength(1);
    expect(after[0].id).not.toBe(before[0].id);
  });

  it('extends a session past half its life and sends the cookie again', async () => {
    const t = makeTestApp();
    const { agent: client } = await t.signUp('ada@lab.example');
    const sixDaysFromNow = Math.floor(Date.now() / 1000) + 6 * 24 * 3600;
    t.db.update(sessions).set({ expiresAt: sixDaysFromNow }).run();
    const res = await client.get('/api/auth/me');
    expect(res.status).toBe(200);
    expect(sessionCookieOf(res)).toContain(`Max-Age=${fourteenDaysSeconds}`);
    expect(t.db.select().from(sessions).get()!.expiresAt).toBeGreaterThan(sixDaysFromNow + 7 * 24 * 3600);
  });

  it('treats an expired session as signed out and clears its cookie', async () => {
    const t = makeTestApp();
    const { agent: client } = await t.signUp('ada@lab.example');
    t.db.update(sessions).set({ expiresAt: Math.floor(Date.now() / 1000) - 1 }).run();
    const res = await client.get('/api/auth/me');
    expect(res.status).toBe(401);
    expect(sessionCookieOf(res)).toMatch(/^orbitab_session=;.*Max-Age=0/);
  });
});

describe('cross-site request forgery', () => {
  const body = { email: 'ada@lab.example', password: testPassword, name: 'Ada' };

  it('refuses a POST from another origin with 403 naming that origin', async () => {
    const t = makeTestApp();
    const res = await request(t.app).post('/api/auth/sign-up').set('Origin', 'https://evil.example').send(body);
    expect(res.status).toBe(403);
    expect(res.body.error).toEqual({ code: 'bad_origin', message: "request origin https://evil.example is not this server's" });
    expect(t.db.select().from(users).all()).toHaveLength(0);
  });

  it('refuses a POST without an Origin header with 403', async () => {
    const t = makeTestApp();
    const res = await request(t.app).post('/api/auth/sign-up').send(body);
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/no Origin header/);
    expect(t.db.select().from(users).all()).toHaveLength(0);
  });

  it('refuses sign-out from another origin, so a foreign page cannot end a session', async () => {
    const t = makeTestApp();
    const { agent: client } = await t.signUp('ada@lab.example');
    const res = await client.post('/api/auth/sign-out').set('Origin', 'http://other.example');
    expect(res.status).toBe(403);
    expect((await client.get('/api/auth/me')).status).toBe(200);
  });

  it('without ORBITAB_ORIGIN, accepts only http://localhost:PORT (or its loopback aliases), whatever the Host header says', async () => {
    const t = makeTestApp({ config: { origin: 'http://localhost:3000', originConfigured: false } });
    await request(t.app).post('/api/auth/sign-up').set('Origin', 'http://localhost:3000').send(body).expect(201);
    await request(t.app).post('/api/auth/sign-in').set('Origin', 'http://127.0.0.1:3000').send(body).expect(200);
    // Host and Origin agreeing on a foreign name used to pass; the configured origin decides now.
    const forged = await request(t.app).post('/api/auth/sign-in').set('Host', 'evil.example').set('Origin', 'http://evil.example').send(body);
    expect(forged.status).toBe(403);
    await request(t.app).post('/api/auth/sign-in').set('Origin', 'http://localhost:4000').send(body).expect(403);
    await request(t.app).post('/api/auth/sign-in').set('Origin', 'https://localhost:3000').send(body).expect(403);
  });

  it('with ORBITAB_ORIGIN, compares scheme, host and port exactly', async () => {
    const t = makeTestApp({ config: { origin: 'https://orbitab.lab.test', originConfigured: true } });
    await request(t.app).post('/api/auth/sign-up').set('Origin', 'https://orbitab.lab.test').send(body).expect(201);
    for (const other of ['http://orbitab.lab.test', 'https://orbitab.lab.test:8443', 'https://lab.test', 'https://orbitab.lab.test.evil.example', 'null']) {
      expect((await request(t.app).post('/api/auth/sign-in').set('Origin', other).send(body)).status, other).toBe(403);
    }
  });

});
