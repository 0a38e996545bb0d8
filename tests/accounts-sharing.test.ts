// Sharing that only reaches the owner of an address: direct adds and invitations bound to verified
// accounts, older invitations revoked when access is settled otherwise, site admins kept out of
// other people's links, links built from the configured origin, and the headers every page carries.
import { startFakeSmtp } from '../server/mail/fakeSmtp.js';
import { openDatabase } from '../server/db/index.js';
import { mailMessages } from '../server/db/schema.js';
import { hiddenLinkText } from '../server/routes/adminTeam.js';
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { loadConfig, publicLink } from '../server/config.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { linkToken, mailedLink, testOrigin, testPassword } from './helpers/app.js';
import { makeTeam, sharedWorkbook, signUpPerson, type Team } from './helpers/team.js';

describe('invitations bound to the invited, verified address', () => {
  let t: Team;
  let wb: WorkbookPayload;
  beforeAll(async () => {
    t = await makeTeam();
    wb = await sharedWorkbook(t, 'Binding');
  });
  afterAll(() => t.ctx.mail.stop());

  const invitationLink = (email: string) => mailedLink(t.db, email, 'invitations')!;

  it('answers a direct add of a pre-registered, unverified address exactly like an unknown one: an invitation', async () => {
    const squatter = await signUpPerson(t, 'colleague@lab.test', 'Squatter', { verified: false });
    const registered = await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'colleague@lab.test', role: 'editor' });
    const unknown = await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'stranger@lab.test', role: 'editor' });
    expect(registered.status).toBe(202);
    expect(unknown.status).toBe(202);
    expect(Object.keys(registered.body.invitation).sort()).toEqual(Object.keys(unknown.body.invitation).sort());
    expect(registered.body.invitation.status).toBe('pending');
    // The squatter holds no membership, and cannot accept the link while unverified.
    expect((await squatter.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
    const accept = await squatter.agent.post(`/api/invitations/${linkToken(invitationLink('colleague@lab.test'))}/accept`);
    expect(accept.status).toBe(403);
    expect(accept.body.error.code).toBe('email_not_verified');
  });

  it('refuses the link to a verified account with another address', async () => {
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'dee@lab.test', role: 'editor' }).expect(201);
    const res = await t.outsider.agent.post(`/api/invitations/${linkToken(invitationLink('dee@lab.test'))}/accept`);
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('invitation_for_another_email');
  });

  it('verifies an address signed up from its own invitation link, which can then be accepted', async () => {
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'eli@lab.test', role: 'viewer' }).expect(201);
    const token = linkToken(invitationLink('eli@lab.test'));
    const eli = t.agent();
    const signUp = await eli.post('/api/auth/sign-up').send({ email: 'Eli@Lab.test', password: testPassword, name: 'Eli', invitationToken: token });
    expect(signUp.status).toBe(201);
    expect(signUp.body.user.emailVerified).toBe(true);
    expect(mailedLink(t.db, 'eli@lab.test', 'verify-email')).toBeUndefined();
    await eli.post(`/api/invitations/${token}/accept`).expect(200);
    // Someone else's token does not verify a different address.
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'fay@lab.test', role: 'viewer' }).expect(201);
    const other = await t.agent().post('/api/auth/sign-up').send({ email: 'gus@lab.test', password: testPassword, name: 'Gus', invitationToken: linkToken(invitationLink('fay@lab.test')) });
    expect(other.body.user.emailVerified).toBe(false);
  });

  it('refuses an older invitation after the member was removed', async () => {
    const hal = await signUpPerson(t, 'hal@lab.test', 'Hal');
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'hal@lab.test', role: 'editor' }).expect(201);
    const older = linkToken(invitationLink('hal@lab.test'));
    await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'hal@lab.test', role: 'viewer' }).expect(201);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${hal.user.id}`).expect(204);
    const res = await hal.agent.post(`/api/invitations/${older}/accept`);
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_revoked');
    expect((await hal.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
  });

  it('revokes pending invitations to a member whose role changes', async () => {
    // An invitation can be pending for a member only when it was sent before they joined by another way; a role change settles it too.
    const ivy = await signUpPerson(t, 'ivy@lab.test', 'Ivy');
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'ivy@lab.test', role: 'editor' }).expect(201);
    const link = linkToken(invitationLink('ivy@lab.test'));
    t.db.$client.prepare(`insert into workbook_members (workbook_id, user_id, role) values (?, ?, 'viewer')`).run(wb.id, ivy.user.id);
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${ivy.user.id}`).send({ role: 'viewer' }).expect(200);
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${ivy.user.id}`).send({ role: 'editor' }).expect(200);
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${ivy.user.id}`).send({ role: 'viewer' }).expect(200);
    expect((await ivy.agent.post(`/api/invitations/${link}/accept`)).status).toBe(410);
  });

  it('refuses an editor invitation sent before the person was added directly as a viewer', async () => {
    const ida = await signUpPerson(t, 'ida@lab.test', 'Ida');
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'ida@lab.test', role: 'editor' }).expect(201);
    const editorLink = linkToken(invitationLink('ida@lab.test'));
    await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'ida@lab.test', role: 'viewer' }).expect(201);
    expect((await ida.agent.post(`/api/invitations/${editorLink}/accept`)).status).toBe(410);
    const me = (await t.owner.agent.get(`/api/workbooks/${wb.id}/members`)).body.members.find((m: { user: { id: string } }) => m.user.id === ida.user.id);
    expect(me.role).toBe('viewer');
  });

  it('does not let a site admin accept an invitation read from the dev inbox', async () => {
    await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'jo@lab.test', role: 'editor' }).expect(201);
    const link = (await t.admin.agent.get('/api/admin/mail')).body.messages.find((m: { to: string }) => m.to === 'jo@lab.test').text as string;
    const token = /\/invitations\/([A-Za-z0-9_-]{43})/.exec(link)![1];
    const res = await t.admin.agent.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(403);
    expect((await t.admin.agent.patch(`/api/workbooks/${wb.id}`).send({ title: 'Taken' })).status).toBe(403);
  });

  it('limits invitations per inviter', async () => {
    const statuses: number[] = [];
    for (let i = 0; i < 40; i++) statuses.push((await t.editor.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: `x${i}@lab.test`, role: 'viewer' })).status);
    // The editor may not invite at all (403); the owner's own allowance is what is counted.
    expect(statuses.every((s) => s === 403)).toBe(true);
    const own = (await t.owner.agent.post('/api/workbooks').send({ title: 'Flood' }).expect(201)).body.workbook.id;
    const sent: number[] = [];
    for (let i = 0; i < 40; i++) sent.push((await t.owner.agent.post(`/api/workbooks/${own}/invitations`).send({ email: `y${i}@lab.test`, role: 'viewer' })).status);
    expect(sent.filter((s) => s === 429).length).toBeGreaterThan(0);
    expect(sent.filter((s) => s === 201).length).toBeLessThanOrEqual(30);
  });
});

