// An .xlsx upload larger than one batch of the streamed read (readXlsx.ts CELLS_PER_BATCH): its cells
// are stored batch by batch while the worker reads on, and must come out exactly as the whole-file
// read in this process gives them — texts that need an apostrophe in every batch, a refused input in a
// later batch named in the summary, the revision's recorded cells equal to the stored ones.
import type ExcelJS from 'exceljs';
import { afterAll, describe, expect, it } from 'vitest';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import { CELLS_PER_BATCH } from '../server/xlsx/readXlsx.js';
import { makeTestApp } from './helpers/app.js';
import { plainXlsx } from './helpers/xlsxFixtures.js';

afterAll(async () => {
  await closeParsePool();
  await stopKeeperThread();
});

const ROWS = 5_000;
const DEEP_ROW = 4_321; // zero-based: E4322, well past the first batch
const deep = '('.repeat(70) + '1' + ')'.repeat(70);

function readingsRows(): ExcelJS.CellValue[][] {
  return Array.from({ length: ROWS }, (_, r) => [
    ['O2', 'N2', 'CO', 'NO+'][r % 4],
    r / 8,
    { formula: `BONDORDER(A${r + 1})` } as ExcelJS.CellValue,
    // Text the engine would read as a number keeps an apostrophe, in every batch.
    r % 1000 === 999 ? '007' : `batch ${r % 97}`,
    r === DEEP_ROW ? ({ formula: deep } as ExcelJS.CellValue) : `lot ${r}`,
  ]);
}

describe('an .xlsx import stored while it is read', () => {
  const t = makeTestApp();

  it('stores every batch as the whole-file read gives it, and records the same cells in its revision', { timeout: 120_000 }, async () => {
    expect(ROWS * 5).toBeGreaterThan(2 * CELLS_PER_BATCH);
    const owner = await t.signUp('tove.lund@example.com', 'Tove Lund');
    const file = await plainXlsx({ Readings: readingsRows(), Notes: [['calibrated'], ['=cmd']] });
    const whole = await readSpreadsheet(file, 'readings.xlsx');

    const upload = await owner.agent.post('/api/imports').attach('file', file, 'readings.xlsx');
    expect(upload.status, JSON.stringify(upload.body).slice(0, 500)).toBe(201);
    expect(upload.body.summary.cells).toBe(ROWS * 5 + 2 - 1);
    expect(upload.body.summary.formulas).toBe(ROWS);
    expect(upload.body.summary.skipped).toEqual([{ sheet: 'Readings', address: `E${DEEP_ROW + 1}`, reason: expect.stringContaining('nests 70 levels') }]);

    const expected = whole.sheets.map((s) => s.cells.filter(([r, c]) => !(s.name === 'Readings' && r === DEEP_ROW && c === 4)));
    expect(expected[0]).toContainEqual([999, 3, "'007"]);
    expect(expected[0]).toContainEqual([4999, 3, "'007"]);
    expect(expected[1]).toEqual([
      [0, 0, 'calibrated'],
      [1, 0, "'=cmd"],
    ]);

    const loaded = await owner.agent.get(`/api/workbooks/${upload.body.workbookId}`);
    expect(loaded.body.sheets.map((s: { name: string }) => s.name)).toEqual(['Readings', 'Notes']);
    expect(loaded.body.sheets.map((s: { cells: unknown[] }) => s.cells)).toEqual(expected);

    const revision = await owner.agent.get(`/api/workbooks/${upload.body.workbookId}/revisions/${upload.body.revision}`);
    expect(revision.status).toBe(200);
    const ops = revision.body.patch.sheetOps;
    expect(ops.map((op: { op: string; name: string }) => [op.op, op.name])).toEqual([
      ['add', 'Readings'],
      ['add', 'Notes'],
    ]);
    expect(ops.map((op: { cells: unknown[] }) => op.cells)).toEqual(expected);
  });
});
