// A workbook past the old 400,000-cell limit of the values keeper gets stored values with the
// default limit: 450,000 plain numbers (the cheapest shape the engine holds), written straight into
// the database as one revision, as an import of that size would leave them.
import { afterAll, describe, expect, it } from 'vitest';
import { nextRevision } from '../server/services/revisionLog.js';
import { defaultMaxKeptCells, maxKeptCells, type KeeperRun } from '../server/values/keeper.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import { cellInserter } from '../server/xlsx/importStore.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import type { CellTriple } from '../server/xlsx/types.js';
import { makeTestApp } from './helpers/app.js';

afterAll(async () => {
  await closeParsePool();
  await stopKeeperThread();
});

const ROWS = 90_000;
const COLS = 5; // 450,000 cells

describe('stored values of a large workbook', () => {
  const t = makeTestApp();

  it('are kept for 450,000 cells under the default limit, and served as stored', { timeout: 240_000 }, async () => {
    expect(maxKeptCells).toBe(defaultMaxKeptCells); // the environment sets no other limit here
    t.ctx.values.maxCells = maxKeptCells;
    const runs: KeeperRun[] = [];
    t.ctx.values.onRun = (run) => runs.push(run);
    const owner = await t.signUp('runa.vell@example.com', 'Runa Vell');
    const workbookId: string = (await owner.agent.post('/api/workbooks').send({ title: 'Many numbers' })).body.workbook.id;
    const sheetId: string = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id;
    await t.ctx.values.idle();

    const cells: CellTriple[] = [];
    for (let r = 0; r < ROWS; r++) for (let c = 0; c < COLS; c++) cells.push([r, c, String(r * COLS + c)]);
    const revision = t.db.transaction((tx) => {
      const n = nextRevision(tx, workbookId);
      cellInserter(t.db.$client)(sheetId, cells, n);
      return n;
    });
    t.ctx.values.noteRevision(workbookId, revision);
    await t.ctx.values.idle();

    expect(runs.map((r) => [r.revision, r.mode])).toContainEqual([revision, 'rebuild']);
    const res = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    expect(res.status).toBe(200);
    expect(res.headers['orbitab-values']).toBe('stored');
    expect(res.body.revision).toBe(revision);
    const values: [number, number, unknown][] = res.body.sheets[0].values;
    expect(values).toHaveLength(ROWS * COLS);
    expect(values[0]).toEqual([0, 0, 0]);
    expect(values[values.length - 1]).toEqual([ROWS - 1, COLS - 1, ROWS * COLS - 1]);
    expect(values[123_457]).toEqual([Math.floor(123_457 / COLS), 123_457 % COLS, 123_457]);
  });
});
