import { eq } from 'drizzle-orm';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../server/app.js';
import { auditLog, sessions } from '../server/db/schema.js';
import { makeTestApp, testOrigin, testPassword } from './helpers/app.js';

/** An app with an admin (the first account) and a member, both signed in. */
async function siteWithAdminAndMember() {
  const t = makeTestApp();
  const admin = await t.signUp('admin@lab.example', 'Site Admin');
  const member = await t.signUp('ada@lab.example', 'Ada');
  return { t, admin, member };
}

describe('admin user list', () => {
  it('lists every account, oldest first, with role, state and creation time but no password hash', async () => {
    const { admin } = await siteWithAdminAndMember();
    const res = await admin.agent.get('/api/admin/users');
    expect(res.status).toBe(200);
    expect(res.body.users.map((u: { email: string }) => u.email)).toEqual(['admin@lab.example', 'ada@lab.example']);
    const [first, second] = res.body.users;
    expect(Object.keys(first).sort()).toEqual(['createdAt', 'disabled', 'email', 'emailVerified', 'id', 'name', 'siteRole']);
    expect(first).toMatchObject({ name: 'Site Admin', siteRole: 'admin', disabled: false });
    expect(second).toMatchObject({ name: 'Ada', siteRole: 'member', disabled: false });
    expect(Math.abs(Date.parse(first.createdAt) - Date.now())).toBeLessThan(60_000);
  });

  it('answers a member with 403 on every admin route', async () => {
    const { admin, member } = await siteWithAdminAndMember();
    const list = await member.agent.get('/api/admin/users');
    expect(list.status).toBe(403);
    expect(list.body.error).toEqual({ code: 'forbidden', message: 'site admins only' });
    const promote = await member.agent.patch(`/api/admin/users/${member.user.id}`).send({ siteRole: 'admin' });
    expect(promote.status).toBe(403);
    const disable = await member.agent.patch(`/api/admin/users/${admin.user.id}`).send({ disabled: true });
    expect(disable.status).toBe(403);
    expect((await admin.agent.get('/api/auth/me')).body.user.siteRole).toBe('admin');
  });

  it('answers a signed-out request with 401', async () => {
    const { t } = await siteWithAdminAndMember();
    expect((await request(t.app).get('/api/admin/users')).status).toBe(401);
  });
});

describe('admin changes to an account', () => {
  it('promotes a member to admin and back, and the change shows in their own session', async () => {
    const { admin, member } = await siteWithAdminAndMember();
    const promoted = await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ siteRole: 'admin' });
    expect(promoted.status).toBe(200);
    expect(promoted.body.user).toMatchObject({ id: member.user.id, siteRole: 'admin', disabled: false });
    expect((await member.agent.get('/api/admin/users')).status).toBe(200);
    await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ siteRole: 'member' }).expect(200);
    expect((await member.agent.get('/api/admin/users')).status).toBe(403);
  });

  it('disabling an account ends its sessions at once and refuses its sign-in', async () => {
    const { t, admin, member } = await siteWithAdminAndMember();
    const otherDevice = t.agent();
    await otherDevice.post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword }).expect(200);

    const res = await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ disabled: true });
    expect(res.status).toBe(200);
    expect(res.body.user.disabled).toBe(true);
    expect(t.db.select().from(sessions).where(eq(sessions.userId, member.user.id)).all()).toHaveLength(0);
    expect((await member.agent.get('/api/auth/me')).status).toBe(401);
    expect((await otherDevice.get('/api/auth/me')).status).toBe(401);
    const signIn = await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword });
    expect(signIn.status).toBe(403);
    expect(signIn.body.error.message).toMatch(/^this account is disabled/);
  });

  it('re-enabling an account lets it sign in again', async () => {
    const { t, admin, member } = await siteWithAdminAndMember();
    await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ disabled: true }).expect(200);
    await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ disabled: false }).expect(200);
    await t.agent().post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword }).expect(200);
  });

  it('refuses to let the last enabled admin demote or disable themself, with the reason', async () => {
    const { t, admin } = await siteWithAdminAndMember();
    const demote = await admin.agent.patch(`/api/admin/users/${admin.user.id}`).send({ siteRole: 'member' });
    expect(demote.status).toBe(400);
    expect(demote.body.error.message).toBe('cannot demote yourself: it is the last enabled admin; make another account admin first');
    const disable = await admin.agent.patch(`/api/admin/users/${admin.user.id}`).send({ disabled: true });
    expect(disable.status).toBe(400);
    expect(disable.body.error.message).toMatch(/^cannot disable yourself: it is the last enabled admin/);
    const list = await admin.agent.get('/api/admin/users');
    expect(list.body.users[0]).toMatchObject({ siteRole: 'admin', disabled: false });
    expect(t.db.select().from(auditLog).all()).toHaveLength(0);
  });

  it('lets an admin step down once another enabled admin exists', async () => {
    const { admin, member } = await siteWithAdminAndMember();
    await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ siteRole: 'admin' }).expect(200);
    const res = await admin.agent.patch(`/api/admin/users/${admin.user.id}`).send({ siteRole: 'member' });
    expect(res.status).toBe(200);
    expect(res.body.user.siteRole).toBe('member');
    expect((await admin.agent.get('/api/admin/users')).status).toBe(403);
  });

  it('records who changed which account, from what to what, in the audit log', async () => {
    const { t, admin, member } = await siteWithAdminAndMember();
    await admin.agent.patch(`/api/admin/users/${member.user.id}`).send({ siteRole: 'admin', disabled: false }).expect(200);
    const entry = t.db.select().from(auditLog).get()!;
    expect(entry).toMatchObject({ actorId: admin.user.id, action: 'site.user_updated', workbookId: null });
    expect(JSON.parse(entry.details)).toEqual({ userId: member.user.id, changes: { siteRole: { from: 'member', to: 'admin' } } });
  });

  it('makes an existing member admin when ORBITAB_ADMIN_EMAIL names them and they next sign in', async () => {
    const { t } = await siteWithAdminAndMember();
    // The operator restarts the server with ORBITAB_ADMIN_EMAIL set, on the same database.
    const restarted = createApp({ db: t.db, config: { ...t.config, adminEmail: 'ada@lab.example' } });
    const client = request.agent(restarted.app).set('Origin', testOrigin);
    const res = await client.post('/api/auth/sign-in').send({ email: 'ada@lab.example', password: testPassword });
    expect(res.body.user.siteRole).toBe('admin');
    expect((await client.get('/api/admin/users')).status).toBe(200);
  });

  it('answers an unknown account with 404', async () => {
    const { admin } = await siteWithAdminAndMember();
    const res = await admin.agent.patch('/api/admin/users/no-such-user').send({ disabled: true });
    expect(res.status).toBe(404);
    expect(res.body.error).toEqual({ code: 'not_found', message: 'user not found' });
  });

  it.each([
    [{ siteRole: 'owner' }, 'siteRole: must be "admin" or "member"'],
    [{ disabled: 'yes' }, 'disabled: must be true or false'],
    [{}, 'body: give siteRole or disabled (or both)'],
    [{ siteRole: 'admin', email: 'x@lab.example' }, 'body: unknown field email; only siteRole and disabled can change'],
  ])('answers the malformed change %j with 400 naming the field', async (body, message) => {
    const { admin, member } = await siteWithAdminAndMember();
    const res = await admin.agent.patch(`/api/admin/users/${member.user.id}`).send(body);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({ code: 'invalid_input', message });
  });
});
