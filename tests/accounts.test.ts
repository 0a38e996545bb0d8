// Accounts a team can trust: addresses proved by a mailed link, the operator's admin address that
// only its owner can claim, and passwords forgotten or changed. Mail goes through nodemailer to the
// built-in fake SMTP server; links are read from the dev inbox the way their owner would open them.
import { describe, expect, it, vi } from 'vitest';
import { hashToken } from '../server/services/accountTokens.js';
import { linkToken, mailedLink, makeTestApp, testOrigin, testPassword } from './helpers/app.js';

const newPassword = 'a different long passphrase';

describe('verified e-mail', () => {
  it('mails a verification link on sign-up; the account is unverified until it is opened, once', async () => {
    const t = makeTestApp();
    const { agent, user } = await t.signUp('ada@lab.test', 'Ada', { verified: false });
    expect(user.emailVerified).toBe(false);
    const link = mailedLink(t.db, 'ada@lab.test', 'verify-email')!;
    expect(link).toMatch(new RegExp(`^${testOrigin}/verify-email/[A-Za-z0-9_-]{43}$`));
    // Only the hash is stored.
    const row = t.db.$client.prepare('select token_hash from account_tokens').get() as { token_hash: string };
    expect(row.token_hash).toBe(hashToken(linkToken(link)));
    expect((await agent.get('/api/auth/me')).body.user.emailVerified).toBe(false);

    const verified = await t.agent().post('/api/auth/verify').send({ token: linkToken(link) });
    expect(verified.status).toBe(200);
    expect(verified.body.user.emailVerified).toBe(true);
    expect((await agent.get('/api/auth/me')).body.user.emailVerified).toBe(true);
    const again = await t.agent().post('/api/auth/verify').send({ token: linkToken(link) });
    expect(again.status).toBe(410);
  });

  it('resends a link on request (the older one stops working) and refuses once verified', async () => {
    const t = makeTestApp();
    const { agent } = await t.signUp('ada@lab.test', 'Ada', { verified: false });
    const first = mailedLink(t.db, 'ada@lab.test', 'verify-email')!;
    await agent.post('/api/auth/verify/resend').expect(202);
    const second = mailedLink(t.db, 'ada@lab.test', 'verify-email')!;
    expect(second).not.toBe(first);
    await t.agent().post('/api/auth/verify').send({ token: linkToken(first) }).expect(410);
    await t.agent().post('/api/auth/verify').send({ token: linkToken(second) }).expect(200);
    const res = await agent.post('/api/auth/verify/resend');
    expect(res.status).toBe(409);
  });

  it('lets an unverified account sign in and work in its own workbooks', async () => {
    const t = makeTestApp();
    await t.signUp('admin@lab.test');
    const { agent } = await t.signUp('ada@lab.test', 'Ada', { verified: false });
    const created = await agent.post('/api/workbooks').send({ title: 'My own' });
    expect(created.status).toBe(201);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: testPassword }).expect(200);
  });

  it('makes the first account on an empty database admin, verified or not', async () => {
    const t = makeTestApp();
    const { user } = await t.signUp('first@lab.test', 'First', { verified: false });
    expect(user).toMatchObject({ siteRole: 'admin', emailVerified: false });
  });

  it('refuses to make an unverified account site admin', async () => {
    const t = makeTestApp();
    const admin = await t.signUp('admin@lab.test');
    const { user } = await t.signUp('ada@lab.test', 'Ada', { verified: false });
    const res = await admin.agent.patch(`/api/admin/users/${user.id}`).send({ siteRole: 'admin' });
    expect(res.status).toBe(409);
    expect(res.body.error.message).toMatch(/has not verified/);
    await t.verifyEmail('ada@lab.test');
    await admin.agent.patch(`/api/admin/users/${user.id}`).send({ siteRole: 'admin' }).expect(200);
  });
});

describe('ORBITAB_ADMIN_EMAIL', () => {
  it('does not make admin whoever signs up first with the address in other capitals', async () => {
    const t = makeTestApp({ adminEmail: 'ops@lab.test' });
    await t.signUp('someone@lab.test');
    const squatter = await t.signUp('OPS@Lab.Test', 'Squatter', { verified: false });
    expect(squatter.user).toMatchObject({ email: 'ops@lab.test', siteRole: 'member' });
    const again = await t.agent().post('/api/auth/sign-in').send({ email: 'ops@lab.test', password: testPassword });
    expect(again.body.user.siteRole).toBe('member');
  });

  it('promotes the account once its owner proves the address, and only once: a demotion sticks', async () => {
    const t = makeTestApp({ adminEmail: 'ops@lab.test' });
    const first = await t.signUp('first@lab.test');
    const ops = await t.signUp('ops@lab.test', 'Ops', { verified: false });
    expect(ops.user.siteRole).toBe('member');
    const verified = await t.verifyEmail('ops@lab.test');
    expect(verified.siteRole).toBe('admin');

    await first.agent.patch(`/api/admin/users/${ops.user.id}`).send({ siteRole: 'member' }).expect(200);
    const signIn = await t.agent().post('/api/auth/sign-in').send({ email: 'ops@lab.test', password: testPassword });
    expect(signIn.body.user.siteRole).toBe('member');
    const row = t.db.$client.prepare('select config_promoted_at from users where email = ?').get('ops@lab.test') as { config_promoted_at: number };
    expect(row.config_promoted_at).toBeGreaterThan(0);
  });

  it('lets the real owner take the address back from a squatter through a password reset', async () => {
    const t = makeTestApp({ adminEmail: 'ops@lab.test' });
    await t.signUp('first@lab.test');
    const squatter = await t.signUp('ops@lab.test', 'Squatter', { verified: false });
    await t.agent().post('/api/auth/password-reset').send({ email: 'ops@lab.test' }).expect(202);
    const link = await vi.waitFor(() => mailedLink(t.db, 'ops@lab.test', 'reset-password') ?? Promise.reject(new Error('no reset mail yet')));
    await t.agent().post(`/api/auth/password-reset/${linkToken(link)}`).send({ password: newPassword }).expect(204);
    // The squatter's session is gone; the owner signs in and, having proved the mailbox, is admin.
    expect((await squatter.agent.get('/api/auth/me')).status).toBe(401);
    const owner = await t.agent().post('/api/auth/sign-in').send({ email: 'ops@lab.test', password: newPassword });
    expect(owner.body.user).toMatchObject({ siteRole: 'admin', emailVerified: true });
  });
});

