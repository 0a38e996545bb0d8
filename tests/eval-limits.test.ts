// Evaluation limits (functions/limits.ts) through the engine every Orbitab surface builds
// (functions/engine.ts createEngine): each formula below once stalled a tab or ran a server out of
// memory. Each must now come back as a cell error naming the limit, with the engine holding only a
// handful of vertices (nothing built per cell of a huge range or spill), while the rest of the
// workbook computes and stays editable. Legitimate large work under the limits still computes.
import { DetailedCellError, type HyperFormula } from 'hyperformula';
import { afterEach, describe, expect, it } from 'vitest';
import { createEngine, type SheetInput } from '../functions/engine.js';
import { evaluationLimits as L, count, formulaOperatorCount } from '../functions/limits.js';
import { clearHuckelCache } from '../functions/chem/huckelCache.js';
import { smilesHeavyAtomCount } from '../functions/catalog/huckelLimits.js';
import { cellInputProblem } from '../shared/cellInput.js';
import { allowedActions } from '../shared/permissions.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';

let engines: HyperFormula[] = [];
afterEach(() => {
  engines.forEach((e) => e.destroy());
  engines = [];
  clearHuckelCache();
});

function open(rows: SheetInput) {
  const engine = createEngine({ S: rows });
  engines.push(engine);
  return engine;
}
const at = (engine: HyperFormula, row: number, col: number) => engine.getCellValue({ sheet: engine.getSheetId('S')!, row, col });
/** Vertices in the engine's dependency graph: a refused range or spill adds none per cell. */
const vertices = (engine: HyperFormula) => engine.graph.getNodes().length;

function expectLimitError(value: unknown, message: RegExp) {
  expect(value).toBeInstanceOf(DetailedCellError);
  expect((value as DetailedCellError).message).toMatch(message);
}

const spillLimit = new RegExp(`spills [\\d,]+ cells; at most ${count(L.maxSpillCells)}$`);
const rangeLimit = new RegExp(`reads [\\d,]+ cells \\([A-Z]+\\d*:[A-Z]+\\d*\\); at most ${count(L.maxRangeCells)} per formula$`);
const textLimit = new RegExp(`makes text of [\\d,]+ characters; at most ${count(L.maxTextLength)}$`);

/** A chain of n benzene rings joined by single bonds (polyphenylene): 6n π centres. */
const polyphenylene = (n: number) => Array.from({ length: n }, (_, i) => (i < n - 1 ? 'c1ccc(cc1)' : 'c1ccccc1')).join('');

