// One check for every 1-based index argument (functions/chem/errors.ts oneBasedIndex): the same rule
// (a whole number from 1 to the count) and the same wording in every family that picks by index.
import { DetailedCellError } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { oneBasedIndex } from '../functions/chem/errors.js';
import { createEngine } from '../functions/engine.js';

const WORDING = /^(\w[\w ]*) (-?[\d.]+) is out of range: .+ has (\d+) [\w ]+ \(use 1 to \3\)$/;

describe('oneBasedIndex', () => {
  it('accepts 1 to count and returns the 0-based position', () => {
    expect(oneBasedIndex(1, 3, { item: 'level', holder: 'this system' })).toBe(0);
    expect(oneBasedIndex(3, 3, { item: 'level', holder: 'this system' })).toBe(2);
  });

  it.each([0, 4, -1, 1.5, Number.NaN])('refuses %s, naming the range', (k) => {
    expect(() => oneBasedIndex(k, 3, { item: 'level', holder: 'this system' })).toThrow(`level ${k} is out of range: this system has 3 levels (use 1 to 3)`);
  });

  it('keeps a caller’s plural and error kind', () => {
    let caught: unknown;
    try {
      oneBasedIndex(9, 4, { item: 'atom', items: 'heavy atoms', holder: "'C=CC=C'", kind: 'REF' });
    } catch (e) {
      caught = e;
    }
    expect(caught).toMatchObject({ kind: 'REF', message: "atom 9 is out of range: 'C=CC=C' has 4 heavy atoms (use 1 to 4)" });
  });
});

describe('every family words an index out of range alike', () => {
  const formulas = [
    '=MOTABLE("O2","auto",7)',
    '=MOTABLE("O2","auto",1,4)',
    '=HUCKEL("c1ccccc1",,7)',
    '=PIBONDORDER("C=CC=C",1,9)',
    '=PPPEXCITE("C=CC=C",9)',
    '=EHTLEVELS("O 0 0 0; H 0 0 0.96",9)',
    '=EHTCHARGE("O 0 0 0; H 0 0 0.96",3)',
  ];
  it.each(formulas)('%s', (formula) => {
    const engine = createEngine({ S: [[formula]] });
    const value = engine.getCellValue({ sheet: engine.getSheetId('S')!, row: 0, col: 0 });
    engine.destroy();
    expect(value).toBeInstanceOf(DetailedCellError);
    expect((value as DetailedCellError).message).toMatch(WORDING);
  });
});
