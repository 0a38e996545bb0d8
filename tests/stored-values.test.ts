// Values kept with each revision (server/values/): a warm engine brought forward patch by patch must
// give exactly what a fresh computation of the same inputs gives — the /values answer and every
// cell an export writes — and a patch must recompute exactly the cells that depend on it.
import { DetailedCellError, type CellValue } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { cellName } from '../shared/a1.js';
import { demoWorkbooks } from '../server/seed/index.js';
import { computeValuesIsolated } from '../server/services/valuesIsolated.js';
import { computedFromStored, decodeValues, encodeValues } from '../server/values/storedFormat.js';
import { WarmWorkbook, type CellChange } from '../server/values/warmWorkbook.js';
import { computeWorkbook, type ComputedWorkbook } from '../server/xlsx/engineValues.js';
import { capComputedWorkbook, capValuesPayload } from '../server/xlsx/longTexts.js';
import type { CellTriple } from '../server/xlsx/types.js';
import { formula, seededRandom, type Random } from './helpers/fuzzInputs.js';

type Sheets = { id: string; name: string; cells: Map<string, string> }[];

const cellsOf = (s: Sheets[number]): CellTriple[] =>
  [...s.cells.entries()].map(([k, input]) => [...(k.split(',').map(Number) as [number, number]), input] as CellTriple).sort((a, b) => a[0] - b[0] || a[1] - b[1]);

const asInput = (sheets: Sheets) => sheets.map((s) => ({ id: s.id, name: s.name, cells: cellsOf(s) }));

/** What GET /values computes today for these inputs (the on-demand path). */
const freshValues = (sheets: Sheets, revision: number) => capValuesPayload(computeValuesIsolated({ revision, sheets: asInput(sheets) }));

/** Cells as an export writes them, errors by code and message, so two computations compare. */
function exportCells(workbook: ComputedWorkbook) {
  const show = (v: CellValue) => (v instanceof DetailedCellError ? { error: v.value, message: v.message } : v);
  return {
    functionsUsed: workbook.functionsUsed,
    sheets: workbook.sheets.map((s) => ({ name: s.name, cells: s.cells.map((c) => ({ ...c, value: show(c.value) })) })),
  };
}

function demoSheets(index: number): Sheets {
  return demoWorkbooks[index].sheets.map((s, i) => {
    const cells = new Map<string, string>();
    s.rows.forEach((row, r) => row.forEach((input, c) => input !== '' && cells.set(`${r},${c}`, input)));
    return { id: `sheet-${i}`, name: s.name, cells };
  });
}

/** A small sheet of random inputs: numbers, species, formulas with our functions and references. */
function fuzzedSheets(r: Random): Sheets {
  const cells = new Map<string, string>();
  for (let i = 0; i < 60; i++) {
    const input = randomInput(r, 15, 6);
    if (input !== '') cells.set(`${r.int(0, 14)},${r.int(0, 5)}`, input); // stored workbooks hold no empty inputs
  }
  const other = new Map<string, string>([['0,0', '=Fuzz!A1*2'], ['1,0', '=SUM(Fuzz!A1:F15)']]);
  return [
    { id: 'fuzz', name: 'Fuzz', cells },
    { id: 'other', name: 'Other', cells: other },
  ];
}

const columns = 'ABCDEFGH';
function randomInput(r: Random, rows: number, cols: number): string {
  const ref = () => `${columns[r.int(0, cols - 1)]}${r.int(1, rows)}`;
  const k = r.next();
  if (k < 0.15) return '';
  if (k < 0.35) return String(r.pick([0, 1, -2.5, 3.14159, 1e-3, 42, 6.022e23]));
  if (k < 0.45) return r.pick(['O2', 'NO', 'N2+', 'CN-', 'Xq2', 'c1ccccc1', 'text']);
  if (k < 0.6) return `=${ref()}*2+${ref()}`;
  if (k < 0.68) return `=SUM(${ref()}:${ref()})`;
  if (k < 0.72) return r.pick(['=TRANSPOSE(A1:A3)', '=SEQUENCE(2,2)', '=""', '=DATE(2024,5,17)', '=1/0', '=NA()']);
  return formula(r);
}

function randomPatch(r: Random, sheets: Sheets): CellChange[] {
  const changes: CellChange[] = [];
  for (let n = r.int(1, 4); n > 0; n--) {
    const s = r.pick(sheets);
    const rows = Math.max(3, ...[...s.cells.keys()].map((k) => Number(k.split(',')[0]) + 2));
    const row = r.int(0, Math.min(rows, 40));
    const col = r.int(0, 7);
    changes.push({ sheetId: s.id, row, col, input: randomInput(r, Math.min(rows, 40), 8) });
  }
  return changes;
}

function applyTo(sheets: Sheets, changes: CellChange[]) {
  for (const c of changes) {
    const s = sheets.find((x) => x.id === c.sheetId)!;
    if (c.input === '') s.cells.delete(`${c.row},${c.col}`);
    else s.cells.set(`${c.row},${c.col}`, c.input);
  }
}

