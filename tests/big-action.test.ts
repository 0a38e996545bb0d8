// One user action larger than a patch (deleting column A of a 4,000 × 10 sheet: 40,000 cells) is sent
// as parts and saved as ONE revision, by the last part; parts out of order, missing or expired are
// refused with a clear 4xx and nothing of the action is saved; a colleague's edit in between is a
// conflict exactly as for a plain patch.
import { afterEach, beforeAll, beforeEach, describe, expect, it, vi } from 'vitest';
import { workbookMembers } from '../server/db/schema.js';
import { actionPartSizes, maxCellsPerAction, maxCellsPerPatch, stagedActionTtlMs, type CellConflict, type WorkbookPayload } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

type Change = { sheetId: string; row: number; col: number; input: string };
const cols = 10;
/** A sheet whose column A, deleted, changes exactly as many cells as one action may: 4,000 rows. */
const rows = maxCellsPerAction / cols;

async function setup() {
  const t = makeTestApp();
  await t.signUp('admin@lab.test', 'Site Admin');
  const ann = await t.signUp('ann@lab.test', 'Ann Analyst');
  const bob = await t.signUp('bob@lab.test', 'Bob Bench');
  return { ...t, ann, bob };
}
type Setup = Awaited<ReturnType<typeof setup>>;

/** Row r, column c of the filled sheet: distinct per cell, so a shifted cell is told from an unshifted one. */
const filledInput = (r: number, c: number) => (c === 0 ? `S${r}` : `=${String.fromCharCode(65 + c)}${r + 1}*${c}+${r}`);

