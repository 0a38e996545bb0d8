// GET /api/workbooks/:id/values computes the saved workbook on the server with the same engine the
// browser uses: its values must equal what createEngine() gives for the same inputs.
import { DetailedCellError } from 'hyperformula';
import { beforeAll, describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';
import type { ValueEntry, ValuesPayload, WorkbookPayload } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

const screen: [row: number, col: number, input: string][] = [
  [0, 0, 'O2'],
  [0, 1, '=BONDORDER(A1)'],
  [0, 2, '=UNPAIRED(A1)'],
  [1, 0, 'N2'],
  [1, 1, '=BONDORDER(A2)'],
  [1, 2, '=UNPAIRED(A2)'],
  [2, 0, 'Xq2'],
  [2, 1, '=BONDORDER(A3)'],
  [4, 3, '1'],
  [5, 3, '2'],
  [6, 3, '3'],
  [7, 3, '=SUM(D5:D7)'],
  [8, 3, '=D8/0'],
  [9, 3, '=TRANSPOSE(D5:D7)'],
  [11, 0, '=MOTABLE("N2")'],
  [3, 6, '=SUM(D5,D6'],
];
const summary: [row: number, col: number, input: string][] = [
  [0, 0, '=Screen!D8*2'],
  [0, 1, '=Screen!B1+Screen!B2'],
  [3, 4, 'note: bond orders from the LCAO model'],
];

/** The same workbook computed directly, without the server: dense sheets, every non-empty value. */
function engineValues(sheets: Record<string, [number, number, string][]>): Record<string, ValueEntry[]> {
  const dense = (cells: [number, number, string][]) => {
    const rows = Math.max(...cells.map(([r]) => r)) + 1;
    const cols = Math.max(...cells.map(([, c]) => c)) + 1;
    const grid: (string | null)[][] = Array.from({ length: rows }, () => Array(cols).fill(null));
    for (const [r, c, input] of cells) grid[r][c] = input;
    return grid;
  };
  const engine = createEngine(Object.fromEntries(Object.entries(sheets).map(([name, cells]) => [name, dense(cells)])));
  const out: Record<string, ValueEntry[]> = {};
  for (const name of Object.keys(sheets)) {
    const values: ValueEntry[] = [];
    engine.getSheetValues(engine.getSheetId(name)!).forEach((row, r) =>
      row.forEach((v, c) => {
        if (v === null || v === '') return;
        // The server words the engine's message-less errors (#DIV/0!…) itself; any text will do here.
        // A parse error is reworded with its position by the server (checked below); any text will do here too.
        const message = v instanceof DetailedCellError && !v.message?.startsWith('Parsing error') ? v.message : '';
        values.push([r, c, v instanceof DetailedCellError ? { error: v.value, message: message || expect.any(String) } : v]);
      }),
    );
    out[name] = values;
  }
  engine.destroy();
  return out;
}

describe('GET /api/workbooks/:id/values', () => {
  let body: ValuesPayload;
  let wb: WorkbookPayload;
  beforeAll(async () => {
    const t = makeTestApp();
    await t.signUp('admin@lab.test'); // the first account is the site admin
    const { agent } = await t.signUp('ann@lab.test', 'Ann Analyst');
    const id = (await agent.post('/api/workbooks').send({ title: 'Computed' }).expect(201)).body.workbook.id;
    const first = (await agent.get(`/api/workbooks/${id}`)).body.sheets[0].id;
    await agent.patch(`/api/workbooks/${id}/sheets/${first}`).send({ name: 'Screen' }).expect(200);
    const second = (await agent.post(`/api/workbooks/${id}/sheets`).send({ name: 'Summary' }).expect(201)).body.sheet.id;
    const changes = [...screen.map(([row, col, input]) => ({ sheetId: first, row, col, input })), ...summary.map(([row, col, input]) => ({ sheetId: second, row, col, input }))];
    await agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: 2, changes }).expect(200);
    wb = (await agent.get(`/api/workbooks/${id}`)).body;
    const res = await agent.get(`/api/workbooks/${id}/values`);
    expect(res.status).toBe(200);
    body = res.body;
  });

  it('equals the values createEngine() computes for the same inputs, sheet by sheet', () => {
    expect(body.revision).toBe(wb.revision);
    const expected = engineValues({ Screen: screen, Summary: summary });
    expect(body.sheets.map((s) => s.name)).toEqual(['Screen', 'Summary']);
    expect(body.sheets.map((s) => s.id)).toEqual(wb.sheets.map((s) => s.id));
    const sorted = (v: ValueEntry[]) => [...v].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    expect(sorted(body.sheets[0].values)).toEqual(sorted(expected.Screen));
    expect(sorted(body.sheets[1].values)).toEqual(sorted(expected.Summary));
  });

  it('computes the chemistry: O2 bond order 2 with two unpaired electrons, N2 bond order 3', () => {
    // Textbook MO results (e.g. Housecroft & Sharpe, Inorganic Chemistry, the O2 and N2 MO diagrams).
    const at = (row: number, col: number) => body.sheets[0].values.find(([r, c]) => r === row && c === col)?.[2];
    expect([at(0, 1), at(0, 2)]).toEqual([2, 2]);
    expect([at(1, 1), at(1, 2)]).toEqual([3, 0]);
    expect(body.sheets[1].values.find(([r, c]) => r === 0 && c === 1)?.[2]).toBe(5);
  });

  it('returns spilled arrays as the cells they fill, and errors with their message', () => {
    const screenValues = body.sheets[0].values;
    expect(screenValues.filter(([r]) => r === 9)).toEqual([
      [9, 3, 1],
      [9, 4, 2],
      [9, 5, 3],
    ]);
    expect(screenValues.find(([r, c]) => r === 2 && c === 1)?.[2]).toEqual({ error: '#VALUE!', message: "unknown element 'Xq' in 'Xq2'" });
    expect(screenValues.find(([r, c]) => r === 8 && c === 3)?.[2]).toEqual({ error: '#DIV/0!', message: 'division by zero' });
    expect(screenValues.filter(([r]) => r >= 11).length).toBeGreaterThan(1); // MOTABLE spills a table
    // A formula that cannot be read is explained in plain words with the place, not the parser's token names.
    expect(screenValues.find(([r, c]) => r === 3 && c === 6)?.[2]).toEqual({ error: '#ERROR!', message: "the bracket opened at character 5 is never closed: add ')'" });
  });
});

