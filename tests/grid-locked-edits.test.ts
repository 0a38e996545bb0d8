// Rows, columns, fill, sort and paste on a sheet with a lock or a protected range that does not name
// me: refused in the grid with the lock's own reason, the engine and every sheet left exactly as they
// were, and nothing handed to the save queue. The server refuses such patches as a whole (403), so a
// change shown here first would only be lost later.
import { allowedActions } from '../shared/permissions.js';
import { beforeEach, describe, expect, it } from 'vitest';
import { parseCellRange } from '../shared/cellRange.js';
import type { Protection, ProtectedRange } from '../shared/team.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { applyStructural, StructureError, undoLast } from '../src/core/workbook/model/structure.js';
import { fillDown, pasteBlock, sortRange } from '../src/core/workbook/model/rangeEdits.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';
import { editRuleFor, structureRuleFor } from '../src/core/team/editability.js';

const ada = { id: 'u-ada', name: 'Ada Okafor' };
const cy = { id: 'u-cy', name: 'Cy Moreau' };

const range = (text: string, sheetId = 's1'): ProtectedRange => ({ id: `r-${text}`, sheetId, range: text, bounds: parseCellRange(text)!, editors: [ada], createdBy: ada, createdAt: 0 });
/** A sheet locked by Ada, who alone is named editor of it. */
const locked = (sheetId: string): Pick<Protection, 'locks' | 'sheetRoles'> => ({
  locks: [{ sheetId, lockedBy: ada, reason: 'reference values checked', editors: [ada], createdAt: 0 }],
  sheetRoles: [{ sheetId, overrides: [{ user: ada, role: 'editor', setBy: ada, viaLock: true, since: 0 }] }],
});
const cyAsEditor = { id: cy.id, role: 'editor' as const };

// N2 bond order 3, O2 bond order 2, F2 bond order 1 (Atkins & de Paula, Physical Chemistry, MO theory of diatomics; from memory).
const payload: WorkbookPayload = {
  id: 'wb',
  title: 'Screening',
  revision: 4,
  role: 'editor',
  actions: allowedActions(['editor']),
  sheets: [
    { id: 's1', name: 'Sheet1', position: 0, settings: {}, cells: [[0, 0, 'Species'], [0, 1, 'Bond order'], [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)'], [2, 0, 'O2'], [2, 1, '=BONDORDER(A3)'], [3, 0, 'F2'], [3, 1, '=BONDORDER(A4)']] },
    { id: 's2', name: 'Summary', position: 1, settings: {}, cells: [[0, 0, '=Sheet1!B3*10']] },
  ],
};

let m: WorkbookModel;
let sent: CellInput[][];
/** Cy works under this protection (only Ada is named on every lock and range). */
function protect(p: Protection) {
  m.structureRule = structureRuleFor(p, cyAsEditor);
  m.setEditRule(editRuleFor(p, cyAsEditor));
}
const inputsOf = (sheet: string) => [...m.sheet(sheet).inputs.entries()].sort((a, b) => a.row - b.row || a.col - b.col).map((e) => [e.row, e.col, e.input]);
const shown = (sheet: string, row: number, col: number) => m.view(sheet, row, col)?.display ?? '';
const refusal = (action: () => unknown) => {
  try {
    action();
  } catch (e) {
    if (e instanceof StructureError) return e.message;
    throw e;
  }
  return null;
};

beforeEach(() => {
  sent = [];
  m = new WorkbookModel(payload, { onLocalChanges: (c) => sent.push(c) });
});

function expectUntouched() {
  expect(inputsOf('s1')).toEqual(payload.sheets[0].cells);
  expect(inputsOf('s2')).toEqual(payload.sheets[1].cells);
  expect([shown('s1', 1, 1), shown('s1', 2, 1), shown('s1', 3, 1), shown('s2', 0, 0)]).toEqual(['3', '2', '1', '20']);
  expect(sent).toEqual([]);
}

describe('rows and columns under protection', () => {
  it('refuses to insert a row on a sheet locked against me, giving who locked it and why', () => {
    protect({ ...locked('s1'), protectedRanges: [] });
    expect(refusal(() => applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 1, count: 1 }))).toBe(
      'View only — Ada Okafor locked this sheet: “reference values checked”. Editors here: Ada Okafor.',
    );
    expectUntouched();
    expect(m.history.canUndo).toBe(false);
  });

  it('refuses a row insert that would move cells of a protected range, and puts every sheet back', () => {
    protect({ locks: [], sheetRoles: [], protectedRanges: [range('A3:B3')] });
    expect(refusal(() => applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 1, count: 1 }))).toBe('View only — A3:B3 is protected by Ada Okafor. Editors of the range: Ada Okafor.');
    expectUntouched();
  });

  it('refuses a column delete whose rewritten formula sits in a protected range on another sheet', () => {
    protect({ locks: [], sheetRoles: [], protectedRanges: [range('A1', 's2')] });
    expect(refusal(() => applyStructural(m, 's1', { axis: 'col', action: 'remove', at: 0, count: 1 }))).toBe('View only — A1 is protected by Ada Okafor. Editors of the range: Ada Okafor.');
    expectUntouched();
  });

  it('still inserts rows where nothing protected moves or changes', () => {
    protect({ ...locked('s2'), protectedRanges: [range('A1:B1')] });
    applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 4, count: 2 });
    expect(sent).toHaveLength(0); // below the used rows: no input moved
    applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 3, count: 1 });
    expect(m.input('s1', 4, 0)).toBe('F2');
    expect(sent.flat()).toContainEqual({ sheetId: 's1', row: 4, col: 1, input: '=BONDORDER(A5)' });
  });

  it('keeps an undo that a lock refused, to be undone once the lock is lifted', () => {
    applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 1, count: 1 });
    protect({ ...locked('s1'), protectedRanges: [] });
    expect(refusal(() => undoLast(m))).toMatch(/^View only — Ada Okafor locked this sheet/);
    expect([m.history.canUndo, m.history.canRedo]).toEqual([true, false]);
    protect({ locks: [], sheetRoles: [], protectedRanges: [] });
    expect(undoLast(m)).toBe(true);
    expect(inputsOf('s1')).toEqual(payload.sheets[0].cells);
  });
});

describe('fill, sort and paste under protection change every cell or none', () => {
  beforeEach(() => protect({ locks: [], sheetRoles: [], protectedRanges: [range('A3')] }));

  it('does not sort a block when one protected cell in it would change', () => {
    protect({ locks: [], sheetRoles: [], protectedRanges: [range('A2')] });
    const outcome = sortRange(m, 's1', { top: 1, bottom: 3, left: 0, right: 1 }, 1, 'ascending'); // F2, O2, N2
    expect(outcome.applied).toEqual([]);
    expect(outcome.refused[0].reason).toBe('View only — A2 is protected by Ada Okafor. Editors of the range: Ada Okafor.');
    expectUntouched();
  });

  it('does not paste or fill into a block with one protected cell in it', () => {
    expect(pasteBlock(m, 's1', [1, 2], 0, [['CO'], ['NO']]).applied).toEqual([]);
    expect(fillDown(m, 's1', { top: 1, bottom: 3, left: 0, right: 0 }).applied).toEqual([]);
    expectUntouched();
  });
});
