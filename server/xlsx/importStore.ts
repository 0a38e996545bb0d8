// Writes an imported workbook into the database: every sheet added in one transaction as one
// revision of kind 'import', recorded as sheet operations so history can show and undo it. Not pure:
// this is the one file of the import that touches the database.
import { sheetActor } from '../services/access.js';
import { assertMayChangeSheet } from '../services/protection.js';
import { randomUUID } from 'node:crypto';
import type Database from 'better-sqlite3';
import { cellInputProblem } from '../../shared/cellInput.js';
import { maxInputLength, maxSheetNameLength, type RevisionKind, type RevisionPatch, type SheetOp } from '../../shared/workbooks.js';
import type { AppContext } from '../context.js';
import { cellName } from '../../shared/a1.js';
import { applySheetOp, workbookSheets } from '../services/sheetOps.js';
import { nextRevision, recordRevision } from '../services/revisionLog.js';
import { settingsFromParsed } from './sheetSettings.js';
import type { CellTriple, ImportSummary, ParsedWorkbook } from './types.js';

export interface ImportOutcome {
  revision: number;
  sheets: { id: string; name: string }[];
  summary: ImportSummary;
}

/** A sheet name the API would accept (shared/workbooks.ts sheetNameSchema), unique in the workbook ignoring case. */
export function importedSheetName(name: string, taken: Set<string>): string {
  // eslint-disable-next-line no-control-regex
  let base = name.replace(/[[\]*?/\\:\u0000-\u001f\u007f]/g, '_').replace(/^'+|'+$/g, '').trim().slice(0, maxSheetNameLength - 5) || 'Sheet';
  base = base.replace(/^'+|'+$/g, '') || 'Sheet';
  let candidate = base;
  for (let n = 2; taken.has(candidate.toLowerCase()); n++) candidate = `${base} (${n})`;
  taken.add(candidate.toLowerCase());
  return candidate;
}

const ROWS_PER_STATEMENT = 200;

/**
 * Inserts a sheet's cells, many rows per statement (SQLite's per-statement cost dominates otherwise).
 * One parameter array is filled in place for every full statement: building a fresh array per cell
 * cost more than SQLite's own work for 100,000 cells. `table` is `cells` but for the benchmark, which
 * times the same loop into a bare table of the same shape (bench/io.ts).
 */
export function cellInserter(sqlite: Database.Database, table = 'cells') {
  const sql = (n: number) => `insert into ${table} (sheet_id, row, col, input, revision) values ${Array.from({ length: n }, () => '(?, ?, ?, ?, ?)').join(', ')}`;
  const full = sqlite.prepare(sql(ROWS_PER_STATEMENT));
  const params: (string | number)[] = new Array(ROWS_PER_STATEMENT * 5);
  return (sheetId: string, cells: readonly CellTriple[], revision: number) => {
    for (let i = 0; i < cells.length; i += ROWS_PER_STATEMENT) {
      const n = Math.min(ROWS_PER_STATEMENT, cells.length - i);
      const bound = n === ROWS_PER_STATEMENT ? params : new Array<string | number>(n * 5);
      for (let k = 0; k < n; k++) {
        const [row, col, input] = cells[i + k];
        const at = k * 5;
        bound[at] = sheetId;
        bound[at + 1] = row;
        bound[at + 2] = col;
        bound[at + 3] = input;
        bound[at + 4] = revision;
      }
      (n === ROWS_PER_STATEMENT ? full : sqlite.prepare(sql(n))).run(bound);
    }
  };
}

/**
 * Adds the parsed sheets after the workbook's existing ones. With `replaceSheetId` (a new workbook's
 * empty first sheet), that sheet is removed in the same revision so the import's own names are free.
 */
export function importSheets(ctx: AppContext, workbookId: string, userId: string, parsed: ParsedWorkbook, opts: { replaceSheetId?: string } = {}): ImportOutcome {
  const summary: ImportSummary = { ...parsed.summary, skipped: [...parsed.summary.skipped], notes: [...parsed.summary.notes] };
  const insertCells = cellInserter(ctx.db.$client);

  const outcome = ctx.db.transaction(
    (tx) => {
      const existing = workbookSheets(tx, workbookId);
      const kept = existing.filter((s) => s.id !== opts.replaceSheetId);
      const taken = new Set(kept.map((s) => s.name.toLowerCase()));
      const ops: SheetOp[] = [];
      const replaced = existing.find((s) => s.id === opts.replaceSheetId);
      if (replaced) assertMayChangeSheet(tx, workbookId, sheetActor(tx, workbookId, userId), replaced.id, replaced.name, { deleting: true });
      if (replaced) ops.push({ op: 'delete', sheetId: replaced.id, name: replaced.name, position: replaced.position, settings: {}, cells: [] });

      const added: { id: string; name: string }[] = [];
      let imported = 0;
      let formulas = 0;
      parsed.sheets.forEach((sheet, i) => {
        const name = importedSheetName(sheet.name, taken);
        if (name !== sheet.name) summary.notes.push(`sheet "${sheet.name}" was imported as "${name}" (the workbook already has that name, or it has characters sheet names cannot hold)`);
        const cells: typeof sheet.cells = [];
        for (const cell of sheet.cells) {
          const input = cell[2];
          // The same checks a typed input meets in the patch schema: nothing is stored altered.
          const problem = input.length > maxInputLength ? `longer than ${maxInputLength.toLocaleString('en')} characters` : cellInputProblem(input);
          if (problem) summary.skipped.push({ sheet: name, address: cellName(cell[0], cell[1]), reason: problem });
          else {
            cells.push(cell);
            if (input.charCodeAt(0) === 61 /* = */) formulas++;
          }
        }
        imported += cells.length;
        const id = randomUUID();
        added.push({ id, name });
        ops.push({ op: 'add', sheetId: id, name, position: kept.length + i, settings: settingsFromParsed(sheet, summary.notes), cells });
      });
      summary.cells = imported;
      summary.formulas = formulas;

      const revision = nextRevision(tx, workbookId);
      const rewrites: RevisionPatch['changes'] = [];
      const recorded = ops.map((op) => {
        if (op.op !== 'add') return applySheetOp(tx, workbookId, op, revision, userId, rewrites);
        // The sheet row through the shared path; its cells in one prepared statement (a workbook of
        // 100,000 cells would otherwise pay the query builder per cell).
        applySheetOp(tx, workbookId, { ...op, cells: [] }, revision, userId, rewrites);
        insertCells(op.sheetId, op.cells, revision);
        return op;
      });
      const patch: RevisionPatch = { sheetOps: recorded, changes: rewrites };
      // 'import' is stored as its own kind so history can name it (shared RevisionKind lists the others).
      recordRevision(tx, workbookId, revision, userId, 'import' as RevisionKind, patch);
      return { revision, sheets: added, patch };
    },
    { behavior: 'immediate' },
  );
  ctx.events.publish(workbookId, { type: 'revision', workbookId, revision: outcome.revision, kind: 'import' as RevisionKind, authorId: userId, patch: outcome.patch });
  return { revision: outcome.revision, sheets: outcome.sheets, summary: { ...summary, sheets: outcome.sheets.length } };
}
