// GET /api/workbooks/:id is written a page of cells at a time, each page's JSON made by SQLite
// (server/services/workbookSlices.ts workbookJsonInSlices); what it answers must be exactly what the
// one-transaction read (loadWorkbook) gives, over pages, sheets, cleared cells and awkward text.
import { describe, expect, it } from 'vitest';
import { protectedRangeSchema, sheetLockSchema } from '../shared/team.js';
import { requireWorkbook } from '../server/services/access.js';
import { lockSheet, protectRange } from '../server/services/locks.js';
import { nextRevision } from '../server/services/revisionLog.js';
import { workbookJsonInSlices } from '../server/services/workbookSlices.js';
import { loadWorkbook } from '../server/services/workbookStore.js';
import { cellInserter } from '../server/xlsx/importStore.js';
import type { CellTriple } from '../server/xlsx/types.js';
import { makeTestApp } from './helpers/app.js';

describe('the workbook answer, read in pages', () => {
  const t = makeTestApp();

  it('parses to what the one-transaction read gives, across pages and sheets', { timeout: 60_000 }, async () => {
    const owner = await t.signUp('iris.oduya@example.com', 'Iris Oduya');
    const workbookId: string = (await owner.agent.post('/api/workbooks').send({ title: 'Paged "answer" \\ ünïcode' })).body.workbook.id;
    const first: string = (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id;
    const added = await owner.agent.post(`/api/workbooks/${workbookId}/sheets`).send({ name: 'Notes' });
    expect(added.status, JSON.stringify(added.body)).toBe(201);
    const second: string = added.body.sheet?.id ?? (await owner.agent.get(`/api/workbooks/${workbookId}`)).body.sheets[1].id;

    // 45,000 cells on the first sheet: more than two pages of 20,000, written out of order.
    const cells: CellTriple[] = [];
    for (let r = 8_999; r >= 0; r--) for (let c = 4; c >= 0; c--) cells.push([r, c, c === 0 ? ['O2', 'NO+', 'CN-'][r % 3] : `=BONDORDER(A${r + 1})*${c}`]);
    const awkward: CellTriple[] = [
      [0, 0, 'line one\nline two'],
      [0, 1, 'quote " and backslash \\ and tab \t'],
      [2, 3, "'007"],
      [5, 1999, 'σ/π — Ψ'],
      [1, 0, ''], // a cleared cell stays as '' in the table and is left out
    ];
    t.db.transaction((tx) => {
      const n = nextRevision(tx, workbookId);
      cellInserter(t.db.$client)(first, cells, n);
      cellInserter(t.db.$client)(second, awkward, n);
    });
    const access = requireWorkbook(t.ctx, { id: owner.user.id, siteRole: 'member' } as never, workbookId, 'view');
    protectRange(t.ctx, access, owner.user.id, first, protectedRangeSchema.parse({ range: 'B1:C10', editors: [] }));
    lockSheet(t.ctx, access, owner.user.id, second, sheetLockSchema.parse({ reason: 'kept as sent', editors: [] }));

    const whole = loadWorkbook(t.ctx, requireWorkbook(t.ctx, { id: owner.user.id, siteRole: 'member' } as never, workbookId, 'view'));
    expect(whole.sheets.find((s) => s.id === first)!.cells).toHaveLength(45_000);
    const paged = JSON.parse(await workbookJsonInSlices(t.ctx, requireWorkbook(t.ctx, { id: owner.user.id, siteRole: 'member' } as never, workbookId, 'view')));
    expect(paged).toEqual(whole);
    // In reading order, as the type states.
    const rows = paged.sheets.find((s: { id: string }) => s.id === first).cells as [number, number, string][];
    expect(rows.every((e, i) => i === 0 || rows[i - 1][0] < e[0] || (rows[i - 1][0] === e[0] && rows[i - 1][1] < e[1]))).toBe(true);

    const res = await owner.agent.get(`/api/workbooks/${workbookId}`);
    expect(res.status).toBe(200);
    expect(res.headers['content-type']).toMatch(/^application\/json/);
    expect(res.body).toEqual(whole);
  });

  it('answers 404 for a workbook that is gone, as before', async () => {
    const owner = await t.signUp('teo.brandt@example.com', 'Teo Brandt');
    const workbookId: string = (await owner.agent.post('/api/workbooks').send({ title: 'Short-lived' })).body.workbook.id;
    expect((await owner.agent.delete(`/api/workbooks/${workbookId}`)).status).toBeLessThan(300);
    const res = await owner.agent.get(`/api/workbooks/${workbookId}`);
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