describe('forgotten password', () => {
  it('gives the same answer for a known and an unknown address, and mails only the known one', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.test');
    const known = await t.agent().post('/api/auth/password-reset').send({ email: 'Ada@Lab.test' });
    const unknown = await t.agent().post('/api/auth/password-reset').send({ email: 'nobody@lab.test' });
    expect(known.status).toBe(202);
    expect(unknown.status).toBe(known.status);
    expect(unknown.body).toEqual(known.body);
    await vi.waitFor(() => expect(mailedLink(t.db, 'ada@lab.test', 'reset-password')).toBeDefined());
    expect(mailedLink(t.db, 'nobody@lab.test', 'reset-password')).toBeUndefined();
  });

  it('resets by the mailed link once, ends every session, and the old password stops working', async () => {
    const t = makeTestApp();
    const { agent } = await t.signUp('ada@lab.test');
    const other = t.agent();
    await other.post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: testPassword }).expect(200);
    await t.agent().post('/api/auth/password-reset').send({ email: 'ada@lab.test' }).expect(202);
    const link = await vi.waitFor(() => mailedLink(t.db, 'ada@lab.test', 'reset-password') ?? Promise.reject(new Error('no reset mail yet')));
    expect(link.startsWith(`${testOrigin}/reset-password/`)).toBe(true);

    // A weak password is refused without using up the link.
    const weak = await t.agent().post(`/api/auth/password-reset/${linkToken(link)}`).send({ password: ' '.repeat(12) });
    expect(weak.status).toBe(400);
    await t.agent().post(`/api/auth/password-reset/${linkToken(link)}`).send({ password: newPassword }).expect(204);
    expect((await agent.get('/api/auth/me')).status).toBe(401);
    expect((await other.get('/api/auth/me')).status).toBe(401);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: testPassword }).expect(401);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: newPassword }).expect(200);
    await t.agent().post(`/api/auth/password-reset/${linkToken(link)}`).send({ password: 'yet another passphrase' }).expect(410);
  });

  it('refuses a reset link after its 30 minutes', async () => {
    const t = makeTestApp();
    await t.signUp('ada@lab.test');
    await t.agent().post('/api/auth/password-reset').send({ email: 'ada@lab.test' }).expect(202);
    const link = await vi.waitFor(() => mailedLink(t.db, 'ada@lab.test', 'reset-password') ?? Promise.reject(new Error('no reset mail yet')));
    t.db.$client.prepare(`update account_tokens set expires_at = ? where purpose = 'reset'`).run(Date.now() - 1);
    await t.agent().post(`/api/auth/password-reset/${linkToken(link)}`).send({ password: newPassword }).expect(410);
  });
});

describe('changing the password', () => {
  it('asks for the current password, keeps this session and ends every other', async () => {
    const t = makeTestApp();
    const { agent } = await t.signUp('ada@lab.test');
    const other = t.agent();
    await other.post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: testPassword }).expect(200);
    const wrong = await agent.post('/api/auth/password').send({ current: 'not my password', next: newPassword });
    expect(wrong.status).toBe(403);
    await agent.post('/api/auth/password').send({ current: testPassword, next: newPassword }).expect(204);
    expect((await agent.get('/api/auth/me')).status).toBe(200);
    expect((await other.get('/api/auth/me')).status).toBe(401);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.test', password: newPassword }).expect(200);
  });

  it('applies the strength rule: length, not all blank, not the e-mail address', async () => {
    const t = makeTestApp();
    const { agent } = await t.signUp('ada.lovelace@lab.test');
    for (const next of ['short', ' '.repeat(10), 'ADA.lovelace@lab.test']) {
      expect((await agent.post('/api/auth/password').send({ current: testPassword, next })).status, JSON.stringify(next)).toBe(400);
    }
    for (const password of [' '.repeat(10), 'ten.spaces@lab.test']) {
      const res = await t.agent().post('/api/auth/sign-up').send({ email: 'ten.spaces@lab.test', password, name: 'Ten' });
      expect(res.status, JSON.stringify(password)).toBe(400);
      expect(res.body.error.message).toMatch(/^password: /);
    }
  });
});

describe('names and titles', () => {
  it('refuses line breaks in a person name and a workbook title', async () => {
    const t = makeTestApp();
    const res = await t.agent().post('/api/auth/sign-up').send({ email: 'crlf@lab.test', password: testPassword, name: 'Ada\r\nBcc: victim@lab.test' });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/^name: may not contain line breaks/);
    const { agent } = await t.signUp('ada@lab.test');
    const wb = await agent.post('/api/workbooks').send({ title: 'Radicals\nSubject: spoofed' });
    expect(wb.status).toBe(400);
    expect(wb.body.error.message).toMatch(/^title: may not contain line breaks/);
  });
});
