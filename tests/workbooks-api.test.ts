// The workbook API as a specification: workbooks and their tabs, who may reach them, and how a
// tab change becomes a revision. Patches, conflicts and restores are in patches-api.test.ts.
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { workbookMembers } from '../server/db/schema.js';
import type { WorkbookPayload, WorkbookSummary } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

async function team() {
  const t = makeTestApp();
  // The first account on a site becomes its admin; make that someone else than the analysts.
  const admin = await t.signUp('admin@lab.test', 'Site Admin');
  const ann = await t.signUp('ann@lab.test', 'Ann Analyst');
  const bob = await t.signUp('bob@lab.test', 'Bob Bench');
  return { ...t, admin, ann, bob };
}
type Team = Awaited<ReturnType<typeof team>>;
type Agent = Team['ann']['agent'];

async function newWorkbook(agent: Agent, title = 'Diatomic screen'): Promise<WorkbookPayload> {
  const created = await agent.post('/api/workbooks').send({ title });
  expect(created.status).toBe(201);
  const loaded = await agent.get(`/api/workbooks/${created.body.workbook.id}`);
  expect(loaded.status).toBe(200);
  return loaded.body as WorkbookPayload;
}

describe('workbooks', () => {
  let t: Team;
  beforeAll(async () => {
    t = await team();
  });

  it('creates a workbook owned by its creator, with one empty Screen1 at revision 0', async () => {
    const res = await t.ann.agent.post('/api/workbooks').send({ title: '  Radicals and ions  ' });
    expect(res.status).toBe(201);
    const summary = res.body.workbook as WorkbookSummary;
    expect(summary).toMatchObject({ title: 'Radicals and ions', revision: 0, role: 'owner', owner: { id: t.ann.user.id, name: 'Ann Analyst' } });

    const wb = (await t.ann.agent.get(`/api/workbooks/${summary.id}`)).body as WorkbookPayload;
    expect(wb).toMatchObject({ id: summary.id, title: 'Radicals and ions', revision: 0, role: 'owner' });
    expect(wb.sheets).toEqual([{ id: expect.any(String), name: 'Screen1', position: 0, settings: {}, cells: [], createdBy: t.ann.user.id }]);
  });

  it('lists only the workbooks the user belongs to', async () => {
    const a = await newWorkbook(t.ann.agent, 'Ann list check');
    const b = await newWorkbook(t.bob.agent, 'Bob list check');
    const annList = ((await t.ann.agent.get('/api/workbooks')).body.workbooks as WorkbookSummary[]).map((w) => w.id);
    const bobList = ((await t.bob.agent.get('/api/workbooks')).body.workbooks as WorkbookSummary[]).map((w) => w.id);
    expect(annList).toContain(a.id);
    expect(annList).not.toContain(b.id);
    expect(bobList).toEqual([b.id]);
  });

  it('refuses a blank or over-long title, naming the field', async () => {
    const blank = await t.ann.agent.post('/api/workbooks').send({ title: '   ' });
    expect(blank.status).toBe(400);
    expect(blank.body.error.message).toBe('title: required');
    const long = await t.ann.agent.post('/api/workbooks').send({ title: 'x'.repeat(201) });
    expect(long.status).toBe(400);
    expect(long.body.error.message).toBe('title: at most 200 characters');
  });

  it('renames a workbook without moving its revision', async () => {
    const wb = await newWorkbook(t.ann.agent, 'Old title');
    const res = await t.ann.agent.patch(`/api/workbooks/${wb.id}`).send({ title: 'Carbonyl ligands' });
    expect(res.status).toBe(200);
    expect(res.body.workbook).toMatchObject({ id: wb.id, title: 'Carbonyl ligands', revision: 0 });
    const list = (await t.ann.agent.get('/api/workbooks')).body.workbooks as WorkbookSummary[];
    expect(list.find((w) => w.id === wb.id)?.title).toBe('Carbonyl ligands');
  });

  it('deletes a workbook with its sheets, cells and history', async () => {
    const wb = await newWorkbook(t.ann.agent, 'To delete');
    await t.ann.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 0, changes: [{ sheetId: wb.sheets[0].id, row: 0, col: 0, input: 'N2' }] }).expect(200);
    expect((await t.ann.agent.delete(`/api/workbooks/${wb.id}`)).status).toBe(204);
    expect((await t.ann.agent.get(`/api/workbooks/${wb.id}`)).status).toBe(404);
    const left = (name: string) => (t.db.$client.prepare(`select count(*) as n from ${name} where ${name === 'cells' ? 'sheet_id' : 'workbook_id'} = ?`).get(name === 'cells' ? wb.sheets[0].id : wb.id) as { n: number }).n;
    expect({ sheets: left('sheets'), cells: left('cells'), revisions: left('revisions'), members: left('workbook_members') }).toEqual({ sheets: 0, cells: 0, revisions: 0, members: 0 });
  });
});

