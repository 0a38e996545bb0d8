// What backup and restore need to know about an SQLite file before trusting it: does it open, does
// it pass SQLite's own integrity check, is it an Orbitab database this version can run, and what is
// in it (a one-line summary for the operator).
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { loadConfig } from '../config.js';
import { migrationsFolder } from '../db/index.js';

export interface DatabaseSummary {
  users: number;
  workbooks: number;
  cells: number;
  revisions: number;
  migrationsApplied: number;
  sizeBytes: number;
}

export type Inspection = { ok: true; summary: DatabaseSummary } | { ok: false; problem: string };

/** The number of migrations this version of Orbitab ships (drizzle/meta/_journal.json). */
export function migrationsShipped(): number {
  const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta/_journal.json'), 'utf8')) as { entries: unknown[] };
  return journal.entries.length;
}

const countOf = (db: Database.Database, sql: string) => (db.prepare(sql).get() as { n: number }).n;

/**
 * Opens the file read-only and checks it from the first page to the last (PRAGMA integrity_check,
 * which reads every page and index; https://sqlite.org/pragma.html#pragma_integrity_check).
 */
export function inspectDatabaseFile(file: string): Inspection {
  if (!fs.existsSync(file)) return { ok: false, problem: `${file} does not exist` };
  let db: Database.Database | undefined;
  try {
    db = new Database(file, { readonly: true, fileMustExist: true });
    const integrity = db.pragma('integrity_check', { simple: false }) as { integrity_check: string }[];
    const problems = integrity.map((r) => r.integrity_check).filter((m) => m !== 'ok');
    if (problems.length > 0) return { ok: false, problem: `${file} fails SQLite's integrity check: ${problems.slice(0, 3).join('; ')}` };
    const tables = new Set((db.prepare(`select name from sqlite_master where type = 'table'`).all() as { name: string }[]).map((t) => t.name));
    for (const required of ['__drizzle_migrations', 'users', 'workbooks', 'cells', 'revisions']) {
      if (!tables.has(required)) return { ok: false, problem: `${file} is an SQLite database but not an Orbitab one (no "${required}" table)` };
    }
    const migrationsApplied = countOf(db, 'select count(*) as n from __drizzle_migrations');
    const shipped = migrationsShipped();
    if (migrationsApplied > shipped) {
      return { ok: false, problem: `${file} was made by a newer Orbitab (${migrationsApplied} migrations applied, this version knows ${shipped}); upgrade Orbitab first` };
    }
    return {
      ok: true,
      summary: {
        users: countOf(db, 'select count(*) as n from users'),
        workbooks: countOf(db, 'select count(*) as n from workbooks'),
        cells: countOf(db, `select count(*) as n from cells where input <> ''`),
        revisions: countOf(db, 'select count(*) as n from revisions'),
        migrationsApplied,
        sizeBytes: fs.statSync(file).size,
      },
    };
  } catch (error) {
    // SQLITE_NOTADB and friends: the file is not a database at all, or is damaged beyond opening.
    return { ok: false, problem: `${file} cannot be read as an SQLite database (${(error as Error).message})` };
  } finally {
    db?.close();
  }
}

export function describeSummary(s: DatabaseSummary): string {
  const kib = (s.sizeBytes / 1024).toFixed(0);
  return `${s.users} users, ${s.workbooks} workbooks, ${s.cells} cells, ${s.revisions} revisions; ${kib} KiB`;
}

/** Splits `--database <path>` and `--force` from the positional arguments. */
export function parseDatabaseArgs(args: string[]): { database: string; force: boolean; positional: string[]; unknown?: string; missingValue?: boolean } {
  let database: string | undefined;
  let force = false;
  const positional: string[] = [];
  for (let i = 0; i < args.length; i++) {
    const arg = args[i];
    if (arg === '--database') {
      database = args[++i];
      if (database === undefined) return { database: '', force, positional, missingValue: true };
    } else if (arg.startsWith('--database=')) database = arg.slice('--database='.length);
    else if (arg === '--force') force = true;
    else if (arg.startsWith('--')) return { database: '', force, positional, unknown: arg };
    else positional.push(arg);
  }
  // The same file the server opens: DATABASE_PATH, or its default.
  return { database: database ?? loadConfig().databasePath, force, positional };
}
