// Sheet operations as data: applied to the database by one function, inverted by another, so that
// user edits to tabs and restores of old revisions go through the same, exactly undoable steps.
// Positions stay dense (0..n-1): inserting shifts later tabs right, removing shifts them left.
import { and, eq, gte, lte, sql } from 'drizzle-orm';
import type { CellChangeRecord, SheetOp, SheetSettings } from '../../shared/workbooks.js';
import { sheets } from '../db/schema.js';
import { notFound } from '../errors.js';
import { insertCells, sheetCells, type Tx } from './cellStore.js';
import { rewriteSheetReferences } from './sheetReferences.js';

export type SheetRow = typeof sheets.$inferSelect;

export function workbookSheets(tx: Pick<Tx, 'select'>, workbookId: string): SheetRow[] {
  return tx.select().from(sheets).where(eq(sheets.workbookId, workbookId)).orderBy(sheets.position).all();
}

export function parseSettings(json: string): SheetSettings {
  return JSON.parse(json) as SheetSettings;
}

function shift(tx: Tx, workbookId: string, by: 1 | -1, range: { from: number; to?: number }) {
  const bounds = [eq(sheets.workbookId, workbookId), gte(sheets.position, range.from)];
  if (range.to !== undefined) bounds.push(lte(sheets.position, range.to));
  tx.update(sheets).set({ position: sql`${sheets.position} + ${by}` }).where(and(...bounds)).run();
}

function requireSheetRow(tx: Tx, workbookId: string, sheetId: string): SheetRow {
  const row = tx.select().from(sheets).where(and(eq(sheets.id, sheetId), eq(sheets.workbookId, workbookId))).get();
  if (!row) throw notFound(`sheet ${sheetId}`);
  return row;
}

/**
 * Applies one operation and returns it as it is to be recorded: a 'delete' records the cells the
 * sheet held at that moment, so undoing it brings them back. A rename or delete also rewrites the
 * formulas that name the sheet; those cell changes are appended to `rewrites`, to be recorded in the
 * same revision.
 */
export function applySheetOp(tx: Tx, workbookId: string, op: SheetOp, revision: number, userId: string, rewrites: CellChangeRecord[]): SheetOp {
  const applied = applyToTabs(tx, workbookId, op, revision, userId);
  rewrites.push(...rewriteSheetReferences(tx, workbookId, applied, revision));
  return applied;
}

function applyToTabs(tx: Tx, workbookId: string, op: SheetOp, revision: number, userId: string): SheetOp {
  switch (op.op) {
    case 'add': {
      shift(tx, workbookId, 1, { from: op.position });
      tx.insert(sheets)
        .values({ id: op.sheetId, workbookId, name: op.name, position: op.position, settings: JSON.stringify(op.settings), createdBy: userId })
        .run();
      insertCells(tx, op.sheetId, op.cells, revision);
      return op;
    }
    case 'delete': {
      const row = requireSheetRow(tx, workbookId, op.sheetId);
      const cells = sheetCells(tx, op.sheetId);
      tx.delete(sheets).where(eq(sheets.id, op.sheetId)).run(); // cells go with it (on delete cascade)
      shift(tx, workbookId, -1, { from: row.position + 1 });
      return { op: 'delete', sheetId: row.id, name: row.name, position: row.position, settings: parseSettings(row.settings), cells };
    }
    case 'rename': {
      requireSheetRow(tx, workbookId, op.sheetId);
      tx.update(sheets).set({ name: op.after }).where(eq(sheets.id, op.sheetId)).run();
      return op;
    }
    case 'move': {
      requireSheetRow(tx, workbookId, op.sheetId);
      if (op.from < op.to) shift(tx, workbookId, -1, { from: op.from + 1, to: op.to });
      else if (op.from > op.to) shift(tx, workbookId, 1, { from: op.to, to: op.from - 1 });
      tx.update(sheets).set({ position: op.to }).where(eq(sheets.id, op.sheetId)).run();
      return op;
    }
    case 'settings': {
      requireSheetRow(tx, workbookId, op.sheetId);
      tx.update(sheets).set({ settings: JSON.stringify(op.after) }).where(eq(sheets.id, op.sheetId)).run();
      return op;
    }
  }
}

/** The operation that undoes `op`. */
export function invertSheetOp(op: SheetOp): SheetOp {
  switch (op.op) {
    case 'add':
      return { ...op, op: 'delete' };
    case 'delete':
      return { ...op, op: 'add' };
    case 'rename':
      return { ...op, before: op.after, after: op.before };
    case 'move':
      return { ...op, from: op.to, to: op.from };
    case 'settings':
      return { ...op, before: op.after, after: op.before };
  }
}
