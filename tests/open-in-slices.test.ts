// Opening a large workbook without holding the page: the answers are handed from the worker in parts
// (src/lib/jsonParts.ts), the model's inputs and placeholder tables are made a slice at a time
// (src/core/workbook/model/openPreparation.ts), and while formulas are put back the grid hears of
// changes at most every so often, but always of the last. What each of these gives must be exactly
// what the one-piece way gives.
import { describe, expect, it } from 'vitest';
import { allowedActions } from '../shared/permissions.js';
import type { ValuesPayload, WorkbookPayload } from '../shared/workbooks.js';
import { computeValues } from '../server/services/values.js';
import { JsonAssembly, partItems, splitIntoParts } from '../src/lib/jsonParts.js';
import { OpenPreparation } from '../src/core/workbook/model/openPreparation.js';
import { SheetInputs } from '../src/core/workbook/model/sheetInputs.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { StructureInputScan, structureInputsOf } from '../src/core/workbook/structures/structureInputs.js';

const SPECIES = ['O2', 'N2', 'NO', 'CO', 'CN-', 'F2'];

/** Rows of a species and formulas reading it, a second sheet reading the first, one array formula. */
function workbook(rows: number): WorkbookPayload {
  const first: [number, number, string][] = [];
  for (let r = 0; r < rows; r++) {
    first.push([r, 0, SPECIES[r % SPECIES.length]], [r, 1, `=BONDORDER(A${r + 1})`], [r, 2, `=UNPAIRED(A${r + 1})*2`]);
    if (r % 7 === 0) first.push([r, 3, `'${r}`]);
  }
  first.push([rows, 0, '=TRANSPOSE(B1:B3)'], [rows + 1, 1, '=EHTGAP("CCO")']);
  const second: [number, number, string][] = [[0, 0, '=SUM(Sheet1!B1:B50)'], [1, 0, '12.50']];
  return {
    id: 'wb',
    title: 'Sliced open',
    revision: 3,
    role: 'editor',
    actions: allowedActions(['editor']),
    sheets: [
      { id: 's2', name: 'Sheet2', position: 1, settings: {}, cells: second },
      { id: 's1', name: 'Sheet1', position: 0, settings: {}, cells: first },
    ],
  };
}

function shown(model: WorkbookModel, sheetId: string) {
  const out: Record<string, string> = {};
  model.rows(sheetId).forEach((row, r) => {
    for (const [c, v] of Object.entries(row)) if (v && (v.display !== '' || v.errorCode)) out[`${r},${c}`] = `${v.input}|${v.display}|${v.errorCode ?? ''}`;
  });
  return out;
}

describe('an answer handed over in parts', () => {
  it('comes back together equal to the answer sent, with every long list cut into parts no longer than a part', () => {
    const payload = workbook(8_000); // Sheet1 holds over 24,000 cells: several parts
    const original = JSON.parse(JSON.stringify(payload)) as WorkbookPayload;
    const stored = computeValues({ revision: 3, sheets: original.sheets.map((s) => ({ ...s, cells: s.cells.slice(0, 200) })) });
    for (const [sent, expected] of [[payload, original], [JSON.parse(JSON.stringify(stored)), stored]] as const) {
      const parts = splitIntoParts(sent);
      const assembly = new JsonAssembly();
      expect(assembly.take({ id: 1, kind: 'head', data: sent, receivedAt: 0 })).toEqual({ done: false });
      for (const p of parts) {
        expect('items' in p ? p.items.length : p.rows.length).toBeLessThanOrEqual(partItems);
        expect('rows' in p).toBe(true); // lists of [row, col, x] cells travel packed
        assembly.take({ id: 1, kind: 'part', ...p });
      }
      const done = assembly.take({ id: 1, kind: 'end' });
      expect(done).toEqual({ done: true, data: expected });
    }
    expect(splitIntoParts(JSON.parse(JSON.stringify(original))).length).toBe(Math.ceil(original.sheets[1].cells.length / partItems));
  });

  it('sends a long list of anything but cells as it is, and puts it back the same', () => {
    const names = Array.from({ length: partItems + 10 }, (_, i) => `name ${i}`);
    const cellsWithText = Array.from({ length: partItems + 10 }, (_, i) => (i === 7 ? [1.5, 0, 'x'] : [i, 0, 'x']));
    const sent = { sheets: [{ id: 's', names: [...names], cells: cellsWithText.map((c) => [...c]) }] };
    const parts = splitIntoParts(sent);
    // Names as they are; of the cells, the slice holding a row of 1.5 (no cell) as it is, the other packed.
    expect(parts.map((p) => [p.key, 'items' in p])).toEqual([['names', true], ['names', true], ['cells', true], ['cells', false]]);
    const assembly = new JsonAssembly();
    assembly.take({ id: 1, kind: 'head', data: sent, receivedAt: 0 });
    for (const p of parts) assembly.take({ id: 1, kind: 'part', ...p });
    expect(assembly.take({ id: 1, kind: 'end' })).toEqual({ done: true, data: { sheets: [{ id: 's', names, cells: cellsWithText }] } });
  });

  it('leaves answers without sheets, and null, as they are', () => {
    expect(splitIntoParts(null)).toEqual([]);
    const small = { error: { code: 'not_found', message: 'no such workbook' } };
    expect(splitIntoParts(small)).toEqual([]);
    expect(small).toEqual({ error: { code: 'not_found', message: 'no such workbook' } });
  });
});

