// `cli backup` and `cli restore`: a consistent copy taken while another process keeps writing, and
// a restore that checks the copy, refuses while the database is in use and keeps the old file.
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { main } from '../server/cli.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE } from '../server/cli/io.js';
import { openDatabase } from '../server/db/index.js';

async function cli(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, stdout: out.join('\n'), stderr: err.join('\n') };
}

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-backup-'));
const live = path.join(dir, 'live.sqlite');
const copy = path.join(dir, 'copy.sqlite');

/**
 * Another process that writes in a loop, the way the server does: one transaction per step, each
 * inserting a pair of audit rows. A consistent snapshot holds whole pairs only, numbered 1..n.
 */
const writerScript = `
const Database = require('better-sqlite3');
const db = new Database(process.argv[1]);
db.pragma('journal_mode = WAL');
db.pragma('busy_timeout = 5000');
const add = db.prepare("insert into audit_log (action, details) values (?, ?)");
const pair = db.transaction((n) => { add.run('tick.a', JSON.stringify({ n })); add.run('tick.b', JSON.stringify({ n })); });
let n = 0;
(function step() { for (let i = 0; i < 20; i++) { pair(++n); } process.stdout.write(n + '\\n'); setImmediate(step); })();
`;

function startWriter(file: string): { child: ChildProcess; committed: () => number } {
  const child = spawn(process.execPath, ['-e', writerScript, file], { cwd: process.cwd(), stdio: ['ignore', 'pipe', 'inherit'] });
  let last = 0;
  child.stdout!.setEncoding('utf8').on('data', (chunk: string) => {
    const lines = chunk.trim().split('\n');
    last = Number(lines[lines.length - 1]);
  });
  return { child, committed: () => last };
}

const until = async (condition: () => boolean, what: string, timeoutMs = 5000) => {
  const start = Date.now();
  while (!condition()) {
    if (Date.now() - start > timeoutMs) throw new Error(`timed out waiting for ${what}`);
    await new Promise((r) => setTimeout(r, 10));
  }
};

function ticks(file: string) {
  const db = new Database(file, { readonly: true });
  try {
    const rows = db.prepare(`select action, json_extract(details, '$.n') as n from audit_log where action like 'tick.%' order by n`).all() as { action: string; n: number }[];
    const integrity = db.pragma('integrity_check', { simple: true });
    return { a: rows.filter((r) => r.action === 'tick.a').map((r) => r.n), b: rows.filter((r) => r.action === 'tick.b').map((r) => r.n), integrity };
  } finally {
    db.close();
  }
}

let committedBefore = 0;
let committedAfter = 0;
let backupResult: Awaited<ReturnType<typeof cli>>;

beforeAll(async () => {
  // A few megabytes, so the copy is many pages while the writer keeps committing.
  const db = openDatabase(live);
  const filler = db.$client.prepare(`insert into audit_log (action, details) values ('filler', ?)`);
  db.$client.transaction(() => {
    for (let i = 0; i < 1500; i++) filler.run(JSON.stringify({ i, text: 'x'.repeat(2000) }));
  })();
  db.$client.close();

  const writer = startWriter(live);
  await until(() => writer.committed() >= 200, 'the writer to start committing');
  committedBefore = writer.committed();
  backupResult = await cli('backup', '--database', live, copy);
  await until(() => writer.committed() > committedBefore + 200, 'the writer to go on after the backup');
  writer.child.kill('SIGKILL');
  await new Promise((r) => writer.child.once('exit', r));
  committedAfter = ticks(live).a.length;
}, 20_000);

afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

