// SQLite's full-disk and I/O errors, injected into the database connection (for machines where the
// tmpfs test in disk-full.test.ts cannot mount): sign-in and writes answer 507/503 with a message,
// never 500 "internal error", and /api/health reports that writes fail.
import Database from 'better-sqlite3';
import { describe, expect, it, vi } from 'vitest';
import { makeTestApp, testPassword } from './helpers/app.js';

function sqliteError(code: string, message: string) {
  return Object.assign(new Database.SqliteError(message, code), {});
}

describe('storage failures as API errors', () => {
  it('answers sign-in and a patch on a full disk with 507 storage_full, and health with writes failing', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const created = await lead.agent.post('/api/workbooks').send({ title: 'Spectra' }).expect(201);
    const id = created.body.workbook.id as string;
    const sheetId = (await lead.agent.get(`/api/workbooks/${id}`)).body.sheets[0].id as string;

    const prepare = t.db.$client.prepare.bind(t.db.$client);
    const spy = vi.spyOn(t.db.$client, 'prepare').mockImplementation(((sql: string) => {
      if (/^\s*(insert|update|delete)/i.test(sql)) throw sqliteError('SQLITE_FULL', 'database or disk is full');
      return prepare(sql);
    }) as never);
    try {
      const signIn = await t.agent().post('/api/auth/sign-in').send({ email: 'lead@lab.test', password: testPassword });
      expect(signIn.status).toBe(507);
      expect(signIn.body.error.code).toBe('storage_full');
      expect(signIn.body.error.message).toMatch(/disk is full, so nothing was saved/);

      const patch = await lead.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: 0, changes: [{ sheetId, row: 0, col: 0, input: '1' }] });
      expect([patch.status, patch.body.error.code]).toEqual([507, 'storage_full']);

      const health = await t.agent().get('/api/health');
      expect(health.status).toBe(503);
      expect(health.body.status).toBe('degraded');
    } finally {
      spy.mockRestore();
    }
  });

  it('answers an I/O error with 503 storage_error', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const prepare = t.db.$client.prepare.bind(t.db.$client);
    const spy = vi.spyOn(t.db.$client, 'prepare').mockImplementation(((sql: string) => {
      if (/^\s*insert/i.test(sql)) throw sqliteError('SQLITE_IOERR_WRITE', 'disk I/O error');
      return prepare(sql);
    }) as never);
    try {
      const created = await lead.agent.post('/api/workbooks').send({ title: 'Spectra' });
      expect([created.status, created.body.error.code]).toEqual([503, 'storage_error']);
    } finally {
      spy.mockRestore();
    }
  });
});
