// History as a specification: every saved change is a numbered revision with its author and what it
// changed; restoring revision n brings the workbook back to how it was after n, as a new revision.
import { beforeAll, describe, expect, it } from 'vitest';
import type { RevisionDetail, RevisionSummary, WorkbookPayload } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

async function setup() {
  const t = makeTestApp();
  await t.signUp('admin@lab.test', 'Site Admin'); // the first account is the site admin
  const ann = await t.signUp('ann@lab.test', 'Ann Analyst');
  const newWorkbook = async () => {
    const id = (await ann.agent.post('/api/workbooks').send({ title: 'History' }).expect(201)).body.workbook.id as string;
    const load = async (): Promise<WorkbookPayload> => (await ann.agent.get(`/api/workbooks/${id}`).expect(200)).body;
    const sheetId = (await load()).sheets[0].id;
    const patch = async (baseRevision: number, changes: [sheetId: string, row: number, col: number, input: string][]) =>
      (
        await ann.agent
          .post(`/api/workbooks/${id}/patches`)
          .send({ baseRevision, changes: changes.map(([s, row, col, input]) => ({ sheetId: s, row, col, input })) })
          .expect(200)
      ).body.revision as number;
    const restore = (n: number) => ann.agent.post(`/api/workbooks/${id}/revisions/${n}/restore`);
    /** Every sheet as name → its non-empty inputs, in tab order. */
    const contents = async () => (await load()).sheets.map((s) => [s.name, s.cells]);
    return { id, sheetId, load, patch, restore, contents };
  };
  return { ...t, ann, newWorkbook };
}

describe('revision history', () => {
  it('lists revisions newest first with author, kind, time and change count, and shows each one\'s before and after', async () => {
    const t = await setup();
    const w = await t.newWorkbook();
    const started = Date.now();
    await w.patch(0, [[w.sheetId, 0, 0, 'O2'], [w.sheetId, 0, 1, '=UNPAIRED(A1)']]);
    await w.patch(1, [[w.sheetId, 0, 0, 'N2']]);

    const list = await t.ann.agent.get(`/api/workbooks/${w.id}/revisions`).expect(200);
    expect(list.body.revision).toBe(2);
    const revisions = list.body.revisions as RevisionSummary[];
    expect(revisions.map((r) => [r.number, r.kind, r.changeCount])).toEqual([
      [2, 'edit', 1],
      [1, 'edit', 2],
    ]);
    expect(revisions[0].author).toEqual({ id: t.ann.user.id, name: 'Ann Analyst', email: 'ann@lab.test' });
    expect(revisions[0].createdAt).toBeGreaterThanOrEqual(started - 1000);

    const second = (await t.ann.agent.get(`/api/workbooks/${w.id}/revisions/2`).expect(200)).body as RevisionDetail;
    expect(second.patch).toEqual({ sheetOps: [], changes: [{ sheetId: w.sheetId, row: 0, col: 0, before: 'O2', after: 'N2' }] });
    expect((await t.ann.agent.get(`/api/workbooks/${w.id}/revisions/9`)).status).toBe(404);
    const paged = (await t.ann.agent.get(`/api/workbooks/${w.id}/revisions?before=2&limit=1`).expect(200)).body.revisions as RevisionSummary[];
    expect(paged.map((r) => r.number)).toEqual([1]);
  });
});

