// `cli restore <backupFile>`: puts a backup in place of the database, keeping the old file beside it.
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { describeSummary, inspectDatabaseFile, parseDatabaseArgs } from './databaseFile.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type CliCommand, type CliIO } from './io.js';

export const restoreUsage = `Usage: cli restore [--database <path>] <backupFile>

Replaces the Orbitab database (DATABASE_PATH, default data/orbitab.sqlite, or --database) with a
file made by "cli backup". Steps:
  1. stop the server (it must not hold the database open; restore refuses while it does)
  2. npm run --silent cli -- restore backups/orbitab-2025-01-31.sqlite
  3. start the server again (it applies any newer migrations to the restored data)

The backup is checked first (PRAGMA integrity_check, and that it is an Orbitab database no newer
than this version); a backup that fails leaves the database untouched. The database it replaces is
kept beside it as <database>.<time>.bak.

Exit status: 0 restored, 1 refused or failed (the database is as it was), 2 usage error.`;

type Claim = { ok: true } | { ok: false; problem: string };

/**
 * Makes sure nothing else has the database open, and folds its write-ahead log into the main file so
 * the old database is one file to set aside. Leaving WAL mode needs the only connection to the file:
 * while a server holds it, SQLite answers SQLITE_BUSY (https://sqlite.org/wal.html#persistence_of_wal_mode).
 */
function claimDatabase(file: string): Claim {
  const db = new Database(file, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 0');
    const mode = db.pragma('journal_mode = DELETE', { simple: true });
    if (mode !== 'delete') return { ok: false, problem: `could not take ${file} out of ${String(mode)} mode` };
    return { ok: true };
  } catch (error) {
    const code = (error as { code?: string }).code;
    if (code === 'SQLITE_BUSY' || code === 'SQLITE_LOCKED') {
      return { ok: false, problem: `${file} is in use (is the Orbitab server running?); stop the server, restore, then start it again` };
    }
    return { ok: false, problem: `${file} cannot be opened: ${(error as Error).message}` };
  } finally {
    db.close();
  }
}

const timeStamp = () => new Date().toISOString().replace(/[:.]/g, '-');

export function runRestore(args: string[], io: CliIO): number {
  const parsed = parseDatabaseArgs(args);
  if (parsed.unknown || parsed.missingValue || parsed.force || parsed.positional.length !== 1) {
    const why = parsed.unknown || parsed.force ? `unknown option '${parsed.unknown ?? '--force'}'` : parsed.missingValue ? '--database needs a path' : 'give exactly one backup file';
    io.stderr(`cli restore: ${why}\n\n${restoreUsage}`);
    return EXIT_USAGE;
  }
  const backup = path.resolve(parsed.positional[0]);
  const target = path.resolve(parsed.database);
  if (backup === target) {
    io.stderr('cli restore: the backup file is the database itself; nothing to do');
    return EXIT_USAGE;
  }

  const check = inspectDatabaseFile(backup);
  if (!check.ok) {
    io.stderr(`cli restore: refused, the database was not touched: ${check.problem}`);
    return EXIT_FAILED;
  }

  let keptAs: string | undefined;
  if (fs.existsSync(target)) {
    const claim = claimDatabase(target);
    if (!claim.ok) {
      io.stderr(`cli restore: refused, the database was not touched: ${claim.problem}`);
      return EXIT_FAILED;
    }
    keptAs = `${target}.${timeStamp()}.bak`;
  } else {
    fs.mkdirSync(path.dirname(target), { recursive: true });
  }

  // Copy first, then two renames in the same folder: at no moment is there a half-written database
  // under the name the server opens.
  const incoming = `${target}.restoring-${process.pid}`;
  fs.copyFileSync(backup, incoming);
  if (keptAs) fs.renameSync(target, keptAs);
  // Stale sidecar files of the old database must not be replayed into the restored one.
  for (const sidecar of ['-wal', '-shm', '-journal']) fs.rmSync(`${target}${sidecar}`, { force: true });
  fs.renameSync(incoming, target);

  const after = inspectDatabaseFile(target);
  if (!after.ok) {
    io.stderr(`cli restore: the restored file did not check out: ${after.problem}${keptAs ? `; the previous database is at ${keptAs}` : ''}`);
    return EXIT_FAILED;
  }
  io.stdout(`restored ${backup} to ${target}: integrity ok; ${describeSummary(after.summary)}`);
  if (keptAs) io.stdout(`the previous database is kept as ${keptAs}`);
  io.stdout('start the server again to use it');
  return EXIT_OK;
}

export const restoreCommand: CliCommand = {
  summary: 'replace the database with a backup (stop the server first)',
  usage: restoreUsage,
  run: runRestore,
};
