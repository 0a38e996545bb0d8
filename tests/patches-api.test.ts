// Saving cells as a specification: a patch is applied whole or not at all, a cell someone else
// changed after the client's base revision is a conflict (409 naming it), nothing is overwritten
// silently, and malformed or oversized patches are refused with the field or limit named.
import { beforeAll, beforeEach, describe, expect, it } from 'vitest';
import { workbookMembers } from '../server/db/schema.js';
import { maxBodyBytes, maxCellsPerPatch, type CellConflict, type WorkbookEvent, type WorkbookPayload } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

async function setup() {
  const t = makeTestApp();
  await t.signUp('admin@lab.test', 'Site Admin'); // the first account is the site admin
  const ann = await t.signUp('ann@lab.test', 'Ann Analyst');
  const bob = await t.signUp('bob@lab.test', 'Bob Bench');
  return { ...t, ann, bob };
}
type Setup = Awaited<ReturnType<typeof setup>>;

/** A new workbook of Ann's that Bob edits too: each test starts from its own, so none depends on another. */
async function newWorkbook(t: Setup) {
  const created = await t.ann.agent.post('/api/workbooks').send({ title: 'Shared screen' }).expect(201);
  const id = created.body.workbook.id as string;
  // Bob edits too (sharing comes later; a membership row is what access reads).
  t.db.insert(workbookMembers).values({ workbookId: id, userId: t.bob.user.id, role: 'editor' }).run();
  const load = async (): Promise<WorkbookPayload> => (await t.ann.agent.get(`/api/workbooks/${id}`).expect(200)).body;
  const sheetId = (await load()).sheets[0].id;
  return { id, sheetId, load };
}

const cell = (sheetId: string, row: number, col: number, input: string) => ({ sheetId, row, col, input });

describe('applying patches', () => {
  let t: Setup;
  let w: Awaited<ReturnType<typeof newWorkbook>>;
  beforeAll(async () => {
    t = await setup();
  });
  beforeEach(async () => {
    w = await newWorkbook(t);
  });
  const send = (who: 'ann' | 'bob', baseRevision: number, changes: object[]) => t[who].agent.post(`/api/workbooks/${w.id}/patches`).send({ baseRevision, changes });

  it('writes every change of a patch as one new revision and returns it', async () => {
    const res = await send('ann', 0, [cell(w.sheetId, 0, 0, 'O2'), cell(w.sheetId, 0, 1, '=BONDORDER(A1)')]);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ revision: 1, applied: 2 });
    const wb = await w.load();
    expect(wb.revision).toBe(1);
    expect(wb.sheets[0].cells).toEqual([
      [0, 0, 'O2'],
      [0, 1, '=BONDORDER(A1)'],
    ]);
  });

  it('keeps both edits when two clients change different cells from the same base', async () => {
    const base = (await w.load()).revision;
    const first = await send('ann', base, [cell(w.sheetId, 5, 0, 'N2')]);
    const second = await send('bob', base, [cell(w.sheetId, 6, 0, 'CO')]);
    expect([first.status, second.status]).toEqual([200, 200]);
    expect(second.body.revision).toBe(first.body.revision + 1);
    const cells = (await w.load()).sheets[0].cells;
    expect(cells).toContainEqual([5, 0, 'N2']);
    expect(cells).toContainEqual([6, 0, 'CO']);
  });

  it('refuses the second of two edits to one cell from the same base with 409 naming the cell, and saves none of that patch', async () => {
    const base = (await w.load()).revision;
    const first = await send('ann', base, [cell(w.sheetId, 10, 2, 'NO')]);
    expect(first.status).toBe(200);
    const second = await send('bob', base, [cell(w.sheetId, 11, 2, 'OH'), cell(w.sheetId, 10, 2, 'NO+')]);
    expect(second.status).toBe(409);
    expect(second.body.error.code).toBe('conflict');
    expect(second.body.error.message).toBe(`changed by someone else after revision ${base}: Screen1!C11 (revision ${first.body.revision}); nothing was saved`);
    expect(second.body.error.details.conflicts).toEqual<CellConflict[]>([{ sheetId: w.sheetId, row: 10, col: 2, theirs: 'NO', mine: 'NO+', revision: first.body.revision }]);

    const wb = await w.load();
    expect(wb.revision).toBe(first.body.revision);
    expect(wb.sheets[0].cells).toContainEqual([10, 2, 'NO']);
    expect(wb.sheets[0].cells.find(([r, c]) => r === 11 && c === 2)).toBeUndefined();
  });

  it('accepts the same input someone else already saved: no conflict and no new revision', async () => {
    const base = (await w.load()).revision;
    const first = await send('ann', base, [cell(w.sheetId, 20, 0, 'CN-')]);
    const same = await send('bob', base, [cell(w.sheetId, 20, 0, 'CN-')]);
    expect(same.status).toBe(200);
    expect(same.body).toEqual({ revision: first.body.revision, applied: 0 });
  });

  it('clears a cell with an empty input and still sees a later edit from an older base as a conflict', async () => {
    await send('ann', 0, [cell(w.sheetId, 5, 0, 'N2')]).expect(200);
    const base = (await w.load()).revision;
    const cleared = await send('ann', base, [cell(w.sheetId, 5, 0, '')]);
    expect(cleared.status).toBe(200);
    expect((await w.load()).sheets[0].cells.find(([r, c]) => r === 5 && c === 0)).toBeUndefined();
    const stale = await send('bob', base, [cell(w.sheetId, 5, 0, 'N2+')]);
    expect(stale.status).toBe(409);
    expect(stale.body.error.details.conflicts[0]).toMatchObject({ row: 5, col: 0, theirs: '', mine: 'N2+' });
  });

  it('refuses a base revision ahead of the workbook', async () => {
    const { revision } = await w.load();
    const res = await send('ann', revision + 5, [cell(w.sheetId, 0, 9, 'x')]);
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe(`baseRevision: ${revision + 5} is ahead of the workbook (revision ${revision}); reload it`);
  });

  it('tells listeners about a saved revision after it is committed, and nothing about a refused one', async () => {
    const events: WorkbookEvent[] = [];
    const stop = t.ctx.events.subscribe(w.id, (e) => events.push(e));
    const base = (await w.load()).revision;
    const ok = await send('ann', base, [cell(w.sheetId, 30, 0, 'F2')]);
    await send('bob', base, [cell(w.sheetId, 30, 0, 'Cl2')]).expect(409);
    stop();
    expect(events).toEqual([
      {
        type: 'revision',
        workbookId: w.id,
        revision: ok.body.revision,
        kind: 'edit',
        authorId: t.ann.user.id,
        patch: { sheetOps: [], changes: [{ sheetId: w.sheetId, row: 30, col: 0, before: '', after: 'F2' }] },
      },
    ]);
  });
  it('saves a patch even when a listener fails (a closed live connection must not lose the edit)', async () => {
    const stop = t.ctx.events.subscribe(w.id, () => {
      throw new Error('connection reset');
    });
    const base = (await w.load()).revision;
    const res = await send('ann', base, [cell(w.sheetId, 31, 0, 'S2')]);
    stop();
    expect(res.status).toBe(200);
    expect((await w.load()).sheets[0].cells).toContainEqual([31, 0, 'S2']);
  });
});