/** Patches a warm engine step by step; after each, stored values must equal a fresh computation. */
function checkAgainstFresh(sheets: Sheets, seed: number, steps: number) {
  const r = seededRandom(seed);
  const warm = new WarmWorkbook(asInput(sheets), 1);
  try {
    for (let revision = 2; revision < 2 + steps; revision++) {
      const patch = randomPatch(r, sheets);
      applyTo(sheets, patch);
      warm.apply(patch, revision);
      const snapshot = warm.snapshot();
      const fresh = freshValues(sheets, revision);
      expect(snapshot.payload, `revision ${revision} after ${JSON.stringify(patch)}`).toEqual(fresh);
      // What is stored (gzip JSON and extras) rebuilds the cells a fresh export computes.
      const stored = decodeValues(encodeValues(snapshot.payload));
      const inputs = asInput(sheets);
      const fromStore = computedFromStored(inputs, inputs.map((s) => s.id), stored, JSON.parse(JSON.stringify(snapshot.extras)));
      expect(exportCells(fromStore)).toEqual(exportCells(capComputedWorkbook(computeWorkbook(inputs))));
    }
  } finally {
    warm.destroy();
  }
}

describe('values kept with each revision', () => {
  // Seeds are fixed so a failure reproduces; each names its workbook and seed.
  for (const [index, title] of demoWorkbooks.map((w, i) => [i, w.title] as const)) {
    it(`equal a fresh computation after random patches to the demo workbook "${title}" (seed ${101 + index})`, () => {
      checkAgainstFresh(demoSheets(index), 101 + index, 25);
    });
  }

  for (const seed of [7, 8, 9, 10]) {
    it(`equal a fresh computation after random patches to a fuzzed workbook (seed ${seed})`, () => {
      checkAgainstFresh(fuzzedSheets(seededRandom(seed * 1000)), seed, 30);
    });
  }

  it('counts formulas calling a function of the clock or of chance, so they are recomputed on reading', () => {
    const warm = new WarmWorkbook([{ id: 's', name: 'S', cells: [[0, 0, '=RAND()'], [0, 1, '=A1*2'], [1, 0, '="NOW()"']] }], 1);
    try {
      expect(warm.snapshot().volatileFormulas).toBe(1); // a name inside a text literal is no call
      warm.apply([{ sheetId: 's', row: 2, col: 0, input: '=today()+1' }], 2);
      expect(warm.snapshot().volatileFormulas).toBe(2);
      warm.apply([{ sheetId: 's', row: 0, col: 0, input: '5' }, { sheetId: 's', row: 2, col: 0, input: '' }], 3);
      expect(warm.snapshot().volatileFormulas).toBe(0);
    } finally {
      warm.destroy();
    }
  });
});

describe('a patch to a kept workbook', () => {
  // Two independent chains and a cross-sheet reader; every formula's value changes with its input,
  // so "recomputed" and "changed value" are the same set here.
  const cells: CellTriple[] = [
    [0, 0, '1'], // A1
    [0, 1, '=A1*2'], // B1 ← A1
    [0, 2, '=B1+1'], // C1 ← B1
    [1, 0, '5'], // A2
    [1, 1, '=A2*3'], // B2 ← A2
    [2, 0, '=SUM(A1:A2)'], // A3 ← A1, A2
    [3, 0, '7'], // A4, read by nothing
  ];
  const other: CellTriple[] = [[0, 0, '=Calc!C1*10']]; // Other!A1 ← Calc!C1

  /** Cells depending on `start`, found in the test by reading each formula's references (independently of the engine). */
  function dependents(start: string): Set<string> {
    const all = [...cells.map(([r, c, input]) => ({ name: `Calc!${cellName(r, c)}`, input })), ...other.map(([r, c, input]) => ({ name: `Other!${cellName(r, c)}`, input }))];
    const refsOf = (name: string, input: string): string[] => {
      if (!input.startsWith('=')) return [];
      const sheet = name.split('!')[0];
      const out: string[] = [];
      for (const m of input.matchAll(/(?:(\w+)!)?([A-Z]+)(\d+)(?::([A-Z]+)(\d+))?/g)) {
        const on = m[1] ?? sheet;
        if (m[4]) for (let row = Number(m[3]); row <= Number(m[5]); row++) out.push(`${on}!${m[2]}${row}`);
        else out.push(`${on}!${m[2]}${m[3]}`);
      }
      return out;
    };
    const found = new Set<string>([start]);
    for (let grew = true; grew; ) {
      grew = false;
      for (const c of all) if (!found.has(c.name) && refsOf(c.name, c.input).some((r) => found.has(r))) grew = found.add(c.name).size > 0;
    }
    return found;
  }

  it('recomputes exactly the cells that depend on the changed input', () => {
    const warm = new WarmWorkbook([{ id: 'calc', name: 'Calc', cells }, { id: 'other', name: 'Other', cells: other }], 1);
    try {
      const names = { calc: 'Calc', other: 'Other' } as Record<string, string>;
      const changed = warm.apply([{ sheetId: 'calc', row: 0, col: 0, input: '4' }], 2)!.map(([s, r, c]) => `${names[s]}!${cellName(r, c)}`);
      expect(new Set(changed)).toEqual(dependents('Calc!A1'));
      expect(new Set(changed)).toEqual(new Set(['Calc!A1', 'Calc!B1', 'Calc!C1', 'Calc!A3', 'Other!A1']));

      const second = warm.apply([{ sheetId: 'calc', row: 1, col: 0, input: '6' }], 3)!.map(([s, r, c]) => `${names[s]}!${cellName(r, c)}`);
      expect(new Set(second)).toEqual(dependents('Calc!A2'));
      expect(warm.snapshot().payload.sheets[1].values).toEqual([[0, 0, (4 * 2 + 1) * 10]]);
    } finally {
      warm.destroy();
    }
  });
});