describe('GET /api/workbooks/:id/values of a large workbook (computed in a worker)', () => {
  it('gives the same values as computing in the server process, while the server keeps answering', async () => {
    const { benchWorkbook } = await import('../bench/ioWorkload.js');
    const { importSheets } = await import('../server/xlsx/importStore.js');
    const { workbookSheets } = await import('../server/services/sheetOps.js');
    const { createWorkbook, loadWorkbook } = await import('../server/services/workbookStore.js');
    const { computeValues } = await import('../server/services/values.js');
    const t = makeTestApp();
    const owner = await t.signUp('lead@lab.test', 'Lab Lead');
    // 3,000 invented screening rows × 10 columns (every workbook is computed in a worker; this one takes a while).
    const cells = benchWorkbook(3_000).sheets[0].cells;
    const id = createWorkbook(t.ctx, owner.user, 'Large screen');
    const [first] = workbookSheets(t.db, id);
    const sheet = { name: 'Screening', cells, columnWidths: {}, frozenRows: 1, frozenCols: 0, merged: [] };
    importSheets(t.ctx, id, owner.user.id, { sheets: [sheet], summary: { sheets: 1, cells: cells.length, formulas: 0, skipped: [], notes: [] } }, { replaceSheetId: first.id });

    let done = false;
    const request = owner.agent.get(`/api/workbooks/${id}/values`).then((r) => ((done = true), r));
    let answeredMeanwhile = 0;
    while (!done) {
      expect((await owner.agent.get('/api/auth/me')).status).toBe(200);
      if (!done) answeredMeanwhile++;
    }
    const res = await request;
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    const inProcess = computeValues(loadWorkbook(t.ctx, { workbook: { id }, role: 'owner', roles: ['owner'] } as never));
    expect(res.body).toEqual(JSON.parse(JSON.stringify(inProcess)));
    // O2 in row 8 of the invented list: bond order 2, two unpaired electrons (Atkins & de Paula, Physical Chemistry).
    const at = (r: number, c: number) => (res.body as ValuesPayload).sheets[0].values.find(([row, col]) => row === r && col === c)?.[2];
    expect([at(7, 0), at(7, 1), at(7, 2)]).toEqual(['O2', 2, 2]);
    // The engine ran in the worker: other requests were answered while it worked.
    expect(answeredMeanwhile).toBeGreaterThan(0);
  }, 60_000);
});