describe('refusing malformed and oversized patches', () => {
  let t: Setup;
  let w: Awaited<ReturnType<typeof newWorkbook>>;
  beforeAll(async () => {
    t = await setup();
  });
  beforeEach(async () => {
    w = await newWorkbook(t);
  });
  const post = (body: unknown) => t.ann.agent.post(`/api/workbooks/${w.id}/patches`).send(body as object);

  it.each([
    ['a negative row', { baseRevision: 0, changes: [{ row: -1, col: 0, input: 'x' }] }, 'changes.0.row: must be 0 or more'],
    ['a fractional row', { baseRevision: 0, changes: [{ row: 1.5, col: 0, input: 'x' }] }, 'changes.0.row: must be a whole number'],
    ['a row given as text', { baseRevision: 0, changes: [{ row: '3', col: 0, input: 'x' }] }, 'changes.0.row: must be a whole number'],
    ['a column past the last', { baseRevision: 0, changes: [{ row: 0, col: 2000, input: 'x' }] }, 'changes.0.col: must be at most 1999 (the last column)'],
    ['a number as input', { baseRevision: 0, changes: [{ row: 0, col: 0, input: 12 }] }, 'changes.0.input: must be text'],
    ['an over-long input', { baseRevision: 0, changes: [{ row: 0, col: 0, input: 'x'.repeat(32_769) }] }, 'changes.0.input: at most 32768 characters'],
    ['no base revision', { changes: [{ row: 0, col: 0, input: 'x' }] }, 'baseRevision: required'],
    ['no changes', { baseRevision: 0 }, 'changes: required'],
    ['an empty list of changes', { baseRevision: 0, changes: [] }, 'changes: must hold at least one change'],
  ])('refuses %s, naming the field', async (_what, body, message) => {
    const withSheet = { ...body, changes: (body as { changes?: object[] }).changes?.map((c) => ({ sheetId: w.sheetId, ...c })) };
    const res = await post(withSheet);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.message).toBe(message);
  });

  it('refuses a patch that names one cell twice', async () => {
    const res = await post({ baseRevision: 0, changes: [cell(w.sheetId, 1, 1, 'a'), cell(w.sheetId, 2, 2, 'b'), cell(w.sheetId, 1, 1, 'c')] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toBe('changes.2: the same cell as changes.0; send one input per cell');
  });

  it('refuses a body that is not JSON', async () => {
    const res = await t.ann.agent.post(`/api/workbooks/${w.id}/patches`).set('Content-Type', 'application/json').send('{"baseRevision": 0,');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_json');
  });

  it(`accepts ${maxCellsPerPatch} cells in one patch and refuses one more with the limit in the message`, async () => {
    const changes = Array.from({ length: maxCellsPerPatch + 1 }, (_, i) => cell(w.sheetId, i, 0, String(i)));
    const tooMany = await post({ baseRevision: 0, changes });
    expect(tooMany.status).toBe(400);
    expect(tooMany.body.error.message).toBe(`changes: a patch may change at most ${maxCellsPerPatch} cells; send the rest in another patch`);
    const atLimit = await post({ baseRevision: 0, changes: changes.slice(0, maxCellsPerPatch) });
    expect(atLimit.status).toBe(200);
    expect(atLimit.body).toEqual({ revision: 1, applied: maxCellsPerPatch });
    expect((await w.load()).sheets[0].cells).toHaveLength(maxCellsPerPatch);
  });

  it('saves a column deleted on a 1,280-row sheet (12,800 cells shifted) as one patch and one revision', async () => {
    const rows = 1_280;
    const species = ['O2', 'N2', 'NO', 'CO', 'CN-'];
    const filled = Array.from({ length: rows * 10 }, (_, i) => {
      const row = Math.floor(i / 10);
      const col = i % 10;
      return cell(w.sheetId, row, col, col === 0 ? species[row % species.length] : `=BONDORDER(A${row + 1})*${col}`);
    });
    const seeded = await post({ baseRevision: 0, changes: filled });
    expect(seeded.body).toEqual({ revision: 1, applied: rows * 10 });
    // Deleting column A: every cell takes its right-hand neighbour's input, the last column empties.
    const inputAt = new Map(filled.map((c) => [`${c.row}:${c.col}`, c.input]));
    const shifted = filled.map((c) => ({ ...c, input: inputAt.get(`${c.row}:${c.col + 1}`) ?? '' }));
    expect(shifted.length).toBeGreaterThan(10_000);
    const res = await post({ baseRevision: 1, changes: shifted });
    expect(res.status).toBe(200);
    expect(res.body).toEqual({ revision: 2, applied: rows * 10 });
    const history = await t.ann.agent.get(`/api/workbooks/${w.id}/revisions`).expect(200);
    expect(history.body.revision).toBe(2);
    expect(history.body.revisions.map((r: { number: number; changeCount: number }) => [r.number, r.changeCount])).toEqual([
      [2, rows * 10],
      [1, rows * 10],
    ]);
    const detail = await t.ann.agent.get(`/api/workbooks/${w.id}/revisions/2`).expect(200);
    expect(detail.body.patch.changes[0]).toEqual({ sheetId: w.sheetId, row: 0, col: 0, before: 'O2', after: '=BONDORDER(A1)*1' });
    const stored = (await w.load()).sheets[0].cells;
    expect(stored).toHaveLength(rows * 9);
    expect(stored[0]).toEqual([0, 0, '=BONDORDER(A1)*1']);
  });

  it('fits a patch at the cell limit of long formulas on long ids inside the body limit', () => {
    const id = 'x'.repeat(36); // a sheet id as long as a UUID
    const input = `=BONDORDER(A1)*${'9'.repeat(100)}`;
    const body = JSON.stringify({ baseRevision: 999_999, changes: Array.from({ length: maxCellsPerPatch }, () => ({ sheetId: id, row: 999_999, col: 1_999, input })) });
    expect(Buffer.byteLength(body)).toBeLessThan(maxBodyBytes);
  });

  it('refuses a body over the size limit with 413 naming the limit, and saves nothing', async () => {
    const big = 'x'.repeat(32_000);
    const changes = Array.from({ length: Math.ceil(maxBodyBytes / big.length) + 1 }, (_, i) => cell(w.sheetId, 20_000 + i, 0, big));
    const before = (await w.load()).revision;
    const res = await post({ baseRevision: before, changes });
    expect(res.status).toBe(413);
    expect(res.body.error).toEqual({ code: 'too_large', message: `body: larger than the limit of ${maxBodyBytes} bytes` });
    expect((await w.load()).revision).toBe(before);
  });
});
