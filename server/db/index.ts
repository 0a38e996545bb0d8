import fs from 'node:fs';
import path from 'node:path';
import Database from 'better-sqlite3';
import { drizzle, type BetterSQLite3Database } from 'drizzle-orm/better-sqlite3';
import { migrate } from 'drizzle-orm/better-sqlite3/migrator';
import * as schema from './schema.js';

export type Db = BetterSQLite3Database<typeof schema> & { $client: Database.Database };

export const migrationsFolder = path.resolve(import.meta.dirname, '../../drizzle');

/** Opens (creating if needed) the SQLite file in WAL mode with foreign keys on, and applies migrations. */
export function openDatabase(file: string): Db {
  if (file !== ':memory:') fs.mkdirSync(path.dirname(path.resolve(file)), { recursive: true });
  const sqlite = new Database(file);
  sqlite.pragma('journal_mode = WAL');
  sqlite.pragma('foreign_keys = ON');
  sqlite.pragma('busy_timeout = 5000');
  sqlite.pragma('synchronous = NORMAL');
  const db = drizzle(sqlite, { schema }) as Db;
  migrate(db, { migrationsFolder });
  return db;
}

/** Number of migration files on disk vs applied in the database, for /api/health. */
export function migrationStatus(db: Db) {
  const journal = JSON.parse(fs.readFileSync(path.join(migrationsFolder, 'meta/_journal.json'), 'utf8')) as { entries: unknown[] };
  const applied = (db.$client.prepare('select count(*) as n from __drizzle_migrations').get() as { n: number }).n;
  return { expected: journal.entries.length, applied, current: applied === journal.entries.length };
}
