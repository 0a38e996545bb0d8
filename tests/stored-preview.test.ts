// The read-only first screenful shown from a revision's stored values while the workspace is built
// (src/core/workbook/model/storedPreview.ts): it must show what the grid shows once the workbook is
// computed, cell for cell, and nothing when the values are not the loaded revision's.
import { describe, expect, it } from 'vitest';
import { allowedActions } from '../shared/permissions.js';
import { firstColsShown, firstRowsShown, type FirstRowsPayload, type ValuesPayload, type WorkbookPayload } from '../shared/workbooks.js';
import { computeValues } from '../server/services/values.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { storedPreview } from '../src/core/workbook/model/storedPreview.js';
import type { RowData } from '../src/core/workbook/model/sheetViews.js';
import { glanceOf } from '../src/core/workbook/session/glance.js';
import { PendingStore, type KeyValueStorage } from '../src/core/workbook/save/pendingStore.js';

const cells: [number, number, string][] = [
  [0, 0, 'O2'],
  [0, 1, '=BONDORDER(A1)'],
  [0, 2, '=UNPAIRED(A1)'],
  [0, 3, '=1/3'],
  [1, 0, 'N2'],
  [1, 1, '=BONDORDER(A2)'],
  [1, 3, '12.5'],
  [1, 4, 'TRUE'],
  [2, 0, '=TRANSPOSE(B1:B2)'],
  [3, 0, '=1/0'],
  [3, 1, '=""'],
  [3, 2, '="007"'],
  [3, 3, '=BONDORDER("Xq2")'],
  [4, 0, '=SUM(B1:B2)*2'],
  [70, 0, 'beyond the first screen'],
];

function payloadWith(settings: WorkbookPayload['sheets'][number]['settings']): WorkbookPayload {
  return {
    id: 'wb',
    title: 'Stored preview',
    revision: 4,
    role: 'editor',
    actions: allowedActions(['editor']),
    sheets: [
      { id: 's2', name: 'Later', position: 1, settings: {}, cells: [[0, 0, 'not the first tab']] },
      { id: 's1', name: 'Sheet1', position: 0, settings, cells },
    ],
  };
}

/** Every shown cell's text, kind and error code. */
function shown(rows: readonly RowData[], upTo: number) {
  const out: Record<string, string> = {};
  rows.slice(0, upTo).forEach((row, r) => {
    for (const [c, v] of Object.entries(row)) if (v && (v.display !== '' || v.errorCode)) out[`${r},${c}`] = `${v.display}|${v.kind}|${v.errorCode ?? ''}|${v.spilled ? 'spilled' : ''}`;
  });
  return out;
}

describe('the stored values preview', () => {
  for (const [label, settings, two, three] of [
    ['automatic number format', {}, '2', '3'],
    ['two decimals', { precision: 2 }, '2.00', '3.00'],
  ] as const) {
    it(`shows what the computed grid shows (${label})`, () => {
      const payload = payloadWith(settings);
      const stored = computeValues({ revision: payload.revision, sheets: payload.sheets });
      const preview = storedPreview(payload, stored)!;
      const model = new WorkbookModel(payload);
      try {
        expect(preview.sheetId).toBe('s1'); // the first tab, not the first listed
        expect(preview.rows).toHaveLength(60);
        expect(shown(preview.rows, 60)).toEqual(shown(model.rows('s1'), 60));
        // The computed grid is the independent side; a few cells spelled out so an empty match cannot pass.
        expect(shown(preview.rows, 60)['0,1']).toBe(`${two}|number||`); // O2 bond order 2 (MO diagram of any general chemistry text)
        expect(shown(preview.rows, 60)['3,0']).toBe('#DIV/0!|error|#DIV/0!|');
        expect(shown(preview.rows, 60)['2,1']).toBe(`${three}|number||spilled`); // N2 bond order, spilled by TRANSPOSE
        expect(preview.colCount).toBe(model.sheet('s1').colCount);
      } finally {
        model.dispose();
      }
    });
  }

  it('carries the error message the stored values hold', () => {
    const payload = payloadWith({});
    const stored = computeValues({ revision: payload.revision, sheets: payload.sheets });
    const cell = storedPreview(payload, stored)!.rows[3][3]!;
    expect(cell.errorCode).toBe('#VALUE!');
    expect(cell.errorMessage).toContain('Xq');
  });

  it('is not made from values of another revision', () => {
    const payload = payloadWith({});
    const stored = computeValues({ revision: payload.revision - 1, sheets: payload.sheets });
    expect(storedPreview(payload, stored)).toBeNull();
  });
});

/** An in-memory KeyValueStorage. */
function memoryStorage(): KeyValueStorage {
  const m = new Map<string, string>();
  return { getItem: (k) => m.get(k) ?? null, setItem: (k, v) => void m.set(k, v), removeItem: (k) => void m.delete(k) };
}

/** The GET …/first-rows answer for a payload and its values, as the server cuts it (server/services/firstRows.ts). */
function firstRowsOf(payload: WorkbookPayload, values: ValuesPayload | null): FirstRowsPayload {
  const sheet = payload.sheets.find((s) => s.position === 0)!;
  return {
    id: payload.id,
    title: payload.title,
    revision: payload.revision,
    sheet: { ...sheet, cells: sheet.cells.filter(([r, c]) => r < firstRowsShown && c < firstColsShown) },
    values: values && values.sheets.find((s) => s.id === sheet.id)!.values.filter(([r, c]) => r < firstRowsShown && c < firstColsShown),
    cells: null,
  };
}

// The glance (src/core/workbook/session/glance.ts): what the page's first script and the workbook
// screen draw from GET …/first-rows before anything else of the workbook is in.
describe('the glance of the first rows', () => {
  const payload = payloadWith({ precision: 2 });
  const stored = computeValues({ revision: payload.revision, sheets: payload.sheets });

  it('shows what the stored preview of the whole workbook shows, with its title and settings', () => {
    const glance = glanceOf(firstRowsOf(payload, stored), memoryStorage())!;
    const whole = storedPreview(payload, stored)!;
    expect(shown(glance.preview.rows, 60)).toEqual(shown(whole.rows, 60));
    expect(shown(glance.preview.rows, 60)['0,1']).toBe('2.00|number||'); // O2 bond order 2, two decimals
    expect(glance.title).toBe('Stored preview');
    expect(glance.settings).toEqual({ precision: 2 });
    expect(glance.revision).toBe(4);
  });

  it('is not drawn without stored values, without a tab, or over changes not yet sent', () => {
    expect(glanceOf(firstRowsOf(payload, null), memoryStorage())).toBeNull();
    expect(glanceOf({ ...firstRowsOf(payload, stored), sheet: null }, memoryStorage())).toBeNull();
    const storage = memoryStorage();
    new PendingStore(storage, 'another workbook').save({ baseRevision: 1, changes: [{ sheetId: 's1', row: 0, col: 0, input: 'N2' }] });
    expect(glanceOf(firstRowsOf(payload, stored), storage)).not.toBeNull(); // another workbook's changes do not count
    new PendingStore(storage, payload.id).save({ baseRevision: 4, changes: [{ sheetId: 's1', row: 0, col: 0, input: 'N2' }] });
    expect(glanceOf(firstRowsOf(payload, stored), storage)).toBeNull(); // O2 in A1 is no longer what the page holds
  });
});
