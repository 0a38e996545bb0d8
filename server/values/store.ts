// The revision_values table: one row per workbook, the newest revision whose values were computed.
import { and, eq, lt } from 'drizzle-orm';
import type { StoredValueExtras } from '../../shared/workbooks.js';
import type { Db } from '../db/index.js';
import { revisionValues, workbooks } from '../db/schema.js';

export interface StoredValues {
  revision: number;
  valuesGzip: Buffer;
  extras: StoredValueExtras;
  volatileFormulas: number;
}

export interface StoredRow extends StoredValues {
  computedMs: number;
  /** JSON of each sheet's values in the rows the first screen shows (storedFormat.ts firstRowsJson). */
  firstRows?: string;
}

/** Keeps `row` as the workbook's stored values and drops older ones, in one transaction. */
export function storeValues(db: Db, workbookId: string, row: StoredRow): void {
  db.transaction((tx) => {
    tx.insert(revisionValues)
      .values({ workbookId, revision: row.revision, valuesGzip: row.valuesGzip, extras: row.extras, firstRows: row.firstRows ?? null, volatileFormulas: row.volatileFormulas, computedMs: Math.round(row.computedMs) })
      .onConflictDoNothing()
      .run();
    tx.delete(revisionValues).where(and(eq(revisionValues.workbookId, workbookId), lt(revisionValues.revision, row.revision))).run();
  });
}

const columns = { revision: revisionValues.revision, valuesGzip: revisionValues.valuesGzip, extras: revisionValues.extras, volatileFormulas: revisionValues.volatileFormulas };

/**
 * The stored values of `revision` (by default the workbook's current one, read in the same
 * statement), or null when they are not stored yet. Values calling a volatile function are
 * returned too; whether to serve them is the caller's call (servableValues).
 */
export function storedValues(db: Db, workbookId: string, revision?: number): StoredValues | null {
  const row =
    revision === undefined
      ? db
          .select(columns)
          .from(workbooks)
          .innerJoin(revisionValues, and(eq(revisionValues.workbookId, workbooks.id), eq(revisionValues.revision, workbooks.revision)))
          .where(eq(workbooks.id, workbookId))
          .get()
      : db
          .select(columns)
          .from(revisionValues)
          .where(and(eq(revisionValues.workbookId, workbookId), eq(revisionValues.revision, revision)))
          .get();
  return row ?? null;
}

/** Stored values that may be served as they are: values of a volatile function are recomputed on every read. */
export function servableValues(db: Db, workbookId: string, revision?: number): StoredValues | null {
  const row = storedValues(db, workbookId, revision);
  return row && row.volatileFormulas === 0 ? row : null;
}