describe('a model prepared a slice at a time', () => {
  const payload = workbook(3_000);
  const stored: ValuesPayload = computeValues({ revision: 3, sheets: payload.sheets });

  const cases: [string, ValuesPayload | null][] = [
    ['on stored values', stored],
    ['on none (formulas empty until their slice)', { revision: 3, sheets: [] }],
    ['without stored values', null],
  ];
  for (const [label, values] of cases) {
    it(`shows and ends with what a model built in one piece shows, ${label}`, () => {
      const preparation = new OpenPreparation(payload, values);
      let slices = 0;
      while (!preparation.step(0)) slices++; // the smallest slices there are
      expect(slices).toBeGreaterThan(5);
      const sliced = new WorkbookModel(payload, { stored: values, prepared: preparation.result() });
      const whole = new WorkbookModel(payload, { stored: values });
      const fresh = new WorkbookModel(payload);
      try {
        for (const s of ['s1', 's2']) expect(shown(sliced, s)).toEqual(shown(whole, s));
        expect(sliced.computing).toEqual(whole.computing);
        sliced.ensureLive();
        whole.ensureLive();
        for (const s of ['s1', 's2']) {
          expect(shown(sliced, s)).toEqual(shown(whole, s));
          expect(shown(sliced, s)).toEqual(shown(fresh, s));
        }
      } finally {
        sliced.dispose();
        whole.dispose();
        fresh.dispose();
      }
    });
  }

  it('tells its listeners of the last slice, so the grid never stays on a half-computed picture', () => {
    const model = new WorkbookModel(payload, { stored, firstRows: 10 });
    try {
      let told = 0;
      let computingWhenTold: unknown = undefined;
      model.subscribe(() => {
        told++;
        computingWhenTold = model.computing;
      });
      let slices = 0;
      while (!model.computeSlice(1)) slices++;
      expect(slices).toBeGreaterThan(3);
      expect(told).toBeGreaterThan(0);
      expect(told).toBeLessThanOrEqual(slices + 1);
      expect(computingWhenTold).toBeNull(); // the last word listeners had: live
    } finally {
      model.dispose();
    }
  });

  it('keeps the rows it shows when the formulas put back give the values already shown', () => {
    // Only formulas whose stored values are what the engine computes (no array formula, no pending result).
    const plain: WorkbookPayload = { ...payload, sheets: payload.sheets.map((s) => ({ ...s, cells: s.cells.filter(([, , input]) => !/TRANSPOSE|EHTGAP/.test(input)) })) };
    const values = computeValues({ revision: 3, sheets: plain.sheets });
    const model = new WorkbookModel(plain, { stored: values, firstRows: 10 });
    try {
      while (model.computing && model.computing.done === 0) model.computeSlice(5); // the rows of constants first
      const rows = model.rows('s1');
      const before = shown(model, 's1');
      model.ensureLive();
      // The same array, rows and views: the grid has nothing to redraw.
      expect(model.rows('s1')).toBe(rows);
      expect(shown(model, 's1')).toEqual(before);
      // An edit still replaces the row it is in (NO → F2: bond order 1, Atkins & de Paula, Physical Chemistry, MO theory; recalled from memory).
      model.edit([{ sheetId: 's1', row: 2, col: 0, input: 'F2' }]);
      const after = model.rows('s1');
      expect(after).not.toBe(rows);
      expect(after[2]).not.toBe(rows[2]);
      expect(after[3]).toBe(rows[3]);
      expect(after[2][1]?.display).toBe('1');
    } finally {
      model.dispose();
    }
  });

  it('puts back formulas listed out of order row by row, on every sheet', () => {
    const shuffled: WorkbookPayload = { ...payload, sheets: payload.sheets.map((s) => ({ ...s, cells: [...s.cells].reverse() })) };
    const preparation = new OpenPreparation(shuffled, stored);
    const held = preparation.result().held!;
    for (const { formulas } of held) {
      const places = formulas.rows.map((r, i) => r * 10 + formulas.cols[i]);
      expect(places).toEqual([...places].sort((a, b) => a - b));
    }
    expect(held.reduce((n, h) => n + h.formulas.rows.length, 0)).toBe(payload.sheets.flatMap((s) => s.cells).filter(([, , i]) => i.startsWith('=')).length);
    const sliced = new WorkbookModel(shuffled, { stored, prepared: preparation.result() });
    const fresh = new WorkbookModel(payload);
    try {
      sliced.ensureLive();
      for (const s of ['s1', 's2']) expect(shown(sliced, s)).toEqual(shown(fresh, s));
    } finally {
      sliced.dispose();
      fresh.dispose();
    }
  });

  it('reads the structures the formulas name the same in slices as in one pass', () => {
    const scan = new StructureInputScan();
    const sheets = [...payload.sheets].sort((a, b) => a.position - b.position);
    let slices = 0;
    while (!scan.step(sheets, 0)) slices++;
    expect(slices).toBeGreaterThan(0);
    expect(scan.result()).toEqual(structureInputsOf(payload));
    expect(scan.result()).toEqual([{ structure: 'CCO' }]);
  });
});

