// Random inputs typed into cells through the patch API: the server never answers 500, keeps exactly
// what was typed, computes values without failing, and the engine never throws on the same inputs.
// Set FUZZ_SEED to replay one run; the seed is part of each test's name. The inputs fuzzing found the
// server could not keep (unpaired surrogates, formulas nested past the parser's stack, numbers past
// the largest double) are refused at the edge; the last block holds them.
import { DetailedCellError } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';
import { cellInputProblem, formulaNestingDepth, maxFormulaNesting } from '../shared/cellInput.js';
import { maxInputLength, type CellEntry } from '../shared/workbooks.js';
import { denseSheet } from '../functions/workbookEngine.js';
import { makeTestApp } from './helpers/app.js';
import { cellInput, seededRandom } from './helpers/fuzzInputs.js';

const seed = Number(process.env.FUZZ_SEED ?? 20_250_131);
const rows = 40;
const cols = 8;
const cellsToType = 300;
const cellsPerPatch = 20;

/**
 * The inputs for one run: distinct cells (so every one can be checked back), in a seeded order.
 * Inputs shared/cellInput.ts refuses are set aside, to be sent on their own and refused.
 */
function plannedCells(runSeed: number): { typed: CellEntry[]; refused: string[] } {
  const r = seededRandom(runSeed);
  const slots = Array.from({ length: rows * cols }, (_, i) => [Math.floor(i / cols), i % cols] as const);
  for (let i = slots.length - 1; i > 0; i--) {
    const j = r.int(0, i);
    [slots[i], slots[j]] = [slots[j], slots[i]];
  }
  const refused: string[] = [];
  const typed = slots.slice(0, cellsToType).map(([row, col]): CellEntry => {
    let input = cellInput(r);
    while (cellInputProblem(input) !== null) {
      refused.push(input);
      input = cellInput(r);
    }
    return [row, col, input];
  });
  return { typed, refused };
}

function expectSaneValue(value: unknown, where: string) {
  if (typeof value === 'number') expect(Number.isFinite(value), `${where} is ${value}`).toBe(true);
  else if (value !== null && typeof value === 'object') {
    const error = value as { error?: unknown; message?: unknown };
    expect(typeof error.error, `${where}: ${JSON.stringify(value)}`).toBe('string');
    expect(typeof error.message === 'string' && error.message.length > 0, `${where} has an error without a message`).toBe(true);
  } else expect(['string', 'boolean'], `${where}: ${JSON.stringify(value)}`).toContain(typeof value);
}

