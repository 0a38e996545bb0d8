// Formulas follow their sheet: a rename rewrites every reference to the tab, a delete turns them into
// #REF!, so a freed name cannot be taken by another tab to change what a (locked) sheet computes.
import { afterAll, beforeEach, describe, expect, it } from 'vitest';
import { removeSheetFromFormula, renameSheetInFormula } from '../shared/formulaText.js';
import type { CellEntry, ComputedValue, RevisionDetail, SheetOp, WorkbookPayload } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { applyRemoteRevision } from '../src/features/live/remoteRevision.js';
import { load, makeTeam, sharedWorkbook, type Agent, type Team } from './helpers/team.js';
import { session } from './helpers/workbookSession.js';
import { allowedActions } from '../shared/permissions.js';

describe('formula text when a sheet is renamed or deleted', () => {
  it('rewrites unquoted, quoted and differently cased references, and both corners of a range', () => {
    expect(renameSheetInFormula(`=Data!A1+'Data'!$B$2+SUM(data!A1:B2)+SUM(DATA!A1:DATA!C3)`, 'Data', 'Data 2')).toBe(
      `='Data 2'!A1+'Data 2'!$B$2+SUM('Data 2'!A1:B2)+SUM('Data 2'!A1:'Data 2'!C3)`,
    );
    expect(renameSheetInFormula(`=SUM('My sheet'!A:B)+'My sheet'!3:4`, 'my sheet', 'Totals')).toBe('=SUM(Totals!A:B)+Totals!3:4');
    expect(renameSheetInFormula(`='Ana''s ions'!A1`, "Ana's ions", "Bo's ions")).toBe(`='Bo''s ions'!A1`);
  });

  it('leaves string literals, other sheets with similar names and plain text alone', () => {
    expect(renameSheetInFormula(`=CONCAT("Data!A1", 'it''s'!A1, Data2!A1, MyData!A1)&"'Data'!B2"`, 'Data', 'X')).toBe(`=CONCAT("Data!A1", 'it''s'!A1, Data2!A1, MyData!A1)&"'Data'!B2"`);
    expect(renameSheetInFormula('Data!A1 is just text', 'Data', 'X')).toBe('Data!A1 is just text');
  });

  it('turns a deleted sheet\'s references, ranges included, into #REF! and keeps the rest', () => {
    expect(removeSheetFromFormula(`=Data!A1*2+SUM('data'!A1:B9)+Keep!A1+"Data!A1"`, 'Data')).toBe(`=#REF!*2+SUM(#REF!)+Keep!A1+"Data!A1"`);
    expect(removeSheetFromFormula('=SUM(Data!A:C)+COUNT(Data!2:3)', 'Data')).toBe('=SUM(#REF!)+COUNT(#REF!)');
  });
});

const valuesOf = async (agent: Agent, id: string, sheetName: string) => {
  const res = await agent.get(`/api/workbooks/${id}/values`).expect(200);
  const sheet = (res.body.sheets as { name: string; values: [number, number, ComputedValue][] }[]).find((s) => s.name === sheetName)!;
  return new Map(sheet.values.map(([r, c, v]) => [`${r},${c}`, v]));
};
const inputsOf = (wb: WorkbookPayload, sheetId: string) => new Map((wb.sheets.find((s) => s.id === sheetId)!.cells as CellEntry[]).map(([r, c, input]) => [`${r},${c}`, input]));

