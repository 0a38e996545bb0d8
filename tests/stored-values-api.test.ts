// The values kept with each revision, through the API: after a commit the keeper stores them; GET
// /values and exports of that revision read them (and say so in the Orbitab-Values header) with
// the same content a fresh computation gives; volatile workbooks and revisions not stored yet are
// computed on demand; an import's values are computed in the background.
import { eq } from 'drizzle-orm';
import ExcelJS from 'exceljs';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { revisionValues } from '../server/db/schema.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import type { KeeperRun } from '../server/values/keeper.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import { makeTestApp } from './helpers/app.js';
import { plainXlsx } from './helpers/xlsxFixtures.js';

afterAll(async () => {
  await closeParsePool();
  await stopKeeperThread();
});

const binary = (res: unknown, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
};

/** Every sheet but the front sheet (which carries the export time), cell by cell. */
async function fileCells(body: Buffer) {
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(body as unknown as ArrayBuffer);
  const out: Record<string, unknown[]> = {};
  for (const ws of wb.worksheets.slice(1)) {
    out[ws.name] = [];
    ws.eachRow((row, r) => row.eachCell((cell, c) => out[ws.name].push([r, c, cell.value, cell.numFmt, cell.note ?? null])));
  }
  return out;
}

describe('values kept with each revision, through the API', () => {
  const t = makeTestApp();
  const runs: KeeperRun[] = [];
  t.ctx.values.onRun = (run) => runs.push(run);
  let owner: Awaited<ReturnType<typeof t.signUp>>;
  let workbookId: string;
  let sheetId: string;
  let revision = 0;

  const patch = async (changes: [row: number, col: number, input: string][]) => {
    const res = await owner.agent.post(`/api/workbooks/${workbookId}/patches`).send({ baseRevision: revision, changes: changes.map(([row, col, input]) => ({ sheetId, row, col, input })) });
    expect(res.status, JSON.stringify(res.body)).toBe(200);
    revision = res.body.revision;
  };
  const storedRow = () => t.db.select().from(revisionValues).where(eq(revisionValues.workbookId, workbookId)).all();
  /** Forget the stored values, so the next read computes them as before. */
  const forget = () => t.db.delete(revisionValues).where(eq(revisionValues.workbookId, workbookId)).run();

  beforeAll(async () => {
    owner = await t.signUp('ilse.marr@example.com', 'Ilse Marr');
    workbookId = (await owner.agent.post('/api/workbooks').send({ title: 'Kept values' })).body.workbook.id;
    sheetId = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id;
    await patch([
      [0, 0, 'O2'],
      [0, 1, '=BONDORDER(A1)'],
      [0, 2, '=UNPAIRED(A1)'],
      [1, 0, 'NO+'],
      [1, 1, '=BONDORDER(A2)'],
      [2, 0, '=TRANSPOSE(B1:B2)'],
      [3, 0, '=DATE(2024,5,17)'],
      [3, 1, '=1/0'],
      [3, 2, '=""'],
      [4, 0, '=Xq(1)'],
      [5, 0, '6.022E23'],
    ]);
    await t.ctx.values.idle();
  });

  it('stores the values of a revision after its commit and serves them, equal to a fresh computation', async () => {
    expect(storedRow().map((r) => r.revision)).toEqual([revision]);
    const stored = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    expect(stored.status).toBe(200);
    expect(stored.headers['orbitab-values']).toBe('stored');
    expect(stored.headers['content-encoding']).toBe('gzip');
    forget();
    const fresh = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    expect(fresh.headers['orbitab-values']).toBe('computed');
    expect(stored.body).toEqual(fresh.body);
    expect(stored.body.sheets[0].values).toContainEqual([0, 1, 2]); // O2: bond order 2 (any MO text, e.g. Atkins' Physical Chemistry)
    await t.ctx.values.idle(); // the read that found none asked for them again
    expect(storedRow().map((r) => r.revision)).toEqual([revision]);
  });

  it('brings a warm workbook forward by the patch alone, keeping one stored revision', async () => {
    runs.length = 0;
    await patch([[1, 0, 'O2-']]);
    await t.ctx.values.idle();
    expect(runs.map((r) => [r.revision, r.mode])).toEqual([[revision, 'incremental']]);
    // The changed input and what depends on it: A2, B2, and the TRANSPOSE formula over B1:B2 (its
    // anchor A3 and the cell B3 it spills into). Nothing else: A4:C6 do not read row 2.
    expect(new Set(runs[0].changed!.map(([, r, c]) => `${r},${c}`))).toEqual(new Set(['1,0', '1,1', '2,0', '2,1']));
    expect(storedRow().map((r) => r.revision)).toEqual([revision]);
    const res = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    expect(res.headers['orbitab-values']).toBe('stored');
    expect(res.body.revision).toBe(revision);
    expect(res.body.sheets[0].values).toContainEqual([1, 1, 1.5]); // superoxide: bond order 1.5 (MO treatment in any inorganic text, e.g. Housecroft & Sharpe)
  });

  it('lists the workbook\'s cells and its stored values in reading order, however they were written', async () => {
    // The page's first screen reads only the first rows of both lists (storedPreview.ts) and relies on this order.
    await patch([
      [9, 3, '=B1*2'],
      [7, 5, 'late'],
      [8, 0, '=A9'],
      [6, 4, '1.5'],
      [7, 1, '=C1+1'],
    ]);
    await t.ctx.values.idle();
    const inOrder = (list: [number, number, unknown][]) => list.every((e, i) => i === 0 || list[i - 1][0] < e[0] || (list[i - 1][0] === e[0] && list[i - 1][1] < e[1]));
    const cells = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].cells;
    const values = (await owner.agent.get(`/api/workbooks/${workbookId}/values?stored=only`)).body.sheets[0].values;
    expect(cells.length).toBeGreaterThan(10);
    expect(inOrder(cells)).toBe(true);
    expect(values).toContainEqual([9, 3, 4]);
    expect(inOrder(values)).toBe(true);
  });

  it('answers stored=only with 204 while a revision has no stored values, then with them', async () => {
    forget();
    const none = await owner.agent.get(`/api/workbooks/${workbookId}/values?stored=only`);
    expect(none.status).toBe(204);
    await t.ctx.values.idle();
    const some = await owner.agent.get(`/api/workbooks/${workbookId}/values?stored=only`);
    expect(some.status).toBe(200);
    expect(some.body.revision).toBe(revision);
    expect((await owner.agent.get(`/api/workbooks/${workbookId}/values?stored=yes`)).status).toBe(400);
  });

  it('exports a stored revision without the engine, to the same file contents as a computed export', async () => {
    for (const format of ['xlsx', 'xlsx-values']) {
      await t.ctx.values.idle();
      const stored = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=${format}`).buffer(true).parse(binary);
      expect(stored.status).toBe(200);
      expect(stored.headers['orbitab-values']).toBe('stored');
      forget();
      const computed = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=${format}`).buffer(true).parse(binary);
      expect(computed.headers['orbitab-values']).toBe('computed');
      expect(await fileCells(stored.body)).toEqual(await fileCells(computed.body));
    }
    await t.ctx.values.idle();
    const csvStored = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=csv`);
    expect(csvStored.headers['orbitab-values']).toBe('stored');
    forget();
    const csvComputed = await owner.agent.get(`/api/workbooks/${workbookId}/export?format=csv`);
    expect(csvStored.text).toBe(csvComputed.text);
  });

  it('recomputes on every read a workbook calling a function of chance or of the clock', async () => {
    await patch([[6, 0, '=RAND()']]);
    await t.ctx.values.idle();
    expect(storedRow()[0].volatileFormulas).toBe(1);
    const res = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
    expect(res.headers['orbitab-values']).toBe('computed');
    expect((await owner.agent.get(`/api/workbooks/${workbookId}/values?stored=only`)).status).toBe(204);
    await patch([[6, 0, '']]);
    await t.ctx.values.idle();
    expect((await owner.agent.get(`/api/workbooks/${workbookId}/values`)).headers['orbitab-values']).toBe('stored');
  });

  it('leaves a workbook over the kept-cell limit to be computed on demand', async () => {
    t.ctx.values.maxCells = 5;
    try {
      await patch([[7, 0, 'F2']]);
      await t.ctx.values.idle();
      const res = await owner.agent.get(`/api/workbooks/${workbookId}/values`);
      expect(res.headers['orbitab-values']).toBe('computed');
      expect(res.body.revision).toBe(revision);
      expect(storedRow().map((r) => r.revision)).not.toContain(revision);
    } finally {
      t.ctx.values.maxCells = Number.POSITIVE_INFINITY;
    }
  });

  it('computes and stores an imported workbook’s values in the background', async () => {
    const file = await plainXlsx({ Screen: [['species', 'order'], ['O2', { formula: 'BONDORDER(A2)' }], ['N2', { formula: 'BONDORDER(A3)' }]] });
    const upload = await owner.agent.post('/api/imports').attach('file', file, 'screen.xlsx');
    expect(upload.status, JSON.stringify(upload.body)).toBe(201);
    await t.ctx.values.idle();
    const res = await owner.agent.get(`/api/workbooks/${upload.body.workbookId}/values`);
    expect(res.headers['orbitab-values']).toBe('stored');
    expect(res.body.revision).toBe(upload.body.revision);
    expect(res.body.sheets[0].values).toContainEqual([2, 1, 3]);
  });
});
