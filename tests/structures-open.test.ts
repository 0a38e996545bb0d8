// Opening a workbook of extended-Hückel formulas in the browser's model (no browser needed): the
// structures the formulas name are read from the formula text (structureInputs.ts) and their stored
// results fetched before the formulas are put back, so a colleague's cells never wait ("computing…")
// and no structure is asked for again; the formulas are put back in many small slices, and once
// live every cell holds what a model built whole, computing each structure itself, holds.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import '../functions/openchemlibNode.js';
import { computeEhtResult, type EhtResult } from '../functions/chem/ehtSummary.js';
import { clearLocalResults, localComputations, setStructureResolver } from '../functions/structureResults.js';
import { allowedActions } from '../shared/permissions.js';
import type { StructuresResponse } from '../shared/structures.js';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { structureInputsOf } from '../src/core/workbook/structures/structureInputs.js';
import { installStructureStore, StructureStore } from '../src/core/workbook/structures/structureStore.js';

const molecules = ['C=C', 'O=C=O', 'N#N', 'CC=O'];
/** Rows of the library, the molecules over and over: more formulas than one slice puts back. */
const ROWS = 60;

/** A one-sheet workbook holding these cells. */
function payloadOf(cells: [number, number, string][]): WorkbookPayload {
  return { id: 'wb', title: 'Library', revision: 3, role: 'editor', actions: allowedActions(['editor']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells }] };
}

function libraryPayload(): WorkbookPayload {
  const cells: [number, number, string][] = [[0, 0, 'SMILES']];
  Array.from({ length: ROWS }, (_, i) => molecules[i % molecules.length]).forEach((m, i) => {
    const r = i + 1;
    cells.push([r, 0, m], [r, 1, `=EHTHOMO(A${r + 1})`], [r, 2, `=EHTGAP($A$${r + 1})`], [r, 3, `=EHTCHARGE(A${r + 1},1)`], [r, 4, `=B${r + 1}*2`]);
  });
  return payloadOf(cells);
}

/** Every cell's shown text, as the grid draws it. */
function shown(model: WorkbookModel) {
  const out: Record<string, string> = {};
  model.rows('s1').forEach((row, r) => {
    for (const [c, v] of Object.entries(row)) if (v && (v.display !== '' || v.errorCode)) out[`${r},${c}`] = `${v.display}|${v.errorCode ?? ''}|${v.kind}`;
  });
  return out;
}

/** The server's answer for stored structures: results computed here once, as the compute pool would. */
const serverResults = new Map<string, EhtResult>();
function storedOnServer(structure: string, charge?: number): EhtResult {
  const key = `${charge ?? ''}|${structure}`;
  if (!serverResults.has(key)) serverResults.set(key, computeEhtResult(structure, charge));
  return serverResults.get(key)!;
}

let reference: Record<string, string>;

beforeAll(() => {
  // A model built whole, every structure computed in this process (no resolver registered).
  setStructureResolver(null);
  clearLocalResults();
  const whole = new WorkbookModel(libraryPayload());
  reference = shown(whole);
  whole.dispose();
  expect(localComputations()).toBe(molecules.length);
});

afterAll(() => setStructureResolver(null));

describe('the structures a workbook names, read from its formulas', () => {
  it('finds the library shapes: a cell reference (relative or absolute), quoted text, a literal charge', () => {
    const payload = payloadOf([
      [0, 0, 'C=C'],
      [0, 1, '=EHTHOMO(A1)'],
      [0, 2, '=ehtgap($A$1)'],
      [0, 3, '=EHTHOMO(A1,-1)'],
      [0, 4, '=EHTCHARGE(A1,2,1)'],
      [0, 5, '=EHTCHARGE(A1,2)'],
      [0, 6, '=EHTBONDPOP("N#N",1,2)'],
      [0, 7, '=EHTGEOMETRY("O=C=O")'],
      [0, 8, '=EHTHOMO(A1,0)'],
    ]);
    expect(structureInputsOf(payload)).toEqual([
      { structure: 'C=C' },
      { structure: 'C=C', charge: -1 },
      { structure: 'C=C', charge: 1 },
      { structure: 'N#N' },
      { structure: 'O=C=O' },
      { structure: 'C=C', charge: 0 },
    ]);
  });

  it('leaves to the engine what it cannot read for certain', () => {
    const payload = payloadOf([
      [0, 0, '12'],
      [0, 1, '=EHTHOMO(A1)'], // a number, not a structure
      [1, 0, '=LOWER("C=C")'],
      [1, 1, '=EHTHOMO(A2)'], // a formula's value
      [2, 1, '=EHTHOMO(A3)'], // an empty cell
      [3, 1, '=EHTHOMO(Other!A1)'], // another sheet
      [4, 1, '=EHTHOMO(A1,B1)'], // a charge worked out by the engine
      [5, 1, '=EHTHOMO(TRIM(A1))'],
      [6, 1, '=HUCKELHOMO(A1)'], // not an extended-Hückel function
    ]);
    expect(structureInputsOf(payload)).toEqual([]);
  });
});

