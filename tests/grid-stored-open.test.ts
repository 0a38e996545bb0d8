// The grid's model opened on the values stored with its revision (src/core/workbook/model/hydration.ts):
// it shows those values before computing anything, takes edits at once, and once every formula is
// back it holds exactly what a model built the usual way (all formulas computed at once) holds.
import { describe, expect, it } from 'vitest';
import { allowedActions } from '../shared/permissions.js';
import type { ValuesPayload, WorkbookPayload } from '../shared/workbooks.js';
import { computeValues } from '../server/services/values.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { applyStructural } from '../src/core/workbook/model/structure.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';

const cells: [number, number, string][] = [
  [0, 0, 'O2'],
  [0, 1, '=BONDORDER(A1)'],
  [0, 2, '=UNPAIRED(A1)'],
  [1, 0, 'N2'],
  [1, 1, '=BONDORDER(A2)'],
  [2, 0, '=TRANSPOSE(B1:B2)'],
  [3, 0, '=1/0'],
  [3, 1, '=""'],
  [3, 2, '="007"'],
  [4, 0, '=SUM(B1:B2)*2'],
];
const payload: WorkbookPayload = { id: 'wb', title: 'Stored open', revision: 7, role: 'editor', actions: allowedActions(['editor']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells }] };
const stored: ValuesPayload = computeValues({ revision: 7, sheets: payload.sheets });

/** Every cell's displayed text and error code, as the grid draws them. */
function shown(model: WorkbookModel) {
  const out: Record<string, string> = {};
  model.rows('s1').forEach((row, r) => {
    for (const [c, v] of Object.entries(row)) if (v && (v.display !== '' || v.errorCode)) out[`${r},${c}`] = `${v.display}|${v.errorCode ?? ''}`;
  });
  return out;
}

function opened(onLocalChanges: (c: CellInput[]) => void = () => {}) {
  return new WorkbookModel(payload, { stored, onLocalChanges });
}

describe('a workbook opened on its stored values', () => {
  it('shows the stored values before computing any formula, then the same once live', () => {
    const model = opened();
    const fresh = new WorkbookModel(payload);
    try {
      expect(model.computing).toEqual({ done: 0, total: 8, revision: 7 });
      expect(model.view('s1', 0, 1)?.display).toBe('2'); // O2 bond order, stored
      expect(model.view('s1', 2, 1)?.display).toBe('3'); // spilled by TRANSPOSE, stored
      expect(model.view('s1', 3, 2)?.display).toBe('007'); // text stays text
      expect(model.view('s1', 3, 0)?.errorCode).toBe('#DIV/0!');
      expect(shown(model)).toEqual(shown(fresh));
      model.ensureLive();
      expect(model.computing).toBeNull();
      expect(shown(model)).toEqual(shown(fresh));
      expect(model.engine.getCellFormula({ sheet: 0, row: 0, col: 1 })).toBe('=BONDORDER(A1)');
    } finally {
      model.dispose();
      fresh.dispose();
    }
  });

  it('takes an edit before it is live, sends it, and computes it with everything that depends on it', () => {
    const sent: CellInput[][] = [];
    const model = opened((c) => sent.push(c));
    const reference = new WorkbookModel(payload);
    try {
      model.edit([{ sheetId: 's1', row: 0, col: 0, input: 'F2' }]);
      expect(sent).toEqual([[{ sheetId: 's1', row: 0, col: 0, input: 'F2' }]]);
      expect(model.computing).not.toBeNull();
      // Slices as the page runs them, until live.
      while (!model.computeSlice(0));
      reference.edit([{ sheetId: 's1', row: 0, col: 0, input: 'F2' }]);
      expect(shown(model)).toEqual(shown(reference));
      expect(model.view('s1', 0, 1)?.display).toBe('1'); // F2: bond order 1 (any general chemistry text)
      expect(model.view('s1', 4, 0)?.display).toBe('8'); // (1 + 3) × 2
    } finally {
      model.dispose();
      reference.dispose();
    }
  });

  it('puts every formula back before a structure change reads them from the engine', () => {
    const model = opened();
    try {
      applyStructural(model, 's1', { axis: 'row', action: 'insert', at: 0, count: 1 });
      expect(model.computing).toBeNull();
      expect(model.input('s1', 1, 1)).toBe('=BONDORDER(A2)');
      expect(model.view('s1', 5, 0)?.display).toBe('10'); // (2 + 3) × 2, moved down a row
    } finally {
      model.dispose();
    }
  });

  it('builds the engine from the first rows only, loads the rest in slices, and keeps an edit made to a row not yet loaded', () => {
    const sent: CellInput[][] = [];
    const model = new WorkbookModel(payload, { stored, firstRows: 1, onLocalChanges: (c) => sent.push(c) });
    const reference = new WorkbookModel(payload);
    try {
      expect(model.view('s1', 0, 1)?.display).toBe('2'); // O2 bond order, stored, in the first build
      expect(model.engine.getCellValue({ sheet: 0, row: 1, col: 0 })).toBeNull(); // row 2 not in the engine yet
      model.edit([{ sheetId: 's1', row: 1, col: 0, input: 'F2' }]);
      expect(sent).toEqual([[{ sheetId: 's1', row: 1, col: 0, input: 'F2' }]]);
      while (!model.computeSlice(0));
      reference.edit([{ sheetId: 's1', row: 1, col: 0, input: 'F2' }]);
      expect(model.input('s1', 1, 0)).toBe('F2');
      expect(shown(model)).toEqual(shown(reference));
      expect(model.view('s1', 1, 1)?.display).toBe('1'); // F2: bond order 1 (any general chemistry text)
      expect(model.view('s1', 4, 0)?.display).toBe('6'); // (2 + 1) × 2
    } finally {
      model.dispose();
      reference.dispose();
    }
  });

  it('shows each later row once it is loaded, before any formula is computed', () => {
    const model = new WorkbookModel(payload, { stored, firstRows: 1 });
    try {
      expect(model.view('s1', 3, 0)).toBeUndefined(); // not loaded yet: shown empty, not as a wrong value
      while (model.view('s1', 3, 0) === undefined) model.computeSlice(0);
      expect(model.view('s1', 3, 0)?.errorCode).toBe('#DIV/0!'); // the stored error
      expect(model.computing?.done).toBe(0);
      model.ensureLive();
      expect(model.view('s1', 4, 0)?.display).toBe('10'); // (2 + 3) × 2
    } finally {
      model.dispose();
    }
  });
});
