// The catalog as plain data for people: the in-app function reference, grid autocomplete and
// docs/functions.md all read this shape, so they cannot disagree with the engine.
import { seeAlso } from './catalog/seeAlso.js';
import { catalog } from './catalog/index.js';
import type { CatalogEntry, Family, FunctionResult, ParamType, Scalar } from './catalog/types.js';

export interface ParamHelp {
  name: string;
  type: ParamType;
  description: string;
  unit?: string;
  optional: boolean;
  default?: Scalar;
  choices?: string[];
}

export interface ExampleHelp {
  formula: string;
  expected: FunctionResult;
  /** The expected value as a spreadsheet user would write it, e.g. `2`, `"paramagnetic"`, `{-18.88; -4.8}`. */
  expectedText: string;
  /** True when the value is rounded (the example carries a tolerance coarser than 1e-9). */
  approximate: boolean;
  note?: string;
}

export interface FunctionHelp {
  name: string;
  family: Family;
  /** e.g. `OVERLAP1S(distance, [zeta], [unit])` */
  signature: string;
  summary: string;
  params: ParamHelp[];
  returns: { description: string; unit?: string; kind: 'number' | 'text' | 'boolean' | 'array' };
  /** True when the function can spill a table (omit its last arguments to get the whole table). */
  spills: boolean;
  examples: ExampleHelp[];
  source: string;
  /** Related functions, linked from this one's help. */
  seeAlso: string[];
}

/** Family order in the reference: structure first, then numbers built on it. */
export const FAMILY_ORDER: Family[] = ['Diatomic', 'LCAO', 'Hückel', 'π spectra', 'Extended Hückel', 'Units'];

export function formatSignature(entry: Pick<CatalogEntry, 'name' | 'params'>): string {
  const params = entry.params.map((p) => (p.optional ? `[${p.name}]` : p.name));
  return `${entry.name}(${params.join(', ')})`;
}

function formatScalar(value: Scalar): string {
  if (typeof value === 'string') return JSON.stringify(value);
  if (typeof value === 'boolean') return value ? 'TRUE' : 'FALSE';
  return String(Number(value.toPrecision(12)));
}

/** Spreadsheet array-literal notation: columns separated by `,`, rows by `;`. */
export function formatResult(value: FunctionResult): string {
  if (!Array.isArray(value)) return formatScalar(value);
  return `{${value.map((row) => row.map(formatScalar).join(', ')).join('; ')}}`;
}

export function toFunctionHelp(entry: CatalogEntry): FunctionHelp {
  return {
    name: entry.name,
    family: entry.family,
    signature: formatSignature(entry),
    summary: entry.summary,
    params: entry.params.map((p) => ({
      name: p.name,
      type: p.type,
      description: p.description,
      ...(p.unit !== undefined && { unit: p.unit }),
      optional: p.optional ?? false,
      ...(p.default !== undefined && { default: p.default }),
      ...(p.choices !== undefined && { choices: [...p.choices] }),
    })),
    returns: { ...entry.returns },
    spills: entry.spill !== undefined,
    examples: entry.examples.map((e) => ({
      formula: e.formula,
      expected: e.expected,
      expectedText: formatResult(e.expected),
      approximate: (e.tolerance ?? 1e-9) > 1e-9,
      ...(e.note !== undefined && { note: e.note }),
    })),
    source: entry.source,
    seeAlso: [...(seeAlso[entry.name] ?? [])],
  };
}

/** Every function, grouped by family in FAMILY_ORDER, in catalog order within a family. */
export function functionHelp(entries: CatalogEntry[] = catalog): FunctionHelp[] {
  const rank = (f: Family) => {
    const i = FAMILY_ORDER.indexOf(f);
    return i === -1 ? FAMILY_ORDER.length : i;
  };
  return [...entries]
    .sort((a, b) => rank(a.family) - rank(b.family))
    .map(toFunctionHelp);
}

/** Case-insensitive look-up for autocomplete and the reference page. */
export function findFunctionHelp(name: string, entries: CatalogEntry[] = catalog): FunctionHelp | undefined {
  const entry = entries.find((e) => e.name === name.trim().toUpperCase());
  return entry && toFunctionHelp(entry);
}

/** Names starting with a prefix, for autocomplete while typing `=BO…`. */
export function completeFunctionName(prefix: string, entries: CatalogEntry[] = catalog): FunctionHelp[] {
  const p = prefix.trim().toUpperCase();
  return functionHelp(entries).filter((h) => h.name.startsWith(p));
}
