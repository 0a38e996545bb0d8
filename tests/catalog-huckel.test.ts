// The Hückel family through a real HyperFormula engine: spills, cell references and matrix ranges,
// one solve per structure in a screening column, composition with LEVELGAP, and a table of bad input
// whose every entry comes back as a cell error with a message (nothing throws out of the engine).
import { DetailedCellError } from 'hyperformula';
import { beforeEach, describe, expect, it } from 'vitest';
import { clearHuckelCache, huckelCacheStats } from '../functions/chem/huckelCache.js';
import { createEngine, type SheetInput } from '../functions/engine.js';

function evaluate(rows: SheetInput) {
  const engine = createEngine({ S: rows });
  const values = engine.getSheetValues(engine.getSheetId('S')!);
  engine.destroy();
  return values;
}
/** Evaluates one formula placed below its data (data from A1), so a spill has room. */
const one = (formula: string, rows: SheetInput = []) => evaluate([...rows, [formula]])[rows.length][0];

const polyene = (doubleBonds: number) => 'C=C'.repeat(doubleBonds);
const butadieneLevels = [1.6180339887, 0.6180339887, -0.6180339887, -1.6180339887];
const allylMatrix = [[0, 1, 0], [1, 0, 1], [0, 1, 0]];

beforeEach(() => clearHuckelCache());

describe('spilled level lists', () => {
  it('spills exactly one row per π centre for a literal SMILES, leaving the cell below free', () => {
    const values = evaluate([['=HUCKEL("C=CC=C")'], [], [], [], ['below']]);
    butadieneLevels.forEach((x, k) => expect(values[k][0]).toBeCloseTo(x, 9));
    expect(values[4][0]).toBe('below');
  });

  it('reports #SPILL! when a literal SMILES spill would overwrite a value', () => {
    const values = evaluate([['=HUCKEL("C=CC=C")'], [], [], ['in the way']]);
    expect((values[0][0] as DetailedCellError).type).toBe('SPILL');
  });

  it('spills a fixed 50-row area for a referenced SMILES, its unused rows empty', () => {
    const values = evaluate([['c1ccccc1', '=HUCKEL(A1)']]);
    expect(values.map((r) => r[1])).toEqual([2, 1, 1, -1, -1, -2].map((x) => expect.closeTo(x, 9)));
    const blocked = (row: number) => {
      const rows: SheetInput = Array.from({ length: row + 1 }, () => []);
      rows[0] = ['c1ccccc1', '=HUCKEL(A1)'];
      rows[row] = ['', 'in the way'];
      return evaluate(rows)[0][1];
    };
    expect((blocked(49) as DetailedCellError).type).toBe('SPILL');
    expect(blocked(50)).toBe(2);
  });

  it('sizes the spill from a matrix range and treats the matrix in β units', () => {
    const values = evaluate([[...allylMatrix[0], '=HUCKEL(A1:C3)'], allylMatrix[1], allylMatrix[2]]);
    expect(values.map((r) => r[3])).toEqual([Math.SQRT2, 0, -Math.SQRT2].map((x) => expect.closeTo(x, 9)));
  });

  it('gives one level per cell with k, which is how a screening column reads it', () => {
    expect(one('=HUCKEL(A1,,1)', [['c1ccccc1']])).toBeCloseTo(2, 12);
    expect(one('=HUCKEL("C=CC=C","Van-Catledge",4)')).toBeCloseTo(-1.6180339887, 9);
  });

  it('refuses to spill more than 50 levels but still answers with k', () => {
    const big = polyene(30);
    expect((one(`=HUCKEL("${big}")`) as DetailedCellError).message).toContain('HUCKEL would spill 60 values, more than the 50 rows');
    expect((one('=HUCKEL(A1)', [[big]]) as DetailedCellError).message).toContain('give the index argument (HUCKEL(structure, params, k))');
    expect(one(`=HUCKEL("${big}",,1)`)).toBeCloseTo(2 * Math.cos(Math.PI / 61), 9);
  });

  it('takes S = 1 when the overlap is left out entirely or left empty', () => {
    const values = evaluate([[0, 1, '=SECULAR(A1:B2)', '=SECULAR(A1:B2,,2)', '=ORBITAL(A1:B2,,1,2)'], [1, 0]]);
    expect([values[0][2], values[1][2]]).toEqual([-1, 1]);
    expect(values[0][3]).toBe(1);
    expect(values[0][4]).toBeCloseTo(-Math.SQRT1_2, 12);
  });

  it('spills SECULAR roots lowest first and ORBITAL coefficients from ranges', () => {
    const values = evaluate([[0, 1, '=SECULAR(A1:B2,C4:D5)', '=ORBITAL(A1:B2,,2)'], [1, 0], [], ['', '', 1, 0.25], ['', '', 0.25, 1]]);
    expect([values[0][2], values[1][2]]).toEqual([expect.closeTo(-1 / 0.75, 9), expect.closeTo(1 / 1.25, 9)]);
    expect([values[0][3], values[1][3]]).toEqual([expect.closeTo(Math.SQRT1_2, 9), expect.closeTo(Math.SQRT1_2, 9)]);
  });
});

