// Settling a conflict without losing either input, the inputs set aside, the read-only view of an
// old revision computed from its inputs, and the sentences of the audit log and addresses.
import { afterEach, describe, expect, it, vi } from 'vitest';
import type { AuditEntry } from '../shared/team.js';
import type { CellConflict } from '../shared/workbooks.js';
import type { PatchTransport } from '../src/core/workbook/save/patchQueue.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';
import { ApiError } from '../src/lib/api.js';
import { resolveConflicts } from '../src/features/live/conflictResolution.js';
import { settleConflicts } from '../src/features/live/settleConflicts.js';
import { applyRemoteRevision, type RemoteRevision } from '../src/features/live/remoteRevision.js';
import { addSetAside, loadSetAside, maxSetAside, saveSetAside } from '../src/features/live/setAside.js';
import { cellAddress as cellAddressOf } from '../shared/a1.js';
import { describeAudit } from '../src/features/audit/describeAudit.js';
import { memoryStorage, session } from './helpers/workbookSession.js';
import { twoAnalysts } from './helpers/liveSession.js';

const ada = { id: 'u-ada', name: 'Ada Okafor' };
const ben = { id: 'u-ben', name: 'Ben Laszlo' };

afterEach(() => vi.useRealTimers());

describe('settling a conflict', () => {
  const conflict = (row: number, theirs: string, mine: string, revision = 6): CellConflict => ({ sheetId: 's1', row, col: 0, theirs, mine, revision });

  it('keeps mine by sending it again, and takes theirs by showing it and setting mine aside', () => {
    const r = resolveConflicts([conflict(0, 'O2', 'CO'), conflict(1, 'N2', 'NO')], (c) => (c.row === 0 ? 'mine' : 'theirs'), [], 1000);
    expect(r.resend).toEqual([{ sheetId: 's1', row: 0, col: 0, input: 'CO' }]);
    expect(r.applyLocally).toEqual([{ sheetId: 's1', row: 1, col: 0, input: 'N2' }]);
    expect(r.setAside).toEqual([{ sheetId: 's1', row: 1, col: 0, input: 'NO', replacedBy: 'N2', at: 1000 }]);
  });

  it('uses what I typed while deciding, not the input the server refused', () => {
    const r = resolveConflicts([conflict(0, 'O2', 'CO')], 'mine', [{ sheetId: 's1', row: 0, col: 0, input: 'CO+' }]);
    expect(r.resend).toEqual([{ sheetId: 's1', row: 0, col: 0, input: 'CO+' }]);
  });

  it('resends mine on top of the revision that beat it, and shows theirs where I took theirs', async () => {
    vi.useFakeTimers();
    try {
      const sent: { baseRevision: number; changes: CellInput[] }[] = [];
      const transport: PatchTransport = {
        send: async (p) => {
          sent.push(structuredClone(p));
          if (sent.length === 1) throw new ApiError(409, 'conflict', 'changed by someone else', { conflicts: [conflict(0, 'O2', 'CO', 6), conflict(1, 'N2', 'NO', 7)] });
          return { revision: 8, applied: 1 };
        },
      };
      const { model, queue } = session([[0, 0, 'N2'], [1, 0, 'O2']], transport);
      // A colleague's revisions 5–7, which the live feed fetches when the queue asks for them.
      const theirs: Record<number, RemoteRevision> = {
        5: { revision: 5, kind: 'edit', authorId: 'u-ben', changes: [{ sheetId: 's1', row: 3, col: 0, before: '', after: 'F2' }], sheetOps: [] },
        6: { revision: 6, kind: 'edit', authorId: 'u-ben', changes: [{ sheetId: 's1', row: 0, col: 0, before: 'N2', after: 'O2' }], sheetOps: [] },
        7: { revision: 7, kind: 'edit', authorId: 'u-ben', changes: [{ sheetId: 's1', row: 1, col: 0, before: 'O2', after: 'N2' }], sheetOps: [] },
      };
      const asked: number[] = [];
      queue.catchUp = (n) => {
        asked.push(n);
        for (let r = queue.baseRevision + 1; r <= n; r++) applyRemoteRevision(model, queue, theirs[r]);
      };
      model.edit([
        { sheetId: 's1', row: 0, col: 0, input: 'CO' },
        { sheetId: 's1', row: 1, col: 0, input: 'NO' },
      ]);
      await vi.advanceTimersByTimeAsync(400);
      expect(queue.status.kind).toBe('conflict');
      const setAside = settleConflicts({ model, queue }, (queue.status as { conflicts: CellConflict[] }).conflicts, (c) => (c.row === 0 ? 'mine' : 'theirs'));
      await vi.advanceTimersByTimeAsync(400);
      expect(asked).toEqual([6]);
      expect(sent[1]).toEqual({ baseRevision: 6, changes: [{ sheetId: 's1', row: 0, col: 0, input: 'CO' }] });
      expect(model.input('s1', 1, 0)).toBe('N2');
      expect(model.input('s1', 0, 0)).toBe('CO');
      expect(model.input('s1', 3, 0)).toBe('F2');
      expect(setAside.map((c) => [c.input, c.replacedBy])).toEqual([['NO', 'N2']]);
      expect(queue.status).toEqual({ kind: 'saved' });
    } finally {
      vi.useRealTimers();
    }
  });

  it('keeps set-aside inputs in local storage, newest last and bounded', () => {
    const storage = memoryStorage();
    const entry = (i: number) => ({ sheetId: 's1', row: i, col: 0, input: `v${i}`, replacedBy: '', at: i });
    const many = addSetAside([], Array.from({ length: maxSetAside + 5 }, (_, i) => entry(i)));
    expect(many).toHaveLength(maxSetAside);
    expect(many[0].input).toBe('v5');
    saveSetAside(storage, 'wb', many);
    expect(loadSetAside(storage, 'wb')).toEqual(many);
    storage.setItem('orbitab.setAside.wb', '{not json');
    expect(loadSetAside(storage, 'wb')).toEqual([]);
  });
});