describe('cli backup', () => {
  it('copies the database while another process writes, and says it checked out', () => {
    expect(backupResult.stderr).toBe('');
    expect(backupResult.code).toBe(EXIT_OK);
    expect(backupResult.stdout).toMatch(/^backed up .*live\.sqlite to .*copy\.sqlite: integrity ok; 0 users, 0 workbooks/);
  });

  it('writes one self-contained file that passes PRAGMA integrity_check', () => {
    expect(fs.existsSync(`${copy}-wal`)).toBe(false);
    const db = new Database(copy, { readonly: true });
    expect(db.pragma('journal_mode', { simple: true })).toBe('delete');
    db.close();
    expect(ticks(copy).integrity).toBe('ok');
  });

  it('holds a snapshot: every transaction committed before it started, whole transactions only, no gaps', () => {
    const { a, b } = ticks(copy);
    expect(a.length).toBeGreaterThanOrEqual(committedBefore);
    expect(a.length).toBeLessThan(committedAfter); // the writer went on after the snapshot
    expect(b).toEqual(a); // never half of a pair
    expect(a).toEqual(Array.from({ length: a.length }, (_, i) => i + 1));
    const filler = new Database(copy, { readonly: true });
    expect((filler.prepare(`select count(*) as n from audit_log where action = 'filler'`).get() as { n: number }).n).toBe(1500);
    filler.close();
  });

  it('keeps an existing file unless --force is given', async () => {
    const other = path.join(dir, 'taken.sqlite');
    fs.writeFileSync(other, 'precious');
    const refused = await cli('backup', '--database', live, other);
    expect(refused.code).toBe(EXIT_FAILED);
    expect(refused.stderr).toContain('already exists; choose another name or pass --force');
    expect(fs.readFileSync(other, 'utf8')).toBe('precious');
    expect((await cli('backup', '--database', live, '--force', other)).code).toBe(EXIT_OK);
  });

  it('names what is wrong with the arguments', async () => {
    expect(await cli('backup')).toMatchObject({ code: EXIT_USAGE, stderr: expect.stringContaining('give exactly one backup file name') });
    expect(await cli('backup', '--database', path.join(dir, 'absent.sqlite'), path.join(dir, 'x.sqlite'))).toMatchObject({
      code: EXIT_FAILED,
      stderr: expect.stringContaining('there is no database at'),
    });
  });
});

describe('cli restore', () => {
  it('refuses while another connection (a running server) holds the database, and leaves it as it was', async () => {
    const server = new Database(live);
    server.pragma('journal_mode = WAL');
    try {
      const result = await cli('restore', '--database', live, copy);
      expect(result.code).toBe(EXIT_FAILED);
      expect(result.stderr).toContain('is in use (is the Orbitab server running?); stop the server, restore, then start it again');
    } finally {
      server.close();
    }
    expect(ticks(live).a.length).toBe(committedAfter);
  });

  it('refuses a damaged backup and a database that is not Orbitab\'s, without touching the database', async () => {
    const truncated = path.join(dir, 'truncated.sqlite');
    fs.writeFileSync(truncated, fs.readFileSync(copy).subarray(0, 64 * 1024));
    const garbage = path.join(dir, 'garbage.sqlite');
    fs.writeFileSync(garbage, 'this is a shopping list, not a database\n'.repeat(200));
    const foreign = path.join(dir, 'foreign.sqlite');
    const f = new Database(foreign);
    f.exec('create table notes (body text)');
    f.close();

    for (const [file, message] of [
      [truncated, /fails SQLite's integrity check|cannot be read as an SQLite database/],
      [garbage, /cannot be read as an SQLite database/],
      [foreign, /is an SQLite database but not an Orbitab one \(no "__drizzle_migrations" table\)/],
    ] as const) {
      const result = await cli('restore', '--database', live, file);
      expect(result.code).toBe(EXIT_FAILED);
      expect(result.stderr).toMatch(/refused, the database was not touched/);
      expect(result.stderr).toMatch(message);
    }
    expect(ticks(live).a.length).toBe(committedAfter);
  });

  it('brings the backed-up rows back and keeps the replaced database as a .bak file', async () => {
    const backedUp = ticks(copy).a;
    const result = await cli('restore', '--database', live, copy);
    expect(result.stderr).toBe('');
    expect(result.code).toBe(EXIT_OK);
    expect(result.stdout).toContain('integrity ok');

    const restored = ticks(live);
    expect(restored.integrity).toBe('ok');
    expect(restored.a).toEqual(backedUp);

    const kept = fs.readdirSync(dir).filter((f) => /^live\.sqlite\..*\.bak$/.test(f));
    expect(kept).toHaveLength(1);
    expect(result.stdout).toContain(`the previous database is kept as ${path.join(dir, kept[0])}`);
    expect(ticks(path.join(dir, kept[0])).a.length).toBe(committedAfter);

    // The server opens the restored file as usual: WAL again, migrations current.
    const reopened = openDatabase(live);
    expect(reopened.$client.pragma('journal_mode', { simple: true })).toBe('wal');
    reopened.$client.close();
  });
});
