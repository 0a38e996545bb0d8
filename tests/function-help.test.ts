// The plain-data help the client's function reference and autocomplete read.
import { describe, expect, it } from 'vitest';
import { catalog } from '../functions/catalog/index.js';
import { completeFunctionName, findFunctionHelp, formatResult, formatSignature, functionHelp } from '../functions/help.js';

describe('function help for the reference page and autocomplete', () => {
  it('writes optional parameters in brackets', () => {
    expect(findFunctionHelp('overlap1s')?.signature).toBe('OVERLAP1S(distance, [zeta], [unit])');
    expect(formatSignature({ name: 'H2PLUSMIN', params: [] })).toBe('H2PLUSMIN()');
  });

  it('describes parameters with unit, default and choices', () => {
    const h2plus = findFunctionHelp('H2PLUS')!;
    expect(h2plus.params.find((p) => p.name === 'energyUnit')).toMatchObject({ optional: true, default: 'hartree', choices: expect.arrayContaining(['eV']) });
    expect(h2plus.returns.unit).toBe('hartree (or energyUnit)');
  });

  it('is plain data that survives JSON (no functions inside)', () => {
    const help = functionHelp();
    expect(JSON.parse(JSON.stringify(help))).toEqual(help);
    expect(help.length).toBe(catalog.length);
  });

  it('shows spilled example values in array-literal notation', () => {
    expect(formatResult([[-18.88], [-4.8]])).toBe('{-18.88; -4.8}');
    expect(formatResult([[1, 'a', true]])).toBe('{1, "a", TRUE}');
    expect(findFunctionHelp('LCAOLEVELS')?.spills).toBe(true);
  });

  it('completes a typed prefix to function names', () => {
    expect(completeFunctionName('lcao').map((h) => h.name)).toEqual(['LCAOLEVELS', 'LCAOCOEFFS']);
    expect(completeFunctionName('ZZZ')).toEqual([]);
  });
});