describe('renaming and deleting sheets through the API', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let results: string;
  let data: string;
  const patch = async (agent: Agent, changes: [sheetId: string, row: number, col: number, input: string][]) => {
    const { revision } = await load(agent, wb.id);
    await agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: revision, changes: changes.map(([sheetId, row, col, input]) => ({ sheetId, row, col, input })) }).expect(200);
  };
  const sheetsUrl = () => `/api/workbooks/${wb.id}/sheets`;

  beforeEach(async () => {
    t ??= await makeTeam();
    wb = await sharedWorkbook(t, 'Ionisation energies');
    results = wb.sheets[0].id;
    await t.owner.agent.patch(`${sheetsUrl()}/${results}`).send({ name: 'Results' }).expect(200);
    data = (await t.owner.agent.post(sheetsUrl()).send({ name: 'Data' }).expect(201)).body.sheet.id;
    await patch(t.owner.agent, [
      [data, 0, 0, '5'],
      [data, 1, 0, '7'],
      [results, 0, 0, '=Data!A1*2'],
      [results, 0, 1, `=SUM('Data'!A1:A2)`],
      [results, 0, 2, '="Data!A1 is the source"'],
      [results, 0, 3, '=data!$A$2'],
    ]);
    await t.owner.agent.put(`${sheetsUrl()}/${results}/lock`).send({ reason: 'figures checked' }).expect(200);
  });
  afterAll(() => t.ctx.mail.stop());

  it('keeps a locked sheet\'s values when an editor renames its source and adds a new sheet under the old name', async () => {
    expect((await valuesOf(t.owner.agent, wb.id, 'Results')).get('0,0')).toBe(10);
    await t.editor.agent.patch(`${sheetsUrl()}/${data}`).send({ name: 'Old data' }).expect(200);
    const impostor = (await t.editor.agent.post(sheetsUrl()).send({ name: 'Data' }).expect(201)).body.sheet.id;
    await patch(t.editor.agent, [[impostor, 0, 0, '1000'], [impostor, 1, 0, '1000']]);

    const values = await valuesOf(t.owner.agent, wb.id, 'Results');
    expect([values.get('0,0'), values.get('0,1'), values.get('0,3')]).toEqual([10, 12, 7]);
    expect(Object.fromEntries(inputsOf(await load(t.owner.agent, wb.id), results))).toEqual({
      '0,0': `='Old data'!A1*2`,
      '0,1': `=SUM('Old data'!A1:A2)`,
      '0,2': '="Data!A1 is the source"',
      '0,3': `='Old data'!$A$2`,
    });
  });

  it('records the rewrite in the rename\'s revision, where history can undo it', async () => {
    const res = await t.editor.agent.patch(`${sheetsUrl()}/${data}`).send({ name: 'Raw' }).expect(200);
    const detail = (await t.owner.agent.get(`/api/workbooks/${wb.id}/revisions/${res.body.revision}`).expect(200)).body as RevisionDetail;
    expect(detail.patch.sheetOps).toEqual([{ op: 'rename', sheetId: data, before: 'Data', after: 'Raw' }]);
    expect(detail.patch.changes).toEqual([
      { sheetId: results, row: 0, col: 0, before: '=Data!A1*2', after: '=Raw!A1*2' },
      { sheetId: results, row: 0, col: 1, before: `=SUM('Data'!A1:A2)`, after: '=SUM(Raw!A1:A2)' },
      { sheetId: results, row: 0, col: 3, before: '=data!$A$2', after: '=Raw!$A$2' },
    ]);

    // Undoing the rename (by the locker, who may change the locked sheet) puts name and formulas back.
    await t.owner.agent.post(`/api/workbooks/${wb.id}/revisions/${res.body.revision - 1}/restore`).expect(200);
    const after = await load(t.owner.agent, wb.id);
    expect(after.sheets.find((s) => s.id === data)!.name).toBe('Data');
    expect(inputsOf(after, results).get('0,1')).toBe(`=SUM('Data'!A1:A2)`);
    expect(inputsOf(after, results).get('0,0')).toBe('=Data!A1*2');
  });

  it('turns references to a deleted sheet into #REF!, which a new sheet of that name does not take over', async () => {
    const res = await t.editor.agent.delete(`${sheetsUrl()}/${data}`).expect(200);
    await t.editor.agent.post(sheetsUrl()).send({ name: 'Data' }).expect(201);
    const values = await valuesOf(t.owner.agent, wb.id, 'Results');
    expect(values.get('0,0')).toMatchObject({ error: '#REF!' });
    expect(values.get('0,1')).toMatchObject({ error: '#REF!' });
    expect(values.get('0,2')).toBe('Data!A1 is the source');
    const detail = (await t.owner.agent.get(`/api/workbooks/${wb.id}/revisions/${res.body.revision}`).expect(200)).body as RevisionDetail;
    expect(detail.patch.changes.map((c) => c.after)).toEqual(['=#REF!*2', '=SUM(#REF!)', '=#REF!']);

    // Undoing the delete brings the tab and the references back, on the locked sheet too.
    await t.owner.agent.post(`/api/workbooks/${wb.id}/revisions/${res.body.revision - 1}/restore`).expect(200);
    expect((await valuesOf(t.owner.agent, wb.id, 'Results')).get('0,0')).toBe(10);
  });

  it('lets an editor not on the lock undo their delete, references on the locked sheet included', async () => {
    const res = await t.editor.agent.delete(`${sheetsUrl()}/${data}`).expect(200);
    const restore = await t.editor.agent.post(`/api/workbooks/${wb.id}/revisions/${res.body.revision - 1}/restore`);
    expect(restore.status, JSON.stringify(restore.body)).toBe(200);
    expect(inputsOf(await load(t.owner.agent, wb.id), results).get('0,0')).toBe('=Data!A1*2');
    // …while an edit of the locked sheet's cells stays theirs to refuse.
    const { revision } = await load(t.editor.agent, wb.id);
    await t.editor.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: revision, changes: [{ sheetId: results, row: 0, col: 0, input: '=1' }] }).expect(403);
  });

  it('still refuses a rename of the locked sheet itself to someone not on the lock, rewriting nothing', async () => {
    const before = await load(t.owner.agent, wb.id);
    await t.editor.agent.patch(`${sheetsUrl()}/${results}`).send({ name: 'Mine now' }).expect(403);
    const after = await load(t.owner.agent, wb.id);
    expect(after.revision).toBe(before.revision);
    expect(inputsOf(after, results)).toEqual(inputsOf(before, results));
  });
});

