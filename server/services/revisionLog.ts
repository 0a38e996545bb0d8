// The revision counter and the history table: every change to a workbook's content is one numbered
// revision holding what it changed (before and after), so any revision can be viewed and undone.
import type { Statement } from 'better-sqlite3';
import { and, desc, eq, gt, lt, sql } from 'drizzle-orm';
import type { CellChangeRecord, RevisionDetail, RevisionKind, RevisionPatch, RevisionSummary, SheetOpPreview } from '../../shared/workbooks.js';
import type { Db } from '../db/index.js';
import { revisions, users, workbooks } from '../db/schema.js';
import { notFound } from '../errors.js';
import type { Tx } from './cellStore.js';

export function currentRevision(tx: Tx, workbookId: string): number {
  const row = tx.select({ revision: workbooks.revision }).from(workbooks).where(eq(workbooks.id, workbookId)).get();
  if (!row) throw notFound('workbook');
  return row.revision;
}

/** Bumps the workbook's revision by one and returns the new number. */
export function nextRevision(tx: Tx, workbookId: string): number {
  const row = tx
    .update(workbooks)
    .set({ revision: sql`${workbooks.revision} + 1`, updatedAt: Date.now() })
    .where(eq(workbooks.id, workbookId))
    .returning({ revision: workbooks.revision })
    .get();
  if (!row) throw notFound('workbook');
  return row.revision;
}

// On the driver, prepared once per connection: the query builder took ~20 ms more than this to pass
// the 5 MB text of a 50,000-cell revision (npm run bench:big-patch).
const insertRevisionText = new WeakMap<Db, Statement<[string, number, string, string, string]>>();

/**
 * recordRevision with the patch already as JSON text (an import's, written batch by batch; a large
 * patch's). `db` is the connection the open transaction is on.
 */
export function recordRevisionJson(db: Db, workbookId: string, number: number, authorId: string, kind: RevisionKind, patchJson: string): void {
  let insert = insertRevisionText.get(db);
  if (!insert) insertRevisionText.set(db, (insert = db.$client.prepare<[string, number, string, string, string]>('insert into revisions (workbook_id, number, author_id, kind, patch) values (?, ?, ?, ?, ?)')));
  insert.run(workbookId, number, authorId, kind, patchJson);
}

export function recordRevision(tx: Tx, workbookId: string, number: number, authorId: string, kind: RevisionKind, patch: RevisionPatch): void {
  tx.insert(revisions).values({ workbookId, number, authorId, kind, patch }).run();
}

const summaryColumns = {
  number: revisions.number,
  kind: revisions.kind,
  createdAt: revisions.createdAt,
  authorId: revisions.authorId,
  authorName: users.name,
  authorEmail: users.email,
  // Counted in SQLite so a long history lists without parsing every patch.
  changeCount: sql<number>`json_array_length(${revisions.patch}, '$.changes') + json_array_length(${revisions.patch}, '$.sheetOps')`,
};

/** Cell changes and tab operations a change-log entry lists; the rest are counted. */
export const previewLength = 5;

// The first few of each, taken in SQLite so an import of 100,000 cells is not parsed to list five.
// Tab adds and deletes carry their cells: those are left out of the preview.
const previewColumns = {
  cellCount: sql<number>`json_array_length(${revisions.patch}, '$.changes')`,
  sheetOpCount: sql<number>`json_array_length(${revisions.patch}, '$.sheetOps')`,
  firstCells: sql<string>`(select json_group_array(json(c.value)) from (select value from json_each(${revisions.patch}, '$.changes') limit ${previewLength}) c)`,
  firstSheetOps: sql<string>`(select json_group_array(json_remove(o.value, '$.cells', '$.settings', '$.position')) from (select value from json_each(${revisions.patch}, '$.sheetOps') limit ${previewLength}) o)`,
  restoredFrom: sql<number | null>`json_extract(${revisions.patch}, '$.restoredFrom')`,
  restoredSheetId: sql<string | null>`json_extract(${revisions.patch}, '$.restoredSheetId')`,
};

type SummaryRow = {
  number: number;
  kind: string;
  createdAt: number;
  authorId: string | null;
  authorName: string | null;
  authorEmail: string | null;
  changeCount: number;
  cellCount: number;
  sheetOpCount: number;
  firstCells: string;
  firstSheetOps: string;
  restoredFrom: number | null;
  restoredSheetId: string | null;
};

function toSummary(r: SummaryRow): RevisionSummary {
  return {
    number: r.number,
    kind: r.kind as RevisionKind,
    author: r.authorId ? { id: r.authorId, name: r.authorName ?? '', email: r.authorEmail ?? '' } : null,
    createdAt: r.createdAt,
    changeCount: r.changeCount,
    preview: {
      cells: JSON.parse(r.firstCells) as CellChangeRecord[],
      cellCount: r.cellCount,
      sheetOps: JSON.parse(r.firstSheetOps) as SheetOpPreview[],
      sheetOpCount: r.sheetOpCount,
      ...(r.restoredFrom !== null ? { restoredFrom: r.restoredFrom } : {}),
      ...(r.restoredSheetId !== null ? { restoredSheetId: r.restoredSheetId } : {}),
    },
  };
}

/** Newest first; `before` pages backwards. */
export function listRevisions(db: Db, workbookId: string, opts: { before?: number; limit: number }): RevisionSummary[] {
  const where = opts.before !== undefined ? and(eq(revisions.workbookId, workbookId), lt(revisions.number, opts.before)) : eq(revisions.workbookId, workbookId);
  return db
    .select({ ...summaryColumns, ...previewColumns })
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(where)
    .orderBy(desc(revisions.number))
    .limit(opts.limit)
    .all()
    .map(toSummary);
}

export function getRevision(db: Db, workbookId: string, number: number): RevisionDetail {
  const row = db
    .select({ ...summaryColumns, ...previewColumns, patch: revisions.patch })
    .from(revisions)
    .leftJoin(users, eq(users.id, revisions.authorId))
    .where(and(eq(revisions.workbookId, workbookId), eq(revisions.number, number)))
    .get();
  if (!row) throw notFound(`revision ${number}`);
  return { ...toSummary(row), patch: row.patch };
}

/** The patches of every revision after `number`, newest first (what a restore undoes). */
export function patchesAfter(tx: Tx, workbookId: string, number: number): { number: number; patch: RevisionPatch }[] {
  return tx
    .select({ number: revisions.number, patch: revisions.patch })
    .from(revisions)
    .where(and(eq(revisions.workbookId, workbookId), gt(revisions.number, number)))
    .orderBy(desc(revisions.number))
    .all()
    .map((r) => ({ number: r.number, patch: r.patch }));
}
