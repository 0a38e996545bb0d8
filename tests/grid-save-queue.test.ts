// The save path: unsent changes merged per cell, sent as debounced patches, retried while the server
// is unreachable, kept in (fake) local storage until acknowledged, and conflicts reported as such.
// Which base revision each patch claims is specified in grid-save-base-revision.test.ts.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';
import { PatchQueue, type PatchTransport, type SaveStatus } from '../src/core/workbook/save/patchQueue.js';
import { PendingStore, pendingKey } from '../src/core/workbook/save/pendingStore.js';
import { ApiError } from '../src/lib/api.js';
import { lastPartCells, maxCellsPerAction, maxCellsPerPatch } from '../shared/workbooks.js';
import { cell, MemoryStorage, scriptedServer, settle } from './helpers/scriptedServer.js';

let storage: MemoryStorage;
let store: PendingStore;

beforeEach(() => {
  vi.useFakeTimers();
  storage = new MemoryStorage();
  store = new PendingStore(storage, 'wb1');
});
afterEach(() => vi.useRealTimers());

function newQueue(transport: PatchTransport, base = 7) {
  const q = new PatchQueue({ transport, store, baseRevision: base, debounceMs: 300, firstRetryMs: 1000, maxRetryMs: 8000 });
  const seen: SaveStatus['kind'][] = [];
  q.subscribe((s) => seen.push(s.kind));
  return { q, seen };
}

/** A colleague's revision 9 wrote N2 in A1 where I typed O2. */
const a1Conflict = { sheetId: 's1', row: 0, col: 0, theirs: 'N2', mine: 'O2', revision: 9 };
/** A scripted server answer: 409, naming the cell changed under the patch. */
const conflictAnswer = (conflict: typeof a1Conflict) => () => Promise.reject(new ApiError(409, 'conflict', 'changed by someone else', { conflicts: [conflict] }));

