// The Diatomic family through the spreadsheet engine: a screening sheet, the MOTABLE spill and its
// scalar routes, every bad input as an error value with its message, and the caches at sheet scale.
import { DetailedCellError, type HyperFormula } from 'hyperformula';
import { afterEach, describe, expect, it } from 'vitest';
import { catalogByName } from '../functions/catalog/index.js';
import { diatomicFunctions } from '../functions/catalog/diatomic.js';
import type { Scalar } from '../functions/catalog/types.js';
import { clearDiatomicCache, diatomicAnalysisCount } from '../functions/chem/diatomic.js';
import { clearSpeciesCache, speciesParseCount } from '../functions/chem/species.js';
import { createEngine, type SheetInput } from '../functions/engine.js';

let engine: HyperFormula | undefined;
afterEach(() => {
  engine?.destroy();
  engine = undefined;
});

function build(sheet: SheetInput) {
  engine = createEngine({ Sheet1: sheet });
  const sheetId = engine.getSheetId('Sheet1')!;
  const at = (row: number, col: number) => engine!.getCellValue({ sheet: sheetId, row, col });
  return { at, sheetId };
}

const COLUMNS = ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'GROUNDTERM', 'DEGENERACY', 'HOMO', 'LUMO', 'ELECTRONS'];

// Bond orders: Atkins' Physical Chemistry; terms and degeneracies: Huber & Herzberg (1979) (from memory);
// magnetism: common practice; HOMO/LUMO labels in Orbitab's notation (CO 5σ/2π*: common practice).
const SCREENING: [string, ...Scalar[]][] = [
  ['O2', 2, 2, 'paramagnetic', '³Σg⁻', 3, 'πg*(2p)', 'πg*(2p)', 12],
  ['N2', 3, 0, 'diamagnetic', '¹Σg⁺', 1, 'σg(2p)', 'πg*(2p)', 10],
  ['NO', 2.5, 1, 'paramagnetic', '²Π', 4, '2π*', '2π*', 11],
  ['OH', 1, 1, 'paramagnetic', '²Π', 4, '1π', '1π', 7],
  ['CO', 3, 0, 'diamagnetic', '¹Σ⁺', 1, '5σ', '2π*', 10],
  ['B2', 1, 2, 'paramagnetic', '³Σg⁻', 3, 'πu(2p)', 'πu(2p)', 6],
  ['O2^2-', 1, 0, 'diamagnetic', '¹Σg⁺', 1, 'πg*(2p)', 'σu*(2p)', 14],
  ['HF', 1, 0, 'diamagnetic', '¹Σ⁺', 1, '1π', '4σ*', 8],
];

describe('a screening sheet: species in column A, the family across', () => {
  it('computes every column for each species', () => {
    const sheet = SCREENING.map(([species], r) => [species, ...COLUMNS.map((fn) => `=${fn}(A${r + 1})`)]);
    const { at } = build(sheet);
    const computed = SCREENING.map((row, r) => [row[0], ...COLUMNS.map((_, c) => at(r, c + 1))]);
    expect(computed).toEqual(SCREENING);
  });

  it('lets a column of orderings sit beside the species', () => {
    const { at } = build([
      ['B2', 'mixed', '=UNPAIRED(A1,B1)'],
      ['B2', 'unmixed', '=UNPAIRED(A2,B2)'],
      ['B2', null, '=UNPAIRED(A3,B3)'],
    ]);
    expect([at(0, 2), at(1, 2), at(2, 2)]).toEqual([2, 0, 2]);
  });
});