describe('matrix input', () => {
  const withAllyl = (formula: string) => evaluate([[formula, ...allylMatrix[0]], ['', ...allylMatrix[1]], ['', ...allylMatrix[2]]])[0][0];

  it('assumes one π electron per centre: the allyl matrix reads as the radical, E_π = 2√2', () => {
    expect(withAllyl('=PIENERGY(B1:D3)')).toBeCloseTo(2 * Math.SQRT2, 9);
  });

  it('takes an explicit electron count: two electrons make the allyl cation, +0.5 on each end', () => {
    expect(withAllyl('=PICHARGE(B1:D3,1,,2)')).toBeCloseTo(0.5, 12);
    expect(withAllyl('=PICHARGE(B1:D3,2,,2)')).toBeCloseTo(0, 12);
  });
});

describe('a screening column solves each molecule once', () => {
  it('builds and solves 6 distinct molecules once for 300 rows × 4 functions', () => {
    const molecules = ['c1ccccc1', 'C=CC=C', 'c1ccncc1', 'C=CC=O', 'c1ccc2ccccc2c1', '[CH+]1C=CC=CC=C1'];
    const rows: SheetInput = Array.from({ length: 300 }, (_, r) => {
      const n = r + 1;
      return [molecules[r % molecules.length], `=PIGAP(A${n})`, `=PIENERGY(A${n})`, `=DELOCALIZATION(A${n})`, `=HUCKEL(A${n},,1)`];
    });
    const values = evaluate(rows);
    expect(values[0].slice(1)).toEqual([expect.closeTo(2, 9), expect.closeTo(8, 9), expect.closeTo(2, 9), expect.closeTo(2, 9)]);
    // Row 300 is the tropylium cation: ring levels x = 2cos(2πk/7) (Hückel's ring formula, Streitwieser
    // 1961, ch. 2), six electrons in k = 0, ±1, so E_π = 4 + 8cos(2π/7), computed here.
    expect(values[299][2]).toBeCloseTo(4 + 8 * Math.cos((2 * Math.PI) / 7), 6);
    expect(huckelCacheStats()).toMatchObject({ piSystemBuilds: 6, modelSolves: 6 });
  });
});

describe('composition with LEVELGAP (lowest energy filled first)', () => {
  it('gives butadiene 1.236 from LEVELGAP(HUCKEL("C=CC=C"),4): the pairing theorem makes the sign of x immaterial', () => {
    expect(one('=LEVELGAP(HUCKEL("C=CC=C"),4)')).toBeCloseTo(1.2360679775, 9);
  });

  it('computes thiophene with the default set, using Van-Catledge sulfur (h_S 1.11, k_CS 0.69; J. Org. Chem. 1980)', () => {
    const gap = one('=PIGAP("c1ccsc1")') as number;
    expect(typeof gap).toBe('number');
    expect(gap).toBeCloseTo(one('=PIGAP("c1ccsc1","van-catledge")') as number, 12);
  });

  it('matches PIGAP for a non-alternant system when given energies E − α = −x|β|', () => {
    const gap = one('=PIGAP("C=CC=O")') as number;
    expect(one('=LEVELGAP(-HUCKEL("C=CC=O"),4)')).toBeCloseTo(gap, 12);
  });
});