describe('restoring a revision', () => {
  let t: Awaited<ReturnType<typeof setup>>;
  beforeAll(async () => {
    t = await setup();
  });

  it('brings back the inputs of revision n as a new revision of kind "restore"', async () => {
    const w = await t.newWorkbook();
    const s = w.sheetId;
    await w.patch(0, [[s, 0, 0, 'a1'], [s, 0, 1, 'b1']]); // 1
    await w.patch(1, [[s, 0, 0, 'a2'], [s, 0, 2, 'c2']]); // 2
    await w.patch(2, [[s, 0, 1, ''], [s, 0, 0, 'a3']]); // 3

    const res = await w.restore(1);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ revision: 4, changeCount: 3 });
    expect(await w.contents()).toEqual([['Screen1', [[0, 0, 'a1'], [0, 1, 'b1']]]]);

    const detail = (await t.ann.agent.get(`/api/workbooks/${w.id}/revisions/4`).expect(200)).body as RevisionDetail;
    expect(detail.kind).toBe('restore');
    expect(detail.patch.restoredFrom).toBe(1);
    expect(detail.patch.changes).toEqual([
      { sheetId: s, row: 0, col: 0, before: 'a3', after: 'a1' },
      { sheetId: s, row: 0, col: 1, before: '', after: 'b1' },
      { sheetId: s, row: 0, col: 2, before: 'c2', after: '' },
    ]);
  });

  it('can itself be undone by restoring the revision before it', async () => {
    const w = await t.newWorkbook();
    const s = w.sheetId;
    await w.patch(0, [[s, 1, 0, 'NO']]); // 1
    await w.patch(1, [[s, 1, 0, 'NO+'], [s, 2, 0, 'CN']]); // 2
    await w.restore(0).expect(200); // 3: empty again
    expect(await w.contents()).toEqual([['Screen1', []]]);
    await w.restore(2).expect(200); // 4: as after 2
    expect(await w.contents()).toEqual([['Screen1', [[1, 0, 'NO+'], [2, 0, 'CN']]]]);
  });

  it('makes restored cells conflict with a client still based before the restore', async () => {
    const w = await t.newWorkbook();
    await w.patch(0, [[w.sheetId, 0, 0, 'F2']]); // 1
    await w.patch(1, [[w.sheetId, 0, 0, 'Cl2']]); // 2
    await w.restore(1).expect(200); // 3
    const stale = await t.ann.agent.post(`/api/workbooks/${w.id}/patches`).send({ baseRevision: 2, changes: [{ sheetId: w.sheetId, row: 0, col: 0, input: 'Br2' }] });
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.conflicts[0]).toMatchObject({ theirs: 'F2', revision: 3 });
  });

  it('brings back a deleted sheet with its id and cells, undoes renames and removes sheets added later', async () => {
    const w = await t.newWorkbook();
    const ions = (await t.ann.agent.post(`/api/workbooks/${w.id}/sheets`).send({ name: 'Ions' }).expect(201)).body.sheet; // 1
    await w.patch(1, [[ions.id, 0, 0, 'NO+'], [w.sheetId, 0, 0, '=Ions!A1']]); // 2
    await t.ann.agent.delete(`/api/workbooks/${w.id}/sheets/${ions.id}`).expect(200); // 3
    await t.ann.agent.patch(`/api/workbooks/${w.id}/sheets/${w.sheetId}`).send({ name: 'Main', settings: { frozenRows: 1 } }).expect(200); // 4
    await t.ann.agent.post(`/api/workbooks/${w.id}/sheets`).send({ name: 'Late', position: 0 }).expect(201); // 5

    const res = await w.restore(2);
    expect(res.status).toBe(200);
    expect(res.body.revision).toBe(6);
    const wb = await w.load();
    expect(wb.sheets.map((s) => [s.id, s.name, s.position, s.settings, s.cells])).toEqual([
      [w.sheetId, 'Screen1', 0, {}, [[0, 0, '=Ions!A1']]],
      [ions.id, 'Ions', 1, {}, [[0, 0, 'NO+']]],
    ]);

    // …and restoring 5 puts every tab back as it was before this restore (deleting Ions in revision 3
    // had turned the reference to it into #REF!).
    await w.restore(5).expect(200);
    expect((await w.load()).sheets.map((s) => [s.name, s.position, s.settings, s.cells])).toEqual([
      ['Late', 0, {}, []],
      ['Main', 1, { frozenRows: 1 }, [[0, 0, '=#REF!']]],
    ]);
  });

  it('refuses to restore the current revision or one that does not exist yet', async () => {
    const w = await t.newWorkbook();
    await w.patch(0, [[w.sheetId, 0, 0, 'x']]);
    const current = await w.restore(1);
    expect(current.status).toBe(400);
    expect(current.body.error.message).toBe('revision 1 is the current revision; there is nothing to restore');
    expect((await w.restore(7)).status).toBe(404);
    const bad = await w.restore(-1);
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('n: must be 0 or more');
    const word = await w.restore('latest' as unknown as number);
    expect(word.status).toBe(400);
    expect(word.body.error.message).toBe('n: must be a whole number');
  });
});
