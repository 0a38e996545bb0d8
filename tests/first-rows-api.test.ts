// GET /api/workbooks/:id/first-rows: the first tab's first rows and columns, and the values stored with
// the current revision for them — what the page paints before the whole workbook has arrived. It must
// agree with the whole answers (GET /:id and GET /:id/values) of the same revision, follow the tab
// order, never serve values of another revision or of a volatile workbook, and stay small.
import { eq } from 'drizzle-orm';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { firstColsShown, firstRowsShown, maxCellsPerPatch, type FirstRowsPayload } from '../shared/workbooks.js';
import { revisionValues } from '../server/db/schema.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import { makeTestApp } from './helpers/app.js';

afterAll(async () => {
  await stopKeeperThread();
});

const SPECIES = ['O2', 'N2', 'NO+', 'CN-', 'B2'];

describe('the first rows of a workbook', () => {
  const t = makeTestApp();
  let owner: Awaited<ReturnType<typeof t.signUp>>;
  let workbookId: string;
  let sheetId: string;
  let revision = 0;

  const patch = async (changes: [row: number, col: number, input: string][], sheet = sheetId) => {
    for (let i = 0; i < changes.length; i += maxCellsPerPatch) {
      const res = await owner.agent
        .post(`/api/workbooks/${workbookId}/patches`)
        .send({ baseRevision: revision, changes: changes.slice(i, i + maxCellsPerPatch).map(([row, col, input]) => ({ sheetId: sheet, row, col, input })) });
      expect(res.status, JSON.stringify(res.body)).toBe(200);
      revision = res.body.revision;
    }
  };
  const firstRows = async (): Promise<FirstRowsPayload> => {
    const res = await owner.agent.get(`/api/workbooks/${workbookId}/first-rows`);
    expect(res.status).toBe(200);
    return res.body;
  };
  const inView = ([row, col]: [number, number, ...unknown[]]) => row < firstRowsShown && col < firstColsShown;

  beforeAll(async () => {
    owner = await t.signUp('tove.lind@example.com', 'Tove Lind');
    workbookId = (await owner.agent.post('/api/workbooks').send({ title: 'First rows' })).body.workbook.id;
    sheetId = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id;
    // 150 rows of species and chemistry formulas, and a few cells right of the columns shown.
    const cells: [number, number, string][] = [];
    for (let r = 0; r < 150; r++) cells.push([r, 0, SPECIES[r % SPECIES.length]], [r, 1, `=BONDORDER(A${r + 1})`], [r, 2, `=GROUNDTERM(A${r + 1})`]);
    cells.push([3, firstColsShown, 'beyond'], [3, firstColsShown + 5, '=1+1']);
    await patch(cells);
  });

  it('answers the first tab’s first rows without values until they are stored, then with them', async () => {
    // Before the keeper has run (it runs after the commit, in its thread): no values yet, or the stored ones.
    const early = await firstRows();
    expect(early.revision).toBe(revision);
    expect(early.title).toBe('First rows');
    await t.ctx.values.idle();
    const first = await firstRows();
    const whole = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body;
    const values = (await owner.agent.get(`/api/workbooks/${workbookId}/values`)).body;
    expect(first.revision).toBe(whole.revision);
    expect(first.sheet!.id).toBe(whole.sheets[0].id);
    expect(first.sheet!.settings).toEqual(whole.sheets[0].settings);
    expect(first.sheet!.cells).toEqual(whole.sheets[0].cells.filter(inView));
    expect(first.values).toEqual(values.sheets[0].values.filter(inView));
    expect(first.sheet!.cells).toHaveLength(60 * 3);
    expect(first.values).toContainEqual([0, 1, 2]); // O2: bond order 2 (MO diagram of any general chemistry text)
    expect(first.values).toContainEqual([1, 2, '¹Σg⁺']); // N2: closed shell, ground term ¹Σg⁺
    expect(first.cells).toBe(150 * 3 + 2);
    // A few kilobytes, whatever the size of the workbook.
    expect(JSON.stringify(first).length).toBeLessThan(20_000);
  });

  it('never serves the values of another revision: after a patch, none until the new ones are stored', async () => {
    await t.ctx.values.idle();
    // Held back: the keeper hears nothing of the next revision until the test tells it.
    const noteRevision = t.ctx.values.noteRevision.bind(t.ctx.values);
    t.ctx.values.noteRevision = () => {};
    try {
      await patch([[0, 0, 'N2']]);
      const stale = await firstRows();
      expect(stale.revision).toBe(revision);
      expect(stale.values).toBeNull();
      expect(stale.cells).toBeNull();
      expect(stale.sheet!.cells).toContainEqual([0, 0, 'N2']);
    } finally {
      t.ctx.values.noteRevision = noteRevision;
    }
    t.ctx.values.noteRevision(workbookId, revision);
    await t.ctx.values.idle();
    const fresh = await firstRows();
    expect(fresh.values).toContainEqual([0, 1, 3]); // N2: bond order 3
  });

  it('follows the tab order', async () => {
    const added = await owner.agent.post(`/api/workbooks/${workbookId}/sheets`).send({ name: 'Front' });
    expect(added.status).toBe(201);
    const frontId = added.body.sheet.id as string;
    revision = added.body.revision ?? (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.revision;
    await patch([[0, 0, 'F2'], [0, 1, '=BONDORDER(A1)']], frontId);
    const moved = await owner.agent.patch(`/api/workbooks/${workbookId}/sheets/${frontId}`).send({ position: 0 });
    expect(moved.status).toBe(200);
    revision = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.revision;
    await t.ctx.values.idle();
    const first = await firstRows();
    expect(first.sheet!.name).toBe('Front');
    expect(first.sheet!.cells).toEqual([
      [0, 0, 'F2'],
      [0, 1, '=BONDORDER(A1)'],
    ]);
    expect(first.values).toEqual([
      [0, 0, 'F2'],
      [0, 1, 1], // F2: bond order 1
    ]);
    // Move it back for the tests below.
    await owner.agent.patch(`/api/workbooks/${workbookId}/sheets/${frontId}`).send({ position: 1 });
    revision = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.revision;
    await t.ctx.values.idle();
  });

  it('gives no values for a workbook calling a function of the clock or of chance, nor for a row kept before first rows were', async () => {
    await patch([[200, 0, '=RAND()']]);
    await t.ctx.values.idle();
    expect(t.db.select().from(revisionValues).where(eq(revisionValues.workbookId, workbookId)).get()?.volatileFormulas).toBe(1);
    expect((await firstRows()).values).toBeNull();
    await patch([[200, 0, '']]);
    await t.ctx.values.idle();
    expect((await firstRows()).values).not.toBeNull();
    // A revision stored by an older release has no first rows: the page waits for the whole answers.
    t.db.update(revisionValues).set({ firstRows: null }).where(eq(revisionValues.workbookId, workbookId)).run();
    const old = await firstRows();
    expect(old.values).toBeNull();
    expect(old.sheet!.cells.length).toBeGreaterThan(0);
  });

  it('is not given to someone the workbook is not shared with', async () => {
    const stranger = await t.signUp('nils.aho@example.com', 'Nils Aho');
    const res = await stranger.agent.get(`/api/workbooks/${workbookId}/first-rows`);
    expect([403, 404]).toContain(res.status);
    expect(res.body.error).toBeDefined();
  });
});
