// A colleague opens a workbook in which someone typed the formulas that used to take Orbitab down:
// saved through the real patch API, loaded as the browser loads it, computed by the browser's
// WorkbookModel (the same createEngine), with another cell edited afterwards. The formula too big
// to parse is refused at the door with a message naming the limit.
import { describe, expect, it } from 'vitest';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { makeTestApp } from './helpers/app.js';

describe('a workbook holding hostile formulas, through the API', () => {
  it('saves them, opens for a colleague with errors naming the limits, and stays editable', async () => {
    const t = makeTestApp();
    await t.signUp('admin@lab.test', 'Site Admin');
    const ann = await t.signUp('ann@lab.test', 'Ann Okafor');
    const bob = await t.signUp('bob@lab.test', 'Bob Laszlo');
    const id = (await ann.agent.post('/api/workbooks').send({ title: 'Spill screen' }).expect(201)).body.workbook.id as string;
    await ann.agent.post(`/api/workbooks/${id}/members`).send({ email: 'bob@lab.test', role: 'editor' }).expect(201);
    const load = async (agent: typeof ann.agent) => (await agent.get(`/api/workbooks/${id}`).expect(200)).body as WorkbookPayload;
    const first = await load(ann.agent);
    const sheetId = first.sheets[0].id;

    const hostile = ['=SEQUENCE(1000000,2000)', '=SUM(A2:BXX1000000)', '=REPT("ab",200000000)', '=BXX1000000', '=SUM(B:B)', '=B1:B1000000*2', '=HUCKEL(B2:BXX1000000)'];
    const changes = [...hostile.map((input, row) => ({ sheetId, row, col: 3, input })), { sheetId, row: 0, col: 0, input: '2' }, { sheetId, row: 0, col: 1, input: '=A1*21' }];
    await ann.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: first.revision, changes }).expect(200);

    const tooLong = '=1' + '+1'.repeat(1249);
    const refused = await ann.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: first.revision + 1, changes: [{ sheetId, row: 9, col: 3, input: tooLong }] });
    expect(refused.status).toBe(400);
    expect(JSON.stringify(refused.body.error)).toMatch(/the formula has 1,249 operators; at most 500/);

    const model = new WorkbookModel(await load(bob.agent));
    try {
      for (const row of [0, 1, 2, 4, 5, 6]) expect(model.view(sheetId, row, 3)?.errorMessage).toMatch(/at most [\d,]+( per formula)?$/);
      expect(model.rows(sheetId)[1][3]?.errorCode).toBe('#VALUE!');
      expect(model.view(sheetId, 0, 1)?.display).toBe('42');
      model.edit([{ sheetId, row: 0, col: 0, input: '3' }]);
      expect(model.view(sheetId, 0, 1)?.display).toBe('63');
    } finally {
      model.dispose();
    }
  });
});
