// The browser's workbook model, run in Node with the real engine and cell functions: what an edit
// computes, what it sends to the server, and how fill, sort, paste, row/column changes and undo
// keep formulas pointing at the right cells.
import { allowedActions } from '../shared/permissions.js';
import { beforeEach, describe, expect, it, vi } from 'vitest';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { applyStructural, redoLast, undoLast } from '../src/core/workbook/model/structure.js';
import { fillDown, fillRight, pasteBlock, pasteCopiedCells, sortRange } from '../src/core/workbook/model/rangeEdits.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';

function payload(cells: [number, number, string][], other: [number, number, string][] = [], role: WorkbookPayload['role'] = 'owner'): WorkbookPayload {
  return {
    id: 'wb',
    title: 'Screening',
    revision: 4,
    role,
    actions: allowedActions([role]),
    sheets: [
      { id: 's1', name: 'Sheet1', position: 0, settings: {}, cells },
      { id: 's2', name: 'Summary sheet', position: 1, settings: {}, cells: other },
    ],
  };
}

let sent: CellInput[][];
function open(p: WorkbookPayload) {
  sent = [];
  const m = new WorkbookModel(p, { onLocalChanges: (c) => sent.push(c) });
  return m;
}
const rowsFrom = (first: number, count: number) => Array.from({ length: count }, (_, i) => first + i);
const display = (m: WorkbookModel, row: number, col: number, sheet = 's1') => m.view(sheet, row, col)?.display ?? '';
const inputsOf = (m: WorkbookModel, sheet = 's1') => [...m.sheet(sheet).inputs.entries()].sort((a, b) => a.row - b.row || a.col - b.col).map((e) => [e.row, e.col, e.input]);

describe('loading and editing', () => {
  it('computes chemistry formulas from the server inputs (dioxygen bond order 2: Atkins & de Paula, MO theory of O2)', () => {
    const m = open(payload([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)']]));
    expect(display(m, 0, 1)).toBe('2');
    expect(display(m, 1, 1)).toBe('3');
  });

  it('shows the message of an error on the cell, naming the bad element', () => {
    const m = open(payload([[0, 0, 'Xq2'], [0, 1, '=BONDORDER(A1)']]));
    expect(m.view('s1', 0, 1)).toMatchObject({ kind: 'error', display: '#VALUE!' });
    expect(m.view('s1', 0, 1)?.errorMessage).toMatch(/unknown element 'Xq'/);
  });

  it('keeps the input exactly as typed while computing with its value', () => {
    const m = open(payload([[0, 0, '1.50'], [0, 1, '=A1*2']]));
    expect(m.view('s1', 0, 0)).toMatchObject({ input: '1.50', display: '1.5' });
    expect(display(m, 0, 1)).toBe('3');
  });

  it('recomputes dependents at once and hands the edit to the save queue', () => {
    const m = open(payload([[0, 0, 'O2'], [0, 1, '=UNPAIRED(A1)']]));
    expect(display(m, 0, 1)).toBe('2');
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'N2' }]);
    expect(display(m, 0, 1)).toBe('0'); // N2 is closed-shell (¹Σg⁺, Huber & Herzberg 1979)
    expect(sent).toEqual([[{ sheetId: 's1', row: 0, col: 0, input: 'N2' }]]);
  });

  it('replaces only the rows an edit touched, so the other rows are not redrawn', () => {
    const m = open(payload([[0, 0, '1'], [5, 0, '=A1+1'], [9, 0, '7']]));
    const before = m.rows('s1');
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: '2' }]);
    const after = m.rows('s1');
    expect(after).not.toBe(before);
    expect(after[9]).toBe(before[9]);
    expect(after[0]).not.toBe(before[0]);
    expect(after[5]).not.toBe(before[5]);
    expect(display(m, 5, 0)).toBe('3');
  });

  it('writes bulk edits with evaluation suspended once, not cell by cell', () => {
    const m = open(payload([]));
    const suspend = vi.spyOn(m.engine, 'suspendEvaluation');
    const block = Array.from({ length: 200 }, (_, i) => [`${i}`, `=A${i + 1}*2`]);
    pasteBlock(m, 's1', rowsFrom(0, 200), 0, block);
    expect(suspend).toHaveBeenCalledTimes(1);
    expect(display(m, 199, 1)).toBe('398');
    expect(sent[0]).toHaveLength(400);
  });

  it('does not send or record an edit that changes nothing', () => {
    const m = open(payload([[0, 0, 'O2']]));
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'O2' }]);
    expect(sent).toEqual([]);
    expect(m.history.canUndo).toBe(false);
  });

  it('shows array results in the cells they spill into, and refuses edits there', () => {
    const m = open(payload([[0, 0, '={1,2,3}']]));
    expect([display(m, 0, 0), display(m, 0, 1), display(m, 0, 2)]).toEqual(['1', '2', '3']);
    expect(m.view('s1', 0, 2)?.spilled).toBe(true);
    const outcome = m.edit([{ sheetId: 's1', row: 0, col: 2, input: '9' }]);
    expect(outcome.refused[0].reason).toMatch(/array formula/);
    expect(sent).toEqual([]);
  });

  it('lets a viewer look but not edit', () => {
    const m = open(payload([[0, 0, 'O2']], [], 'viewer'));
    expect(m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'N2' }]).refused).toHaveLength(1);
    expect(m.input('s1', 0, 0)).toBe('O2');
  });

  it('consults the extra edit rule (locks and protected ranges plug in here)', () => {
    const m = open(payload([[0, 0, 'O2']]));
    m.setEditRule((_sheet, row) => (row === 0 ? 'row 1 is protected' : null));
    expect(m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'N2' }]).refused[0].reason).toBe('row 1 is protected');
    expect(m.edit([{ sheetId: 's1', row: 1, col: 0, input: 'N2' }]).applied).toHaveLength(1);
  });

  it('applies changes from elsewhere without sending them back or making them undoable', () => {
    const m = open(payload([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)']]));
    m.applyRemote([{ sheetId: 's1', row: 0, col: 0, input: 'F2' }]);
    expect(display(m, 0, 1)).toBe('1');
    expect(sent).toEqual([]);
    expect(m.history.canUndo).toBe(false);
  });
});

