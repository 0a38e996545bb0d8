// The server process dies hard (SIGKILL) or is asked to stop (SIGTERM) while patches stream in: no
// acknowledged change may be lost, no patch may be half-saved, and the database file stays sound.
import http from 'node:http';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, describe, expect, it } from 'vitest';
import { apiClient, startOrbitab } from './helpers/orbitabProcess.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-fault-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

interface SentPatch {
  row: number;
  cols: [number, number];
  inputs: [string, string];
  acknowledgedRevision?: number;
}

async function signedInWithWorkbook(url: string) {
  const client = apiClient(url);
  expect((await client.post('/api/auth/sign-up', { email: 'kim.vesper@example.com', password: 'a long test password', name: 'Kim Vesper' })).status).toBe(201);
  const created = await client.post('/api/workbooks', { title: 'Crash drill' });
  expect(created.status).toBe(201);
  const workbookId = created.body.workbook.id as string;
  const sheetId = (await client.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id as string;
  return { client, workbookId, sheetId };
}

/**
 * Several writers at once, each on its own pair of columns, one patch after another: every patch sets
 * two cells, so a half-saved patch would show. Stops at the first failed request (the server is gone).
 */
function streamPatches(client: ReturnType<typeof apiClient>, workbookId: string, sheetId: string, streams: number, sent: SentPatch[], firstRow = 0) {
  let latest = 0;
  let stopped = false;
  const acknowledged = () => sent.filter((p) => p.acknowledgedRevision !== undefined).length;
  const runs = Array.from({ length: streams }, async (_, s) => {
    for (let row = firstRow; !stopped; row++) {
      const patch: SentPatch = { row, cols: [2 * s, 2 * s + 1], inputs: [`stream ${s} row ${row}`, `=BONDORDER("O2")+${row}`] };
      sent.push(patch);
      try {
        const res = await client.post(`/api/workbooks/${workbookId}/patches`, {
          baseRevision: latest,
          changes: patch.cols.map((col, k) => ({ sheetId, row, col, input: patch.inputs[k] })),
        });
        if (res.status !== 200) throw new Error(`patch answered ${res.status}: ${JSON.stringify(res.body)}`);
        patch.acknowledgedRevision = res.body.revision as number;
        latest = Math.max(latest, patch.acknowledgedRevision);
      } catch (error) {
        if ((error as Error).message.startsWith('patch answered')) throw error;
        return; // connection refused or reset: the server stopped
      }
    }
  });
  return { acknowledged, stop: () => (stopped = true), done: Promise.all(runs) };
}

const until = async (condition: () => boolean, what: string, timeoutMs = 10_000) => {
  const start = Date.now();
  while (!condition()) {
    if (Date.now() - start > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 5));
  }
};

function integrity(file: string): string {
  const db = new Database(file);
  try {
    return db.pragma('integrity_check', { simple: true }) as string;
  } finally {
    db.close();
  }
}

function expectSaved(cells: [number, number, string][], sent: SentPatch[]) {
  const stored = new Map(cells.map(([r, c, input]) => [`${r}:${c}`, input]));
  for (const p of sent) {
    const found = p.cols.map((col) => stored.get(`${p.row}:${col}`));
    if (p.acknowledgedRevision !== undefined) expect(found).toEqual(p.inputs);
    // Not acknowledged: the server may have committed it before dying, but never only half of it.
    else if (found.some((input) => input !== undefined)) expect(found).toEqual(p.inputs);
  }
}