describe('MOTABLE', () => {
  it('spills six rows of label, character and electrons for O2, and pads OH with empty text', () => {
    const { at } = build([['O2', '=MOTABLE(A1)', null, null, 'OH', '=MOTABLE(E1)']]);
    const table = (col: number) => Array.from({ length: 6 }, (_, r) => [0, 1, 2].map((c) => at(r, col + c)));
    expect(table(1)).toEqual([
      ['σg(2s)', 'bonding', 2],
      ['σu*(2s)', 'antibonding', 2],
      ['σg(2p)', 'bonding', 2],
      ['πu(2p)', 'bonding', 4],
      ['πg*(2p)', 'antibonding', 2],
      ['σu*(2p)', 'antibonding', 0],
    ]);
    expect(table(5).slice(3)).toEqual([
      ['4σ*', 'antibonding', 0],
      ['', '', ''],
      ['', '', ''],
    ]);
  });

  it('gives every spilled cell a scalar route MOTABLE(species, ordering, row, column)', () => {
    const sheet: SheetInput = [['NO', '=MOTABLE(A1)', null, null]];
    for (let r = 1; r <= 6; r++) sheet.push([null, null, null, null, ...[1, 2, 3].map((c) => `=MOTABLE($A$1,"auto",${r},${c})`)]);
    while (sheet.length < 7) sheet.push([]);
    const { at } = build(sheet);
    for (let r = 0; r < 6; r++) for (let c = 0; c < 3; c++) expect(at(r + 1, 4 + c)).toEqual(at(r, 1 + c));
  });

  it('returns one row when asked for a row', () => {
    const { at } = build([['=MOTABLE("N2","auto",4)']]);
    expect([at(0, 0), at(0, 1), at(0, 2)]).toEqual(['σg(2p)', 'bonding', 2]);
    expect(at(1, 0)).toBeNull();
  });
});

// formula, error type, message
const BAD_INPUT: [string, string, string][] = [
  ['=BONDORDER("Xq2")', 'VALUE', "unknown element 'Xq' in 'Xq2'"],
  ['=BONDORDER("H2O")', 'VALUE', "only diatomic species are supported: 'H2O' has 3 atoms"],
  ['=UNPAIRED("O2^5+")', 'VALUE', "charge +5 in 'O2^5+' is outside the supported range -3 to +3"],
  ['=MAGNETISM("H2^3+")', 'VALUE', "charge +3 leaves no electrons in 'H2^3+'"],
  ['=GROUNDTERM("")', 'VALUE', 'species is empty: type a diatomic such as O2, NO+ or OH'],
  ['=BONDORDER(5)', 'VALUE', 'species must be text such as "O2", not the number 5'],
  ['=BONDORDER(TRUE())', 'VALUE', 'species must be text such as "O2", not the logical value TRUE'],
  ['=BONDORDER(Z1)', 'VALUE', 'species is empty: type a diatomic such as O2, NO+ or OH'],
  ['=BONDORDER("O2","sideways")', 'VALUE', "unknown ordering 'sideways': use auto, mixed or unmixed"],
  ['=GROUNDTERM("O2","latex")', 'VALUE', "unknown format 'latex': use unicode or ascii"],
  ['=MOCONFIG("O2","auto","brief")', 'VALUE', "unknown core style 'brief': use abbreviated or full"],
  ['=ELECTRONS("O2","core")', 'VALUE', "unknown count 'core': use valence or total"],
  ['=SPINMOMENT("Fe2")', 'VALUE', "element 'Fe' in 'Fe2' is outside the supported range H to Ar"],
  ['=HOMO("NaCl")', 'VALUE', "'NaCl' pairs sodium (an s-block metal) with chlorine: such largely ionic pairs are outside this covalent MO model"],
  ['=DEGENERACY("Ne2-")', 'VALUE', "'Ne2-' has 17 valence electrons; its valence orbitals hold at most 16"],
  ['=LUMO("Ne2")', 'NA', "'Ne2' fills every valence orbital: no LUMO in the valence set"],
  ['=MOTABLE("O2","auto",7)', 'REF', 'row 7 is out of range: the table has 6 rows (use 1 to 6)'],
  ['=MOTABLE("O2","auto",1,4)', 'REF', 'column 4 is out of range: the table has 3 columns (use 1 to 3)'],
  ['=MOTABLE(A1:A2)', 'VALUE', 'species must be a single cell, not a 2×1 range'],
  ['=MOTABLE("Xq2")', 'VALUE', "unknown element 'Xq' in 'Xq2'"],
  ['=BONDORDER(1/0)', 'DIV_BY_ZERO', 'the species cell holds an error (DIV_BY_ZERO)'],
];

