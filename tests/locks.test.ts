// Sheet locks and protected ranges as the API enforces them: who may set them, whose edits they
// refuse (403 naming the cell, who locked it and why), whose they let through, and that they stay
// in force after the server restarts on the same database file.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import request from 'supertest';
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { linkToken, mailedLink, testOrigin, testPassword } from './helpers/app.js';
import { load, makeTeam, sharedWorkbook, type Agent, type Team } from './helpers/team.js';

const edit = (agent: Agent, wb: WorkbookPayload, row: number, col: number, input: string, baseRevision = 0, sheetId = wb.sheets[0].id) =>
  agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision, changes: [{ sheetId, row, col, input }] });

describe('sheet locks', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let sheet: string;
  beforeEach(async () => {
    t ??= await makeTeam();
    wb = await sharedWorkbook(t, 'Settled bond orders');
    sheet = wb.sheets[0].id;
  });
  afterAll(() => t.ctx.mail.stop());

  it('shows everyone who locked a sheet, when and why, and who may still edit it', async () => {
    const res = await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'values checked against the handbook', editors: [t.editor.user.id] });
    expect(res.status).toBe(200);
    const seen = await load(t.viewer.agent, wb.id);
    expect(seen.locks).toEqual([
      {
        sheetId: sheet,
        lockedBy: { id: t.owner.user.id, name: 'Ann Analyst' },
        reason: 'values checked against the handbook',
        editors: [
          { id: t.owner.user.id, name: 'Ann Analyst' },
          { id: t.editor.user.id, name: 'Bob Bench' },
        ],
        createdAt: expect.any(Number),
      },
    ]);
    expect(Date.now() - seen.locks![0].createdAt).toBeLessThan(60_000);
  });

  it('refuses an edit by an editor not named on the lock with 403 naming the cell, the locker and the reason', async () => {
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'final', editors: [t.editor.user.id] }).expect(200);
    const res = await edit(t.editor2.agent, wb, 1, 1, 'NO+');
    expect(res.status).toBe(403);
    expect(res.body.error.code).toBe('protected');
    expect(res.body.error.message).toMatch(/^Screen1!B2 is on sheet "Screen1", locked by Ann Analyst on \d{4}-\d\d-\d\d \("final"\); only Ann Analyst, Bob Bench may change it; nothing was saved$/);
    expect(res.body.error.details.cells).toEqual([expect.objectContaining({ sheetId: sheet, row: 1, col: 1, lockedSheet: sheet })]);
    expect((await load(t.owner.agent, wb.id)).revision).toBe(0);
  });

  it('lets the locker and the people named on the lock edit', async () => {
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'final', editors: [t.editor.user.id] }).expect(200);
    expect((await edit(t.editor.agent, wb, 0, 0, 'O2')).status).toBe(200);
    expect((await edit(t.owner.agent, wb, 0, 1, 'N2', 1)).status).toBe(200);
  });

  it('refuses renaming, moving or deleting a locked sheet to those not on the lock', async () => {
    await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Scratch' }).expect(201);
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'final' }).expect(200);
    const rename = await t.editor.agent.patch(`/api/workbooks/${wb.id}/sheets/${sheet}`).send({ name: 'Mine now' });
    expect(rename.status).toBe(403);
    expect(rename.body.error).toMatchObject({ code: 'locked', message: expect.stringMatching(/^sheet "Screen1" is locked by Ann Analyst since .* \("final"\); only Ann Analyst may change it$/) });
    expect((await t.editor.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}`)).status).toBe(403);
    expect((await t.editor.agent.patch(`/api/workbooks/${wb.id}/sheets/${sheet}`).send({ position: 1 })).status).toBe(403);
    expect((await load(t.owner.agent, wb.id)).sheets.map((s) => s.name)).toEqual(['Screen1', 'Scratch']);
  });

  it('lifts the lock on the owner\'s word, after which anyone with the editor role may edit again', async () => {
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'final' }).expect(200);
    expect((await edit(t.editor2.agent, wb, 0, 0, 'F2')).status).toBe(403);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).expect(204);
    expect((await edit(t.editor2.agent, wb, 0, 0, 'F2')).status).toBe(200);
    expect((await load(t.owner.agent, wb.id)).locks).toEqual([]);
  });

  it('lets an editor lock only a sheet they created, and an owner lift an editor\'s lock', async () => {
    const own = await t.editor.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Bob data' });
    const ownId = own.body.sheet.id as string;
    const notTheirs = await t.editor.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'mine' });
    expect(notTheirs.status).toBe(403);
    expect(notTheirs.body.error.message).toBe('as an editor you can lock, protect or give roles only on sheets you created, and "Screen1" is someone else\'s; ask an owner');
    await t.editor.agent.put(`/api/workbooks/${wb.id}/sheets/${ownId}/lock`).send({ reason: 'still measuring' }).expect(200);
    expect((await edit(t.editor2.agent, wb, 0, 0, '1', 1, ownId)).status).toBe(403);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${ownId}/lock`).expect(204);
  });

  it('refuses a viewer\'s lock, a lock without a reason, and editors who are not members', async () => {
    const viewer = await t.viewer.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'x' });
    expect(viewer.status).toBe(403);
    expect(viewer.body.error.message).toBe('as a viewer you cannot lock sheets or protect ranges');
    const noReason = await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: '  ' });
    expect(noReason.status).toBe(400);
    expect(noReason.body.error.message).toBe('reason: required: say why the sheet is locked');
    const stranger = await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'x', editors: [t.outsider.user.id] });
    expect(stranger.status).toBe(400);
    expect(stranger.body.error.message).toBe(`editors.0: user ${t.outsider.user.id} is not a member of this workbook`);
  });

  it('lets a workbook viewer named on a lock edit that sheet, as a sheet role, and nothing else', async () => {
    const other = (await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Other' }).expect(201)).body.sheet.id as string;
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'measured', editors: [t.viewer.user.id] }).expect(200);
    const rev = (await load(t.owner.agent, wb.id)).revision;
    await t.viewer.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev, changes: [{ sheetId: sheet, row: 3, col: 0, input: 'NO' }] }).expect(200);
    const elsewhere = await t.viewer.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev + 1, changes: [{ sheetId: other, row: 0, col: 0, input: 'NO' }] });
    expect(elsewhere.status).toBe(403);
    expect(elsewhere.body.error.message).toMatch(/^Other!A1 is on sheet "Other": you are a viewer of sheet "Other" \(your role in this workbook\)/);
    const roles = (await t.viewer.agent.get(`/api/workbooks/${wb.id}/sheets/${sheet}/roles`).expect(200)).body;
    expect(roles.overrides.map((o: { user: { name: string }; role: string; viaLock: boolean }) => [o.user.name, o.role, o.viaLock]).sort()).toEqual([
      ['Ann Analyst', 'editor', true],
      ['Vic Viewer', 'editor', true],
    ]);
    // Lifting the lock takes away what it named: the viewer views again.
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).expect(204);
    const after = await t.viewer.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev + 1, changes: [{ sheetId: sheet, row: 4, col: 0, input: 'NO' }] });
    expect(after.status).toBe(403);
  });

  it('holds against a restore by someone not on the lock', async () => {
    await edit(t.owner.agent, wb, 0, 0, 'O2').expect(200);
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'final' }).expect(200);
    const restore = await t.editor.agent.post(`/api/workbooks/${wb.id}/revisions/0/restore`);
    expect(restore.status).toBe(403);
    expect(restore.body.error.message).toMatch(/^Screen1!A1 is on sheet "Screen1", locked by Ann Analyst/);
    expect((await load(t.owner.agent, wb.id)).sheets[0].cells).toEqual([[0, 0, 'O2']]);
  });
});

