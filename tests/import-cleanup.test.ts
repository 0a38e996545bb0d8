// An import that fails while being stored leaves nothing behind: no new workbook, no sheet in the
// workbook it was going into, and the log names the import's own error first (not a clean-up's).
import Database from 'better-sqlite3';
import { describe, expect, it, vi } from 'vitest';
import { sweepStagedImports } from '../server/xlsx/importStaged.js';
import { makeTestApp } from './helpers/app.js';

const csv = Array.from({ length: 3_000 }, (_, r) => `${r},${(r * 0.5).toFixed(1)},band ${r}`).join('\n');

function failCellInserts(db: Database.Database, alsoDeletes = false) {
  const prepare = db.prepare.bind(db);
  return vi.spyOn(db, 'prepare').mockImplementation(((sql: string) => {
    if (/insert into cells/i.test(sql) || (alsoDeletes && /^\s*delete from cells/i.test(sql))) throw new Database.SqliteError('database or disk is full', 'SQLITE_FULL');
    return prepare(sql);
  }) as never);
}

const counts = (db: Database.Database) => db.prepare('select (select count(*) from workbooks) as workbooks, (select count(*) from sheets) as sheets, (select count(*) from cells) as cells').get();

describe('a failed import', () => {
  it('leaves no workbook behind and logs its first error', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const before = counts(t.db.$client);
    const logged = vi.spyOn(t.ctx.logger, 'error');
    const spy = failCellInserts(t.db.$client);
    try {
      const res = await lead.agent.post('/api/imports').attach('file', Buffer.from(csv), 'bands.csv');
      expect([res.status, res.body.error.code]).toEqual([507, 'storage_full']);
    } finally {
      spy.mockRestore();
    }
    expect(counts(t.db.$client)).toEqual(before);
    expect((await lead.agent.get('/api/workbooks')).body.workbooks).toEqual([]);
    const first = logged.mock.calls[0] as unknown as [{ err: { code?: string } }, string];
    expect(first[1]).toMatch(/^import failed/);
    expect(first[0].err.code).toBe('SQLITE_FULL');
  });

  it('adds no sheet to the workbook it was going into', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const id = (await lead.agent.post('/api/workbooks').send({ title: 'Bands' }).expect(201)).body.workbook.id as string;
    const before = counts(t.db.$client);
    const spy = failCellInserts(t.db.$client);
    try {
      const res = await lead.agent.post('/api/imports').field('workbookId', id).attach('file', Buffer.from(csv), 'bands.csv');
      expect(res.status).toBe(507);
    } finally {
      spy.mockRestore();
    }
    expect(counts(t.db.$client)).toEqual(before);
    const wb = (await lead.agent.get(`/api/workbooks/${id}`)).body;
    expect([wb.revision, wb.sheets.map((s: { name: string }) => s.name)]).toEqual([0, ['Screen1']]);
  });

  it('when the clean-up fails too, logs the import\'s error first, shows no one the leftover, and the next start removes it', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const before = counts(t.db.$client);
    const logged = vi.spyOn(t.ctx.logger, 'error');
    const spy = failCellInserts(t.db.$client, true);
    try {
      const res = await lead.agent.post('/api/imports').attach('file', Buffer.from(csv), 'bands.csv');
      expect(res.status).toBe(507);
    } finally {
      spy.mockRestore();
    }
    expect((logged.mock.calls[0] as unknown as [unknown, string])[1]).toMatch(/^import failed/);
    expect((logged.mock.calls[1] as unknown as [unknown, string])[1]).toMatch(/removing a failed import failed too/);
    expect((await lead.agent.get('/api/workbooks')).body.workbooks).toEqual([]);
    expect(await sweepStagedImports(t.ctx)).toBe(1);
    expect(counts(t.db.$client)).toEqual(before);
  });
});
