// `cli backup <file>`: a consistent copy of the live database, safe to take while the server runs.
import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { describeSummary, inspectDatabaseFile, parseDatabaseArgs } from './databaseFile.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE, type CliCommand, type CliIO } from './io.js';

export const backupUsage = `Usage: cli backup [--database <path>] [--force] <file>

Copies the Orbitab database (DATABASE_PATH, default data/orbitab.sqlite, or --database) into
<file> while the server keeps running, e.g.
  npm run --silent cli -- backup backups/orbitab-2025-01-31.sqlite

The copy is one consistent snapshot: SQLite's online backup API copies every page inside a single
read transaction, so edits saved during the backup are either wholly in it or wholly not. The
copy is then checked with PRAGMA integrity_check and written as one self-contained file.
An existing <file> is kept unless --force is given. Bring a copy back with "cli restore".

Exit status: 0 backed up and checked, 1 it failed (nothing is left at <file>), 2 usage error.`;

/**
 * Returned from the progress callback: copy all remaining pages in the next step. One step holds one
 * read transaction on the source, so a writer on another connection cannot make the copy a mix of
 * before and after (if it writes between steps, SQLite restarts the copy; https://sqlite.org/backup.html).
 */
const allRemainingPages = 0x7fffffff;

export async function runBackup(args: string[], io: CliIO): Promise<number> {
  const parsed = parseDatabaseArgs(args);
  if (parsed.unknown || parsed.missingValue || parsed.positional.length !== 1) {
    const why = parsed.unknown ? `unknown option '${parsed.unknown}'` : parsed.missingValue ? '--database needs a path' : 'give exactly one backup file name';
    io.stderr(`cli backup: ${why}\n\n${backupUsage}`);
    return EXIT_USAGE;
  }
  const target = path.resolve(parsed.positional[0]);
  const source = path.resolve(parsed.database);
  if (target === source) {
    io.stderr('cli backup: the backup file cannot be the database itself');
    return EXIT_USAGE;
  }
  if (!fs.existsSync(source)) {
    io.stderr(`cli backup: there is no database at ${source} (set DATABASE_PATH or pass --database)`);
    return EXIT_FAILED;
  }
  if (fs.existsSync(target) && !parsed.force) {
    io.stderr(`cli backup: ${target} already exists; choose another name or pass --force to replace it`);
    return EXIT_FAILED;
  }
  if (!fs.existsSync(path.dirname(target))) {
    io.stderr(`cli backup: the folder ${path.dirname(target)} does not exist; create it first`);
    return EXIT_FAILED;
  }

  // Written beside the target and renamed into place, so a failed backup never leaves a half file
  // under the name the operator will later restore from.
  const partial = `${target}.partial-${process.pid}`;
  const db = new Database(source, { fileMustExist: true });
  try {
    db.pragma('busy_timeout = 5000');
    await db.backup(partial, { progress: () => allRemainingPages });
  } catch (error) {
    fs.rmSync(partial, { force: true });
    io.stderr(`cli backup: copying ${source} failed: ${(error as Error).message}`);
    return EXIT_FAILED;
  } finally {
    db.close();
  }

  // The copy inherits WAL mode from the source; a backup should be one file that can be moved alone.
  const copy = new Database(partial);
  copy.pragma('journal_mode = DELETE');
  copy.close();

  const check = inspectDatabaseFile(partial);
  if (!check.ok) {
    fs.rmSync(partial, { force: true });
    io.stderr(`cli backup: the copy did not check out, nothing was kept: ${check.problem}`);
    return EXIT_FAILED;
  }
  fs.renameSync(partial, target);
  io.stdout(`backed up ${source} to ${target}: integrity ok; ${describeSummary({ ...check.summary, sizeBytes: fs.statSync(target).size })}`);
  return EXIT_OK;
}

export const backupCommand: CliCommand = {
  summary: 'copy the database consistently while the server runs',
  usage: backupUsage,
  run: runBackup,
};
