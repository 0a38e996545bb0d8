// The function reference page's view of functions/help.ts (the catalog as plain help data, shared
// with the grid's autocomplete and docs/functions.md): search and grouping for the page.
import { FAMILY_ORDER, functionHelp, type FunctionHelp } from '@functions/help.js';
import type { Family } from '@functions/catalog/types.js';

export type { FunctionHelp };

export const allFunctions: FunctionHelp[] = functionHelp();

/** Every word of the query must appear in the name, family, summary or a parameter's name, description or unit. */
export function searchFunctions(all: FunctionHelp[], query: string): FunctionHelp[] {
  const words = query.toLowerCase().split(/\s+/).filter(Boolean);
  if (!words.length) return all;
  return all.filter((f) => {
    const text = [f.name, f.family, f.summary, ...f.params.flatMap((p) => [p.name, p.description, p.unit ?? ''])].join(' ').toLowerCase();
    return words.every((w) => text.includes(w));
  });
}

/** Families in FAMILY_ORDER (unknown ones last), functions in catalog order; empty families left out. */
export function groupByFamily(functions: FunctionHelp[]): { family: Family; functions: FunctionHelp[] }[] {
  const families = [...new Set([...FAMILY_ORDER, ...functions.map((f) => f.family)])];
  return families.map((family) => ({ family, functions: functions.filter((f) => f.family === family) })).filter((g) => g.functions.length > 0);
}
