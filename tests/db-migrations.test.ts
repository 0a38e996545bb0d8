// Upgrading databases made by older releases: cells rebuilt WITHOUT ROWID (0001), verified
// addresses (0002), sheet locks turned into sheet roles (0003).
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import { afterAll, describe, expect, it } from 'vitest';
import { migrationsFolder, openDatabase } from '../server/db/index.js';
import { loadProtection } from '../server/services/protection.js';
import { editBlock } from '../shared/team.js';
import type { WorkbookRole } from '../shared/permissions.js';

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

describe('migration 0003: sheet locks become sheet roles', () => {
  // Who could edit a cell before 0003, written out independently of the code under test: a
  // workbook viewer never; on a locked sheet only those the lock listed; inside a protected range
  // only those the range listed.
  interface OldState {
    roles: Record<string, string>;
    locks: Record<string, string[]>;
    ranges: { sheet: string; top: number; left: number; bottom: number; right: number; editors: string[] }[];
  }
  function couldEditBefore(s: OldState, user: string, sheet: string, row: number, col: number): boolean {
    if (!s.roles[user] || s.roles[user] === 'viewer') return false;
    if (s.locks[sheet] && !s.locks[sheet].includes(user)) return false;
    return !s.ranges.some((r) => r.sheet === sheet && row >= r.top && row <= r.bottom && col >= r.left && col <= r.right && !r.editors.includes(user));
  }

  it('lets the same people edit the same cells, and keeps reasons and audit entries', () => {
    const file = path.join(dir, 'locks.db');
    const old = new Database(file);
    old.pragma('foreign_keys = ON');
    migrate(drizzle(old), { migrationsFolder: olderMigrations(3) });
    const people = ['ann', 'bob', 'cara', 'dan', 'vic'];
    old.exec(`insert into users (id, email, name, password_hash) values ${people.map((p) => `('${p}', '${p}@lab.test', '${p}', 'x')`).join(', ')}`);
    old.exec(`insert into workbooks (id, title, owner_id) values ('w', 'Screen', 'ann')`);
    // Dan was listed on a lock as an editor and made a viewer since: he could not edit, and must not now.
    const state: OldState = {
      roles: { ann: 'owner', bob: 'editor', cara: 'editor', dan: 'viewer', vic: 'viewer' },
      locks: { settled: ['ann', 'bob'], bench: ['bob', 'dan'] },
      ranges: [
        { sheet: 'open', top: 0, left: 0, bottom: 1, right: 1, editors: ['ann', 'cara'] },
        { sheet: 'bench', top: 2, left: 0, bottom: 2, right: 3, editors: ['bob'] },
      ],
    };
    old.exec(`insert into workbook_members (workbook_id, user_id, role) values ${Object.entries(state.roles).map(([u, r]) => `('w', '${u}', '${r}')`).join(', ')}`);
    old.exec(`insert into sheets (id, workbook_id, name, position, created_by) values ('settled', 'w', 'Settled', 0, 'ann'), ('open', 'w', 'Open', 1, 'ann'), ('bench', 'w', 'Bench', 2, 'bob')`);
    old.exec(`insert into sheet_locks (sheet_id, locked_by, reason, editors, created_at) values
      ('settled', 'ann', 'values checked against the handbook', '["ann","bob"]', 1000),
      ('bench', 'bob', 'bench results pending review', '["bob","dan"]', 2000)`);
    const insertRange = old.prepare('insert into protected_ranges (id, sheet_id, range, editors, created_by) values (?, ?, ?, ?, ?)');
    insertRange.run('r1', 'open', 'A1:B2', JSON.stringify(['ann', 'cara']), 'ann');
    insertRange.run('r2', 'bench', 'A3:D3', JSON.stringify(['bob']), 'bob');
    old.exec(`insert into audit_log (workbook_id, actor_id, action, details) values ('w', 'ann', 'sheet.locked', '{"sheetId":"settled"}'), ('w', 'bob', 'sheet.locked', '{"sheetId":"bench"}')`);
    old.close();

    const db = openDatabase(file);
    try {
      const protection = loadProtection(db, 'w');
      let compared = 0;
      for (const user of people) {
        for (const sheet of ['settled', 'open', 'bench']) {
          for (let row = 0; row < 4; row++) {
            for (let col = 0; col < 4; col++) {
              const now = editBlock(protection, { id: user, role: state.roles[user] as WorkbookRole }, sheet, row, col) === null;
              expect(now, `${user} on ${sheet} ${row},${col}`).toBe(couldEditBefore(state, user, sheet, row, col));
              compared++;
            }
          }
        }
      }
      expect(compared).toBe(5 * 3 * 16);
      expect(protection.locks.map((l) => [l.sheetId, l.reason, l.lockedBy.id, l.editors.map((e) => e.id)])).toEqual([
        ['settled', 'values checked against the handbook', 'ann', ['ann', 'bob']],
        ['bench', 'bench results pending review', 'bob', ['bob']],
      ]);
      expect(protection.sheetRoles.flatMap((s) => s.overrides.map((o) => [s.sheetId, o.user.id, o.role, o.viaLock, o.setBy.id]))).toEqual([
        ['settled', 'ann', 'editor', true, 'ann'],
        ['settled', 'bob', 'editor', true, 'ann'],
        ['bench', 'bob', 'editor', true, 'bob'],
      ]);
      expect(protection.protectedRanges.map((r) => [r.range, r.editors.map((e) => e.id)])).toEqual([
        ['A1:B2', ['ann', 'cara']],
        ['A3:D3', ['bob']],
      ]);
      expect((db.$client.prepare(`select count(*) n from audit_log where action = 'sheet.locked'`).get() as { n: number }).n).toBe(2);
      expect(db.$client.pragma('integrity_check', { simple: true })).toBe('ok');
    } finally {
      db.$client.close();
    }
  });
});
