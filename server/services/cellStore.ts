// Cell rows inside a transaction. Cells are sparse; a cleared cell stays as '' with the revision that
// cleared it, so a later patch based on an older revision still sees the clearing as a conflict.
import { and, asc, eq, ne } from 'drizzle-orm';
import type { CellEntry } from '../../shared/workbooks.js';
import { maxColIndex } from '../../shared/a1.js';
import type { Db } from '../db/index.js';
import { cells } from '../db/schema.js';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

// The statements of patches and restores, on the driver itself and prepared once per connection:
// building the SQL on every call made a 10,000-cell patch take ~2.1 s (~0.4 s prepared), and the
// query builder's per-call mapping was a good part of what remained. A statement prepared on the
// connection runs inside whatever transaction is open on it. Reading goes by the patch's own
// [row, col] pairs (json_each joined to the primary key), one query per sheet, so it costs what the
// patch touches, not what the sheet holds.
const rawStatements = (db: Db) => ({
  readMany: db.$client
    .prepare<[string, string], [number, string, number]>(
      'select j.key, c.input, c.revision from json_each(?) j cross join cells c on c.sheet_id = ? and c.row = (j.value >> 11) and c.col = (j.value & 2047)',
    )
    .raw(),
  write: db.$client.prepare<[string, number, number, string, number]>(
    'insert into cells (sheet_id, row, col, input, revision) values (?, ?, ?, ?, ?) on conflict (sheet_id, row, col) do update set input = excluded.input, revision = excluded.revision',
  ),
});
if (maxColIndex >= 2048) throw new Error('readCells packs a column into 11 bits: widen it');
const prepared = new WeakMap<Db, ReturnType<typeof rawStatements>>();

function raw(db: Db) {
  let s = prepared.get(db);
  if (!s) prepared.set(db, (s = rawStatements(db)));
  return s;
}

/**
 * The stored input and revision of each of `places` on one sheet, in the same order (undefined where
 * no row exists). Call inside a transaction opened on `db`.
 */
export function readCells(db: Db, sheetId: string, places: readonly { row: number; col: number }[]): ({ input: string; revision: number } | undefined)[] {
  const found: ({ input: string; revision: number } | undefined)[] = new Array(places.length).fill(undefined);
  // Each place as one number, row × 2048 + col (columns stop at 1,999): a flat JSON array of
  // numbers is quicker to build and for SQLite to read than one of pairs.
  let packed = '[';
  for (let i = 0; i < places.length; i++) packed += `${i ? ',' : ''}${places[i].row * 2048 + places[i].col}`;
  for (const [i, input, revision] of raw(db).readMany.all(`${packed}]`, sheetId)) found[i] = { input, revision };
  return found;
}

/** Writes many cells of one revision. Call inside a transaction opened on `db`. */
export function writeCells(db: Db, revision: number, changes: readonly { sheetId: string; row: number; col: number; after: string }[]): void {
  const write = raw(db).write;
  for (const c of changes) write.run(c.sheetId, c.row, c.col, c.after, revision);
}

/** Inserts a new sheet's cells, many rows per statement. */
export function insertCells(tx: Tx, sheetId: string, entries: CellEntry[], revision: number): void {
  // 500 rows × 5 values stays far below SQLite's limit on bound parameters.
  for (let i = 0; i < entries.length; i += 500) {
    tx.insert(cells)
      .values(entries.slice(i, i + 500).map(([row, col, input]) => ({ sheetId, row, col, input, revision })))
      .run();
  }
}

/** The sheet's non-empty cells in reading order. */
export function sheetCells(tx: Tx | Db, sheetId: string): CellEntry[] {
  return tx
    .select({ row: cells.row, col: cells.col, input: cells.input })
    .from(cells)
    .where(and(eq(cells.sheetId, sheetId), ne(cells.input, '')))
    .orderBy(asc(cells.row), asc(cells.col))
    .all()
    .map((c): CellEntry => [c.row, c.col, c.input]);
}
