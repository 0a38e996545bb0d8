// Sheet settings are checked at the edge: an oversized merged range (which the export's xlsx library
// would fill cell by cell until the worker ran out of memory) is refused with 400 naming it, while
// everything the grid or an import makes is stored and exported as given.
import ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { maxMergedCells } from '../shared/sheetSettings.js';
import { defaultImportLimits } from '../server/xlsx/limits.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import { makeTestApp } from './helpers/app.js';

afterAll(() => closeParsePool());

const binary = (res: unknown, done: (err: Error | null, body: Buffer) => void) => {
  const stream = res as NodeJS.ReadableStream;
  const chunks: Buffer[] = [];
  stream.on('data', (c: Buffer) => chunks.push(Buffer.from(c)));
  stream.on('end', () => done(null, Buffer.concat(chunks)));
};

describe('PATCH /api/workbooks/:id/sheets/:sheetId settings', async () => {
  const t = makeTestApp();
  const { agent } = await t.signUp('ann@lab.test', 'Ann Analyst');
  const created = await agent.post('/api/workbooks').send({ title: 'Layout' }).expect(201);
  const id = created.body.workbook.id as string;
  const sheetId = (await agent.get(`/api/workbooks/${id}`).expect(200)).body.sheets[0].id as string;
  const setSettings = (settings: unknown) => agent.patch(`/api/workbooks/${id}/sheets/${sheetId}`).send({ settings });

  it('refuses a merge over most of the grid with 400 naming the range and the limit', async () => {
    const res = await setSettings({ merged: ['B2:BXX1000000'] });
    expect(res.status).toBe(400);
    const cells = (2000 - 1) * (1_000_000 - 1); // columns B..BXX × rows 2..1,000,000
    expect(res.body.error.message).toBe(`settings.merged.0: "B2:BXX1000000" merges ${cells.toLocaleString('en')} cells; a merged range may cover at most 2,000,000`);
  });

  it('refuses merges that together cover too much, ranges past the grid and malformed fields', async () => {
    const many = await setSettings({ merged: ['A1:BXX600', 'A601:BXX1200'] });
    expect(many.status).toBe(400);
    expect(many.body.error.message).toBe('settings.merged: the merged ranges cover 2,400,000 cells; at most 2,000,000 in all');
    const past = await setSettings({ merged: ['A1:BXY2'] });
    expect(past.body.error.message).toBe('settings.merged.0: must be a range of cells inside the grid (A1:BXX1000000), such as "B2:C3"');
    expect((await setSettings({ frozenRows: -1 })).body.error.message).toBe('settings.frozenRows: must be 0 or more');
    expect((await setSettings({ columnWidths: { 0: 'wide' } })).body.error.message).toBe('settings.columnWidths.0: must be a number of pixels');
    expect((await setSettings({ precision: 40 })).body.error.message).toBe('settings.precision: must be at most 15');
  });

  it('allows merges as large as an import may bring (the same limit)', () => {
    expect(defaultImportLimits.maxMergedCells).toBe(maxMergedCells);
  });

  it('stores what the grid and imports write and gives it back; the export writes the merge', async () => {
    const settings = { columnWidths: { 0: 126, 3: 98 }, freezeHeaderRow: true, precision: 3, frozenRows: 1, frozenCols: 1, merged: ['G1:H1', 'A3:B4'], note: 'kept as given' };
    await setSettings(settings).expect(200);
    const loaded = await agent.get(`/api/workbooks/${id}`).expect(200);
    expect(loaded.body.sheets[0].settings).toEqual(settings);

    const exported = await agent.get(`/api/workbooks/${id}/export?format=xlsx`).buffer(true).parse(binary).expect(200);
    const wb = new ExcelJS.Workbook();
    await wb.xlsx.load(exported.body as unknown as ArrayBuffer);
    expect([...wb.getWorksheet('Screen1')!.model.merges].sort()).toEqual(['A3:B4', 'G1:H1']);
  });

  it('exports a sheet whose merges reach the limit', async () => {
    await setSettings({ merged: ['A1:BXX1000'] }).expect(200);
    const exported = await agent.get(`/api/workbooks/${id}/export?format=xlsx`).buffer(true).parse(binary);
    expect(exported.status).toBe(200);
    expect((exported.body as Buffer).subarray(0, 2).toString()).toBe('PK');
  }, 120_000);
});