describe('hostile formulas become cell errors naming the limit', () => {
  const cases: { name: string; rows: SheetInput; cell: [number, number]; message: RegExp }[] = [
    { name: 'a 1,000,000 × 2,000 SEQUENCE', rows: [['=SEQUENCE(1000000,2000)']], cell: [0, 0], message: /^the formula spills 2,000,000,000 cells; at most/ },
    { name: 'SUM over A2:BXX1000000 beside one number', rows: [['=SUM(A2:BXX1000000)', 1]], cell: [0, 0], message: /reads 1,999,998,000 cells \(A2:BXX1000000\)/ },
    { name: 'HUCKEL over B2:BXX1000000', rows: [['=HUCKEL(B2:BXX1000000)']], cell: [0, 0], message: /reads 1,998,998,001 cells \(B2:BXX1000000\)/ },
    { name: 'SUM over B1:CW100000', rows: [['=SUM(B1:CW100000)']], cell: [0, 0], message: /reads 10,000,000 cells \(B1:CW100000\)/ },
    { name: 'SECULAR over B2:BXX2001 (empty cells)', rows: [['=SECULAR(B2:BXX2001)']], cell: [0, 0], message: /reads 3,998,000 cells \(B2:BXX2001\)/ },
    { name: 'array arithmetic over a million rows', rows: [['=B1:B1000000*2']], cell: [0, 0], message: /reads 1,000,000 cells \(B1:B1000000\)/ },
    { name: 'SUM(B:B) beside a reference to BXX1000000', rows: [['=BXX1000000', '=SUM(B:B)']], cell: [0, 1], message: /reads 1,000,000 cells \(B:B\)/ },
    { name: 'INDEX(A:A,2000000) beside OFFSET(A1,999999,1999)', rows: [['=OFFSET(A1,999999,1999)', '=INDEX(A:A,2000000)']], cell: [0, 1], message: /reads 1,000,000 cells \(A:A\)/ },
    // 50,000 rows (A2:A50001) times 1,999 columns (B1:BXX1)
    { name: 'MMULT whose product would spill 99,950,000 cells', rows: [['=MMULT(A2:A50001,B1:BXX1)']], cell: [0, 0], message: /^the formula spills 99,950,000 cells; at most/ },
  ];
  for (const c of cases)
    it(c.name, () => {
      const engine = open(c.rows);
      const value = at(engine, ...c.cell);
      expectLimitError(value, c.message);
      expectLimitError(value, /spills/.test(c.message.source) ? spillLimit : rangeLimit);
      expect(vertices(engine)).toBeLessThan(20);
    });

  it('ten cells of REPT("ab",200000000) each refuse before building the text', () => {
    const engine = open(Array.from({ length: 10 }, () => ['=REPT("ab",200000000)']));
    for (let r = 0; r < 10; r++) expectLimitError(at(engine, r, 0), /^REPT makes text of 400,000,000 characters; at most 32,767$/);
    expect(vertices(engine)).toBeLessThan(20);
  });

  it('text that grows by SUBSTITUTE or by joining cells is refused too', () => {
    const engine = open([
      ['=SUBSTITUTE(REPT("a",30000),"a","bbbb")', '=REPT("x",30000)', '=B1&B1', '=LEN(B1&B1)'],
    ]);
    expectLimitError(at(engine, 0, 0), /^SUBSTITUTE makes text of 120,000 characters/);
    expectLimitError(at(engine, 0, 2), textLimit);
    expect(at(engine, 0, 3)).toBe(60000); // an intermediate may be longer; only what a cell keeps is bounded
  });

  it('a SEQUENCE sized by cells is checked when it runs', () => {
    const engine = open([[3000, 400, '=SUM(SEQUENCE(A1,B1))', '=SUM(SEQUENCE(3,4))']]);
    expectLimitError(at(engine, 0, 2), /^SEQUENCE spills 1,200,000 cells; at most 100,000$/);
    expect(at(engine, 0, 3)).toBe(78); // 1 + 2 + … + 12
  });

  it('HUCKEL of a 500-ring SMILES is refused before perception', () => {
    const engine = open([[polyphenylene(500), '=HUCKEL(A1,,1)']]);
    expectLimitError(at(engine, 0, 1), new RegExp(`^the SMILES has 3,000 heavy atoms; at most ${L.maxSmilesAtoms} are read$`));
  });

  it('HUCKEL solves up to the π-centre limit and refuses one more double bond past it', () => {
    const under = 'C=C'.repeat(L.maxPiCentres / 2);
    const over = 'C=C'.repeat(L.maxPiCentres / 2 + 1);
    const engine = open([[under, '=HUCKEL(A1,,1)'], [over, '=HUCKEL(A2,,1)']]);
    // Linear polyene of N centres: x_1 = 2cos(π/(N+1)) (Hückel's closed form for a chain,
    // Streitwieser 1961 §2.4), an independent computation of the most bonding level.
    expect(at(engine, 0, 1)).toBeCloseTo(2 * Math.cos(Math.PI / (L.maxPiCentres + 1)), 9);
    expectLimitError(at(engine, 1, 1), new RegExp(`^the π system has ${L.maxPiCentres + 2} centres; at most ${L.maxPiCentres} are solved$`));
  });

  it('SECULAR and HUCKEL refuse a matrix range past the matrix limit, and solve one at it', () => {
    const n = L.maxMatrixSize;
    const chain = (size: number) => Array.from({ length: size }, (_, i) => Array.from({ length: size }, (_, j) => (Math.abs(i - j) === 1 ? 1 : 0)));
    const big = chain(n + 1);
    const engine = open([...big.map((row) => [...row]), [`=SECULAR(A1:${colName(n)}${n + 1},,1)`, `=HUCKEL(A1:${colName(n)}${n + 1},,1)`, `=SECULAR(A1:${colName(n - 1)}${n},,1)`]]);
    const message = new RegExp(`^the matrix range is ${n + 1} × ${n + 1}; at most ${n} × ${n}$`);
    expectLimitError(at(engine, n + 1, 0), message);
    expectLimitError(at(engine, n + 1, 1), message);
    // Lowest root of a chain of n: −2cos(π/(n+1)) (same closed form as above).
    expect(at(engine, n + 1, 2)).toBeCloseTo(-2 * Math.cos(Math.PI / (n + 1)), 9);
  });
});