describe('fill, sort and paste move formulas the way the engine fills them', () => {
  it('fills a formula down with its relative reference shifted and its absolute one kept', () => {
    const m = open(payload([[0, 0, 'O2'], [1, 0, 'N2'], [2, 0, 'F2'], [0, 1, '=BONDORDER(A1)*$D$1'], [0, 3, '10']]));
    fillDown(m, 's1', { top: 0, left: 1, bottom: 2, right: 1 });
    expect([m.input('s1', 1, 1), m.input('s1', 2, 1)]).toEqual(['=BONDORDER(A2)*$D$1', '=BONDORDER(A3)*$D$1']);
    expect([display(m, 1, 1), display(m, 2, 1)]).toEqual(['30', '10']);
  });

  it('fills right with column references shifted', () => {
    const m = open(payload([[0, 0, '2'], [0, 1, '3'], [1, 0, '=A1*10']]));
    fillRight(m, 's1', { top: 1, left: 0, bottom: 1, right: 1 });
    expect(m.input('s1', 1, 1)).toBe('=B1*10');
    expect(display(m, 1, 1)).toBe('30');
  });

  it('sorts rows by a computed column, carrying each row’s formulas with it', () => {
    const m = open(payload([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)'], [2, 0, 'F2'], [2, 1, '=BONDORDER(A3)']]));
    sortRange(m, 's1', { top: 0, left: 0, bottom: 2, right: 1 }, 1, 'descending');
    expect(inputsOf(m)).toEqual([
      [0, 0, 'N2'], [0, 1, '=BONDORDER(A1)'],
      [1, 0, 'O2'], [1, 1, '=BONDORDER(A2)'],
      [2, 0, 'F2'], [2, 1, '=BONDORDER(A3)'],
    ]);
    expect([display(m, 0, 1), display(m, 1, 1), display(m, 2, 1)]).toEqual(['3', '2', '1']);
  });

  it('pastes cells copied in the workbook with their formulas re-pointed', () => {
    const m = open(payload([[0, 0, '4'], [0, 1, '=A1*2']]));
    pasteCopiedCells(m, 's1', [3], 1, { sheetId: 's1', rows: [0], left: 1, right: 1 });
    expect(m.input('s1', 3, 1)).toBe('=A4*2');
  });

  it('fills every selected cell with one copied cell, each formula re-pointed', () => {
    const m = open(payload([[0, 0, '4'], [0, 1, '=A1*2']]));
    pasteCopiedCells(m, 's1', [1, 2], 1, { sheetId: 's1', rows: [0], left: 1, right: 1 }, { down: 2, across: 2 });
    expect([m.input('s1', 1, 1), m.input('s1', 2, 2)]).toEqual(['=A2*2', '=B3*2']);
  });

  it('pastes into the rows it is given (the visible rows of a filtered view)', () => {
    const m = open(payload([]));
    pasteBlock(m, 's1', [2, 5], 1, [['CO', 'NO'], ['CN-', 'O2']]);
    expect(inputsOf(m)).toEqual([[2, 1, 'CO'], [2, 2, 'NO'], [5, 1, 'CN-'], [5, 2, 'O2']]);
  });
});

describe('rows and columns', () => {
  let m: WorkbookModel;
  beforeEach(() => {
    m = open(payload([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)']], [[0, 0, "=Sheet1!B2*2"]]));
  });

  it('inserting a row moves the cells below and re-points formulas on every sheet', () => {
    applyStructural(m, 's1', { axis: 'row', action: 'insert', at: 1, count: 1 });
    expect(inputsOf(m)).toEqual([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [2, 0, 'N2'], [2, 1, '=BONDORDER(A3)']]);
    expect(m.input('s2', 0, 0)).toBe('=Sheet1!B3*2');
    expect(display(m, 0, 0, 's2')).toBe('6');
    // The server stores cells by position: the patch empties row 2 and fills row 3.
    expect(sent[0]).toEqual(
      expect.arrayContaining([
        { sheetId: 's1', row: 1, col: 0, input: '' },
        { sheetId: 's1', row: 2, col: 1, input: '=BONDORDER(A3)' },
        { sheetId: 's2', row: 0, col: 0, input: '=Sheet1!B3*2' },
      ]),
    );
  });

  it('deleting a column that formulas read leaves #REF!, and undo brings the inputs back exactly', () => {
    applyStructural(m, 's1', { axis: 'col', action: 'remove', at: 0, count: 1 });
    expect(display(m, 0, 0)).toBe('#REF!');
    expect(undoLast(m)).toBe(true);
    expect(inputsOf(m)).toEqual([[0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)']]);
    expect(m.input('s2', 0, 0)).toBe('=Sheet1!B2*2');
    expect(display(m, 1, 1)).toBe('3');
    // Undo is sent like any edit: the last patch puts the original inputs back.
    expect(sent.flat()).toEqual(expect.arrayContaining([{ sheetId: 's1', row: 1, col: 1, input: '=BONDORDER(A2)' }]));
  });

  it('redo repeats a structural change after undo', () => {
    applyStructural(m, 's1', { axis: 'row', action: 'remove', at: 0, count: 1 });
    undoLast(m);
    redoLast(m);
    expect(inputsOf(m)).toEqual([[0, 0, 'N2'], [0, 1, '=BONDORDER(A1)']]);
  });
});

describe('undo and redo of cell edits', () => {
  it('undoes and redoes a paste as one step, sending each as a patch', () => {
    const m = open(payload([[0, 0, 'O2']]));
    pasteBlock(m, 's1', [0, 1], 0, [['N2', 'CO'], ['F2', 'NO']]);
    expect(undoLast(m)).toBe(true);
    expect(inputsOf(m)).toEqual([[0, 0, 'O2']]);
    expect(sent[1]).toEqual(
      expect.arrayContaining([
        { sheetId: 's1', row: 0, col: 0, input: 'O2' },
        { sheetId: 's1', row: 1, col: 1, input: '' },
      ]),
    );
    expect(redoLast(m)).toBe(true);
    expect(m.input('s1', 1, 1)).toBe('NO');
    expect(undoLast(m)).toBe(true);
    expect(undoLast(m)).toBe(false); // nothing older to undo
  });

  it('a new edit after undo clears what could be redone', () => {
    const m = open(payload([]));
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'a' }]);
    undoLast(m);
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: 'b' }]);
    expect(redoLast(m)).toBe(false);
  });
});