describe('protected ranges', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let sheet: string;
  beforeEach(async () => {
    t ??= await makeTeam();
    wb = await sharedWorkbook(t, 'Reference values');
    sheet = wb.sheets[0].id;
  });
  afterAll(() => t.ctx.mail.stop());

  const protect = (agent: Agent, range: string, editors: string[] = []) => agent.post(`/api/workbooks/${wb.id}/sheets/${sheet}/protected-ranges`).send({ range, editors });

  it('refuses edits inside the range from those not listed, and allows cells outside it', async () => {
    const res = await protect(t.owner.agent, 'a1:c1', [t.editor.user.id]);
    expect(res.status).toBe(201);
    expect(res.body.protectedRange).toMatchObject({ range: 'A1:C1', bounds: { top: 0, left: 0, bottom: 0, right: 2 }, createdBy: { name: 'Ann Analyst' } });
    const inside = await edit(t.editor2.agent, wb, 0, 1, 'CO');
    expect(inside.status).toBe(403);
    expect(inside.body.error.message).toBe('Screen1!B1 is in the protected range Screen1!A1:C1, set by Ann Analyst; only Ann Analyst, Bob Bench may edit it; nothing was saved');
    expect(inside.body.error.details.cells[0]).toMatchObject({ row: 0, col: 1, rangeId: res.body.protectedRange.id });
    expect((await edit(t.editor2.agent, wb, 1, 1, 'CO')).status).toBe(200);
    expect((await edit(t.editor.agent, wb, 0, 1, 'CN-', 1)).status).toBe(200);
  });

  it('refuses a whole patch when one of its cells is protected, saving none of it', async () => {
    await protect(t.owner.agent, 'B:B').expect(201);
    const res = await t.editor.agent.post(`/api/workbooks/${wb.id}/patches`).send({
      baseRevision: 0,
      changes: [
        { sheetId: sheet, row: 4, col: 0, input: 'N2' },
        { sheetId: sheet, row: 999, col: 1, input: 'O2' },
      ],
    });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toMatch(/^Screen1!B1000 is in the protected range Screen1!B:B/);
    expect((await load(t.owner.agent, wb.id)).sheets[0].cells).toEqual([]);
  });

  it('refuses deleting a sheet that holds a range the user may not edit', async () => {
    await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets`).send({}).expect(201);
    await protect(t.owner.agent, '2:3').expect(201);
    const del = await t.editor.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}`);
    expect(del.status).toBe(403);
    expect(del.body.error.message).toMatch(/^sheet "Screen1" holds the protected range Screen1!2:3, set by Ann Analyst; only Ann Analyst may edit it, so the sheet cannot be deleted$/);
  });

  it('names a range that is not A1 notation or leaves the grid', async () => {
    for (const bad of ['A0:C1', 'A1:C', 'Sheet1!A1', 'ZZZZ1', 'A1:B2:C3', '']) {
      const res = await protect(t.owner.agent, bad);
      expect(res.status, bad).toBe(400);
      expect(res.body.error.message, bad).toBe(`range: "${bad}" is not a range in A1 notation on the grid (like B2, A1:C3, A:C or 2:5)`);
    }
    expect((await load(t.owner.agent, wb.id)).protectedRanges).toEqual([]);
  });

  it('removes a range on its creator\'s or the owner\'s word only', async () => {
    const own = (await t.editor.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Bob calc' })).body.sheet.id as string;
    const created = await t.editor.agent.post(`/api/workbooks/${wb.id}/sheets/${own}/protected-ranges`).send({ range: 'D4' });
    expect(created.status).toBe(201);
    const id = created.body.protectedRange.id as string;
    const other = await t.editor2.agent.delete(`/api/workbooks/${wb.id}/sheets/${own}/protected-ranges/${id}`);
    expect(other.status).toBe(403);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${own}/protected-ranges/${id}`).expect(204);
    expect((await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${own}/protected-ranges/${id}`)).status).toBe(404);
  });

  it('takes a removed member off every editor list, so re-joining grants nothing old', async () => {
    await protect(t.owner.agent, 'A1', [t.editor.user.id]).expect(201);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.editor.user.id}`).expect(204);
    await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: 'bob@lab.test', role: 'editor' }).expect(201);
    expect((await load(t.owner.agent, wb.id)).protectedRanges![0].editors.map((e) => e.name)).toEqual(['Ann Analyst']);
    expect((await edit(t.editor.agent, wb, 0, 0, 'x')).status).toBe(403);
  });

  it('audits locks and ranges', async () => {
    const r = await protect(t.owner.agent, 'C3').expect(201);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}/protected-ranges/${r.body.protectedRange.id}`).expect(204);
    await t.owner.agent.put(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).send({ reason: 'r' }).expect(200);
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/sheets/${sheet}/lock`).expect(204);
    const entries = (await t.owner.agent.get(`/api/workbooks/${wb.id}/audit`)).body.entries as { action: string; details: Record<string, unknown> }[];
    expect(entries.slice(0, 4).map((e) => e.action)).toEqual(['sheet.unlocked', 'sheet.locked', 'range.unprotected', 'range.protected']);
    expect(entries[3].details).toMatchObject({ sheetName: 'Screen1', range: 'C3' });
  });
});

describe('after a restart on the same database file', () => {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-locks-'));
  afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

  function boot() {
    const db = openDatabase(path.join(dir, 'orbitab.sqlite'));
    const { app, ctx } = createApp({ db, config: { ...loadConfig({ NODE_ENV: 'test' }), seed: false, origin: testOrigin, originConfigured: true } });
    const signIn = async (email: string) => {
      const agent = request.agent(app).set('Origin', testOrigin);
      await agent.post('/api/auth/sign-in').send({ email, password: testPassword }).expect(200);
      return agent;
    };
    return { db, app, ctx, signIn, agent: () => request.agent(app).set('Origin', testOrigin) };
  }

  it('keeps locks and protected ranges, and keeps refusing the same edits', async () => {
    const first = boot();
    const signUp = async (email: string, name: string) => {
      const user = (await first.agent().post('/api/auth/sign-up').send({ email, password: testPassword, name }).expect(201)).body.user;
      // Opens the mailed verification link, so the owner can add them directly.
      await first.agent().post('/api/auth/verify').send({ token: linkToken(mailedLink(first.db, email, 'verify-email')!) }).expect(200);
      return user;
    };
    await signUp('root@lab.test', 'Root');
    await signUp('ann@lab.test', 'Ann Analyst');
    const bob = await signUp('bob@lab.test', 'Bob Bench');
    await signUp('cara@lab.test', 'Cara Chemist');
    const ann = await first.signIn('ann@lab.test');
    const id = (await ann.post('/api/workbooks').send({ title: 'Durable' }).expect(201)).body.workbook.id as string;
    await ann.post(`/api/workbooks/${id}/members`).send({ email: 'bob@lab.test', role: 'editor' }).expect(201);
    await ann.post(`/api/workbooks/${id}/members`).send({ email: 'cara@lab.test', role: 'editor' }).expect(201);
    const second = (await ann.post(`/api/workbooks/${id}/sheets`).send({ name: 'Open' }).expect(201)).body.sheet.id as string;
    const sheet1 = (await ann.get(`/api/workbooks/${id}`)).body.sheets[0].id as string;
    await ann.put(`/api/workbooks/${id}/sheets/${sheet1}/lock`).send({ reason: 'signed off' }).expect(200);
    await ann.post(`/api/workbooks/${id}/sheets/${second}/protected-ranges`).send({ range: 'A1:B2', editors: [bob.id] }).expect(201);
    const before = (await ann.get(`/api/workbooks/${id}`)).body as WorkbookPayload;
    await first.ctx.mail.stop();
    first.db.$client.close();

    const again = boot();
    const annAgain = await again.signIn('ann@lab.test');
    const after = (await annAgain.get(`/api/workbooks/${id}`)).body as WorkbookPayload;
    expect(after.locks).toEqual(before.locks);
    expect(after.protectedRanges).toEqual(before.protectedRanges);
    const cara = await again.signIn('cara@lab.test');
    const patch = (sheetId: string, row: number, col: number) => cara.post(`/api/workbooks/${id}/patches`).send({ baseRevision: after.revision, changes: [{ sheetId, row, col, input: '1' }] });
    expect((await patch(sheet1, 5, 5)).status).toBe(403);
    expect((await patch(second, 1, 1)).status).toBe(403);
    expect((await patch(second, 2, 2)).status).toBe(200);
    const bobAgain = await again.signIn('bob@lab.test');
    expect((await bobAgain.post(`/api/workbooks/${id}/patches`).send({ baseRevision: after.revision + 1, changes: [{ sheetId: second, row: 1, col: 1, input: '2' }] })).status).toBe(200);
    again.db.$client.close();
  });
});