describe('the extent of a sheet kept as cells are set', () => {
  it('keeps cells far apart in rows, reads each back, and lists them a block of rows after another', () => {
    const s = new SheetInputs();
    const cells: [number, number, string][] = [[70_000, 3, 'far'], [0, 0, 'first'], [255, 1, 'end of a block'], [256, 1, 'next block'], [70_000, 3, 'far again']];
    for (const [r, c, v] of cells) s.set(r, c, v);
    expect(s.size).toBe(4);
    expect(s.get(70_000, 3)).toBe('far again');
    expect(s.get(256, 1)).toBe('next block');
    expect(s.get(69_999, 3)).toBe('');
    expect([...s.entries()].map((e) => e.row)).toEqual([0, 255, 256, 70_000]);
    s.set(255, 1, '');
    expect(s.size).toBe(3);
    expect(s.clone().size).toBe(3);
    expect(s.extent()).toEqual({ rows: 70_001, cols: 4 });
  });

  it('grows with each cell and shrinks again when the last row or column is cleared', () => {
    const s = SheetInputs.from([[0, 0, 'a'], [4, 2, 'b'], [2, 6, 'c']]);
    expect(s.extent()).toEqual({ rows: 5, cols: 7 });
    s.set(9, 1, 'd');
    expect(s.extent()).toEqual({ rows: 10, cols: 7 });
    s.set(9, 1, '');
    expect(s.extent()).toEqual({ rows: 5, cols: 7 });
    s.set(2, 6, '');
    expect(s.extent()).toEqual({ rows: 5, cols: 3 });
    s.set(1, 1, ''); // not there: nothing changes
    expect(s.extent()).toEqual({ rows: 5, cols: 3 });
    expect(s.clone().extent()).toEqual({ rows: 5, cols: 3 });
    const copy = s.clone();
    copy.set(20, 20, 'e');
    expect(s.extent()).toEqual({ rows: 5, cols: 3 });
  });
});
