// Cell rows inside a transaction. Cells are sparse; a cleared cell stays as '' with the revision that
// cleared it, so a later patch based on an older revision still sees the clearing as a conflict.
import { and, asc, eq, ne } from 'drizzle-orm';
import type { CellEntry } from '../../shared/workbooks.js';
import { maxColIndex } from '../../shared/a1.js';
import type { Db } from '../db/index.js';
import { cells } from '../db/schema.js';

export type Tx = Parameters<Parameters<Db['transaction']>[0]>[0];

// The statements of patches and restores, on the driver itself and prepared once per connection.
// Both are set-based: the cells travel as one JSON text and SQLite walks it with json_each, so the
// per-cell loop runs in C. Timed apart at 50,000 cells on a loaded machine, the read fell from ~130 to
// ~60 ms of CPU and the write from ~190 to ~115 ms against one call per cell. The read answers with
// JSON arrays (places, inputs, revisions), since handing 50,000 rows across to JS one by one was most
// of its cost. A
// statement prepared on the connection runs inside whatever transaction is open on it. Reading goes
// by the patch's own places (json_each joined to the primary key), so it costs what the patch
// touches, not what the sheet holds.
const rawStatements = (db: Db) => ({
  readMany: db.$client
    .prepare<[string, string], [string, string, string]>(
      `select json_group_array(j.key), json_group_array(coalesce(c.input, '')), json_group_array(coalesce(c.revision, -1))
       from json_each(?) j left join cells c on c.sheet_id = ? and c.row = (j.value >> 11) and c.col = (j.value & 2047)`,
    )
    .raw(),
  // "where true" keeps SQLite from reading "on conflict" as part of the select's join.
  writeMany: db.$client.prepare<[string, number, string]>(
    `insert into cells (sheet_id, row, col, input, revision)
     select ?, j.value ->> 0 >> 11, j.value ->> 0 & 2047, j.value ->> 1, ? from json_each(?) j where true
     on conflict (sheet_id, row, col) do update set input = excluded.input, revision = excluded.revision`,
  ),
});
if (maxColIndex >= 2048) throw new Error('readCells packs a column into 11 bits: widen it');
const prepared = new WeakMap<Db, ReturnType<typeof rawStatements>>();

function raw(db: Db) {
  let s = prepared.get(db);
  if (!s) prepared.set(db, (s = rawStatements(db)));
  return s;
}

/** Each place as one number, row × 2048 + col (columns stop at 1,999). */
export const placeNumber = (p: { row: number; col: number }) => p.row * 2048 + p.col;

/**
 * The stored input and revision of each of `places` on one sheet, in the same order (undefined where
 * no row exists). Call inside a transaction opened on `db`.
 */
export function readCells(db: Db, sheetId: string, places: readonly { row: number; col: number }[]): ({ input: string; revision: number } | undefined)[] {
  // A flat JSON array of numbers is quicker to build and for SQLite to read than one of pairs.
  let list = '[';
  for (let i = 0; i < places.length; i++) list += `${i ? ',' : ''}${placeNumber(places[i])}`;
  const [keysJson, inputsJson, revisionsJson] = raw(db).readMany.get(`${list}]`, sheetId)!;
  const keys = JSON.parse(keysJson) as number[];
  const inputs = JSON.parse(inputsJson) as string[];
  const revisions = JSON.parse(revisionsJson) as number[];
  // The aggregate follows json_each's order (the left join walks it first), but SQL does not promise
  // that; the keys say where each answer belongs. An "order by" in the aggregate cost a sort (~35 ms
  // at 50,000 cells).
  const found: ({ input: string; revision: number } | undefined)[] = new Array(places.length).fill(undefined);
  for (let k = 0; k < keys.length; k++) if (revisions[k] >= 0) found[keys[k]] = { input: inputs[k], revision: revisions[k] };
  return found;
}

/** Writes many cells of one revision, one statement per sheet. Call inside a transaction opened on `db`. */
export function writeCells(db: Db, revision: number, changes: readonly { sheetId: string; row: number; col: number; after: string }[]): void {
  const bySheet = new Map<string, [number, string][]>();
  for (const c of changes) {
    const list = bySheet.get(c.sheetId);
    if (list) list.push([placeNumber(c), c.after]);
    else bySheet.set(c.sheetId, [[placeNumber(c), c.after]]);
  }
  const { writeMany } = raw(db);
  for (const [sheetId, list] of bySheet) writeMany.run(sheetId, revision, JSON.stringify(list));
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
