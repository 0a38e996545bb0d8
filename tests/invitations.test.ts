// Sharing by e-mail, end to end: nodemailer → the built-in fake SMTP server → mail_messages →
// GET /api/admin/mail → the link's token → POST /api/invitations/:token/accept.
import { createHash } from 'node:crypto';
import { afterAll, beforeAll, beforeEach, describe, expect, it } from 'vitest';
import type { Invitation } from '../shared/team.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { createMailer } from '../server/mail/mailer.js';
import { testOrigin } from './helpers/app.js';
import { inbox, invitationToken, load, makeTeam, sharedWorkbook, signUpPerson, type Team } from './helpers/team.js';

const sha256 = (s: string) => createHash('sha256').update(s).digest('hex');

describe('invitations by e-mail', () => {
  let t: Team;
  let wb: WorkbookPayload;
  beforeAll(async () => {
    t = await makeTeam();
  });
  // A fresh shared workbook per test: no test sees the members, invitations or audit entries of another.
  beforeEach(async () => {
    wb = await sharedWorkbook(t, 'Nitrogen oxides');
  });
  afterAll(() => t.ctx.mail.stop());

  /** Invites `email`, then returns the invitation and the token from the e-mail that arrived for it. */
  async function invite(email: string, role: 'editor' | 'viewer' = 'editor') {
    const res = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email, role });
    expect(res.status).toBe(201);
    const message = (await inbox(t)).find((m) => m.to === email)!;
    return { invitation: res.body.invitation as Invitation, message, token: invitationToken(message.text) };
  }

  it('sends the invitation through SMTP to the dev inbox, with a link to this server', async () => {
    const res = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'Eve@Lab.test ', role: 'editor' });
    expect(res.status).toBe(201);
    expect(res.body.invitation).toMatchObject({ email: 'eve@lab.test', role: 'editor', status: 'pending', invitedBy: { id: t.owner.user.id, name: 'Ann Analyst' } });
    const sevenDaysMs = 7 * 24 * 3600 * 1000;
    expect(res.body.invitation.expiresAt - res.body.invitation.createdAt).toBeCloseTo(sevenDaysMs, -3);

    const [message] = await inbox(t);
    expect(message).toMatchObject({ to: 'eve@lab.test', from: 'Orbitab <no-reply@orbitab.invalid>', subject: 'Ann Analyst invited you to "Nitrogen oxides" on Orbitab' });
    expect(message.text).toContain('as an editor');
    expect(message.text).toMatch(new RegExp(`^${testOrigin}/invitations/[A-Za-z0-9_-]{43}$`, 'm'));

    // The health route names the fake server the message went through.
    const health = await t.admin.agent.get('/api/health');
    expect(health.body.details.mail).toMatch(/^fake smtp on 127\.0\.0\.1:\d+$/);
  });

  it('stores only the SHA-256 of the token, never the token itself', async () => {
    const { invitation, token } = await invite('hash.check@lab.test');
    const row = t.db.$client.prepare('select * from invitations where id = ?').get(invitation.id) as Record<string, unknown>;
    expect(row.token_hash).toBe(sha256(token));
    expect(JSON.stringify(row)).not.toContain(token);
  });

  it('lets the invitee sign up, preview the link, and accept it as the invited role', async () => {
    const { token } = await invite('fay@lab.test', 'viewer');
    const preview = await t.agent().get(`/api/invitations/${token}`);
    expect(preview.status).toBe(200);
    expect(preview.body).toMatchObject({ workbook: { id: wb.id, title: 'Nitrogen oxides' }, email: 'fay@lab.test', role: 'viewer', status: 'pending', invitedBy: { name: 'Ann Analyst' } });

    const fay = await signUpPerson(t, 'fay@lab.test', 'Fay Fluorine');
    expect((await fay.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
    const accepted = await fay.agent.post(`/api/invitations/${token}/accept`);
    expect(accepted.status).toBe(200);
    expect(accepted.body).toEqual({ workbookId: wb.id, role: 'viewer' });
    expect((await load(fay.agent, wb.id)).role).toBe('viewer');
    const members = (await t.owner.agent.get(`/api/workbooks/${wb.id}/members`)).body.members;
    expect(members.map((m: { user: { email: string }; role: string }) => [m.user.email, m.role])).toContainEqual(['fay@lab.test', 'viewer']);
  });

  it('refuses a link used a second time with 410', async () => {
    const { token } = await invite('gus@lab.test');
    const gus = await signUpPerson(t, 'gus@lab.test', 'Gus Gallium');
    await gus.agent.post(`/api/invitations/${token}/accept`).expect(200);
    const again = await gus.agent.post(`/api/invitations/${token}/accept`);
    expect(again.status).toBe(410);
    expect(again.body.error.code).toBe('invitation_used');
    expect(again.body.error.message).toMatch(/already been used/);
  });

  it('refuses an expired link with 410 and adds nobody', async () => {
    const { invitation, token } = await invite('hal@lab.test');
    t.db.$client.prepare('update invitations set expires_at = ? where id = ?').run(Date.now() - 1, invitation.id);
    const hal = await signUpPerson(t, 'hal@lab.test', 'Hal Halogen');
    const res = await hal.agent.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(410);
    expect(res.body.error).toMatchObject({ code: 'invitation_expired', message: 'this invitation has expired; ask the owner to send a new one' });
    expect((await hal.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
  });

  it('refuses a revoked link with 410, and lists only pending invitations', async () => {
    const { invitation, token } = await invite('ida@lab.test');
    const before = (await t.owner.agent.get(`/api/workbooks/${wb.id}/invitations`)).body.invitations as Invitation[];
    expect(before.map((i) => i.id)).toContain(invitation.id);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/invitations/${invitation.id}`).expect(204);
    const after = (await t.owner.agent.get(`/api/workbooks/${wb.id}/invitations`)).body.invitations as Invitation[];
    expect(after.map((i) => i.id)).not.toContain(invitation.id);

    const ida = await signUpPerson(t, 'ida@lab.test', 'Ida Iodine');
    const res = await ida.agent.post(`/api/invitations/${token}/accept`);
    expect(res.status).toBe(410);
    expect(res.body.error.code).toBe('invitation_revoked');
  });

  it('replaces an earlier pending invitation to the same address with the newer one', async () => {
    const first = await invite('jo@lab.test', 'viewer');
    const second = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'jo@lab.test', role: 'editor' }).expect(201);
    const newest = (await inbox(t)).find((m) => m.to === 'jo@lab.test')!;
    const jo = await signUpPerson(t, 'jo@lab.test', 'Jo Joule');
    expect((await jo.agent.post(`/api/invitations/${first.token}/accept`)).status).toBe(410);
    const ok = await jo.agent.post(`/api/invitations/${invitationToken(newest.text)}/accept`);
    expect(ok.body).toEqual({ workbookId: wb.id, role: second.body.invitation.role });
  });

  it('refuses a link opened by an account with another address (403) and keeps it usable for the right one', async () => {
    const { token } = await invite('kim@lab.test');
    const wrong = await t.outsider.agent.post(`/api/invitations/${token}/accept`);
    expect(wrong.status).toBe(403);
    expect(wrong.body.error.message).toBe('this invitation was sent to kim@lab.test, but you are signed in as olga@elsewhere.test; sign in with kim@lab.test to accept it');
    expect((await t.outsider.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
    const kim = await signUpPerson(t, 'kim@lab.test', 'Kim Krypton');
    expect((await kim.agent.post(`/api/invitations/${token}/accept`)).status).toBe(200);
  });

  it('answers 404 to an unknown token, 400 to a malformed one, and 401 to accepting while signed out', async () => {
    const unknown = 'A'.repeat(43);
    expect((await t.owner.agent.post(`/api/invitations/${unknown}/accept`)).status).toBe(404);
    const malformed = await t.owner.agent.post('/api/invitations/not-a-token/accept');
    expect(malformed.status).toBe(400);
    expect(malformed.body.error.message).toMatch(/^token: not an invitation token/);
    expect((await t.agent().post(`/api/invitations/${unknown}/accept`)).status).toBe(401);
  });

  it('adds an existing account at once (201, no e-mail) and invites an unknown address (202)', async () => {
    const mailsBefore = (await inbox(t)).length;
    const existing = await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'olga@elsewhere.test', role: 'viewer' });
    expect(existing.status).toBe(201);
    expect(existing.body.member).toMatchObject({ user: { id: t.outsider.user.id, name: 'Olga Outside' }, role: 'viewer' });
    expect((await inbox(t)).length).toBe(mailsBefore);

    const unknown = await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'lea@lab.test', role: 'editor' });
    expect(unknown.status).toBe(202);
    expect(unknown.body.invitation).toMatchObject({ email: 'lea@lab.test', role: 'editor', status: 'pending' });
    expect((await inbox(t))[0].to).toBe('lea@lab.test');

    const twice = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'bob@lab.test', role: 'viewer' });
    expect(twice.status).toBe(409);
    expect(twice.body.error.message).toBe('bob@lab.test is already a member (editor); change their role instead');
  });

  it('records sharing in the audit log', async () => {
    // The workbook's members were added through the API (member.added); one invitation is accepted, one revoked.
    const accepted = await invite('pia@lab.test', 'viewer');
    const pia = await signUpPerson(t, 'pia@lab.test', 'Pia Palladium');
    await pia.agent.post(`/api/invitations/${accepted.token}/accept`).expect(200);
    const revoked = await invite('quin@lab.test');
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/invitations/${revoked.invitation.id}`).expect(204);
    const entries = (await t.owner.agent.get(`/api/workbooks/${wb.id}/audit?limit=500`)).body.entries as { action: string }[];
    const actions = new Set(entries.map((e) => e.action));
    for (const a of ['member.added', 'invitation.created', 'invitation.accepted', 'invitation.revoked']) expect(actions).toContain(a);
  });

  it('keeps non-ASCII names and titles intact through SMTP (RFC 2047 subject, encoded body)', async () => {
    const zoe = await signUpPerson(t, 'zoe@lab.test', 'Zoë Ångström');
    const created = await zoe.agent.post('/api/workbooks').send({ title: 'Übergangsmetalle – Spinzustände' }).expect(201);
    await zoe.agent.post(`/api/workbooks/${created.body.workbook.id}/invitations`).send({ email: 'mia@lab.test', role: 'viewer' }).expect(201);
    const message = (await inbox(t)).find((m) => m.to === 'mia@lab.test')!;
    expect(message.subject).toBe('Zoë Ångström invited you to "Übergangsmetalle – Spinzustände" on Orbitab');
    expect(message.text).toContain('Zoë Ångström (zoe@lab.test) invited you to the workbook "Übergangsmetalle – Spinzustände"');
  });

  it('shows the dev inbox to site admins only', async () => {
    const res = await t.owner.agent.get('/api/admin/mail');
    expect(res.status).toBe(403);
    expect((await t.agent().get('/api/admin/mail')).status).toBe(401);
  });
});

describe('when the mail server refuses', () => {
  it('answers 502 naming the address and stores no invitation', async () => {
    // Port 1 on the loopback interface: nothing listens, so the connection is refused at once.
    const t = await makeTeam();
    const wb = await sharedWorkbook(t);
    // The team signed up and verified through the dev inbox; from here on mail goes to a relay that refuses.
    await t.ctx.mail.stop();
    t.ctx.mail = createMailer({ db: t.db, smtpUrl: 'smtp://127.0.0.1:1', logger: t.ctx.logger });
    const res = await t.owner.agent.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'nia@lab.test', role: 'viewer' });
    expect(res.status).toBe(502);
    expect(res.body.error.code).toBe('mail_failed');
    expect(res.body.error.message).toMatch(/^the invitation e-mail to nia@lab\.test could not be sent \(.+\); nothing was saved/);
    expect((t.db.$client.prepare('select count(*) as n from invitations').get() as { n: number }).n).toBe(0);
    expect((await t.admin.agent.get('/api/health')).body.details.mail).toMatch(/^error: /);
    await t.ctx.mail.stop();
  });
});
