// Formulas follow their sheet: renaming a tab rewrites every reference to it in the workbook, and
// deleting one turns references to it into #REF! (as desktop spreadsheets do). Formulas are stored
// as text and resolved by name, so without this a name freed by a rename or a delete could be taken
// by another tab, and formulas (on a locked sheet too) would silently read the newcomer.
//
// The rewrite is a consequence of the tab operation, not an edit of those cells by the user, so it
// meets no lock or protected-range check; the tab operation itself is checked by its caller.
import { and, asc, eq, like } from 'drizzle-orm';
import { removeSheetFromFormula, renameSheetInFormula } from '../../shared/formulaText.js';
import type { CellChangeRecord, SheetOp } from '../../shared/workbooks.js';
import { cells, sheets } from '../db/schema.js';
import type { Tx } from './cellStore.js';

/** How a tab operation changes formula text, or null when it changes none. */
function formulaRewrite(op: SheetOp): ((input: string) => string) | null {
  if (op.op === 'rename') return (input) => renameSheetInFormula(input, op.before, op.after);
  if (op.op === 'delete') return (input) => removeSheetFromFormula(input, op.name);
  return null;
}

/**
 * Rewrites the workbook's formulas after `op` has been applied to the tabs; returns the cell changes
 * (in tab, row, column order) for the revision's patch.
 */
export function rewriteSheetReferences(tx: Tx, workbookId: string, op: SheetOp, revision: number): CellChangeRecord[] {
  const rewrite = formulaRewrite(op);
  if (!rewrite) return [];
  const candidates = tx
    .select({ sheetId: cells.sheetId, row: cells.row, col: cells.col, input: cells.input })
    .from(cells)
    .innerJoin(sheets, eq(sheets.id, cells.sheetId))
    .where(and(eq(sheets.workbookId, workbookId), like(cells.input, '=%!%')))
    .orderBy(asc(sheets.position), asc(cells.row), asc(cells.col))
    .all();
  const changes: CellChangeRecord[] = [];
  for (const c of candidates) {
    const after = rewrite(c.input);
    if (after === c.input) continue;
    tx.update(cells)
      .set({ input: after, revision })
      .where(and(eq(cells.sheetId, c.sheetId), eq(cells.row, c.row), eq(cells.col, c.col)))
      .run();
    changes.push({ sheetId: c.sheetId, row: c.row, col: c.col, before: c.input, after });
  }
  return changes;
}
