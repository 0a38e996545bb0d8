// "View as of revision n": GET /api/workbooks/:id/revisions/:n/snapshot gives the cell inputs and
// tabs right after revision n, the same state a restore of n brings back; restores are audited.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { AuditEntry, RevisionSnapshot } from '../shared/team.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { load, makeTeam, sharedWorkbook, type Team } from './helpers/team.js';

describe('revision snapshots', () => {
  let t: Team;
  let wb: WorkbookPayload;
  let ions: string;
  beforeAll(async () => {
    t = await makeTeam();
    wb = await sharedWorkbook(t, 'History');
    const a = t.owner.agent;
    const s1 = wb.sheets[0].id;
    await a.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 0, changes: [{ sheetId: s1, row: 0, col: 0, input: 'N2' }] }).expect(200); // 1
    ions = (await a.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Ions' }).expect(201)).body.sheet.id; // 2
    await a.post(`/api/workbooks/${wb.id}/patches`).send({
      baseRevision: 2,
      changes: [
        { sheetId: s1, row: 0, col: 0, input: 'O2' },
        { sheetId: ions, row: 0, col: 1, input: 'NO+' },
      ],
    }).expect(200); // 3
    await a.delete(`/api/workbooks/${wb.id}/sheets/${ions}`).expect(200); // 4
  });
  afterAll(() => t.ctx.mail.stop());

  const snapshot = async (n: number) => (await t.viewer.agent.get(`/api/workbooks/${wb.id}/revisions/${n}/snapshot`).expect(200)).body as RevisionSnapshot;
  const shape = (s: { sheets: { name: string; position: number; cells: unknown[] }[] }) => s.sheets.map((x) => [x.name, x.position, x.cells]);

  it('shows each revision as it was, tabs included', async () => {
    expect(shape(await snapshot(0))).toEqual([['Screen1', 0, []]]);
    expect(shape(await snapshot(1))).toEqual([['Screen1', 0, [[0, 0, 'N2']]]]);
    expect(shape(await snapshot(2))).toEqual([['Screen1', 0, [[0, 0, 'N2']]], ['Ions', 1, []]]);
    expect(shape(await snapshot(3))).toEqual([['Screen1', 0, [[0, 0, 'O2']]], ['Ions', 1, [[0, 1, 'NO+']]]]);
    expect(shape(await snapshot(4))).toEqual([['Screen1', 0, [[0, 0, 'O2']]]]);
    expect((await snapshot(3)).sheets[1].id).toBe(ions);
  });

  it('matches what the current workbook holds at the latest revision', async () => {
    const now = await load(t.owner.agent, wb.id);
    expect((await snapshot(now.revision)).sheets).toEqual(contentOf(now.sheets));
  });

  it('answers 404 for a revision that does not exist yet and 400 for one that is not a number', async () => {
    const ahead = await t.owner.agent.get(`/api/workbooks/${wb.id}/revisions/99/snapshot`);
    expect(ahead.status).toBe(404);
    expect(ahead.body.error.message).toBe('revision 99 not found');
    const bad = await t.owner.agent.get(`/api/workbooks/${wb.id}/revisions/two/snapshot`);
    expect(bad.status).toBe(400);
    expect(bad.body.error.message).toBe('n: must be a whole number');
  });

  it('brings back by restore exactly what the snapshot showed, and audits the restore', async () => {
    const before = await snapshot(3);
    const restored = await t.editor.agent.post(`/api/workbooks/${wb.id}/revisions/3/restore`);
    expect(restored.status).toBe(200);
    const now = await load(t.owner.agent, wb.id);
    expect(contentOf(now.sheets)).toEqual(before.sheets);
    const [entry] = (await t.owner.agent.get(`/api/workbooks/${wb.id}/audit`)).body.entries as AuditEntry[];
    expect(entry).toMatchObject({ action: 'revision.restored', actor: { name: 'Bob Bench' }, details: { restoredFrom: 3, revision: restored.body.revision } });
  });
});

/** A snapshot rebuilds what revisions record; who created a tab (for sheet roles) is not part of them. */
function contentOf<T extends { createdBy?: unknown }>(sheets: T[]): Omit<T, 'createdBy'>[] {
  return sheets.map(({ createdBy: _creator, ...rest }) => rest);
}
