// The database's disk fills up under a running server (a small tmpfs mounted for the test, when it
// runs as root): writes and sign-in answer a clear 507/503 JSON error instead of "internal error",
// /api/health says writes fail, a failed import leaves no workbook behind and its first error is
// logged, and once space is back everything works again (and the next start sweeps any leftovers).
import { execFileSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { stagingTitle } from '../server/xlsx/importStaged.js';
import { apiClient, startOrbitab, type OrbitabProcess } from './helpers/orbitabProcess.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-disk-'));
let mounted = false;
if (process.getuid?.() === 0) {
  try {
    execFileSync('mount', ['-t', 'tmpfs', '-o', 'size=24m', 'tmpfs', dir]);
    mounted = true;
  } catch {
    mounted = false;
  }
}

const account = { email: 'noor.halden@example.com', password: 'a long test password', name: 'Noor Halden' };

/** Writes a filler file until the file system refuses (ENOSPC); returns its path. */
function fillDisk(): string {
  const filler = path.join(dir, 'filler.bin');
  const fd = fs.openSync(filler, 'w');
  for (const size of [1024 * 1024, 4096, 512]) {
    const block = Buffer.alloc(size, 7);
    try {
      for (;;) fs.writeSync(fd, block);
    } catch (e) {
      if ((e as NodeJS.ErrnoException).code !== 'ENOSPC') throw e;
    }
  }
  fs.closeSync(fd);
  return filler;
}

async function importCsv(url: string, cookie: string, csv: string) {
  const form = new FormData();
  form.append('file', new Blob([csv], { type: 'text/csv' }), 'spectra.csv');
  const res = await fetch(`${url}/api/imports`, { method: 'POST', headers: { Origin: url, Cookie: cookie }, body: form });
  return { status: res.status, body: await res.json() };
}

describe.skipIf(!mounted)('a full disk under a running server', () => {
  const dbPath = path.join(dir, 'orbitab.db');
  let server: OrbitabProcess;
  beforeAll(async () => {
    server = await startOrbitab(dbPath, { ORBITAB_STORAGE_FAILURE_MS: '1500', LOG_LEVEL: 'error' });
  });
  afterAll(async () => {
    server?.child.kill('SIGKILL');
    await server?.exited;
    if (mounted) execFileSync('umount', ['-l', dir]);
    fs.rmSync(dir, { recursive: true, force: true });
  });

  it('answers writes, sign-in and imports with a storage error, says so in /api/health, and recovers', async () => {
    const client = apiClient(server.url);
    expect((await client.post('/api/auth/sign-up', account)).status).toBe(201);
    const created = await client.post('/api/workbooks', { title: 'Absorption log' });
    expect(created.status).toBe(201);
    const workbookId = created.body.workbook.id as string;
    const sheetId = (await client.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id as string;
    const before = (await client.get('/api/workbooks')).body.workbooks.length as number;

    // An empty write-ahead log first, so every later write needs new space on the disk.
    const probe = new Database(dbPath);
    probe.pragma('wal_checkpoint(TRUNCATE)');
    probe.close();
    const filler = fillDisk();

    const patch = await client.post(`/api/workbooks/${workbookId}/patches`, {
      baseRevision: 0,
      changes: Array.from({ length: 2_000 }, (_, i) => ({ sheetId, row: i, col: 0, input: `λmax reading ${i} ${'·'.repeat(200)}` })),
    });
    expect([507, 503]).toContain(patch.status);
    expect(['storage_full', 'storage_error']).toContain(patch.body.error.code);
    expect(patch.body.error.message).toMatch(/disk/);

    const other = apiClient(server.url);
    const signIn = await other.post('/api/auth/sign-in', { email: account.email, password: account.password });
    expect([507, 503]).toContain(signIn.status);
    expect(signIn.body.error.message).toMatch(/disk/);

    const health = await fetch(`${server.url}/api/health`);
    expect(health.status).toBe(503);
    expect((await health.json()).status).toBe('degraded');

    const csv = Array.from({ length: 5_000 }, (_, r) => `${r},${r * 2},peak ${r}`).join('\n');
    const imported = await importCsv(server.url, client.cookie(), csv);
    expect([507, 503]).toContain(imported.status);
    expect(['storage_full', 'storage_error']).toContain(imported.body.error.code);
    expect((await client.get('/api/workbooks')).body.workbooks.length).toBe(before);
    // The import's own failure is what the log names first.
    expect(server.output()).toMatch(/import failed[^\n]*|SQLITE_FULL|SQLITE_IOERR/);

    fs.rmSync(filler);
    // Health recovers once the remembered failure has aged out (1.5 s here) and space is back.
    for (let i = 0; ; i++) {
      const h = await fetch(`${server.url}/api/health`);
      if (h.status === 200) break;
      expect(i).toBeLessThan(100);
      await new Promise((r) => setTimeout(r, 100));
    }
    expect((await other.post('/api/auth/sign-in', { email: account.email, password: account.password })).status).toBe(200);
    const retried = await importCsv(server.url, client.cookie(), csv);
    expect(retried.status).toBe(201);
    expect((await client.get('/api/workbooks')).body.workbooks.length).toBe(before + 1);

    // A restart sweeps any staging workbook a failed clean-up left; none is left afterwards.
    server.child.kill('SIGTERM');
    await server.exited;
    server = await startOrbitab(dbPath, { LOG_LEVEL: 'error' });
    const db = new Database(dbPath, { readonly: true });
    expect(db.prepare('select count(*) as n from workbooks where title = ? and id not in (select workbook_id from workbook_members)').get(stagingTitle)).toEqual({ n: 0 });
    db.close();
  }, 60_000);
});
