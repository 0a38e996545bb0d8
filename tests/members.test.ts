// Members and roles: owners change roles, remove people and hand the workbook over; a workbook
// always keeps exactly one owner; every change is audited.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import type { AuditEntry, Member } from '../shared/team.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { load, makeTeam, sharedWorkbook, type Team } from './helpers/team.js';

describe('members and roles', () => {
  let t: Team;
  let wb: WorkbookPayload;
  beforeEach(async () => {
    t ??= await makeTeam();
    wb = await sharedWorkbook(t);
  });
  afterAll(() => t.ctx.mail.stop());

  const roles = async () =>
    Object.fromEntries(((await t.owner.agent.get(`/api/workbooks/${wb.id}/members`)).body.members as Member[]).map((m) => [m.user.email, m.role]));

  it('lists every member with their role to any member, owner first', async () => {
    const res = await t.viewer.agent.get(`/api/workbooks/${wb.id}/members`);
    expect(res.status).toBe(200);
    expect((res.body.members as Member[]).map((m) => [m.user.name, m.role])).toEqual([
      ['Ann Analyst', 'owner'],
      ['Bob Bench', 'editor'],
      ['Cara Chemist', 'editor'],
      ['Vic Viewer', 'viewer'],
    ]);
  });

  it('lets the owner turn an editor into a viewer, who then can no longer edit', async () => {
    const res = await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).send({ role: 'viewer' });
    expect(res.status).toBe(200);
    expect(res.body.member).toMatchObject({ user: { id: t.editor.user.id }, role: 'viewer' });
    const edit = await t.editor.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 0, changes: [{ sheetId: wb.sheets[0].id, row: 0, col: 0, input: 'O2' }] });
    expect(edit.status).toBe(403);
    expect(edit.body.error.message).toBe('as a viewer you cannot edit cells');
  });

  it('transfers ownership: the new owner holds every right and the previous owner becomes an editor', async () => {
    const res = await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).send({ role: 'owner' });
    expect(res.status).toBe(200);
    expect(res.body.member).toMatchObject({ user: { id: t.editor.user.id }, role: 'owner' });
    expect(res.body.previousOwner).toMatchObject({ user: { id: t.owner.user.id }, role: 'editor' });
    expect(await roles()).toMatchObject({ 'ann@lab.test': 'editor', 'bob@lab.test': 'owner' });
    const list = (await t.editor.agent.get('/api/workbooks')).body.workbooks as { id: string; owner: { id: string } }[];
    expect(list.find((w) => w.id === wb.id)?.owner.id).toBe(t.editor.user.id);
    // The former owner can no longer share or delete.
    const del = await t.owner.agent.delete(`/api/workbooks/${wb.id}`);
    expect(del.status).toBe(403);
    expect(del.body.error.message).toBe('as an editor you cannot delete this workbook');
  });

  it('never leaves a workbook without its owner: the owner can be neither demoted nor removed', async () => {
    const demote = await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.owner.user.id}`).send({ role: 'editor' });
    expect(demote.status).toBe(409);
    expect(demote.body.error.message).toMatch(/^Ann Analyst is the owner; to hand the workbook over, make another member owner/);
    const remove = await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.owner.user.id}`);
    expect(remove.status).toBe(409);
    expect(remove.body.error.message).toBe('Ann Analyst is the owner and cannot be removed; transfer ownership to another member first');
    expect((await roles())['ann@lab.test']).toBe('owner');
  });

  it('removes a member, who then gets 404 for the workbook', async () => {
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.viewer.user.id}`).expect(204);
    expect((await t.viewer.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
    expect(await roles()).not.toHaveProperty('vic@lab.test');
  });

  it('lets any member leave, but not remove someone else', async () => {
    const other = await t.editor.agent.delete(`/api/workbooks/${wb.id}/members/${t.editor2.user.id}`);
    expect(other.status).toBe(403);
    expect(other.body.error.message).toBe('as an editor you cannot share this workbook or change its members');
    await t.editor.agent.delete(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).expect(204);
    expect((await t.editor.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
  });

  it('refuses an unknown role or member with a message naming the problem', async () => {
    const bad = await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).send({ role: 'admin' });
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('role: must be "owner", "editor" or "viewer"');
    const addOwner = await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'olga@elsewhere.test', role: 'owner' });
    expect(addOwner.status).toBe(400);
    expect(addOwner.body.error.message).toBe('role: must be "editor" or "viewer"');
    const stranger = await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.outsider.user.id}`).send({ role: 'viewer' });
    expect(stranger.status).toBe(404);
    expect(stranger.body.error.message).toBe('member not found');
  });

  it('records role changes, transfers and removals in the audit log, shown to owners and admins only', async () => {
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor2.user.id}`).send({ role: 'viewer' }).expect(200);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.viewer.user.id}`).expect(204);
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).send({ role: 'owner' }).expect(200);
    const entries = (await t.admin.agent.get(`/api/workbooks/${wb.id}/audit`)).body.entries as AuditEntry[];
    expect(entries.slice(0, 3).map((e) => [e.action, e.actor?.name, e.details])).toEqual([
      ['ownership.transferred', 'Ann Analyst', { from: t.owner.user.id, to: t.editor.user.id, previousRoleOfNewOwner: 'editor' }],
      ['member.removed', 'Ann Analyst', { userId: t.viewer.user.id, email: 'vic@lab.test', role: 'viewer', left: false }],
      ['member.role_changed', 'Ann Analyst', { userId: t.editor2.user.id, from: 'editor', to: 'viewer' }],
    ]);
    expect((await t.editor.agent.get(`/api/workbooks/${wb.id}/audit`)).status).toBe(200); // Bob owns it now
    const former = await t.owner.agent.get(`/api/workbooks/${wb.id}/audit`);
    expect(former.status).toBe(403);
    expect(former.body.error.message).toBe('as an editor you cannot see the audit log');
    expect((await load(t.owner.agent, wb.id)).role).toBe('editor');
  });
});
