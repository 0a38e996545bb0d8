// Live updates over Server-Sent Events: a revision saved by one client reaches another's open stream
// within a second; presence lists who has the workbook open and where their cursor is; streams
// replay what a reconnecting client missed and close when access ends.
import { beforeAll, describe, expect, it } from 'vitest';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { liveStreamSuite } from './helpers/liveStreamSuite.js';
import type { Team } from './helpers/team.js';

describe('live updates', () => {
  const live = liveStreamSuite('Live screen');
  let t: Team;
  let wb: WorkbookPayload;
  beforeAll(() => ({ t, wb } = live));
  const stream = live.stream;
  const revisionNow = async () => (await t.owner.agent.get(`/api/workbooks/${wb.id}`)).body.revision as number;

  it('pushes a revision saved by one client to another client\'s stream within a second', async () => {
    const watcher = await stream(t.owner);
    expect(watcher.status).toBe(200);
    expect(watcher.contentType).toMatch(/^text\/event-stream/);
    const ready = await watcher.next((e) => e.event === 'ready');
    const base = ready.data.revision as number;

    const saved = await t.editor.agent
      .post(`/api/workbooks/${wb.id}/patches`)
      .send({ baseRevision: base, changes: [{ sheetId: wb.sheets[0].id, row: 2, col: 1, input: '=BOND_ORDER("O2")' }] });
    expect(saved.status).toBe(200);
    const pushed = await watcher.next((e) => e.event === 'revision' && e.data.revision === saved.body.revision);
    expect(pushed.id).toBe(String(saved.body.revision));
    expect(pushed.data).toEqual({
      revision: saved.body.revision,
      kind: 'edit',
      authorId: t.editor.user.id,
      changes: [{ sheetId: wb.sheets[0].id, row: 2, col: 1, before: '', after: '=BOND_ORDER("O2")' }],
      sheetOps: [],
    });
    watcher.close();
  });

  it('lets a viewer listen, and refuses outsiders (404) and signed-out clients (401)', async () => {
    const viewer = await stream(t.viewer);
    expect((await viewer.next((e) => e.event === 'ready')).data.role).toBe('viewer');
    viewer.close();
    expect((await stream(t.outsider)).status).toBe(404);
    expect((await stream(null)).status).toBe(401);
  });

  it('lists the people connected, with the cell each is on, and drops those who leave', async () => {
    const ann = await stream(t.owner);
    const bob = await stream(t.editor);
    const both = await ann.next((e) => e.event === 'presence' && e.data.users.length === 2);
    expect(both.data.users).toEqual([
      { userId: t.owner.user.id, name: 'Ann Analyst', cell: null },
      { userId: t.editor.user.id, name: 'Bob Bench', cell: null },
    ]);

    await t.editor.agent.post(`/api/workbooks/${wb.id}/presence`).send({ sheetId: wb.sheets[0].id, row: 4, col: 2 }).expect(204);
    const moved = await ann.next((e) => e.event === 'presence' && e.data.users.some((u: { cell: unknown }) => u.cell !== null));
    expect(moved.data.users[1]).toEqual({ userId: t.editor.user.id, name: 'Bob Bench', cell: { sheetId: wb.sheets[0].id, row: 4, col: 2 } });

    const seen = ann.events.length;
    bob.close();
    const left = await ann.next((e) => ann.events.indexOf(e) >= seen && e.event === 'presence');
    expect(left.data.users.map((u: { name: string }) => u.name)).toEqual(['Ann Analyst']);
    ann.close();
  });

  it('refuses a cursor on a sheet of another workbook', async () => {
    const other = (await t.owner.agent.post('/api/workbooks').send({ title: 'Other' })).body.workbook.id as string;
    const foreignSheet = (await t.owner.agent.get(`/api/workbooks/${other}`)).body.sheets[0].id as string;
    const res = await t.owner.agent.post(`/api/workbooks/${wb.id}/presence`).send({ sheetId: foreignSheet, row: 0, col: 0 });
    expect(res.status).toBe(404);
    expect(res.body.error.message).toBe('sheet not found');
  });

  it('replays the revisions a reconnecting client missed (Last-Event-ID)', async () => {
    const start = await revisionNow();
    for (const input of ['N2', 'O2', 'F2']) {
      const rev = await revisionNow();
      await t.owner.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev, changes: [{ sheetId: wb.sheets[0].id, row: 10, col: 0, input }] }).expect(200);
    }
    const back = await stream(t.editor, wb.id, { 'Last-Event-ID': String(start + 1) });
    const replayed = await back.next((e) => e.event === 'revision' && e.data.revision === start + 3);
    const revisions = back.events.filter((e) => e.event === 'revision').map((e) => [e.data.revision, e.data.changes[0].after]);
    expect(revisions).toEqual([
      [start + 2, 'O2'],
      [start + 3, 'F2'],
    ]);
    expect(replayed.id).toBe(String(start + 3));
    back.close();
  });

  it('pushes lock changes so every grid can grey the cells at once', async () => {
    const watcher = await stream(t.editor2);
    await watcher.next((e) => e.event === 'ready');
    await t.owner.agent.post(`/api/workbooks/${wb.id}/sheets/${wb.sheets[0].id}/protected-ranges`).send({ range: 'A1:A3' }).expect(201);
    const pushed = await watcher.next((e) => e.event === 'protection');
    expect(pushed.data.protectedRanges.map((r: { range: string }) => r.range)).toEqual(['A1:A3']);
    watcher.close();
  });

  it('tells a member who is removed, and closes their stream', async () => {
    const viewer = await stream(t.viewer);
    await viewer.next((e) => e.event === 'ready');
    await t.owner.agent.delete(`/api/workbooks/${wb.id}/members/${t.viewer.user.id}`).expect(204);
    const closed = await viewer.next((e) => e.event === 'closed');
    expect(closed.data).toEqual({ reason: 'access_removed' });
    await viewer.ended;
  });

  it('tells a member whose role changed, and keeps their stream open', async () => {
    const cara = await stream(t.editor2);
    await cara.next((e) => e.event === 'ready');
    await t.owner.agent.patch(`/api/workbooks/${wb.id}/members/${t.editor2.user.id}`).send({ role: 'viewer' }).expect(200);
    expect((await cara.next((e) => e.event === 'role')).data).toEqual({ role: 'viewer', actions: ['view', 'viewHistory', 'export'] });
    cara.close();
  });

  it('closes every stream of a deleted workbook', async () => {
    const id = (await t.owner.agent.post('/api/workbooks').send({ title: 'Short-lived' })).body.workbook.id as string;
    const s = await stream(t.owner, id);
    await s.next((e) => e.event === 'ready');
    await t.owner.agent.delete(`/api/workbooks/${id}`).expect(204);
    expect((await s.next((e) => e.event === 'closed')).data).toEqual({ reason: 'deleted' });
    await s.ended;
  });
});
