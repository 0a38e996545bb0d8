// "See also" links between related functions: every link names a real function, none links to
// itself, every function has some, and the help and generated docs carry them.
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import { catalog } from '../functions/catalog/index.js';
import { seeAlso } from '../functions/catalog/seeAlso.js';
import { findFunctionHelp } from '../functions/help.js';

const names = new Set(catalog.map((e) => e.name));

describe('see-also links', () => {
  it('name only functions of the catalog, never the function itself', () => {
    const broken = Object.entries(seeAlso).flatMap(([from, to]) => [...(names.has(from) ? [] : [`${from} (unknown)`]), ...to.filter((n) => !names.has(n) || n === from).map((n) => `${from} → ${n}`)]);
    expect(broken).toEqual([]);
  });

  it('give every catalog function somewhere to go next', () => {
    expect(catalog.filter((e) => (seeAlso[e.name] ?? []).length === 0).map((e) => e.name)).toEqual([]);
  });

  it('reach the help and the generated reference (BONDORDER → PIBONDORDER)', () => {
    expect(findFunctionHelp('BONDORDER')?.seeAlso).toContain('PIBONDORDER');
    expect(fs.readFileSync('docs/functions.md', 'utf8')).toContain('[PIBONDORDER](#pibondorder)');
  });
});