describe('links from the configured origin', () => {
  it('builds invitation links from ORBITAB_ORIGIN whatever Host the request names', async () => {
    const t = await makeTeam();
    const wb = await sharedWorkbook(t);
    const res = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).set('Host', 'evil.example').set('X-Forwarded-Host', 'evil.example').send({ email: 'kim@lab.test', role: 'viewer' });
    expect(res.status).toBe(201);
    expect(mailedLink(t.db, 'kim@lab.test', 'invitations')!.startsWith(`${testOrigin}/invitations/`)).toBe(true);
    await t.ctx.mail.stop();
  });

  it('without ORBITAB_ORIGIN the public origin is http://localhost:PORT', () => {
    expect(loadConfig({ PORT: '3100' })).toMatchObject({ origin: 'http://localhost:3100', originConfigured: false });
    expect(loadConfig({ PORT: '3100', ORBITAB_ORIGIN: 'https://orbitab.lab.test/' })).toMatchObject({ origin: 'https://orbitab.lab.test', originConfigured: true });
    expect(publicLink(loadConfig({ PORT: '3100' }), '/verify-email/x')).toBe('http://localhost:3100/verify-email/x');
  });

  it('builds verification and reset links from the configured origin too, whatever the Host', async () => {
    const t = await makeTeam();
    await t.agent().post('/api/auth/sign-up').set('Host', 'evil.example').send({ email: 'mo@lab.test', password: testPassword, name: 'Mo' }).expect(201);
    expect(mailedLink(t.db, 'mo@lab.test', 'verify-email')!.startsWith(`${testOrigin}/verify-email/`)).toBe(true);
    await t.agent().post('/api/auth/password-reset').set('Host', 'evil.example').send({ email: 'mo@lab.test' }).expect(202);
    const link = await vi.waitFor(() => mailedLink(t.db, 'mo@lab.test', 'reset-password') ?? Promise.reject(new Error('no reset mail yet')));
    expect(link.startsWith(`${testOrigin}/reset-password/`)).toBe(true);
    await t.ctx.mail.stop();
  });
});

describe('the admin mail page with a real relay', () => {
  it('hides the links of stored messages once mail goes through SMTP_URL', async () => {
    // A second dev inbox on its own database stands in for the site's real relay.
    const relayDb = openDatabase(':memory:');
    const relay = await startFakeSmtp(relayDb, () => undefined);
    try {
      const t = await makeTeam();
      await t.ctx.mail.stop();
      t.config.smtpUrl = `smtp://${relay.host}:${relay.port}`;
      t.db.insert(mailMessages).values({ from: 'x', to: 'old@lab.test', subject: 'older invitation', text: `open ${testOrigin}/invitations/${'a'.repeat(43)}` }).run();
      const messages = (await t.admin.agent.get('/api/admin/mail').expect(200)).body.messages as { text: string }[];
      expect(messages.length).toBeGreaterThan(0);
      for (const m of messages) {
        expect(m.text).not.toMatch(/https?:\/\//);
      }
      expect(messages[0].text).toContain(hiddenLinkText);
    } finally {
      await relay.close();
    }
  });
});

describe('security headers', () => {
  it('sends CSP with the theme script hash, no framing, nosniff and a referrer policy; HSTS only over https', async () => {
    const t = await makeTeam();
    const res = await t.agent().get('/api/health');
    const csp = res.headers['content-security-policy'] as string;
    expect(csp).toMatch(/frame-ancestors 'none'/);
    expect(csp).toMatch(/script-src 'self' 'sha256-[A-Za-z0-9+/]+=*'/);
    expect(csp).not.toMatch(/unsafe-eval|script-src[^;]*unsafe-inline/);
    expect(res.headers['x-content-type-options']).toBe('nosniff');
    expect(res.headers['x-frame-options']).toBe('DENY');
    expect(res.headers['referrer-policy']).toBe('no-referrer');
    expect(res.headers['strict-transport-security']).toBeUndefined();
    // Behind a loopback proxy that terminated TLS:
    const https = await t.agent().get('/api/health').set('X-Forwarded-Proto', 'https');
    expect(https.headers['strict-transport-security']).toMatch(/max-age=\d+/);
    await t.ctx.mail.stop();
  });
});