describe('the browser\'s model', () => {
  const open = () =>
    new WorkbookModel({
      id: 'wb',
      title: 'Screening',
      revision: 3,
      role: 'owner',
      actions: allowedActions(['owner']),
      sheets: [
        { id: 's1', name: 'Results', position: 0, settings: {}, cells: [[0, 0, '=Data!A1*2'], [0, 1, '="Data!A1"']] },
        { id: 's2', name: 'Data', position: 1, settings: {}, cells: [[0, 0, '5']] },
      ],
    });

  it('shows the rewritten text after a rename and keeps computing from the renamed sheet', () => {
    const m = open();
    m.renameSheetState('s2', 'Raw data');
    expect([m.input('s1', 0, 0), m.input('s1', 0, 1)]).toEqual([`='Raw data'!A1*2`, '="Data!A1"']);
    expect(m.view('s1', 0, 0)?.display).toBe('10');
  });

  it('shows #REF! in the text and the value after a delete', () => {
    const m = open();
    m.removeSheetState('s2');
    expect(m.input('s1', 0, 0)).toBe('=#REF!*2');
    expect(m.view('s1', 0, 0)?.display).toContain('#REF!');
  });

  it('agrees with the server\'s recorded rewrite, so a remote rename leaves nothing to write twice', () => {
    const m = open();
    const op: SheetOp = { op: 'rename', sheetId: 's2', before: 'Data', after: 'Raw' };
    m.renameSheetState(op.sheetId, op.after);
    expect(m.input('s1', 0, 0)).toBe(renameSheetInFormula('=Data!A1*2', op.before, op.after));
  });

  it('takes in a colleague\'s rename with its rewrite, and my unsent formula follows the sheet too', () => {
    const { model, queue } = session([[0, 0, '=Data!A1*2']]);
    const add: SheetOp = { op: 'add', sheetId: 's2', name: 'Data', position: 1, settings: {}, cells: [[0, 0, '5']] };
    applyRemoteRevision(model, queue, { revision: 5, kind: 'sheet', authorId: 'u-ben', changes: [], sheetOps: [add] });
    model.edit([{ sheetId: 's1', row: 1, col: 0, input: '=SUM(Data!A1:A3)' }]);

    const rename: SheetOp = { op: 'rename', sheetId: 's2', before: 'Data', after: 'Raw data' };
    const changes = [{ sheetId: 's1', row: 0, col: 0, before: '=Data!A1*2', after: `='Raw data'!A1*2` }];
    const result = applyRemoteRevision(model, queue, { revision: 6, kind: 'sheet', authorId: 'u-ben', changes, sheetOps: [rename] });
    expect(result.writes).toEqual([]); // the model had rewritten the text already, to the same words
    expect(model.input('s1', 0, 0)).toBe(`='Raw data'!A1*2`);
    expect(model.view('s1', 0, 0)?.display).toBe('10');
    expect(queue.waiting).toEqual([{ sheetId: 's1', row: 1, col: 0, input: `=SUM('Raw data'!A1:A3)` }]);
    expect(model.input('s1', 1, 0)).toBe(`=SUM('Raw data'!A1:A3)`);
  });
});
