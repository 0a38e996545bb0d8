// Roles per sheet through the API: a member's role on one sheet overrides their workbook role either
// way; GET lists the overrides and every member's effective role; PUT sets or removes one; the
// workbook load tells me my role on each sheet; every change is audited and carried into exports.
import ExcelJS from 'exceljs';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import type { SheetRolesResponse } from '../shared/team.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { load, makeTeam, sharedWorkbook, type Agent, type Team } from './helpers/team.js';

describe('roles per sheet', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let sheet: string;
  beforeEach(async () => {
    t ??= await makeTeam();
    wb = await sharedWorkbook(t, 'Measurements');
    sheet = wb.sheets[0].id;
  });
  afterAll(() => t.ctx.mail.stop());

  const put = (agent: Agent, email: string, role: 'editor' | 'viewer' | null, sheetId = sheet) => agent.put(`/api/workbooks/${wb.id}/sheets/${sheetId}/roles`).send({ email, role });
  const roles = async (agent: Agent = t.owner.agent) => (await agent.get(`/api/workbooks/${wb.id}/sheets/${sheet}/roles`).expect(200)).body as SheetRolesResponse;
  const edit = async (agent: Agent, row: number, input: string, sheetId = sheet) => {
    const rev = (await load(t.owner.agent, wb.id)).revision;
    return agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev, changes: [{ sheetId, row, col: 0, input }] });
  };

  it('lists every member with the workbook role as their role on a sheet nobody has set', async () => {
    const r = await roles(t.viewer.agent);
    expect(r).toMatchObject({ sheetId: sheet, sheetName: 'Screen1', lock: null, overrides: [] });
    expect(r.members.map((m) => [m.user.name, m.workbookRole, m.role, m.source])).toEqual([
      ['Ann Analyst', 'owner', 'editor', 'workbook'],
      ['Bob Bench', 'editor', 'editor', 'workbook'],
      ['Cara Chemist', 'editor', 'editor', 'workbook'],
      ['Vic Viewer', 'viewer', 'viewer', 'workbook'],
    ]);
  });

  it('lets a workbook viewer edit one sheet, and makes a workbook editor a viewer of it', async () => {
    const other = (await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Settled' }).expect(201)).body.sheet.id as string;
    expect((await put(t.owner.agent, 'vic@lab.test', 'editor')).status).toBe(200);
    const after = (await put(t.owner.agent, 'BOB@lab.test', 'viewer').expect(200)).body as SheetRolesResponse;
    expect(after.members.find((m) => m.user.name === 'Vic Viewer')).toMatchObject({ workbookRole: 'viewer', role: 'editor', source: 'override' });
    expect(after.members.find((m) => m.user.name === 'Bob Bench')).toMatchObject({ workbookRole: 'editor', role: 'viewer', source: 'override' });
    expect(after.overrides.map((o) => [o.user.name, o.role, o.setBy.name, o.viaLock])).toEqual([
      ['Vic Viewer', 'editor', 'Ann Analyst', false],
      ['Bob Bench', 'viewer', 'Ann Analyst', false],
    ]);

    expect((await edit(t.viewer.agent, 1, 'O2')).status).toBe(200);
    expect((await edit(t.viewer.agent, 1, 'O2', other)).status).toBe(403);
    const refused = await edit(t.editor.agent, 2, 'N2');
    expect(refused.status).toBe(403);
    expect(refused.body.error.message).toBe('Screen1!A3 is on sheet "Screen1": Ann Analyst made you a viewer of sheet "Screen1"; ask them or an owner; nothing was saved');
    expect((await edit(t.editor.agent, 2, 'N2', other)).status).toBe(200);

    // The workbook load tells each of them their role on each sheet, in tab order.
    expect((await load(t.viewer.agent, wb.id)).mySheetRoles).toEqual([
      { sheetId: sheet, role: 'editor', source: 'override' },
      { sheetId: other, role: 'viewer', source: 'workbook' },
    ]);
    expect((await load(t.viewer.agent, wb.id)).actions).toContain('editCells');
    expect((await load(t.editor.agent, wb.id)).mySheetRoles).toEqual([
      { sheetId: sheet, role: 'viewer', source: 'override' },
      { sheetId: other, role: 'editor', source: 'workbook' },
    ]);

    // null goes back to the workbook role.
    await put(t.owner.agent, 'vic@lab.test', null).expect(200);
    expect((await edit(t.viewer.agent, 3, 'F2')).status).toBe(403);
    expect((await load(t.viewer.agent, wb.id)).actions).not.toContain('editCells');
  });

  it('gives an override on a locked sheet precedence over the lock, in both directions', async () => {
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'values settled', editors: [t.editor.user.id] }).expect(200);
    expect((await roles()).members.map((m) => [m.user.name, m.role, m.source])).toEqual([
      ['Ann Analyst', 'editor', 'override'],
      ['Bob Bench', 'editor', 'override'],
      ['Cara Chemist', 'viewer', 'lock'],
      ['Vic Viewer', 'viewer', 'workbook'],
    ]);
    await put(t.owner.agent, 'cara@lab.test', 'editor').expect(200);
    await put(t.owner.agent, 'bob@lab.test', 'viewer').expect(200);
    expect((await edit(t.editor2.agent, 1, 'O2')).status).toBe(200);
    expect((await edit(t.editor.agent, 1, 'N2')).status).toBe(403);
    // Lifting the lock takes away only what the lock named; Cara's and Bob's own roles stay.
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).expect(204);
    expect((await roles()).overrides.map((o) => [o.user.name, o.role])).toEqual([
      ['Cara Chemist', 'editor'],
      ['Bob Bench', 'viewer'],
    ]);
  });

  it('lets an editor set roles only on a sheet they created, never an owner\'s, and refuses bad requests with 4xx', async () => {
    const mine = (await t.editor.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Bench' }).expect(201)).body.sheet.id as string;
    expect((await put(t.editor.agent, 'vic@lab.test', 'editor', mine)).status).toBe(200);
    const notTheirs = await put(t.editor.agent, 'vic@lab.test', 'editor');
    expect(notTheirs.status).toBe(403);
    expect(notTheirs.body.error.message).toMatch(/only on sheets you created, and "Screen1" is someone else's/);
    const owner = await put(t.editor.agent, 'ann@lab.test', 'viewer', mine);
    expect(owner.status).toBe(403);
    expect(owner.body.error.message).toBe('only an owner may change an owner\'s role on "Bench"');
    // The owner can close the editor's own sheet to them; then they cannot open it again themselves.
    await put(t.owner.agent, 'bob@lab.test', 'viewer', mine).expect(200);
    expect((await put(t.editor.agent, 'cara@lab.test', 'viewer', mine)).body.error.message).toBe('you are a viewer of "Bench" now, so you cannot change who may edit it; ask an owner');

    const viewer = await put(t.viewer.agent, 'vic@lab.test', 'editor');
    expect([viewer.status, viewer.body.error.message]).toEqual([403, 'as a viewer you cannot lock sheets or protect ranges']);
    const badRole = await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/roles`).send({ email: 'vic@lab.test', role: 'owner' });
    expect([badRole.status, badRole.body.error.message]).toEqual([400, 'role: must be "editor", "viewer" or null']);
    const stranger = await put(t.owner.agent, 'olga@elsewhere.test', 'editor');
    expect([stranger.status, stranger.body.error.message]).toEqual([400, 'email: olga@elsewhere.test is not a member of this workbook; invite them first']);
    const noSheet = await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/00000000-0000-4000-8000-000000000000/roles`).send({ email: 'vic@lab.test', role: 'editor' });
    expect([noSheet.status, noSheet.body.error.code]).toEqual([404, 'not_found']);
  });

  it('records every change in the audit log', async () => {
    await put(t.owner.agent, 'vic@lab.test', 'editor').expect(200);
    await put(t.owner.agent, 'vic@lab.test', 'viewer').expect(200);
    await put(t.owner.agent, 'vic@lab.test', null).expect(200);
    await put(t.owner.agent, 'vic@lab.test', null).expect(200); // nothing to remove: nothing recorded
    const entries = (await t.owner.agent.get(`/api/workbooks/${wb.id}/audit`).expect(200)).body.entries as { action: string; details: Record<string, unknown> }[];
    expect(entries.filter((e) => e.action.startsWith('sheet.role')).map((e) => [e.action, e.details.name, e.details.before, e.details.role ?? null])).toEqual([
      ['sheet.role_removed', 'Vic Viewer', 'viewer', null],
      ['sheet.role_set', 'Vic Viewer', 'editor', 'viewer'],
      ['sheet.role_set', 'Vic Viewer', null, 'editor'],
    ]);
  });

  it('drops a removed member\'s sheet roles, so re-joining grants nothing old', async () => {
    await put(t.owner.agent, 'vic@lab.test', 'editor').expect(200);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.viewer.user.id}`).expect(204);
    await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'vic@lab.test', role: 'viewer' }).expect(201);
    expect((await roles()).overrides).toEqual([]);
    expect((await edit(t.viewer.agent, 1, 'O2')).status).toBe(403);
  });

  it('exports a sheet that makes someone a viewer as a protected sheet, and says so on the front sheet', async () => {
    const open = (await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Open' }).expect(201)).body.sheet.id as string;
    await put(t.owner.agent, 'bob@lab.test', 'viewer').expect(200);
    await put(t.owner.agent, 'vic@lab.test', 'editor', open).expect(200);
    const res = await t.owner.agent.get(`/api/workbooks/${wb.id}/export?format=xlsx`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c));
      r.on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as unknown as ArrayBuffer);
    const protectedSheet = (name: string) => (book.getWorksheet(name) as unknown as { sheetProtection?: { sheet?: boolean } }).sheetProtection?.sheet ?? false;
    expect(protectedSheet('Screen1')).toBe(true); // Bob only views it
    expect(protectedSheet('Open')).toBe(false); // opening a sheet to one more person closes it to nobody
    const front = book.worksheets[0];
    const text: string[] = [];
    front.eachRow((row) => row.eachCell((c) => text.push(String(c.value))));
    expect(text.join('\n')).toMatch(/Screen1: roles set on this sheet in Orbitab \(viewer: Bob Bench\)\. In this file the whole sheet is protected without a password/);
  });
});