// One scenario in three steps, sharing two server starts (each start compiles the server with tsx).
describe('a server that is killed, restarted and then stopped while patches stream in', () => {
  const databasePath = path.join(dir, 'orbitab.sqlite');
  const sent: SentPatch[] = [];
  let session: Awaited<ReturnType<typeof signedInWithWorkbook>>;
  let second: Awaited<ReturnType<typeof startOrbitab>>;

  afterAll(() => {
    second?.child.kill('SIGKILL');
  });

  it('leaves a database that passes integrity_check when SIGKILL hits in the middle of the stream', async () => {
    const first = await startOrbitab(databasePath);
    session = await signedInWithWorkbook(first.url);
    const stream = streamPatches(session.client, session.workbookId, session.sheetId, 3, sent);
    await until(() => stream.acknowledged() >= 60, '60 acknowledged patches');
    first.child.kill('SIGKILL'); // with requests still in flight on the other streams
    expect((await first.exited).signal).toBe('SIGKILL');
    await stream.done;

    expect(integrity(databasePath)).toBe('ok');
    const acked = sent.filter((p) => p.acknowledgedRevision !== undefined);
    expect(acked.length).toBeGreaterThanOrEqual(60);
    expect(new Set(acked.map((p) => p.acknowledgedRevision)).size).toBe(acked.length); // one revision each
  }, 60_000);

  it('has every acknowledged change, and no half patch, after a restart on the same file', async () => {
    const { workbookId, sheetId } = session;
    second = await startOrbitab(databasePath);
    const again = apiClient(second.url);
    expect((await again.post('/api/auth/sign-in', { email: 'kim.vesper@example.com', password: 'a long test password' })).status).toBe(200);
    const workbook = await again.get(`/api/workbooks/${workbookId}`);
    expect(workbook.status).toBe(200);
    const acked = sent.filter((p) => p.acknowledgedRevision !== undefined);
    expect(workbook.body.revision).toBeGreaterThanOrEqual(Math.max(...acked.map((p) => p.acknowledgedRevision!)));
    expectSaved(workbook.body.sheets[0].cells, sent);
    // The restarted server goes on taking patches from where the file left off.
    const next = await again.post(`/api/workbooks/${workbookId}/patches`, { baseRevision: workbook.body.revision, changes: [{ sheetId, row: 0, col: 10, input: 'after restart' }] });
    expect(next).toMatchObject({ status: 200, body: { revision: workbook.body.revision + 1 } });
    session = { ...session, client: again };
  }, 60_000);

  it('on SIGTERM finishes the patch it is receiving, refuses new connections, keeps what it acknowledged and exits 0 with the database closed', async () => {
    const { client, workbookId, sheetId } = session;
    const server = second;
    const before = (await client.get(`/api/workbooks/${workbookId}`)).body.revision as number;

    // A patch whose body is only half sent when SIGTERM arrives: it is in flight by any definition.
    const body = JSON.stringify({ baseRevision: before, changes: [{ sheetId, row: 500, col: 0, input: '=UNPAIRED("NO")' }] });
    const half = Math.floor(body.length / 2);
    let inFlightRequest: http.ClientRequest | undefined;
    let halfFlushed = false;
    const inFlight = new Promise<{ status: number; body: string }>((resolve, reject) => {
      const req = http.request(`${server.url}/api/workbooks/${workbookId}/patches`, {
        method: 'POST',
        agent: false,
        headers: { Origin: server.url, Cookie: client.cookie(), 'Content-Type': 'application/json', 'Content-Length': Buffer.byteLength(body) },
      });
      req.on('response', (res) => {
        let text = '';
        res.on('data', (c: Buffer) => (text += c.toString())).on('end', () => resolve({ status: res.statusCode!, body: text }));
      });
      req.on('error', reject);
      req.write(body.slice(0, half), () => (halfFlushed = true));
      inFlightRequest = req;
    });

    const afterRestart: SentPatch[] = [];
    const stream = streamPatches(client, workbookId, sheetId, 2, afterRestart, 1000);
    await until(() => stream.acknowledged() >= 10 && halfFlushed, '10 acknowledged patches and the half request sent');
    // A patch sent after the half request's bytes left this process has been answered: the server
    // has accepted the half request's connection by then.
    const ackedAfterHalf = stream.acknowledged();
    await until(() => stream.acknowledged() >= ackedAfterHalf + 2, 'two more acknowledged patches');
    server.child.kill('SIGTERM');

    // Stopped taking requests: a new connection is refused (soon after the signal).
    let refused = false;
    for (const started = Date.now(); !refused && Date.now() - started < 10_000; ) {
      refused = await fetch(`${server.url}/api/health`).then(() => false, () => true);
      if (!refused) await new Promise((r) => setImmediate(r));
    }
    expect(refused).toBe(true);
    stream.stop();
    inFlightRequest!.end(body.slice(half));
    const finished = await inFlight;
    expect(finished.status).toBe(200);
    expect(JSON.parse(finished.body).revision).toBeGreaterThan(before);

    expect(await server.exited).toEqual({ code: 0, signal: null });
    await stream.done;

    // Closed cleanly: the last connection's close checkpoints the WAL and removes it.
    const wal = `${databasePath}-wal`;
    expect(!fs.existsSync(wal) || fs.statSync(wal).size === 0).toBe(true);
    expect(integrity(databasePath)).toBe('ok');
    const db = new Database(databasePath, { readonly: true });
    const cells = db.prepare('select row, col, input from cells').all() as { row: number; col: number; input: string }[];
    db.close();
    expect(cells).toContainEqual({ row: 500, col: 0, input: '=UNPAIRED("NO")' });
    expectSaved(cells.map((c) => [c.row, c.col, c.input]), [...sent, ...afterRestart]);
  }, 60_000);
});