describe('patch queue', () => {
  it('waits for a pause in typing, then sends every change in one patch on the loaded revision', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2')]);
    await vi.advanceTimersByTimeAsync(200);
    q.enqueue([cell(0, 1, '=BONDORDER(A1)')]);
    expect(server.sent).toHaveLength(0);
    expect(q.status).toEqual({ kind: 'saving', waiting: 2 });
    await vi.advanceTimersByTimeAsync(300);
    expect(server.sent).toEqual([{ baseRevision: 7, changes: [cell(0, 0, 'O2'), cell(0, 1, '=BONDORDER(A1)')] }]);
    expect(q.status).toEqual({ kind: 'saved' });
    expect(q.baseRevision).toBe(8);
  });

  it('sends only the last input when one cell is edited several times', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    q.enqueue([cell(2, 0, 'N2')]);
    q.enqueue([cell(2, 0, 'N2+')]);
    q.enqueue([cell(2, 0, 'N2-')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(server.sent[0].changes).toEqual([cell(2, 0, 'N2-')]);
  });

  it('bases the next patch on the revision the server returned for the previous one', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'a')]);
    await vi.advanceTimersByTimeAsync(300);
    q.enqueue([cell(0, 0, 'b')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(server.sent.map((p) => p.baseRevision)).toEqual([7, 8]);
  });

  it('keeps a change made while its cell was on the way, and sends it next', async () => {
    const server = scriptedServer();
    let release!: () => void;
    server.answers.push(() => new Promise((resolve) => (release = () => resolve({ revision: 8, applied: 1 }))));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'first')]);
    await vi.advanceTimersByTimeAsync(300);
    q.enqueue([cell(0, 0, 'second')]);
    expect(q.waiting).toEqual([cell(0, 0, 'second')]);
    release();
    await settle();
    expect(server.sent[1]).toEqual({ baseRevision: 8, changes: [cell(0, 0, 'second')] });
    expect(q.status.kind).toBe('saved');
  });

  it('says "offline" with the number of changes waiting, retries with growing pauses, then saves', async () => {
    const server = scriptedServer();
    const down = () => Promise.reject(new TypeError('Failed to fetch'));
    server.answers.push(down, down, down);
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2'), cell(1, 0, 'N2')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(q.status).toMatchObject({ kind: 'offline', waiting: 2 });
    await vi.advanceTimersByTimeAsync(999);
    expect(server.sent).toHaveLength(1);
    await vi.advanceTimersByTimeAsync(1); // first pause 1 s
    expect(server.sent).toHaveLength(2);
    await vi.advanceTimersByTimeAsync(2000); // then 2 s
    expect(server.sent).toHaveLength(3);
    q.enqueue([cell(2, 0, 'CO')]);
    expect(q.status).toMatchObject({ kind: 'offline', waiting: 3 });
    await vi.advanceTimersByTimeAsync(4000); // then 4 s, and the server is back
    expect(server.sent).toHaveLength(4);
    expect(server.sent[3].changes).toHaveLength(3);
    expect(q.status).toEqual({ kind: 'saved' });
  });

  it('retries a 503 but not a 400, which it reports without dropping the changes', async () => {
    const server = scriptedServer();
    server.answers.push(() => Promise.reject(new ApiError(503, 'unavailable', 'database busy')));
    server.answers.push(() => Promise.reject(new ApiError(400, 'invalid', 'changes.0.row: must be 0 or more')));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'x')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(q.status).toMatchObject({ kind: 'offline', reason: 'database busy' });
    await vi.advanceTimersByTimeAsync(1000);
    expect(q.status).toEqual({ kind: 'refused', waiting: 1, message: 'changes.0.row: must be 0 or more' });
    await vi.advanceTimersByTimeAsync(60_000);
    expect(server.sent).toHaveLength(2);
    expect(store.load()?.changes).toEqual([cell(0, 0, 'x')]);
  });

  it('sends one action of 12,000 changes (a column deleted on a 1,200-row sheet) as one patch', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    const action = Array.from({ length: 12_000 }, (_, i) => cell(Math.floor(i / 10), i % 10, i % 10 === 9 ? '' : `=BONDORDER(A${i})`));
    q.enqueue(action);
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent).toHaveLength(1);
    expect(server.sent[0]).toEqual({ baseRevision: 7, changes: action });
    expect(q.status).toEqual({ kind: 'saved' });
    expect(q.baseRevision).toBe(8);
  });

  /** Deleting column A of a 4,000 × 10 sheet: 40,000 changed cells (the most one action may change), more than one patch may carry. */
  const bigAction = (input: (row: number, col: number) => string) => Array.from({ length: maxCellsPerAction }, (_, i) => cell(Math.floor(i / 10), i % 10, input(Math.floor(i / 10), i % 10)));

  it('sends one action over the patch limit as parts of one action, saved as one revision; its undo too', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    const action = bigAction((r, c) => (c === 9 ? '' : `=BONDORDER(A${r}${c})`));
    q.enqueue(action);
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    // Full parts, then a short last one: its request applies the whole action, so it should carry little.
    expect(server.sent.map((p) => [p.baseRevision, p.changes.length, p.part?.index, p.part?.count])).toEqual([
      [7, maxCellsPerPatch, 0, 3],
      [7, maxCellsPerAction - maxCellsPerPatch - lastPartCells, 1, 3],
      [7, lastPartCells, 2, 3],
    ]);
    expect(new Set(server.sent.map((p) => p.part?.actionId)).size).toBe(1);
    expect(server.sent.flatMap((p) => p.changes)).toEqual(action);
    expect(q.status).toEqual({ kind: 'saved' });
    expect(q.baseRevision).toBe(8);

    // Undoing it is the same size of action: one revision again, on the revision the first made.
    q.enqueue(bigAction((r, c) => `S${r}:${c}`));
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent.slice(3).map((p) => [p.baseRevision, p.part?.index])).toEqual([
      [8, 0],
      [8, 1],
      [8, 2],
    ]);
    expect(server.sent[3].part?.actionId).not.toBe(server.sent[0].part?.actionId);
    expect(q.baseRevision).toBe(9);
    expect(store.load()).toBeNull();
  });

  it('sends the whole action again from its first part when the server no longer holds the earlier ones', async () => {
    const server = scriptedServer();
    let calls = 0;
    const transport: PatchTransport = {
      send: (p) => (++calls === 2 ? Promise.reject(new ApiError(410, 'action_expired', 'its earlier parts are no longer held')) : server.transport.send(p)),
    };
    const { q } = newQueue(transport);
    q.enqueue(bigAction(() => 'x'));
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent.map((p) => p.part?.index)).toEqual([0, 0, 1, 2]);
    expect(server.sent[1].part?.actionId).not.toBe(server.sent[0].part?.actionId);
    expect(q.status).toEqual({ kind: 'saved' });
    expect(q.baseRevision).toBe(8);
  });

  it('says why when the server refuses an action as too large, and does not split it into several revisions', async () => {
    const server = scriptedServer();
    const { q } = newQueue(server.transport);
    server.answers.push(() => Promise.reject(new ApiError(413, 'action_too_large', 'one action may change at most 40,000 cells')));
    q.enqueue(bigAction(() => 'x'));
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent).toHaveLength(1);
    expect(q.status).toEqual({ kind: 'refused', waiting: maxCellsPerAction, message: 'one action may change at most 40,000 cells' });
  });

  it('splits a patch the server finds too large and sends the halves', async () => {
    const server = scriptedServer();
    server.answers.push(() => Promise.reject(new ApiError(413, 'too_large', 'patch too large')));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'a'), cell(1, 0, 'b'), cell(2, 0, 'c'), cell(3, 0, 'd')]);
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent.map((p) => p.changes.length)).toEqual([4, 2, 2]);
    expect(q.status.kind).toBe('saved');
  });

  it('reports a conflict naming the cells and sends nothing more until the user chooses', async () => {
    const server = scriptedServer();
    server.answers.push(conflictAnswer(a1Conflict));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2'), cell(5, 5, 'CO')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(q.status).toEqual({ kind: 'conflict', waiting: 2, conflicts: [a1Conflict] });
    await vi.advanceTimersByTimeAsync(60_000);
    expect(server.sent).toHaveLength(1);
  });

  it('keeping mine sends it again on top of the revision that beat it, once that revision is here', async () => {
    const server = scriptedServer();
    server.answers.push(conflictAnswer(a1Conflict));
    server.commitByColleague();
    server.commitByColleague(); // revisions 8 and 9 are a colleague's
    const { q } = newQueue(server.transport);
    const asked: number[] = [];
    q.catchUp = (n) => asked.push(n);
    q.enqueue([cell(0, 0, 'O2'), cell(5, 5, 'CO')]);
    await vi.advanceTimersByTimeAsync(300);

    q.keepMine();
    await settle();
    // E5 met no conflict on base 7, so it goes at once; A1 waits for revisions 8 and 9.
    expect(server.sent[1]).toEqual({ baseRevision: 7, changes: [cell(5, 5, 'CO')] });
    expect(asked).toContain(9);
    expect(q.status.kind).toBe('saving');
    q.takeInRemote(8, []);
    q.takeInRemote(9, [cell(0, 0, 'N2')]); // shown as mine, as I chose
    q.takeInRemote(10, []); // my own E5, echoed by the live feed
    await settle();
    expect(server.sent[2]).toEqual({ baseRevision: 10, changes: [cell(0, 0, 'O2')] });
    expect(q.status.kind).toBe('saved');
  });

  it('after a conflict, taking theirs drops my input for those cells and returns what is stored', async () => {
    const server = scriptedServer();
    server.answers.push(conflictAnswer(a1Conflict));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2'), cell(5, 5, 'CO')]);
    await vi.advanceTimersByTimeAsync(300);
    expect(q.takeTheirs()).toEqual([cell(0, 0, 'N2')]);
    await settle();
    // Revisions 8 and 9 have not been taken in here, so the patch still claims only revision 7.
    expect(server.sent[1]).toEqual({ baseRevision: 7, changes: [cell(5, 5, 'CO')] });
  });

  it('treats a 409 on cells that already hold my input (an answer lost on the way) as saved', async () => {
    const server = scriptedServer();
    const stored = { sheetId: 's1', row: 0, col: 0, theirs: 'O2', mine: 'O2', revision: 8 };
    server.answers.push(() => Promise.reject(new ApiError(409, 'conflict', 'changed', { conflicts: [stored] })));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2'), cell(1, 0, 'N2')]);
    await vi.advanceTimersByTimeAsync(300);
    await settle();
    expect(server.sent[1]).toEqual({ baseRevision: 7, changes: [cell(1, 0, 'N2')] });
    expect(q.status.kind).toBe('saved');
  });
});

