// Autocomplete in the formula bar and in cells: which name is being typed, what is offered, and
// what accepting a suggestion writes.
import { describe, expect, it } from 'vitest';
import { acceptSuggestion, allFunctionHelp, builtInHelp, functionTokenAt, suggestFunctions } from '../src/features/grid/formula/functionHelp.js';
import { catalog } from '../functions/catalog/index.js';

describe('the name being typed', () => {
  it('is the letters before the caret in a formula', () => {
    expect(functionTokenAt('=BOND', 5)).toEqual({ start: 1, end: 5, prefix: 'BOND' });
    expect(functionTokenAt('=A1+unp', 7)).toEqual({ start: 4, end: 7, prefix: 'unp' });
  });

  it('is nothing outside a formula, inside quotes, after a sheet name or when it reads as a cell', () => {
    expect(functionTokenAt('BOND', 4)).toBeNull();
    expect(functionTokenAt('=BONDORDER("O', 13)).toBeNull();
    expect(functionTokenAt('=Sheet2!A', 9)).toBeNull();
    expect(functionTokenAt('=B12', 4)).toBeNull();
  });

  it('covers the rest of a name when the caret is inside it', () => {
    expect(functionTokenAt('=BONDXX(A1)', 3)).toEqual({ start: 1, end: 7, prefix: 'BO' });
  });
});

describe('what is offered', () => {
  it('offers every catalog function with its signature and summary, ours before the built-ins', () => {
    const all = allFunctionHelp();
    for (const e of catalog) expect(all.find((h) => h.name === e.name)?.origin).toBe('orbitab');
    const firstBuiltIn = all.findIndex((h) => h.origin === 'built-in');
    const lastOurs = all.findLastIndex((h) => h.origin === 'orbitab');
    expect(lastOurs).toBe(catalog.length - 1);
    expect(firstBuiltIn).toBe(catalog.length);
    expect(all.length).toBeGreaterThan(catalog.length + 300); // the engine registers ~400 built-ins
  });

  it('writes optional parameters in brackets', () => {
    const bondOrder = allFunctionHelp().find((h) => h.name === 'BONDORDER')!;
    expect(bondOrder.signature).toMatch(/^BONDORDER\(species(, \[[a-z]+\])*\)$/);
    expect(bondOrder.summary.length).toBeGreaterThan(10);
  });

  it('derives a built-in’s signature from the engine’s parameter list', () => {
    expect(builtInHelp('ROUND').signature).toBe('ROUND(number, [number])');
    expect(builtInHelp('SUM').signature).toBe('SUM(value, …)');
    expect(builtInHelp('SUM').summary).toBe('Adds the numbers given.');
  });

  it('matches the start of names regardless of case', () => {
    const names = suggestFunctions('unp', allFunctionHelp()).map((h) => h.name);
    expect(names).toContain('UNPAIRED');
    const su = suggestFunctions('SU', allFunctionHelp(), 50).map((h) => h.name);
    expect(su).toEqual(expect.arrayContaining(['SUM', 'SUMIF', 'SUMPRODUCT']));
    expect(su.filter((n) => !n.startsWith('SU'))).toEqual([]);
  });
});

describe('accepting a suggestion', () => {
  it('replaces the partial name and opens the bracket', () => {
    const token = functionTokenAt('=2*unp', 6)!;
    expect(acceptSuggestion('=2*unp', token, 'UNPAIRED')).toEqual({ text: '=2*UNPAIRED(', caret: 12 });
  });

  it('does not add a second bracket when one follows', () => {
    const token = functionTokenAt('=BO(A1)', 3)!;
    expect(acceptSuggestion('=BO(A1)', token, 'BONDORDER')).toEqual({ text: '=BONDORDER(A1)', caret: 11 });
  });
});
