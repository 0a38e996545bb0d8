// The change log and the chart on the server: every listed revision carries its first few cell
// changes (before → after) and tab operations with the full counts; one sheet can be brought back to
// how it was after a revision while the other sheets stay as they are; a sheet's chart is stored
// with its settings, checked at the edge, and comes back when the workbook is loaded again.
import { describe, expect, it } from 'vitest';
import type { RevisionSummary, WorkbookPayload } from '../shared/workbooks.js';
import { makeTestApp } from './helpers/app.js';

async function setup() {
  const t = makeTestApp();
  await t.signUp('admin@lab.test', 'Site Admin'); // the first account is the site admin
  const ann = await t.signUp('ann@lab.test', 'Ann Analyst');
  const id = (await ann.agent.post('/api/workbooks').send({ title: 'Log' }).expect(201)).body.workbook.id as string;
  const load = async (): Promise<WorkbookPayload> => (await ann.agent.get(`/api/workbooks/${id}`).expect(200)).body;
  const first = (await load()).sheets[0].id;
  const second = (await ann.agent.post(`/api/workbooks/${id}/sheets`).send({}).expect(201)).body.sheet?.id ?? (await load()).sheets[1].id;
  const patch = async (changes: [sheetId: string, row: number, col: number, input: string][]) => {
    const baseRevision = (await load()).revision;
    return (await ann.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision, changes: changes.map(([s, row, col, input]) => ({ sheetId: s, row, col, input })) }).expect(200)).body.revision as number;
  };
  const cells = async (sheetId: string) => (await load()).sheets.find((s) => s.id === sheetId)!.cells;
  const log = async () => (await ann.agent.get(`/api/workbooks/${id}/revisions`).expect(200)).body.revisions as RevisionSummary[];
  return { ...t, ann, id, first, second, load, patch, cells, log };
}

describe('change log entries', () => {
  it('list the first cell changes with before and after, and count the rest', async () => {
    const t = await setup();
    await t.patch([[t.first, 0, 0, 'O2']]);
    await t.patch([[t.first, 0, 0, 'NO'], ...Array.from({ length: 8 }, (_, i): [string, number, number, string] => [t.first, i, 1, `=BONDORDER("N2")+${i}`])]);
    const [latest, earlier] = await t.log();
    expect(latest.preview.cellCount).toBe(9);
    expect(latest.preview.cells).toHaveLength(5);
    expect(latest.preview.cells[0]).toEqual({ sheetId: t.first, row: 0, col: 0, before: 'O2', after: 'NO' });
    expect(latest.preview.cells[1]).toEqual({ sheetId: t.first, row: 0, col: 1, before: '', after: '=BONDORDER("N2")+0' });
    expect(earlier.preview).toMatchObject({ cellCount: 1, cells: [{ row: 0, col: 0, before: '', after: 'O2' }], sheetOpCount: 0, sheetOps: [] });
  });

  it('show tab operations without the cells a deleted tab carried', async () => {
    const t = await setup();
    await t.patch([[t.second, 0, 0, 'CO']]);
    await t.ann.agent.delete(`/api/workbooks/${t.id}/sheets/${t.second}`).expect(200);
    const [deleted] = await t.log();
    expect(deleted.preview.sheetOps).toEqual([{ op: 'delete', sheetId: t.second, name: expect.any(String) }]);
  });
});

describe('restoring one sheet', () => {
  it('brings back that sheet as it was after the revision and leaves the other sheet alone', async () => {
    const t = await setup();
    const target = await t.patch([[t.first, 0, 0, 'O2'], [t.second, 0, 0, 'N2']]);
    await t.patch([[t.first, 0, 0, 'F2'], [t.first, 1, 0, 'CO'], [t.second, 0, 0, 'NO']]);

    const res = await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).send({ sheetId: t.first }).expect(200);
    expect(res.body.changeCount).toBe(2);
    expect(await t.cells(t.first)).toEqual([[0, 0, 'O2']]);
    expect(await t.cells(t.second)).toEqual([[0, 0, 'NO']]);
    const [entry] = await t.log();
    expect(entry).toMatchObject({ kind: 'restore', preview: { restoredFrom: target, restoredSheetId: t.first, cellCount: 2 } });
    const audit = (await t.ann.agent.get(`/api/workbooks/${t.id}/audit`).expect(200)).body.entries as { action: string; details: Record<string, unknown> }[];
    expect(audit[0]).toMatchObject({ action: 'revision.restored', details: { restoredFrom: target, sheetId: t.first, sheetName: (await t.load()).sheets[0].name } });
  });

  it('brings back a sheet\'s settings too', async () => {
    const t = await setup();
    await t.ann.agent.patch(`/api/workbooks/${t.id}/sheets/${t.first}`).send({ settings: { precision: 2 } }).expect(200);
    const target = (await t.load()).revision;
    await t.ann.agent.patch(`/api/workbooks/${t.id}/sheets/${t.first}`).send({ settings: { precision: 5, freezeHeaderRow: true } }).expect(200);
    await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).send({ sheetId: t.first }).expect(200);
    expect((await t.load()).sheets[0].settings).toEqual({ precision: 2 });
  });

  it('refuses, saying why, when there is nothing to bring back or the sheet is unknown', async () => {
    const t = await setup();
    const target = await t.patch([[t.first, 0, 0, 'O2']]);
    await t.patch([[t.second, 0, 0, 'N2']]);
    const same = await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).send({ sheetId: t.first });
    expect(same.status).toBe(400);
    expect(same.body.error.message).toMatch(/already as it was after revision/);
    const unknown = await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).send({ sheetId: 'no-such-sheet' });
    expect(unknown.status).toBe(404);
    const bad = await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).send({ sheetId: 7 });
    expect(bad.status).toBe(400);
  });

  it('still restores the whole workbook without a sheet', async () => {
    const t = await setup();
    const target = await t.patch([[t.first, 0, 0, 'O2'], [t.second, 0, 0, 'N2']]);
    await t.patch([[t.first, 0, 0, 'F2'], [t.second, 0, 0, 'NO']]);
    await t.ann.agent.post(`/api/workbooks/${t.id}/revisions/${target}/restore`).expect(200);
    expect([await t.cells(t.first), await t.cells(t.second)]).toEqual([[[0, 0, 'O2']], [[0, 0, 'N2']]]);
  });
});

describe('a sheet\'s chart', () => {
  it('is stored with the sheet settings and loaded with the workbook', async () => {
    const t = await setup();
    const chart = { x: 3, y: 2, kind: 'compare', label: 0 };
    await t.ann.agent.patch(`/api/workbooks/${t.id}/sheets/${t.first}`).send({ settings: { precision: 3, chart } }).expect(200);
    expect((await t.load()).sheets[0].settings).toEqual({ precision: 3, chart });
  });

  it('is refused with a message naming the field when it does not read', async () => {
    const t = await setup();
    const res = await t.ann.agent.patch(`/api/workbooks/${t.id}/sheets/${t.first}`).send({ settings: { chart: { x: 1, y: 2, kind: 'pie', label: null } } });
    expect(res.status).toBe(400);
    expect(JSON.stringify(res.body.error)).toMatch(/chart/);
  });
});
