// Which base revision a patch claims. The server refuses (409) a change to a cell another revision
// wrote after the patch's base; so the base may only cover revisions this browser has taken in, or
// my next edit would overwrite a colleague's input I never saw. The same scenario end to end, on a
// real server, is in client-team-conflicts.test.ts.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PatchQueue, type PatchTransport } from '../src/core/workbook/save/patchQueue.js';
import { PendingStore, type CellInput } from '../src/core/workbook/save/pendingStore.js';
import { RevisionLedger } from '../src/core/workbook/save/revisionLedger.js';
import { ApiError } from '../src/lib/api.js';
import { cell, MemoryStorage, scriptedServer, settle } from './helpers/scriptedServer.js';

let store: PendingStore;
beforeEach(() => {
  vi.useFakeTimers();
  store = new PendingStore(new MemoryStorage(), 'wb1');
});
afterEach(() => vi.useRealTimers());

const newQueue = (transport: PatchTransport, base = 7, showRemote?: (inputs: CellInput[]) => void) => ({ q: new PatchQueue({ transport, store, baseRevision: base, debounceMs: 300, firstRetryMs: 1000, maxRetryMs: 8000, showRemote }) });

describe('the base revision a patch claims (no silent overwrite of a colleague)', () => {
  it('does not jump to an acknowledged revision past a colleague’s revision not yet seen here', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2')]);
    server.commitByColleague(); // revision 8: a colleague's, not yet arrived over the live feed
    await vi.advanceTimersByTimeAsync(300);
    expect(q.status.kind).toBe('saved'); // my A1 is stored, as revision 9
    expect(q.baseRevision).toBe(7);
    // Whatever revision 8 changed, my next edit must meet it as a conflict, so it claims base 7.
    q.enqueue([cell(1, 0, 'CO')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(server.sent[1]).toEqual({ baseRevision: 7, changes: [cell(1, 0, 'CO')] });
    // Once revision 8 is shown, the base runs on over my own revisions 9 and 10.
    q.takeInRemote(8, []);
    expect(q.baseRevision).toBe(10);
  });

  it('stays below a colleague’s revision held back behind my waiting input, even after my own patch is acknowledged', async () => {
    const server = scriptedServer();
    let release!: () => void;
    server.answers.push(() => new Promise((resolve) => (release = () => resolve({ revision: 9, applied: 1 }))));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2')]);
    await vi.advanceTimersByTimeAsync(300); // A1 on its way
    q.enqueue([cell(1, 0, 'CO')]); // I type in A2 meanwhile…
    q.takeInRemote(8, [cell(1, 0, 'N2')]); // …and a colleague's revision 8 sets A2, kept off my screen
    const a2 = { sheetId: 's1', row: 1, col: 0, theirs: 'N2', mine: 'CO', revision: 8 };
    server.answers.push(() => Promise.reject(new ApiError(409, 'conflict', 'changed by someone else', { conflicts: [a2] })));
    release();
    await settle();
    // On base 7 the server sees revision 8's A2 and answers 409, instead of storing CO over N2 unseen.
    expect(server.sent[1]).toEqual({ baseRevision: 7, changes: [cell(1, 0, 'CO')] });
    expect(q.status).toMatchObject({ kind: 'conflict', conflicts: [a2] });
    expect(q.baseRevision).toBe(7);
  });

  it('does not take the revision answered for a patch that changed nothing as its own', async () => {
    const server = scriptedServer();
    server.answers.push(() => Promise.resolve({ revision: 12, applied: 0 }));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(q.status.kind).toBe('saved');
    expect(q.baseRevision).toBe(7);
  });

  it('holds a cell I saved in a revision past the base until the revisions before it arrive, and asks for them', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    const asked: number[] = [];
    q.catchUp = (n) => asked.push(n);
    server.commitByColleague(); // revision 8
    q.enqueue([cell(0, 0, 'O2')]);
    await vi.advanceTimersByTimeAsync(300); // stored as 9
    q.enqueue([cell(0, 0, 'O2+')]);
    await vi.advanceTimersByTimeAsync(300);
    // On base 7 the server would call my own revision 9 a conflict: wait for revision 8 instead.
    expect(server.sent).toHaveLength(1);
    expect(asked).toContain(9);
    expect(q.status).toEqual({ kind: 'saving', waiting: 1 });
    q.takeInRemote(8, []);
    await settle();
    expect(server.sent[1]).toEqual({ baseRevision: 9, changes: [cell(0, 0, 'O2+')] });
  });

  it('shows a colleague’s newer input once my own older input in that cell is saved', async () => {
    const server = scriptedServer();
    let release!: () => void;
    server.answers.push(() => new Promise((resolve) => (release = () => resolve({ revision: 8, applied: 1 }))));
    const shown: CellInput[] = [];
    const { q } = newQueue(server.transport, 7, (inputs) => shown.push(...inputs));
    q.enqueue([cell(0, 0, 'O2')]);
    await vi.advanceTimersByTimeAsync(300);
    // The live feed brings my revision 8, then a colleague's 9 that changed A1 again on top of it.
    q.takeInRemote(8, []);
    q.takeInRemote(9, [cell(0, 0, 'N2')]);
    expect(q.baseRevision).toBe(8);
    release();
    await settle();
    expect(shown).toEqual([cell(0, 0, 'N2')]);
    expect(q.baseRevision).toBe(9);
  });

  it('claims the saved base for restored changes, then the loaded revision once they are saved', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport, 12);
    q.restore({ baseRevision: 5, changes: [cell(3, 1, 'NO')] });
    expect(q.baseRevision).toBe(5);
    server.answers.push(() => Promise.resolve({ revision: 13, applied: 1 }));
    await settle();
    expect(server.sent[0].baseRevision).toBe(5);
    expect(q.baseRevision).toBe(13);
  });
});

describe('the revision ledger behind the base', () => {
  it('stops holding the base back for cells of a sheet that was deleted', () => {
    const ledger = new RevisionLedger(4);
    ledger.takeIn(5, [cell(0, 0, 'N2', 's2')]);
    ledger.takeIn(6, []);
    expect(ledger.base).toBe(4);
    ledger.dropSheet('s2');
    expect(ledger.base).toBe(6);
  });

  it('keeps a restored snapshot’s base until each restored cell is settled, then jumps to the loaded revision', () => {
    const ledger = new RevisionLedger(12);
    ledger.restore(5, [cell(0, 0, 'CO'), cell(1, 0, 'NO')]);
    ledger.takeIn(13, []);
    ledger.settle([{ cell: cell(0, 0, ''), revision: 14, mineStillWaiting: false }]);
    expect(ledger.base).toBe(5);
    ledger.settle([{ cell: cell(1, 0, ''), revision: 3, mineStillWaiting: false }]); // unchanged since revision 3
    expect(ledger.base).toBe(13);
  });
});