function colName(index: number): string {
  let s = '';
  for (let n = index + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
}

describe('legitimate large work still computes', () => {
  it('SUM over A1:A100000 of numbers', () => {
    const engine = open([...Array.from({ length: 100_000 }, (_, i) => [i + 1, i === 0 ? '=SUM(A1:A100000)' : null])]);
    expect(at(engine, 0, 1)).toBe((100_000 * 100_001) / 2);
  });

  it('SEQUENCE(1000) spills a thousand rows, and a spill at the limit is allowed', () => {
    const engine = open([['=SEQUENCE(1000)', '=SUM(SEQUENCE(100000))']]);
    expect(at(engine, 999, 0)).toBe(1000);
    expect(at(engine, 0, 1)).toBe((100_000 * 100_001) / 2);
  });

  it('a whole row is within the range limit; a far single reference is allowed', () => {
    const engine = open([[1, 2], ['=SUM(1:1)', '=BXX1000000']]);
    expect(at(engine, 1, 0)).toBe(3);
    expect(at(engine, 1, 1)).toBeNull(); // an empty cell, as HyperFormula reports a reference to one
  });

  it('REPT and SUBSTITUTE at ordinary sizes behave as before', () => {
    const engine = open([['=REPT("ab",3)', '=SUBSTITUTE("a-b-c","-","+")', '=SUBSTITUTE("a-b-c","-","+",2)', '=SUBSTITUTE("ab","b","$&$&")']]);
    expect([0, 1, 2, 3].map((c) => at(engine, 0, c))).toEqual(['ababab', 'a+b+c', 'a-b+c', 'a$&$&']);
  });
});

describe('a workbook holding hostile formulas stays usable', () => {
  it('opens in the browser model with errors in those cells and the rest editable', () => {
    const hostile = ['=SEQUENCE(1000000,2000)', '=SUM(A2:BXX1000000)', '=REPT("ab",200000000)', '=BXX1000000', '=SUM(B:B)', '=B1:B1000000*2', '=1' + '+1'.repeat(1249)];
    const cells: [number, number, string][] = hostile.map((f, i) => [i, 3, f]);
    cells.push([0, 0, '2'], [0, 1, '=A1*21']);
    const model = new WorkbookModel({ id: 'wb', title: 'Hostile', revision: 1, role: 'owner', actions: allowedActions(['owner']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells }] });
    try {
      for (const row of [0, 1, 2, 4, 5, 6]) expect(model.view('s1', row, 3)?.errorMessage).toMatch(/at most/);
      expect(model.view('s1', 0, 1)?.display).toBe('42');
      // The grid's rows come from the typed block, not the engine's sheet (a million rows long here).
      const rows = model.rows('s1');
      expect(rows[0][3]?.errorMessage).toMatch(/at most 100,000$/);
      expect(rows.length).toBeLessThan(2000);
      model.edit([{ sheetId: 's1', row: 0, col: 0, input: '3' }]);
      expect(model.view('s1', 0, 1)?.display).toBe('63');
      expect(vertices(model.engine)).toBeLessThan(40);
    } finally {
      model.dispose();
    }
  });
});

describe('formula size: the cell-input check and the engine agree', () => {
  const chain = (operands: number) => '=1' + '+1'.repeat(operands - 1);

  it.each([1250, 10000])('refuses =1+1+… of %i operands, naming the limit', (n) => {
    expect(cellInputProblem(chain(n))).toBe(`the formula has ${count(n - 1)} operators; at most ${count(L.maxFormulaOperators)}`);
    expectLimitError(at(open([[chain(n)]]), 0, 0), /operators; at most/);
  });

  it('accepts ordinary long formulas, and long argument lists', () => {
    const long = '=IF(AND(A1>0,B1<>"x+y-z"),ROUND(HUCKEL("C=CC=CC=C",,1)*2.5e-3+PIGAP("c1ccccc1")/4-1,6),SUM(A1:A100)&" mol")';
    expect(formulaOperatorCount(long)).toBeLessThan(20); // text inside "…" is not counted
    expect(cellInputProblem(long)).toBeNull();
    expect(cellInputProblem(chain(L.maxFormulaOperators + 1))).toBeNull();
    expect(cellInputProblem('=SUM(' + Array(2000).fill('A1').join(',') + ')')).toBeNull();
    expect(at(open([[chain(L.maxFormulaOperators + 1)]]), 0, 0)).toBe(L.maxFormulaOperators + 1);
  });

  it('counts heavy atoms of SMILES text as written', () => {
    expect(smilesHeavyAtomCount('c1ccccc1')).toBe(6);
    expect(smilesHeavyAtomCount('ClC(Br)=[N+]([O-])[2H]')).toBe(5); // Cl, C, Br, N, O; [2H] is hydrogen
  });
});

describe('one table of limits', () => {
  it('lists the science core’s own method bounds exactly as the methods apply them', async () => {
    const { MAX_PPP_CENTRES } = await import('../functions/chem/ppp.js');
    const { EHT_MAX_ATOMS, EHT_MAX_BASIS } = await import('../functions/chem/eht.js');
    expect([L.maxPppCentres, L.maxEhtBasisFunctions, L.maxEhtAtoms]).toEqual([MAX_PPP_CENTRES, EHT_MAX_BASIS, EHT_MAX_ATOMS]);
  });
});
