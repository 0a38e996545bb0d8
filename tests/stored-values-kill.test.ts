// A revision's stored values survive the server dying: values committed before a SIGKILL are served
// from storage after the restart; values the keeper had not committed when the process died are
// computed again on demand (and stored once more), never served stale or half written.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { computeValues } from '../server/services/values.js';
import { apiClient, startOrbitab, type OrbitabProcess } from './helpers/orbitabProcess.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-stored-kill-'));
const databasePath = path.join(dir, 'orbitab.sqlite');
const started: OrbitabProcess[] = [];
afterAll(() => {
  for (const p of started) p.child.kill('SIGKILL');
  fs.rmSync(dir, { recursive: true, force: true });
});

const email = 'ona.brandt@example.com';
const password = 'a long test password';

async function start() {
  const p = await startOrbitab(databasePath);
  started.push(p);
  return p;
}

async function kill(p: OrbitabProcess) {
  p.child.kill('SIGKILL');
  expect((await p.exited).signal).toBe('SIGKILL');
}

/** GET …/values with the header saying where the values came from. */
async function values(url: string, cookie: string, workbookId: string, query = '') {
  const res = await fetch(`${url}/api/workbooks/${workbookId}/values${query}`, { headers: { Cookie: cookie } });
  return { status: res.status, source: res.headers.get('orbitab-values'), body: res.status === 204 ? null : await res.json() };
}

/** Polls until the server answers from storage (the keeper works in the background). */
async function storedValues(url: string, cookie: string, workbookId: string, timeoutMs = 60_000) {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const v = await values(url, cookie, workbookId, '?stored=only'); // 204 until they are
    if (v.source === 'stored') return v;
    if (Date.now() > deadline) throw new Error('the values were never stored');
    await new Promise((r) => setTimeout(r, 100));
  }
}

/** What the database file holds: the workbook's revision, its stored revision, and a fresh computation of its cells. */
function onDisk(workbookId: string) {
  const db = new Database(databasePath, { readonly: true });
  try {
    const revision = (db.prepare('select revision from workbooks where id = ?').get(workbookId) as { revision: number }).revision;
    const storedRevisions = (db.prepare('select revision from revision_values where workbook_id = ?').all(workbookId) as { revision: number }[]).map((r) => r.revision);
    const sheets = (db.prepare('select id, name from sheets where workbook_id = ? order by position').all(workbookId) as { id: string; name: string }[]).map((s) => ({
      ...s,
      cells: db.prepare(`select row, col, input from cells where sheet_id = ? and input != '' order by row, col`).raw().all(s.id) as [number, number, string][],
    }));
    return { revision, storedRevisions, fresh: computeValues({ revision, sheets }) };
  } finally {
    db.close();
  }
}

describe('stored values and a server killed with SIGKILL', () => {
  let workbookId = '';
  let sheetId = '';
  let servedBeforeKill: unknown;

  it('serves values committed before the kill from storage after the restart', async () => {
    const first = await start();
    const client = apiClient(first.url);
    expect((await client.post('/api/auth/sign-up', { email, password, name: 'Ona Brandt' })).status).toBe(201);
    workbookId = (await client.post('/api/workbooks', { title: 'Kept through a crash' })).body.workbook.id;
    sheetId = (await client.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id;
    const changes = ['O2', 'N2', 'NO', 'CN-'].flatMap((species, row) => [
      { sheetId, row, col: 0, input: species },
      { sheetId, row, col: 1, input: `=BONDORDER(A${row + 1})` },
    ]);
    expect((await client.post(`/api/workbooks/${workbookId}/patches`, { baseRevision: 0, changes })).status).toBe(200);
    const before = await storedValues(first.url, client.cookie(), workbookId);
    servedBeforeKill = before.body;
    await kill(first);

    const disk = onDisk(workbookId);
    expect(disk.storedRevisions).toEqual([disk.revision]);
    const second = await start();
    const again = apiClient(second.url);
    expect((await again.post('/api/auth/sign-in', { email, password })).status).toBe(200);
    const after = await values(second.url, again.cookie(), workbookId);
    expect(after.source).toBe('stored');
    expect(after.body).toEqual(servedBeforeKill);
    expect(after.body).toEqual(disk.fresh);
    // Bond orders 2, 3, 2.5, 3 (MO diagrams of O2, N2, NO and CN⁻ in any general chemistry text).
    expect(after.body.sheets[0].values.filter(([, col]: [number, number]) => col === 1).map(([, , v]: [number, number, number]) => v)).toEqual([2, 3, 2.5, 3]);

    // Now a large patch, and the kill as soon as it is acknowledged: its values are not committed yet.
    const rows = Array.from({ length: 1_500 }, (_, i) => i + 10);
    const big = rows.flatMap((row) => [
      { sheetId, row, col: 0, input: ['O2', 'N2+', 'F2', 'C2', 'B2'][row % 5] },
      { sheetId, row, col: 1, input: `=BONDORDER(A${row + 1})` },
      { sheetId, row, col: 2, input: `=UNPAIRED(A${row + 1})` },
      { sheetId, row, col: 3, input: `=MOCONFIG(A${row + 1})` },
    ]);
    const acked = await again.post(`/api/workbooks/${workbookId}/patches`, { baseRevision: disk.revision, changes: big });
    expect(acked.status).toBe(200);
    await kill(second);
    const killed = onDisk(workbookId);
    expect(killed.revision).toBe(acked.body.revision);
    expect(killed.storedRevisions).not.toContain(killed.revision);
  }, 120_000);

  it('computes values that were not committed again after the restart, then stores them', async () => {
    const third = await start();
    const client = apiClient(third.url);
    expect((await client.post('/api/auth/sign-in', { email, password })).status).toBe(200);
    const disk = onDisk(workbookId);
    const first = await values(third.url, client.cookie(), workbookId);
    expect(first.source).toBe('computed');
    expect(first.body).toEqual(disk.fresh);
    const later = await storedValues(third.url, client.cookie(), workbookId);
    expect(later.body).toEqual(disk.fresh);
    expect(onDisk(workbookId).storedRevisions).toEqual([disk.revision]);
    await kill(third);
  }, 120_000);
});