describe('bad input: each a #VALUE! (or #NUM!) with a message saying what is wrong', () => {
  const cases: [string, string, SheetInput?][] = [
    ['=HUCKEL("C1CC",,1)', "cannot read SMILES 'C1CC': dangling ring closure"],
    ['=PIGAP("")', 'empty structure: give a SMILES string or a square range'],
    ['=PIGAP("CCO")', "no π system in 'CCO'"],
    ['=PIENERGY("C=C=C")', 'two cumulated double bonds'],
    ['=PIGAP("Brc1ccccc1","van-catledge")', 'the van-catledge parameter set has no value for bromine (atom 1) — try "streitwieser"'],
    ['=PIGAP("[O-]c1ccccc1")', 'no Hückel parameters for O⁻ with 2 π electrons (atom 1)'],
    ['=PIGAP("C=CC=C","hueckel")', `unknown Hückel parameter set 'hueckel': use "streitwieser" or "van-catledge"`],
    ['=HUCKEL(A1,,1)', 'the structure must be SMILES text or a square matrix range, got TRUE', [[true]]],
    ['=HUCKEL(A1:B3,,1)', 'the Hückel matrix range must be a square range, got 3 rows × 2 columns', [[0, 1], [1, 0], [0, 0]]],
    ['=HUCKEL(A1:B2,,1)', 'must be symmetric: element (1,2) = 1 but (2,1) = 2', [[0, 1], [2, 0]]],
    ['=HUCKEL(A1:B2,,1)', "must hold numbers only: row 2, column 1 is 'x'", [[0, 1], ['x', 0]]],
    ['=HUCKEL(A1:B2,,1)', 'row 1, column 2 is an empty cell', [[0, ''], [1, 0]]],
    ['=HUCKEL(A1:B2,"streitwieser",1)', 'the params argument applies to SMILES input', [[0, 1], [1, 0]]],
    ['=DELOCALIZATION(A1:B2)', 'DELOCALIZATION needs a SMILES structure', [[0, 1], [1, 0]]],
    ['=AROMATICITY(A1:B2)', 'AROMATICITY needs a SMILES structure', [[0, 1], [1, 0]]],
    ['=HUCKEL("c1ccccc1",,7)', 'level 7 is out of range: this system has 6 levels (use 1 to 6)'],
    ['=PIBONDORDER("C=CC=C",1,3)', 'atoms 1 and 3 are not bonded in the π system'],
    ['=PIBONDORDER("C=CC=C",2,2)', 'i and j are both atom 2'],
    ['=PIBONDORDER("C=CC=C",1,9)', "atom 9 is out of range: 'C=CC=C' has 4 heavy atoms (use 1 to 4)"],
    ['=PICHARGE("CC=C",1)', "atom 1 (C) of 'CC=C' is not in the π system"],
    ['=PICHARGE("C([H])=C",1)', 'atom numbers are ambiguous'],
    ['=PICHARGE(A1:B2,3)', 'atom 3 is out of range: the matrix has 2 centres', [[0, 1], [1, 0]]],
    ['=PIGAP("C=C",,5)', 'electron count must be a whole number from 0 to 4 (two per level), got 5'],
    ['=PIGAP("C=C",,4)', 'every π level is full (4 electrons on 2 levels)'],
    ['=PIGAP("C=C",,0)', 'no π electrons'],
    ['=PIGAP(5)', 'the singly filled HOMO is the highest π level'],
    ['=ABSORPTION("C1=CC=C1")', 'the HOMO–LUMO gap is 0 (open-shell degenerate π shell)'],
    ['=ABSORPTION("C=CC=C",0)', 'beta_eV must not be 0'],
    ['=SECULAR(A1:B2,C1:D2,1)', 'the overlap matrix S is not positive definite', [[0, 1, 1, 1.2], [1, 0, 1.2, 1]]],
    ['=SECULAR(A1:B2,C1:C1,1)', 'the overlap range S is 1×1 but H is 2×2', [[0, 1, 1], [1, 0]]],
    ['=SECULAR(A1:B2,C1:D2,1)', 'the overlap range S must have 1 on its diagonal', [[0, 1, 2, 0], [1, 0, 0, 1]]],
    ['=SECULAR(A1:B2,,3)', 'root 3 is out of range: this system has 2 roots', [[0, 1], [1, 0]]],
    ['=ORBITAL(A1:B2,,3)', 'orbital 3 is out of range: this system has 2 orbitals', [[0, 1], [1, 0]]],
    ['=ORBITAL(A1:B2,,1,5)', 'basis function 5 is out of range', [[0, 1], [1, 0]]],
  ];

  it('builds the whole table without throwing', () => {
    expect(() => evaluate(cases.map(([f]) => [f]))).not.toThrow();
  });

  it.each(cases)('%s → %s', (formula, message, data = []) => {
    const value = one(formula, data);
    expect(value, JSON.stringify(value)).toBeInstanceOf(DetailedCellError);
    expect(['VALUE', 'NUM']).toContain((value as DetailedCellError).type);
    expect((value as DetailedCellError).message).toContain(message);
  });
});
