// Upgrading a database made before 0001 (cells as a rowid table): the cells survive the rebuild as a
// WITHOUT ROWID table, keep their key and foreign key, and a fresh database gets the same table.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { afterAll, describe, expect, it } from 'vitest';
import { migrationsFolder, openDatabase } from '../server/db/index.js';

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-migrations-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** A copy of the migrations folder holding only the first `n` migrations, as an older release had. */
function olderMigrations(n: number): string {
  const folder = path.join(dir, `migrations-${n}`);
  fs.mkdirSync(path.join(folder, 'meta'), { recursive: true });
  const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta/_journal.json'), 'utf8')) as { entries: { tag: string }[] };
  const kept = journal.entries.slice(0, n);
  fs.writeFileSync(path.join(folder, 'meta/_journal.json'), JSON.stringify({ ...journal, entries: kept }));
  for (const e of kept) fs.copyFileSync(path.join(migrationsFolder, `${e.tag}.sql`), path.join(folder, `${e.tag}.sql`));
  return folder;
}

const tableSql = (sqlite: Database.Database) => (sqlite.prepare(`select sql from sqlite_master where type = 'table' and name = 'cells'`).get() as { sql: string }).sql;

describe('migration 0001: cells WITHOUT ROWID', () => {
  it('keeps every cell of a database made at 0000, with key and cascade intact', () => {
    const file = path.join(dir, 'old.db');
    const old = new Database(file);
    old.pragma('foreign_keys = ON');
    migrate(drizzle(old), { migrationsFolder: olderMigrations(1) });
    expect(tableSql(old)).not.toMatch(/WITHOUT ROWID/i);
    old.exec(`insert into users (id, email, name, password_hash) values ('u1', 'a@example.com', 'A', 'x')`);
    old.exec(`insert into workbooks (id, title, owner_id) values ('w1', 'Old', 'u1')`);
    old.exec(`insert into sheets (id, workbook_id, name, position) values ('s1', 'w1', 'Sheet1', 0), ('s2', 'w1', 'Sheet2', 1)`);
    const insert = old.prepare('insert into cells (sheet_id, row, col, input, revision) values (?, ?, ?, ?, ?)');
    const before: [string, number, number, string, number][] = [];
    for (let r = 0; r < 50; r++) for (let c = 0; c < 4; c++) before.push([r % 2 ? 's2' : 's1', r, c, c === 1 ? `=BONDORDER(A${r + 1})` : `v${r}.${c}`, 1 + (r % 3)]);
    for (const row of before) insert.run(...row);
    old.close();

    const db = openDatabase(file);
    try {
      const sqlite = db.$client;
      expect(tableSql(sqlite)).toMatch(/WITHOUT ROWID/i);
      const after = sqlite.prepare('select sheet_id, row, col, input, revision from cells order by sheet_id, row, col').raw().all();
      const sorted = [...before].sort((a, b) => a[0].localeCompare(b[0]) || a[1] - b[1] || a[2] - b[2]);
      expect(after).toEqual(sorted);
      expect(() => sqlite.prepare(`insert into cells (sheet_id, row, col, input, revision) values ('s1', 0, 0, 'dup', 2)`).run()).toThrow(/UNIQUE|PRIMARY KEY/);
      expect(() => sqlite.prepare(`insert into cells (sheet_id, row, col, input, revision) values ('nope', 0, 0, 'x', 1)`).run()).toThrow(/FOREIGN KEY/);
      sqlite.prepare(`delete from sheets where id = 's2'`).run();
      expect((sqlite.prepare(`select count(*) n from cells where sheet_id = 's2'`).get() as { n: number }).n).toBe(0);
      expect((sqlite.prepare(`select count(*) n from cells where sheet_id = 's1'`).get() as { n: number }).n).toBe(100);
      expect(sqlite.pragma('integrity_check', { simple: true })).toBe('ok');
    } finally {
      db.$client.close();
    }
  });

  it('gives a new database the same table', () => {
    const db = openDatabase(path.join(dir, 'new.db'));
    try {
      expect(tableSql(db.$client)).toMatch(/WITHOUT ROWID/i);
    } finally {
      db.$client.close();
    }
  });
});

describe('migration 0002: verified addresses', () => {
  it('marks admins and members of shared workbooks verified, records earlier config promotions, and lower-cases addresses', () => {
    const file = path.join(dir, 'accounts.db');
    const old = new Database(file);
    old.pragma('foreign_keys = ON');
    migrate(drizzle(old), { migrationsFolder: olderMigrations(2) });
    old.exec(`insert into users (id, email, name, password_hash, site_role) values
      ('admin', 'root@lab.test', 'Root', 'x', 'admin'),
      ('owner', 'Ann@Lab.test', 'Ann', 'x', 'member'),
      ('peer', 'bob@lab.test', 'Bob', 'x', 'member'),
      ('alone', 'solo@lab.test', 'Solo', 'x', 'member'),
      ('ops', 'ops@lab.test', 'Ops', 'x', 'member')`);
    old.exec(`insert into workbooks (id, title, owner_id) values ('shared', 'Shared', 'owner'), ('mine', 'Mine', 'alone')`);
    old.exec(`insert into workbook_members (workbook_id, user_id, role) values ('shared', 'owner', 'owner'), ('shared', 'peer', 'editor'), ('mine', 'alone', 'owner')`);
    old.exec(`insert into audit_log (actor_id, action, details) values ('ops', 'site.user_promoted_by_config', '{}')`);
    old.close();

    const db = openDatabase(file);
    try {
      const rows = db.$client.prepare('select id, email, email_verified_at, config_promoted_at from users order by id').all() as { id: string; email: string; email_verified_at: number | null; config_promoted_at: number | null }[];
      const byId = Object.fromEntries(rows.map((r) => [r.id, r]));
      expect(byId.admin.email_verified_at).not.toBeNull();
      expect(byId.owner.email_verified_at).not.toBeNull();
      expect(byId.peer.email_verified_at).not.toBeNull();
      expect(byId.alone.email_verified_at).toBeNull(); // asked at the next sign-in
      expect(byId.ops.config_promoted_at).not.toBeNull(); // the operator's promotion already happened
      expect(byId.owner.email).toBe('ann@lab.test');
    } finally {
      db.$client.close();
    }
  });
});