describe('no silent overwrite of a colleague’s input (a real server, live events staged)', () => {
  it('refuses my edit of a cell a colleague changed between my base and my acknowledgement, though their event is late', async () => {
    const w = await twoAnalysts();
    // Bob's revision is stored just before Ann's first patch reaches the server; its live event has not reached her.
    w.beforeAnnSends(() => w.bobSets(0, 1, 'N2'));
    w.annTypes(0, 0, 'O2');
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('saved'));
    w.annTypes(0, 1, 'CO'); // B1, where she has not seen Bob's N2
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('conflict'));
    expect(await w.serverCells()).toContainEqual([0, 1, 'N2']);
    expect((w.queue.status as { conflicts: CellConflict[] }).conflicts).toMatchObject([{ row: 0, col: 1, theirs: 'N2', mine: 'CO' }]);
  });

  it('refuses my edit of a cell whose colleague’s change was held back while my earlier patch was on its way', async () => {
    const w = await twoAnalysts();
    let letAnnThrough: (() => void) | null = null;
    w.beforeAnnSends(() => new Promise<void>((resolve) => (letAnnThrough = resolve)));
    w.annTypes(0, 0, 'O2');
    await vi.waitFor(() => expect(letAnnThrough).not.toBeNull());
    w.annTypes(0, 1, 'CO'); // typed while A1 is on its way
    await w.bobSets(0, 1, 'N2');
    w.deliverLiveEvents(); // Bob's B1 reaches Ann but stays off her screen: her own input waits there
    expect(w.model.input(w.sheetId, 0, 1)).toBe('CO');
    letAnnThrough!();
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('conflict'));
    expect(await w.serverCells()).toContainEqual([0, 1, 'N2']);
  });

  it('after a conflict, keeping mine stores it on top of the colleague’s revision, and both screens end up equal', async () => {
    const w = await twoAnalysts();
    w.beforeAnnSends(async () => {
      await w.bobSets(0, 1, 'N2');
      await w.bobSets(5, 0, 'F2');
    });
    w.annTypes(0, 0, 'O2');
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('saved'));
    w.annTypes(0, 1, 'CO');
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('conflict'));
    settleConflicts(w, (w.queue.status as { conflicts: CellConflict[] }).conflicts, 'mine');
    // Bob's revisions are fetched (the live events are still late) before CO goes out on top of them.
    await vi.waitFor(() => expect(w.queue.status.kind).toBe('saved'));
    const cells = await w.serverCells();
    expect(cells).toContainEqual([0, 1, 'CO']);
    expect(cells).toContainEqual([5, 0, 'F2']);
    w.deliverLiveEvents();
    expect(cells.map(([row, col, input]) => w.model.input(w.sheetId, row, col) === input)).not.toContain(false);
  });
});

describe('words on screen', () => {
  it('quotes sheet names that formulas would quote (common practice)', () => {
    expect(cellAddressOf('Sheet1', 1, 1)).toBe('Sheet1!B2');
    expect(cellAddressOf("Ada's ions", 0, 27)).toBe("'Ada''s ions'!AB1");
  });

  it('tells the audit log in sentences, naming people who are still members', () => {
    const entry = (action: AuditEntry['action'], details: Record<string, unknown>): AuditEntry => ({ id: 1, action, actor: { ...ada, email: 'ada@lab.example' }, details, createdAt: 0 });
    const names = (id: string) => (id === ben.id ? ben.name : undefined);
    expect(describeAudit(entry('member.role_changed', { userId: ben.id, from: 'viewer', to: 'editor' }), names)).toBe('changed Ben Laszlo from viewer to editor');
    expect(describeAudit(entry('member.removed', { userId: 'gone', email: 'x@lab.example', role: 'viewer', left: false }), names)).toBe('removed x@lab.example (was a viewer)');
    expect(describeAudit(entry('sheet.locked', { sheetName: 'Reference', reason: 'checked', replaced: false }), names)).toBe('locked sheet “Reference”: “checked”');
    expect(describeAudit(entry('revision.restored', { restoredFrom: 3, revision: 9 }), names)).toBe('restored revision #3 as revision #9');
    expect(describeAudit(entry('sheet.role_set', { userId: ben.id, sheetName: 'Measurements', role: 'editor', before: null }), names)).toBe('made Ben Laszlo an editor on sheet “Measurements”');
    expect(describeAudit(entry('sheet.role_set', { userId: 'gone', name: 'Vic', sheetName: 'Settled', role: 'viewer', before: 'editor' }), names)).toBe('made Vic a viewer on sheet “Settled” (was an editor there)');
    expect(describeAudit(entry('sheet.role_removed', { userId: ben.id, sheetName: 'Settled' }), names)).toBe('set Ben Laszlo back to their workbook role on sheet “Settled”');
  });
});
