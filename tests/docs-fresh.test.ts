// docs/functions.md is generated from the catalog; this fails when someone changes the catalog
// and forgets `npm run docs:functions`.
import { readFileSync } from 'node:fs';
import { describe, expect, it } from 'vitest';
import { catalog } from '../functions/catalog/index.js';
import { CAUTIONS, FUNCTIONS_DOC_PATH, renderFunctionsMarkdown } from '../functions/docs.js';
import { functionHelp } from '../functions/help.js';

describe('docs/functions.md', () => {
  it('is current with the catalog (regenerate with `npm run docs:functions`)', () => {
    const committed = readFileSync(FUNCTIONS_DOC_PATH, 'utf8');
    expect(committed === renderFunctionsMarkdown(), 'docs/functions.md is stale: run `npm run docs:functions`').toBe(true);
  });

  it('carries the cautions: model estimates, not a basis for safety decisions', () => {
    const markdown = renderFunctionsMarkdown();
    expect(markdown).toContain(CAUTIONS);
    expect(CAUTIONS).toMatch(/model estimates/);
    expect(CAUTIONS).toMatch(/safety data sheets/);
  });

  it('gives every function a section with its signature, examples and source', () => {
    const markdown = renderFunctionsMarkdown();
    for (const h of functionHelp()) {
      const start = markdown.indexOf(`### ${h.name}\n`);
      expect(start, `${h.name} has a section`).toBeGreaterThanOrEqual(0);
      const next = markdown.indexOf('\n### ', start + 1);
      const section = markdown.slice(start, next === -1 ? undefined : next);
      expect(markdown).toContain(`### ${h.name}\n\n\`${h.signature}\``);
      for (const e of h.examples) expect(section).toContain(e.formula);
      expect(section).toContain(`**Source:** ${h.source}`);
    }
    expect(functionHelp().length).toBe(catalog.length);
  });

  it('groups functions under one heading per family', () => {
    const markdown = renderFunctionsMarkdown();
    for (const family of new Set(catalog.map((e) => e.family))) expect(markdown.split(`\n## ${family}\n`).length).toBe(2);
  });
});