describe(`cells typed with random input (seed ${seed})`, () => {
  const planned = plannedCells(seed).typed;

  it('never makes the patch API answer 500, and keeps every input exactly as typed', async () => {
    const { signUp } = makeTestApp();
    const { agent } = await signUp('fuzz.tester@example.com');
    const workbookId = (await agent.post('/api/workbooks').send({ title: 'Fuzz' })).body.workbook.id as string;
    const sheetId = (await agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id as string;

    let revision = 0;
    for (let i = 0; i < planned.length; i += cellsPerPatch) {
      const changes = planned.slice(i, i + cellsPerPatch).map(([row, col, input]) => ({ sheetId, row, col, input }));
      const res = await agent.post(`/api/workbooks/${workbookId}/patches`).send({ baseRevision: revision, changes });
      expect(res.status, `patch ${i / cellsPerPatch}: ${JSON.stringify(res.body).slice(0, 500)}`).toBe(200);
      revision = res.body.revision;
    }

    // One character over the cap is refused with a message that names the cap, not stored cut short.
    const tooLong = await agent.post(`/api/workbooks/${workbookId}/patches`).send({ baseRevision: revision, changes: [{ sheetId, row: 100, col: 0, input: 'x'.repeat(maxInputLength + 1) }] });
    expect(tooLong.status).toBe(400);
    expect(JSON.stringify(tooLong.body.error)).toContain(`at most ${maxInputLength} characters`);

    const loaded = await agent.get(`/api/workbooks/${workbookId}`);
    expect(loaded.status).toBe(200);
    const stored = new Map((loaded.body.sheets[0].cells as CellEntry[]).map(([row, col, input]) => [`${row}:${col}`, input]));
    for (const [row, col, input] of planned) {
      expect(stored.get(`${row}:${col}`), `cell ${row}:${col} typed as ${JSON.stringify(input).slice(0, 120)}`).toBe(input === '' ? undefined : input);
    }

    const values = await agent.get(`/api/workbooks/${workbookId}/values`);
    expect(values.status, JSON.stringify(values.body).slice(0, 500)).toBe(200);
    for (const [row, col, value] of values.body.sheets[0].values as [number, number, unknown][]) expectSaneValue(value, `value at ${row}:${col}`);
  }, 60_000);

  for (const runSeed of [seed, seed + 1, seed + 2]) {
    it(`never makes the engine throw, nor give NaN or Infinity (seed ${runSeed})`, () => {
      const cells = runSeed === seed ? planned : plannedCells(runSeed).typed;
      const engine = createEngine({ Sheet1: denseSheet(cells) });
      try {
        for (const [row, col, input] of cells) {
          const value = engine.getCellValue({ sheet: 0, row, col });
          const where = `${JSON.stringify(input).slice(0, 120)} at ${row}:${col}`;
          if (value instanceof DetailedCellError) expect(typeof value.value, where).toBe('string');
          else expectSaneValue(value, where);
        }
      } finally {
        engine.destroy();
      }
    });
  }
});

describe('inputs a cell cannot hold as typed (found by this fuzz test)', () => {
  const nested = (depth: number) => `=${'('.repeat(depth)}1${')'.repeat(depth)}`;

  it('measures formula nesting by parentheses and braces, ignoring those inside text', () => {
    expect(formulaNestingDepth('=BONDORDER("O2")')).toBe(1);
    expect(formulaNestingDepth('=SUM({1,2;3,4})+(1*(2+3))')).toBe(2);
    expect(formulaNestingDepth('=LEN("((((((((")')).toBe(1);
    expect(formulaNestingDepth('=LEN("say ""(("" twice")')).toBe(1);
  });

  it(`lets the engine evaluate a formula nested ${maxFormulaNesting} deep, the most allowed`, () => {
    expect(cellInputProblem(nested(maxFormulaNesting))).toBeNull();
    const engine = createEngine({ Sheet1: [[nested(maxFormulaNesting)]] });
    expect(engine.getCellValue({ sheet: 0, row: 0, col: 0 })).toBe(1);
    engine.destroy();
  });

  it('names the problem of an unpaired surrogate, a formula nested too deep and a number too large', () => {
    expect(cellInputProblem('x\udfff')).toBe('contains an unpaired surrogate (U+DFFF at character 2), which is not valid Unicode text');
    expect(cellInputProblem('\ud800 lone')).toMatch(/^contains an unpaired surrogate \(U\+D800 at character 1\)/);
    expect(cellInputProblem('O₂²⁻ 🧪')).toBeNull(); // a pair is a character
    expect(cellInputProblem(nested(200))).toBe(`the formula nests 200 levels of parentheses; at most ${maxFormulaNesting} are allowed`);
    expect(cellInputProblem(`'${'('.repeat(200)}`)).toBeNull(); // text, not a formula
    // The largest double is about 1.797e308 (IEEE 754 binary64); past it the engine would show NaN.
    expect(cellInputProblem('1e400')).toMatch(/^is a number beyond the largest a cell can hold/);
    expect(cellInputProblem('5'.repeat(400))).not.toBeNull();
    expect(cellInputProblem('1.7e308')).toBeNull();
    expect(cellInputProblem("'1e400")).toBeNull(); // the apostrophe keeps it as text
  });

  // Before the check the first was stored as "x\ufffd\ufffd\ufffd", the second made GET /values answer
  // 500 and the third computed to NaN, which JSON sends as null.
  it('refuses them through the patch API with a 400 that names the cell and the problem, saving nothing', async () => {
    const { signUp } = makeTestApp();
    const { agent } = await signUp('fuzz.edge@example.com');
    const workbookId = (await agent.post('/api/workbooks').send({ title: 'Edges' })).body.workbook.id as string;
    const sheetId = (await agent.get(`/api/workbooks/${workbookId}`)).body.sheets[0].id as string;
    const { refused } = plannedCells(seed);
    for (const input of ['x\udfff', nested(200), '1e400', ...refused]) {
      const res = await agent.post(`/api/workbooks/${workbookId}/patches`).send({ baseRevision: 0, changes: [{ sheetId, row: 0, col: 0, input: 'fine' }, { sheetId, row: 1, col: 0, input }] });
      expect(res.status).toBe(400);
      expect(JSON.stringify(res.body.error)).toContain('changes.1.input');
      expect(JSON.stringify(res.body.error)).toContain(cellInputProblem(input)!.slice(0, 30));
    }
    expect((await agent.get(`/api/workbooks/${workbookId}`)).body.revision).toBe(0);
    expect((await agent.get(`/api/workbooks/${workbookId}/values`)).status).toBe(200);
  });
});