describe('who may reach a workbook', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let routes: [method: 'get' | 'post' | 'patch' | 'delete', path: string, body?: object][];
  beforeAll(async () => {
    t = await team();
  });
  // Each test gets its own workbook (one saved cell, revision 1), so none sees another's membership rows.
  beforeEach(async () => {
    wb = await newWorkbook(t.ann.agent);
    const s = wb.sheets[0].id;
    await t.ann.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 0, changes: [{ sheetId: s, row: 0, col: 0, input: 'O2' }] }).expect(200);
    routes = [
      ['get', `/api/workbooks/${wb.id}`],
      ['patch', `/api/workbooks/${wb.id}`, { title: 'taken over' }],
      ['delete', `/api/workbooks/${wb.id}`],
      ['post', `/api/workbooks/${wb.id}/sheets`, {}],
      ['patch', `/api/workbooks/${wb.id}/sheets/${s}`, { name: 'Mine' }],
      ['delete', `/api/workbooks/${wb.id}/sheets/${s}`],
      ['post', `/api/workbooks/${wb.id}/patches`, { baseRevision: 1, changes: [{ sheetId: s, row: 0, col: 0, input: 'N2' }] }],
      ['get', `/api/workbooks/${wb.id}/revisions`],
      ['get', `/api/workbooks/${wb.id}/revisions/1`],
      ['post', `/api/workbooks/${wb.id}/revisions/0/restore`],
      ['get', `/api/workbooks/${wb.id}/values`],
    ];
  });

  it('answers 401 on every route to a signed-out client', async () => {
    for (const [method, path, body] of [['get', '/api/workbooks'] as const, ['post', '/api/workbooks', { title: 'x' }] as const, ...routes]) {
      const res = await t.agent()[method](path).send(body);
      expect(res.status, `${method} ${path}`).toBe(401);
      expect(res.body.error.code).toBe('unauthorized');
    }
  });

  it('answers 404 on every route to someone who is not a member, and changes nothing', async () => {
    for (const [method, path, body] of routes) {
      const res = await t.bob.agent[method](path).send(body);
      expect(res.status, `${method} ${path}`).toBe(404);
      expect(res.body.error).toEqual({ code: 'not_found', message: 'workbook not found' });
    }
    const after = (await t.ann.agent.get(`/api/workbooks/${wb.id}`)).body as WorkbookPayload;
    expect(after).toMatchObject({ title: wb.title, revision: 1 });
    expect(after.sheets[0].cells).toEqual([[0, 0, 'O2']]);
  });

  it('lets a viewer read but refuses their edits with 403 and the reason', async () => {
    // Sharing has its own routes later; a membership row is all the access check reads.
    t.db.insert(workbookMembers).values({ workbookId: wb.id, userId: t.bob.user.id, role: 'viewer' }).run();
    const read = await t.bob.agent.get(`/api/workbooks/${wb.id}`);
    expect(read.status).toBe(200);
    expect(read.body.role).toBe('viewer');
    const edit = await t.bob.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 1, changes: [{ sheetId: wb.sheets[0].id, row: 1, col: 0, input: 'NO' }] });
    expect(edit.status).toBe(403);
    expect(edit.body.error.message).toBe('as a viewer you cannot edit cells');
    const del = await t.bob.agent.delete(`/api/workbooks/${wb.id}`);
    expect(del.status).toBe(403);
    expect(del.body.error.message).toBe('as a viewer you cannot delete this workbook');
  });

  it('lets a site admin who is not a member open the workbook but not change it', async () => {
    const read = await t.admin.agent.get(`/api/workbooks/${wb.id}`);
    expect(read.status).toBe(200);
    expect(read.body.role).toBe('site-admin');
    const rename = await t.admin.agent.patch(`/api/workbooks/${wb.id}`).send({ title: 'admin was here' });
    expect(rename.status).toBe(403);
    expect(rename.body.error.message).toBe('as a site admin you cannot rename this workbook');
  });
});