describe('an action larger than one patch', () => {
  let t: Setup;
  let id: string;
  let sheetId: string;
  let filledAt: number;
  let filled: Change[];
  const load = async (): Promise<WorkbookPayload> => (await t.ann.agent.get(`/api/workbooks/${id}`).expect(200)).body;
  const post = (who: 'ann' | 'bob', body: object) => t[who].agent.post(`/api/workbooks/${id}/patches`).send(body);
  /** Deleting column A: every cell takes its right-hand neighbour's input, the last column is cleared. */
  const deleteColumnA = (): Change[] => filled.map((c) => ({ ...c, input: c.col + 1 < cols ? filledInput(c.row, c.col + 1) : '' }));
  /** As the save queue cuts an action: full parts, then a short last one. */
  const partsOf = (changes: Change[]) => {
    let from = 0;
    return actionPartSizes(changes.length, maxCellsPerPatch).map((size) => changes.slice(from, (from += size)));
  };
  const sendParts = async (changes: Change[], baseRevision: number, actionId = 'delete-col-a', order?: number[]) => {
    const parts = partsOf(changes);
    const answers = [];
    for (const i of order ?? parts.keys()) answers.push(await post('ann', { baseRevision, changes: parts[i], part: { actionId, index: i, count: parts.length } }));
    return answers;
  };

  beforeAll(async () => {
    t = await setup();
  });
  beforeEach(async () => {
    id = (await t.ann.agent.post('/api/workbooks').send({ title: 'Long screen' }).expect(201)).body.workbook.id;
    t.db.insert(workbookMembers).values({ workbookId: id, userId: t.bob.user.id, role: 'editor' }).run();
    sheetId = (await load()).sheets[0].id;
    filled = [];
    for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) filled.push({ sheetId, row: r, col: c, input: filledInput(r, c) });
    // The sheet is filled with plain patches of the usual size (that is not what is under test).
    let revision = 0;
    for (const part of partsOf(filled)) revision = (await post('ann', { baseRevision: revision, changes: part }).expect(200)).body.revision;
    filledAt = revision;
  });
  afterEach(() => {
    vi.useRealTimers();
  });

  const expectUnchanged = async () => {
    const wb = await load();
    expect(wb.revision).toBe(filledAt);
    expect(wb.sheets[0].cells).toHaveLength(rows * cols);
    expect(wb.sheets[0].cells[1]).toEqual([0, 1, filledInput(0, 1)]);
  };

  it(`saves deleting column A of a ${rows} × ${cols} sheet (${rows * cols} cells, the most one action may change) as one revision the change log lists`, async () => {
    const changes = deleteColumnA();
    expect(changes.length).toBe(maxCellsPerAction);
    const answers = await sendParts(changes, filledAt);
    expect(answers.map((a) => a.status)).toEqual([202, 202, 200]);
    expect(answers[0].body).toEqual({ staged: { actionId: 'delete-col-a', received: 1, count: 3, cells: maxCellsPerPatch } });
    expect(answers[2].body).toEqual({ revision: filledAt + 1, applied: rows * cols });

    const wb = await load();
    expect(wb.revision).toBe(filledAt + 1);
    const expected = deleteColumnA()
      .filter((c) => c.input !== '')
      .map((c) => [c.row, c.col, c.input]);
    expect(wb.sheets[0].cells).toEqual(expected);

    const log = (await t.ann.agent.get(`/api/workbooks/${id}/revisions?limit=2`).expect(200)).body;
    expect(log.revisions[0]).toMatchObject({ number: filledAt + 1, kind: 'edit', changeCount: rows * cols });
    expect(log.revisions[0].preview.cells[0]).toEqual({ sheetId, row: 0, col: 0, before: 'S0', after: filledInput(0, 1) });
    const detail = (await t.ann.agent.get(`/api/workbooks/${id}/revisions/${filledAt + 1}`).expect(200)).body;
    expect(detail.patch).toEqual({ sheetOps: [], changes: filled.map((c, i) => ({ sheetId, row: c.row, col: c.col, before: c.input, after: changes[i].input })) });
    // Its undo is one revision too: the before values, sent the same way.
    const undo = filled.map((c) => ({ ...c }));
    const undone = await sendParts(undo, filledAt + 1, 'undo-delete-col-a');
    expect(undone.at(-1)!.body).toEqual({ revision: filledAt + 2, applied: rows * cols });
    expect((await load()).sheets[0].cells).toEqual(filled.map((c) => [c.row, c.col, c.input]));
  });

  it('refuses a part out of order with a clear 400 and saves nothing of the action', async () => {
    const answers = await sendParts(deleteColumnA(), filledAt, 'jumbled', [0, 2, 1]);
    expect(answers[1].status).toBe(400);
    expect(answers[1].body.error).toEqual({ code: 'part_refused', message: expect.stringContaining('part 3 of 3 of action jumbled came after part 1 of 3; send the parts in order') });
    // The action was forgotten: the remaining part has nothing to join.
    expect(answers[2].status).toBe(410);
    await expectUnchanged();
  });

  it('answers 410 for a part whose earlier parts the server never had or no longer holds', async () => {
    const parts = partsOf(deleteColumnA());
    const missing = await post('ann', { baseRevision: filledAt, changes: parts[1], part: { actionId: 'never-started', index: 1, count: 3 } });
    expect(missing.status).toBe(410);
    expect(missing.body.error.code).toBe('action_expired');
    expect(missing.body.error.message).toMatch(/earlier parts are no longer held .*send it again from its first part/);

    vi.useFakeTimers({ toFake: ['Date'], now: Date.now() });
    await post('ann', { baseRevision: filledAt, changes: parts[0], part: { actionId: 'slow', index: 0, count: 3 } }).expect(202);
    vi.setSystemTime(Date.now() + stagedActionTtlMs + 1);
    const late = await post('ann', { baseRevision: filledAt, changes: parts[1], part: { actionId: 'slow', index: 1, count: 3 } });
    expect(late.status).toBe(410);
    expect(late.body.error.code).toBe('action_expired');
    await expectUnchanged();
  });

  it('treats a colleague’s edit made between the parts as a conflict, as for a plain patch, and saves nothing', async () => {
    const parts = partsOf(deleteColumnA());
    await post('ann', { baseRevision: filledAt, changes: parts[0], part: { actionId: 'raced', index: 0, count: 3 } }).expect(202);
    const bobs = await post('bob', { baseRevision: filledAt, changes: [{ sheetId, row: 10, col: 3, input: 'bob was here' }] }).expect(200);
    await post('ann', { baseRevision: filledAt, changes: parts[1], part: { actionId: 'raced', index: 1, count: 3 } }).expect(202);
    const last = await post('ann', { baseRevision: filledAt, changes: parts[2], part: { actionId: 'raced', index: 2, count: 3 } });
    expect(last.status).toBe(409);
    expect(last.body.error.code).toBe('conflict');
    expect(last.body.error.details.conflicts as CellConflict[]).toEqual([
      { sheetId, row: 10, col: 3, theirs: 'bob was here', mine: filledInput(10, 4), revision: bobs.body.revision },
    ]);
    const wb = await load();
    expect(wb.revision).toBe(bobs.body.revision);
    expect(wb.sheets[0].cells[0]).toEqual([0, 0, 'S0']);
  });

  it('reports a conflict already there when the first part arrives only with the last part, naming every cell', async () => {
    const bobs = await post('bob', { baseRevision: filledAt, changes: [{ sheetId, row: 0, col: 0, input: 'bob first' }, { sheetId, row: rows - 1, col: 9, input: 'bob last' }] }).expect(200);
    const answers = await sendParts(deleteColumnA(), filledAt, 'stale');
    expect(answers.map((a) => a.status)).toEqual([202, 202, 409]);
    expect((answers[2].body.error.details.conflicts as CellConflict[]).map((c) => [c.row, c.col, c.theirs, c.revision])).toEqual([
      [0, 0, 'bob first', bobs.body.revision],
      [rows - 1, 9, 'bob last', bobs.body.revision],
    ]);
    expect(answers[2].body.error.message).toBe(`changed by someone else after revision ${filledAt}: Screen1!A1 (revision ${bobs.body.revision}), Screen1!J${rows} (revision ${bobs.body.revision}); nothing was saved`);
    expect((await load()).revision).toBe(bobs.body.revision);
  });

  it('applies the action on top of a colleague’s edit elsewhere that landed between its parts, with exact before values', async () => {
    const parts = partsOf(deleteColumnA());
    await post('ann', { baseRevision: filledAt, changes: parts[0], part: { actionId: 'beside', index: 0, count: 3 } }).expect(202);
    const bobs = await post('bob', { baseRevision: filledAt, changes: [{ sheetId, row: rows + 600, col: 0, input: 'CO' }] }).expect(200);
    await post('ann', { baseRevision: filledAt, changes: parts[1], part: { actionId: 'beside', index: 1, count: 3 } }).expect(202);
    const last = await post('ann', { baseRevision: filledAt, changes: parts[2], part: { actionId: 'beside', index: 2, count: 3 } });
    expect(last.body).toEqual({ revision: bobs.body.revision + 1, applied: rows * cols });
    const cells = (await load()).sheets[0].cells;
    expect(cells.at(-1)).toEqual([rows + 600, 0, 'CO']);
    expect(cells).toHaveLength(rows * (cols - 1) + 1);
    const detail = (await t.ann.agent.get(`/api/workbooks/${id}/revisions/${last.body.revision}`).expect(200)).body;
    expect(detail.patch.changes).toHaveLength(rows * cols);
    expect(detail.patch.changes).toEqual(filled.map((c) => ({ sheetId, row: c.row, col: c.col, before: c.input, after: c.col + 1 < cols ? filledInput(c.row, c.col + 1) : '' })));
  });

  it('refuses an action over the limit, a cell sent twice and a changed base, naming why', async () => {
    // Deleting column A of a sheet 500 rows longer would change 5,000 cells too many.
    const big = Array.from({ length: maxCellsPerAction + 5_000 }, (_, i) => ({ sheetId, row: rows + 1_000 + Math.floor(i / cols), col: i % cols, input: 'x' }));
    expect(big.length).toBeGreaterThan(maxCellsPerAction);
    const over = partsOf(big).length;
    let answer;
    for (const [i, part] of partsOf(big).entries()) {
      answer = await post('ann', { baseRevision: filledAt, changes: part, part: { actionId: 'huge', index: i, count: over } });
      if (answer.status !== 202) break;
    }
    expect(answer!.status).toBe(413);
    expect(answer!.body.error).toEqual({ code: 'action_too_large', message: expect.stringContaining(`one action may change at most ${maxCellsPerAction.toLocaleString('en-US')} cells`) });

    const cellA1 = [{ sheetId, row: 0, col: 0, input: 'a' }];
    await post('ann', { baseRevision: filledAt, changes: cellA1, part: { actionId: 'twice', index: 0, count: 2 } }).expect(202);
    const twice = await post('ann', { baseRevision: filledAt, changes: cellA1, part: { actionId: 'twice', index: 1, count: 2 } });
    expect(twice.status).toBe(400);
    expect(twice.body.error.message).toContain('a cell an earlier part already changed');

    await post('ann', { baseRevision: filledAt, changes: cellA1, part: { actionId: 'rebased', index: 0, count: 2 } }).expect(202);
    const rebased = await post('ann', { baseRevision: filledAt - 1, changes: [{ sheetId, row: 0, col: 1, input: 'b' }], part: { actionId: 'rebased', index: 1, count: 2 } });
    expect(rebased.status).toBe(400);
    expect(rebased.body.error.message).toContain(`differs from the first part's ${filledAt}`);
    await expectUnchanged();
  });
});