describe('a library opened in slices with its stored structure results fetched first', () => {
  it('shows no cell waiting, asks for nothing again, and ends with every value a whole build gives', async () => {
    const requests: { structure: string; charge?: number }[][] = [];
    const store = new StructureStore(async (inputs): Promise<StructuresResponse<EhtResult>> => {
      requests.push(inputs);
      return { results: inputs.map((i) => storedOnServer(i.structure, i.charge)), underWay: 0 };
    });
    const uninstall = installStructureStore(store);
    const payload = libraryPayload();
    try {
      await store.prefetch(structureInputsOf(payload));
      expect(requests).toHaveLength(1);
      expect(requests[0]).toHaveLength(molecules.length);

      // Nothing stored for the revision: formula cells are empty until their slice.
      const model = new WorkbookModel(payload, { stored: { revision: payload.revision, sheets: [] } });
      const arrivals: number[] = [];
      store.onArrival((cells) => arrivals.push(cells.length));
      try {
        expect(model.computing).toEqual({ done: 0, total: ROWS * 4, revision: payload.revision });
        expect(model.computingFromStored).toBe(false);
        expect(model.view('s1', 1, 1)?.display ?? '').toBe('');
        let slices = 0;
        let sawPending = false;
        // A budget of 0 ms: each slice puts back as few formulas as the model allows.
        for (let live = false; !live; slices++) {
          live = model.computeSlice(0);
          sawPending ||= Object.values(shown(model)).some((v) => v.endsWith('|pending'));
        }
        expect(slices).toBeGreaterThan(1);
        expect(sawPending).toBe(false);
        expect(model.computing).toBeNull();
        expect(shown(model)).toEqual(reference);
        // No cell had to ask: no progress line, no second request, nothing announced.
        expect(store.progress).toEqual({ total: 0, done: 0, problem: null });
        expect(store.pending).toBe(0);
        expect(requests).toHaveLength(1);
        expect(arrivals).toEqual([]);
      } finally {
        model.dispose();
      }
    } finally {
      uninstall();
    }
  });

  it('puts back a small first step, whatever the budget, and grows steps at most fourfold', () => {
    // The first step runs the functions' code for the first time; a large one held the page. A slice
    // is written in steps (each one engine write), the clock looked at after each.
    const model = new WorkbookModel(libraryPayload(), { stored: { revision: 3, sheets: [] } });
    const steps: number[] = [];
    const internals = model as unknown as { writeEngine(cells: unknown[]): void };
    const write = internals.writeEngine.bind(model);
    internals.writeEngine = (cells) => {
      steps.push(cells.length);
      write(cells);
    };
    try {
      while (!model.computeSlice(Number.POSITIVE_INFINITY));
      expect(steps[0]).toBe(20);
      for (let i = 1; i < steps.length - 1; i++) expect(steps[i]).toBeLessThanOrEqual(4 * steps[i - 1]);
      expect(steps.reduce((a, b) => a + b, 0)).toBe(ROWS * 4);
      expect(model.computing).toBeNull();
    } finally {
      model.dispose();
    }
  });

  it('announces a prefetched result to the cells already waiting for it', async () => {
    let release: (() => void) | null = null;
    const store = new StructureStore(async (inputs) => {
      await new Promise<void>((r) => (release = r));
      return { results: inputs.map((i) => storedOnServer(i.structure, i.charge)), underWay: 0 };
    });
    const uninstall = installStructureStore(store);
    const payload = libraryPayload();
    const model = new WorkbookModel(payload);
    try {
      // Built whole before the results came: every extended-Hückel cell waits.
      expect(model.view('s1', 1, 1)?.kind).toBe('pending');
      expect(store.pending).toBe(molecules.length);
      const announced: { sheet: number; row: number; col: number }[] = [];
      store.onArrival((cells) => announced.push(...cells));
      const prefetch = store.prefetch(structureInputsOf(payload));
      await expect.poll(() => release !== null).toBe(true);
      release!();
      await prefetch;
      expect(store.pending).toBe(0);
      expect(store.progress).toMatchObject({ total: molecules.length, done: molecules.length });
      expect(announced).toHaveLength(ROWS * 3); // the three formulas per row that call the store
      model.reevaluate(announced);
      expect(shown(model)).toEqual(reference);
    } finally {
      model.dispose();
      uninstall();
    }
  });
});