describe('unsent changes in local storage', () => {
  it('keeps every unacknowledged change under the workbook key and clears it once acknowledged', async () => {
    const server = scriptedServer();
    server.answers.push(() => Promise.reject(new TypeError('Failed to fetch')));
    const { q } = newQueue(server.transport);
    q.enqueue([cell(0, 0, 'O2')]);
    expect(JSON.parse(storage.getItem(pendingKey('wb1'))!)).toMatchObject({ baseRevision: 7, changes: [cell(0, 0, 'O2')] });
    await vi.advanceTimersByTimeAsync(300);
    expect(storage.getItem(pendingKey('wb1'))).not.toBeNull();
    await vi.advanceTimersByTimeAsync(1000);
    expect(q.status.kind).toBe('saved');
    expect(storage.getItem(pendingKey('wb1'))).toBeNull();
  });

  it('hands changes left by an earlier page to a new queue, which sends them on their own base revision', async () => {
    const server = scriptedServer();
    storage.setItem(pendingKey('wb1'), JSON.stringify({ v: 1, baseRevision: 5, changes: [cell(3, 1, '=UNPAIRED("O2")')] }));
    const snapshot = store.load();
    expect(snapshot).toEqual({ baseRevision: 5, changes: [cell(3, 1, '=UNPAIRED("O2")')] });
    const { q } = newQueue(server.transport, 12);
    q.restore(snapshot!);
    expect(q.status).toEqual({ kind: 'saving', waiting: 1 });
    await settle();
    expect(server.sent).toEqual([{ baseRevision: 5, changes: [cell(3, 1, '=UNPAIRED("O2")')] }]);
  });

  it('keeps other workbooks apart', () => {
    new PendingStore(storage, 'wb2').save({ baseRevision: 1, changes: [cell(0, 0, 'x')] });
    expect(store.load()).toBeNull();
  });

  it('ignores damaged entries and malformed changes instead of failing to open', () => {
    storage.setItem(pendingKey('wb1'), '{not json');
    expect(store.load()).toBeNull();
    storage.setItem(pendingKey('wb1'), JSON.stringify({ baseRevision: 2, changes: [{ sheetId: 's1', row: -1, col: 0, input: 'x' }, cell(1, 1, 'ok')] }));
    expect(store.load()).toEqual({ baseRevision: 2, changes: [cell(1, 1, 'ok')] });
  });

  it('notes when the browser refuses to store, so the page can warn', () => {
    storage.failWrites = true;
    store.save({ baseRevision: 1, changes: [cell(0, 0, 'x')] });
    expect(store.storageWorks).toBe(false);
  });
});