describe('bad input becomes an error value with a message, never an exception', () => {
  it('answers each wrong species, option and argument type with its own message', () => {
    // Seven rows apart, so that even a full MOTABLE spill has room.
    const sheet: SheetInput = [];
    BAD_INPUT.forEach(([formula], i) => {
      sheet[i * 7] = [i === 0 ? 'O2' : i === 1 ? 'N2' : null, formula];
      for (let k = 1; k < 7; k++) sheet[i * 7 + k] = [i === 0 && k === 1 ? 'N2' : null];
    });
    let at!: (r: number, c: number) => unknown;
    expect(() => ({ at } = build(sheet))).not.toThrow();
    const seen = BAD_INPUT.map(([formula], i) => {
      const v = at(i * 7, 1);
      return [formula, v instanceof DetailedCellError ? v.type : v, v instanceof DetailedCellError ? v.message : v];
    });
    expect(seen).toEqual(BAD_INPUT);
  });
});

describe('caches at sheet scale', () => {
  it('parses and analyses once per distinct species in a 100,000-row column', () => {
    clearSpeciesCache();
    clearDiatomicCache();
    const distinct = ['O2', 'N2', 'NO+', 'CN-'];
    const rows = 100_000;
    const sheet: SheetInput = Array.from({ length: rows }, (_, r) => [distinct[r % 4], `=BONDORDER(A${r + 1})`]);
    const { at } = build(sheet);
    expect([at(0, 1), at(1, 1), at(2, 1), at(rows - 1, 1)]).toEqual([2, 3, 3, 3]);
    expect(speciesParseCount()).toBe(distinct.length);
    expect(diatomicAnalysisCount()).toBe(distinct.length);
  });
});

describe('catalog entries of the family', () => {
  it('registers all twelve functions with a source and examples', () => {
    const names = diatomicFunctions.map((e) => e.name);
    expect(names).toEqual(['MOCONFIG', 'BONDORDER', 'UNPAIRED', 'MAGNETISM', 'SPINMOMENT', 'GROUNDTERM', 'DEGENERACY', 'MODELCAVEAT', 'HOMO', 'LUMO', 'ELECTRONS', 'MOTABLE']);
    for (const e of diatomicFunctions) {
      expect(catalogByName.get(e.name)).toBe(e);
      expect(e.source.length).toBeGreaterThan(40);
      expect(e.examples.length).toBeGreaterThan(0);
    }
  });

  it('fixes the MOTABLE spill from the formula text: 6×3, one row with row, one cell with row and column', () => {
    const spill = catalogByName.get('MOTABLE')!.spill!;
    const lit = (value: Scalar) => ({ kind: 'literal' as const, value });
    expect(spill([lit('O2')])).toEqual({ rows: 6, cols: 3 });
    expect(spill([lit('O2'), lit('auto'), { kind: 'other' }])).toEqual({ rows: 1, cols: 3 });
    expect(spill([lit('O2'), lit('auto'), lit(2), lit(3)])).toEqual({ rows: 1, cols: 1 });
  });

  it('gives the value its own examples promise, through the engine', () => {
    const examples = diatomicFunctions.flatMap((e) => e.examples);
    const { at } = build(examples.flatMap((ex) => [[ex.formula], ...Array.from({ length: 6 }, () => [])]));
    examples.forEach((ex, i) => {
      const expected = ex.expected;
      const got = Array.isArray(expected) ? expected.map((row, r) => row.map((_, c) => at(i * 7 + r, c))) : at(i * 7, 0);
      if (typeof expected === 'number') expect(got as number, ex.formula).toBeCloseTo(expected, 9);
      else expect(got, ex.formula).toEqual(expected);
    });
  });
});
