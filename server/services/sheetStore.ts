// Tabs: add, rename/move/re-configure, delete. Each is one revision (kind 'sheet') recorded as
// sheet operations, so history can undo it; a workbook always keeps at least one sheet.
import { randomUUID } from 'node:crypto';
import { defaultSheetName, type CreateSheetInput, type RevisionPatch, type SheetMutationResult, type SheetOp, type UpdateSheetInput } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { badRequest, conflict, HttpError, notFound } from '../errors.js';
import type { Tx } from './cellStore.js';
import { currentRevision, nextRevision, recordRevision } from './revisionLog.js';
import { sheetActor } from './access.js';
import { assertMayChangeSheet } from './protection.js';
import { applySheetOp, workbookSheets, type SheetRow } from './sheetOps.js';

/** Sheet names are compared without case, as formulas compare them ('sheet1'!A1 is Sheet1!A1). */
function assertNameFree(all: SheetRow[], name: string, exceptId?: string) {
  const taken = all.find((s) => s.id !== exceptId && s.name.toLowerCase() === name.toLowerCase());
  if (taken) throw new HttpError(409, 'name_taken', `name: a sheet named "${taken.name}" already exists in this workbook`);
}

function defaultName(all: SheetRow[]): string {
  const names = new Set(all.map((s) => s.name.toLowerCase()));
  let n = all.length + 1;
  while (names.has(defaultSheetName(n).toLowerCase())) n++;
  return defaultSheetName(n);
}

function sheetOf(workbookSheetsNow: SheetRow[], sheetId: string): SheetRow {
  const sheet = workbookSheetsNow.find((s) => s.id === sheetId);
  // A sheet of another workbook is as unknown here as one that never existed.
  if (!sheet) throw notFound('sheet');
  return sheet;
}

function commit(ctx: AppContext, workbookId: string, userId: string, build: (tx: Tx, all: SheetRow[]) => SheetOp[]): { revision: number; patch: RevisionPatch | null } {
  const result = ctx.db.transaction(
    (tx) => {
      const all = workbookSheets(tx, workbookId);
      const ops = build(tx, all);
      if (ops.length === 0) return { revision: currentRevision(tx, workbookId), patch: null };
      const revision = nextRevision(tx, workbookId);
      const changes: RevisionPatch['changes'] = [];
      const patch: RevisionPatch = { sheetOps: ops.map((op) => applySheetOp(tx, workbookId, op, revision, userId, changes)), changes };
      recordRevision(tx, workbookId, revision, userId, 'sheet', patch);
      return { revision, patch };
    },
    { behavior: 'immediate' },
  );
  if (result.patch) ctx.events.publish(workbookId, { type: 'revision', workbookId, revision: result.revision, kind: 'sheet', authorId: userId, patch: result.patch });
  return result;
}

function sheetResult(ctx: AppContext, workbookId: string, sheetId: string, revision: number): SheetMutationResult {
  const sheet = sheetOf(workbookSheets(ctx.db, workbookId), sheetId);
  return { revision, sheet: { id: sheet.id, name: sheet.name, position: sheet.position, settings: sheet.settings, createdBy: sheet.createdBy } };
}

export function addSheet(ctx: AppContext, workbookId: string, userId: string, input: CreateSheetInput): SheetMutationResult {
  const sheetId = randomUUID();
  const { revision } = commit(ctx, workbookId, userId, (_tx, all) => {
    const name = input.name ?? defaultName(all);
    assertNameFree(all, name);
    const position = input.position ?? all.length;
    if (position > all.length) throw badRequest(`position: must be at most ${all.length} (the number of sheets)`);
    return [{ op: 'add', sheetId, name, position, settings: {}, cells: [] }];
  });
  return sheetResult(ctx, workbookId, sheetId, revision);
}

export function updateSheet(ctx: AppContext, workbookId: string, sheetId: string, userId: string, input: UpdateSheetInput): SheetMutationResult {
  const { revision } = commit(ctx, workbookId, userId, (tx, all) => {
    const sheet = sheetOf(all, sheetId);
    assertMayChangeSheet(tx, workbookId, sheetActor(tx, workbookId, userId), sheetId, sheet.name);
    const ops: SheetOp[] = [];
    if (input.name !== undefined && input.name !== sheet.name) {
      assertNameFree(all, input.name, sheetId);
      ops.push({ op: 'rename', sheetId, before: sheet.name, after: input.name });
    }
    if (input.position !== undefined && input.position !== sheet.position) {
      if (input.position >= all.length) throw badRequest(`position: must be at most ${all.length - 1} (the last tab)`);
      ops.push({ op: 'move', sheetId, from: sheet.position, to: input.position });
    }
    const settingsBefore = sheet.settings;
    if (input.settings !== undefined && JSON.stringify(input.settings) !== JSON.stringify(settingsBefore)) {
      ops.push({ op: 'settings', sheetId, before: settingsBefore, after: input.settings });
    }
    return ops;
  });
  return sheetResult(ctx, workbookId, sheetId, revision);
}

export function deleteSheet(ctx: AppContext, workbookId: string, sheetId: string, userId: string): { revision: number } {
  const { revision } = commit(ctx, workbookId, userId, (tx, all) => {
    const sheet = sheetOf(all, sheetId);
    assertMayChangeSheet(tx, workbookId, sheetActor(tx, workbookId, userId), sheetId, sheet.name, { deleting: true });
    if (all.length === 1) throw conflict(`"${sheet.name}" is the only sheet; a workbook keeps at least one`);
    // name, position, settings and cells are filled in from the database when it is applied
    return [{ op: 'delete', sheetId, name: sheet.name, position: sheet.position, settings: {}, cells: [] }];
  });
  return { revision };
}
