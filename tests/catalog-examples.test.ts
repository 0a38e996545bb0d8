// Every catalog example, of every registered family, is evaluated by a real engine: the help and
// docs/functions.md cannot promise a value the engine does not give. Also checks the catalog's
// own hygiene: no clash with HyperFormula's built-ins, and every entry fully documented.
import { DetailedCellError, HyperFormula } from 'hyperformula';
import { afterAll, describe, expect, it } from 'vitest';
import { catalog } from '../functions/catalog/index.js';
import type { CatalogEntry, Example, Scalar } from '../functions/catalog/types.js';
import { createEngine } from '../functions/engine.js';
import { OrbitabPlugin } from '../functions/plugin.js';

// Taken before createEngine() registers our plugin (it registers lazily, on first build).
const namesBeforeRegistration = HyperFormula.getRegisteredFunctionNames('enGB');
// The same list from the plugin classes themselves, whatever the registration order.
const builtInNames = new Set([
  ...namesBeforeRegistration,
  ...HyperFormula.getAllFunctionPlugins()
    .filter((plugin) => plugin !== OrbitabPlugin)
    .flatMap((plugin: any) => [...Object.keys(plugin.implementedFunctions ?? {}), ...Object.keys(plugin.aliases ?? {})]),
]);

const examples = catalog.flatMap((entry) => entry.examples.map((example) => ({ entry, example })));
const engine = createEngine(Object.fromEntries(examples.map(({ example }, i) => [`E${i}`, [[example.formula]]])));
afterAll(() => engine.destroy());

function valuesOf(index: number): unknown[][] {
  return engine.getSheetValues(engine.getSheetId(`E${index}`)!);
}

function expectCellMatches(actual: unknown, expected: Scalar, example: Example) {
  if (actual instanceof DetailedCellError) throw new Error(`${example.formula} gave ${actual.value} ${actual.message}`);
  if (typeof expected === 'number') {
    expect(typeof actual, `${example.formula} should give a number`).toBe('number');
    const tolerance = example.tolerance ?? 1e-9;
    expect(Math.abs((actual as number) - expected), `${example.formula}: ${String(actual)} vs ${expected} ± ${tolerance}`).toBeLessThanOrEqual(tolerance);
  } else {
    expect(actual, example.formula).toEqual(expected);
  }
}

describe('every catalog example gives the documented value', () => {
  it('has examples to run', () => {
    expect(examples.length).toBeGreaterThan(0);
  });

  it.each(examples.map(({ entry, example }, i) => [entry.name, example.formula, i] as const))('%s: %s', (_name, _formula, i) => {
    const { example } = examples[i];
    const values = valuesOf(i);
    if (Array.isArray(example.expected)) {
      const expected = example.expected;
      expect(values.length, `${example.formula} rows`).toBe(expected.length);
      expected.forEach((row, r) => {
        expect(values[r].length, `${example.formula} row ${r + 1} columns`).toBe(row.length);
        row.forEach((cell, c) => expectCellMatches(values[r][c], cell, example));
      });
    } else {
      expect(values.length === 1 && values[0].length === 1, `${example.formula} should give one value, gave ${JSON.stringify(values)}`).toBe(true);
      expectCellMatches(values[0][0], example.expected, example);
    }
  });
});

describe('catalog hygiene', () => {
  it('sees the built-in function list before registration (SUM, LEN, INDEX present)', () => {
    expect(namesBeforeRegistration).toEqual(expect.arrayContaining(['SUM', 'LEN', 'INDEX']));
  });

  it.each(catalog.map((e) => [e.name, e] as const))('%s does not collide with a HyperFormula built-in', (name) => {
    expect(builtInNames.has(name)).toBe(false);
  });

  it('has unique names written as engine function names', () => {
    const names = catalog.map((e) => e.name);
    expect(new Set(names).size).toBe(names.length);
    for (const name of names) expect(name).toMatch(/^[A-Z][A-Z0-9]*$/);
  });

  it.each(catalog.map((e) => [e.name, e] as const))('%s is documented: summary, source, params, returns, examples', (_name, entry: CatalogEntry) => {
    expect(entry.summary.trim().length).toBeGreaterThan(10);
    expect(entry.source.trim().length).toBeGreaterThan(10);
    expect(entry.returns.description.trim().length).toBeGreaterThan(0);
    expect(entry.examples.length).toBeGreaterThan(0);
    for (const example of entry.examples) expect(example.formula.toUpperCase()).toContain(`${entry.name}(`);
    for (const p of entry.params) {
      expect(p.name, `${entry.name} parameter name`).toMatch(/^[A-Za-z][A-Za-z0-9_]*$/);
      expect(p.description.trim().length, `${entry.name}(${p.name}) description`).toBeGreaterThan(0);
      if (p.default !== undefined) expect(p.optional, `${entry.name}(${p.name}) has a default but is required`).toBe(true);
      if (p.default !== undefined && p.choices) {
        expect(p.choices.map((c) => c.toLowerCase()), `${entry.name}(${p.name}) default among choices`).toContain(String(p.default).toLowerCase());
      }
    }
  });

  it.each(catalog.filter((e) => e.spill).map((e) => [e.name, e] as const))('%s spills and so offers a one-value route through an optional argument', (_name, entry: CatalogEntry) => {
    expect(entry.params.some((p) => p.optional)).toBe(true);
  });
});
