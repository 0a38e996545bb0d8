// One user action is one undo step: a cleared block, a tiled paste, cells typed and drag-filled at
// once. Also the pure rules behind paste repetition and telling a header row from data. Bond orders
// from MO theory: O2 2, N2 3, F2 1 (Atkins & de Paula, Physical Chemistry, MO theory of diatomics;
// recalled from memory).
import { describe, expect, it } from 'vitest';
import { allowedActions } from '../shared/permissions.js';
import { actionTooLargeReason, maxCellsPerAction } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { applyStructural, redoLast, undoLast } from '../src/core/workbook/model/structure.js';
import { clearRange, fillPairs, pasteBlock, pasteCopiedCells, pasteRepeats, tileBlock } from '../src/core/workbook/model/rangeEdits.js';
import { looksLikeHeader } from '../src/core/workbook/model/sortFilter.js';
import { History } from '../src/core/workbook/model/history.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';

function open(cells: [number, number, string][]) {
  const sent: CellInput[][] = [];
  const m = new WorkbookModel(
    { id: 'wb', title: 'Screen', revision: 1, role: 'owner', actions: allowedActions(['owner']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells }] },
    { onLocalChanges: (c) => sent.push(c) },
  );
  return { m, sent };
}
const inputs = (m: WorkbookModel) => [...m.sheet('s1').inputs.entries()].sort((a, b) => a.row - b.row || a.col - b.col).map((e) => `${e.row},${e.col}=${e.input}`);
const screen = [
  [0, 0, 'O2'], [0, 1, '=BONDORDER(A1)'], [0, 2, 'x'],
  [1, 0, 'N2'], [1, 1, '=BONDORDER(A2)'], [1, 2, 'y'],
  [2, 0, 'F2'], [2, 1, '=BONDORDER(A3)'], [2, 2, 'z'],
] as [number, number, string][];

describe('one action, one undo step', () => {
  it('clearing a block of three rows comes back whole with one undo', () => {
    const { m } = open(screen);
    const before = inputs(m);
    clearRange(m, 's1', [0, 1, 2], 0, 2);
    expect(inputs(m)).toEqual([]);
    expect(undoLast(m)).toBe(true);
    expect(inputs(m)).toEqual(before);
    expect(m.view('s1', 1, 1)?.display).toBe('3');
    expect(undoLast(m)).toBe(false);
  });

  it('cells typed and filled in one gesture are undone together, newest step first', () => {
    const { m } = open(screen);
    m.history.action(() => {
      m.edit([{ sheetId: 's1', row: 3, col: 0, input: 'CO' }]);
      fillPairs(m, 's1', [{ from: { row: 2, col: 1 }, to: { row: 3, col: 1 } }]);
    });
    expect(m.input('s1', 3, 1)).toBe('=BONDORDER(A4)');
    expect(m.view('s1', 3, 1)?.display).toBe('3'); // CO is isoelectronic with N2: bond order 3
    undoLast(m);
    expect(inputs(m)).toEqual(inputs(open(screen).m));
    redoLast(m);
    expect(m.input('s1', 3, 0)).toBe('CO');
    expect(m.input('s1', 3, 1)).toBe('=BONDORDER(A4)');
  });

  it('a group holding a column delete undoes the delete with its inputs exact', () => {
    const { m } = open(screen);
    m.history.action(() => {
      applyStructural(m, 's1', { axis: 'col', action: 'remove', at: 0, count: 1 });
      m.edit([{ sheetId: 's1', row: 0, col: 1, input: 'changed' }]);
    });
    expect(m.view('s1', 0, 0)?.display).toBe('#REF!');
    undoLast(m);
    expect(inputs(m)).toEqual(inputs(open(screen).m));
    expect(m.view('s1', 2, 1)?.display).toBe('1');
  });

  it('an undo that a lock would cut in half is refused whole, and stays to be undone later', () => {
    const { m, sent } = open(screen);
    clearRange(m, 's1', [0, 1], 0, 0);
    const patches = sent.length;
    m.setEditRule((_sheet, row) => (row === 1 ? 'Protected range A2: only Ann may change it' : null));
    expect(() => undoLast(m)).toThrow(/only Ann may change it/);
    expect([m.input('s1', 0, 0), m.input('s1', 1, 0)]).toEqual(['', '']);
    expect(sent.length).toBe(patches); // nothing half-undone was sent
    m.setEditRule(null);
    expect(undoLast(m)).toBe(true);
    expect([m.input('s1', 0, 0), m.input('s1', 1, 0)]).toEqual(['O2', 'N2']);
  });

  it('refuses an action over the per-action limit whole, saying why, instead of saving it as several revisions', () => {
    // A 6,000 × 10 block: deleting column A changes 60,000 cells, over maxCellsPerAction.
    const big: [number, number, string][] = [];
    for (let r = 0; r < 6_000; r++) for (let c = 0; c < 10; c++) big.push([r, c, `v${r}:${c}`]);
    expect(big.length).toBeGreaterThan(maxCellsPerAction);
    const { m, sent } = open(big);
    const before = inputs(m);
    const outcome = m.edit(big.map(([row, col]) => ({ sheetId: 's1', row, col, input: '' })));
    expect(outcome.applied).toEqual([]);
    expect(outcome.refused).toHaveLength(60_000);
    expect(outcome.refused[0].reason).toBe(actionTooLargeReason(60_000));
    expect(outcome.refused[0].reason).toContain(`at most ${maxCellsPerAction.toLocaleString('en-US')}`);
    expect(() => applyStructural(m, 's1', { axis: 'col', action: 'remove', at: 0, count: 1 })).toThrow(actionTooLargeReason(60_000));
    expect(inputs(m)).toEqual(before);
    expect(m.view('s1', 0, 0)?.display).toBe('v0:0');
    expect(sent).toEqual([]);
    expect(undoLast(m)).toBe(false);
    // At the limit it is one action, one undo step.
    const atLimit = big.slice(0, maxCellsPerAction).map(([row, col]) => ({ sheetId: 's1', row, col, input: 'z' }));
    expect(m.edit(atLimit).applied).toHaveLength(maxCellsPerAction);
    expect(sent).toHaveLength(1);
    expect(undoLast(m)).toBe(true);
    expect(inputs(m)).toEqual(before);
  });

  it('an action that pushes nothing leaves the history alone', () => {
    const h = new History();
    h.action(() => undefined);
    expect(h.canUndo).toBe(false);
  });
});