describe('sheets', () => {
  let t: Team;
  beforeAll(async () => {
    t = await team();
  });

  const tabs = async (id: string) => ((await t.ann.agent.get(`/api/workbooks/${id}`)).body as WorkbookPayload).sheets.map((s) => [s.name, s.position]);

  it('adds sheets named Screen<n> at the end, or with a name at a given position', async () => {
    const wb = await newWorkbook(t.ann.agent);
    const second = await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({});
    expect(second.status).toBe(201);
    expect(second.body).toMatchObject({ revision: 1, sheet: { name: 'Screen2', position: 1, settings: {} } });
    await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Ions', position: 0 }).expect(201);
    expect(await tabs(wb.id)).toEqual([['Ions', 0], ['Screen1', 1], ['Screen2', 2]]);
    const beyond = await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ position: 9 });
    expect(beyond.status).toBe(400);
    expect(beyond.body.error.message).toBe('position: must be at most 3 (the number of sheets)');
  });

  it('renames a sheet, refusing a name already used (ignoring case) or holding forbidden characters', async () => {
    const wb = await newWorkbook(t.ann.agent);
    const other = (await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Radicals' })).body.sheet;
    const renamed = await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${other.id}`).send({ name: 'Open-shell species' });
    expect(renamed.status).toBe(200);
    expect(renamed.body.sheet.name).toBe('Open-shell species');

    const taken = await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${other.id}`).send({ name: 'screen1' });
    expect(taken.status).toBe(409);
    expect(taken.body.error.message).toBe('name: a sheet named "Screen1" already exists in this workbook');
    for (const bad of ['a/b', 'Q?', "'quoted'", '[x]']) {
      const res = await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${other.id}`).send({ name: bad });
      expect(res.status, bad).toBe(400);
      expect(res.body.error.message).toMatch(/^name: may not/);
    }
    const empty = await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${other.id}`).send({});
    expect(empty.status).toBe(400);
    expect(empty.body.error.message).toMatch(/give at least one of name, position, settings/);
  });

  it('moves a sheet and keeps the other tabs numbered 0..n-1 in order', async () => {
    const wb = await newWorkbook(t.ann.agent);
    const b = (await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'B' })).body.sheet;
    await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'C' }).expect(201);
    const c = (await t.ann.agent.get(`/api/workbooks/${wb.id}`)).body.sheets[2];
    await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${c.id}`).send({ position: 0 }).expect(200);
    expect(await tabs(wb.id)).toEqual([['C', 0], ['Screen1', 1], ['B', 2]]);
    await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${c.id}`).send({ position: 2 }).expect(200);
    expect(await tabs(wb.id)).toEqual([['Screen1', 0], ['B', 1], ['C', 2]]);
    const past = await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${b.id}`).send({ position: 3 });
    expect(past.status).toBe(400);
  });

  it('deletes a sheet with its cells but never the last one', async () => {
    const wb = await newWorkbook(t.ann.agent);
    const extra = (await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Scratch' })).body.sheet;
    await t.ann.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 1, changes: [{ sheetId: extra.id, row: 2, col: 1, input: '=1+1' }] }).expect(200);
    const del = await t.ann.agent.delete(`/api/workbooks/${wb.id}/sheets/${extra.id}`);
    expect(del.status).toBe(200);
    expect(del.body.revision).toBe(3);
    expect(await tabs(wb.id)).toEqual([['Screen1', 0]]);
    const last = await t.ann.agent.delete(`/api/workbooks/${wb.id}/sheets/${wb.sheets[0].id}`);
    expect(last.status).toBe(409);
    expect(last.body.error.message).toBe('"Screen1" is the only sheet; a workbook keeps at least one');
  });

  it('records every tab change as a revision of kind "sheet"', async () => {
    const wb = await newWorkbook(t.ann.agent);
    const s = (await t.ann.agent.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Tmp' })).body.sheet;
    await t.ann.agent.patch(`/api/workbooks/${wb.id}/sheets/${s.id}`).send({ name: 'Kept', settings: { frozenRows: 1 } }).expect(200);
    await t.ann.agent.delete(`/api/workbooks/${wb.id}/sheets/${s.id}`).expect(200);
    const history = (await t.ann.agent.get(`/api/workbooks/${wb.id}/revisions`)).body;
    expect(history.revisions.map((r: { number: number; kind: string; changeCount: number }) => [r.number, r.kind, r.changeCount])).toEqual([
      [3, 'sheet', 1],
      [2, 'sheet', 2],
      [1, 'sheet', 1],
    ]);
    const rename = (await t.ann.agent.get(`/api/workbooks/${wb.id}/revisions/2`)).body;
    expect(rename.patch.sheetOps).toEqual([
      { op: 'rename', sheetId: s.id, before: 'Tmp', after: 'Kept' },
      { op: 'settings', sheetId: s.id, before: {}, after: { frozenRows: 1 } },
    ]);
  });

  it('does not reach a sheet of another workbook through this workbook', async () => {
    const mine = await newWorkbook(t.ann.agent, 'Mine');
    const alsoMine = await newWorkbook(t.ann.agent, 'Also mine');
    const foreign = alsoMine.sheets[0].id;
    const rename = await t.ann.agent.patch(`/api/workbooks/${mine.id}/sheets/${foreign}`).send({ name: 'Hijacked' });
    expect(rename.status).toBe(404);
    const del = await t.ann.agent.delete(`/api/workbooks/${mine.id}/sheets/${foreign}`);
    expect(del.status).toBe(404);
    const patch = await t.ann.agent.post(`/api/workbooks/${mine.id}/patches`).send({ baseRevision: 0, changes: [{ sheetId: foreign, row: 0, col: 0, input: 'x' }] });
    expect(patch.status).toBe(404);
    expect(patch.body.error.message).toBe(`changes.0.sheetId: sheet ${foreign} not found in this workbook`);
    const untouched = (await t.ann.agent.get(`/api/workbooks/${alsoMine.id}`)).body as WorkbookPayload;
    expect(untouched).toMatchObject({ revision: 0, sheets: [{ name: 'Screen1', cells: [] }] });
  });
});