describe('paste repeats a smaller block over a larger selection', () => {
  it('tiles when the selection is a whole multiple of the block', () => {
    expect(pasteRepeats({ height: 6, width: 2 }, { height: 2, width: 1 })).toEqual({ down: 3, across: 2, note: null });
    expect(pasteRepeats({ height: 1, width: 1 }, { height: 2, width: 3 })).toEqual({ down: 1, across: 1, note: null });
  });

  it('pastes once and says why when the selection is larger but not a multiple', () => {
    const r = pasteRepeats({ height: 5, width: 1 }, { height: 2, width: 1 });
    expect(r).toMatchObject({ down: 1, across: 1 });
    expect(r.note).toMatch(/5 × 1.*not a whole multiple.*2 × 1/);
  });

  it('one copied row with a formula fills every row of a taller selection, re-pointed, as one undo step', () => {
    const { m } = open(screen);
    pasteCopiedCells(m, 's1', [3, 4, 5], 1, { sheetId: 's1', rows: [0], left: 1, right: 1 }, pasteRepeats({ height: 3, width: 1 }, { height: 1, width: 1 }));
    expect([m.input('s1', 3, 1), m.input('s1', 4, 1), m.input('s1', 5, 1)]).toEqual(['=BONDORDER(A4)', '=BONDORDER(A5)', '=BONDORDER(A6)']);
    undoLast(m);
    expect(m.input('s1', 4, 1)).toBe('');
  });

  it('tiles plain text blocks down and across', () => {
    expect(tileBlock([['a', 'b'], ['c']], 2, 2)).toEqual([
      ['a', 'b', 'a', 'b'],
      ['c', '', 'c', ''],
      ['a', 'b', 'a', 'b'],
      ['c', '', 'c', ''],
    ]);
    const { m } = open([]);
    pasteBlock(m, 's1', [0, 1, 2, 3], 0, tileBlock([['O2'], ['N2']], 2, 1));
    expect(inputs(m)).toEqual(['0,0=O2', '1,0=N2', '2,0=O2', '3,0=N2']);
  });
});

describe('a header row is text over numbers', () => {
  it('takes titles over numbers as a header', () => {
    expect(looksLikeHeader([['Species', 'Bond order'], ['O2', 2], ['N2', 3]])).toBe(true);
  });
  it('does not take a row of data for a header', () => {
    expect(looksLikeHeader([['F2', 1], ['O2', 2], ['N2', 3]])).toBe(false);
    expect(looksLikeHeader([[5, 'a'], [2, 'b']])).toBe(false);
  });
  it('cannot tell from text over text alone', () => {
    expect(looksLikeHeader([['Species'], ['O2'], ['N2']])).toBe(false);
  });
  it('ignores empty header cells but needs one title', () => {
    expect(looksLikeHeader([['', 'Gap / eV'], ['x', 1.2], ['y', 3.4]])).toBe(true);
    expect(looksLikeHeader([[null, ''], [1, 2]])).toBe(false);
  });
});
