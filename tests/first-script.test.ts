// The page's first script (main.tsx, with earlyStart.ts and earlyGlance.ts) draws a workbook's first
// rows before React, the router and the engine's code are in, so it must stay small and free of them:
// anything the glance imports by mistake (cellView.ts pulls in the formula engine, shared/workbooks.ts
// builds its schemas as it loads) lands in what every page loads first. Reads the client build
// (`npm test` builds it first).
import fs from 'node:fs';
import path from 'node:path';
import { describe, expect, it } from 'vitest';

const dist = path.resolve(import.meta.dirname, '../dist');

/** The scripts index.html loads before anything else: its module script and what it preloads. */
function firstScripts(): { file: string; text: string }[] {
  const html = fs.readFileSync(path.join(dist, 'index.html'), 'utf8');
  const urls = [...html.matchAll(/<script type="module"[^>]*src="([^"]+)"|<link rel="modulepreload"[^>]*href="([^"]+)"/g)].map((m) => m[1] ?? m[2]);
  return urls.map((u) => ({ file: u, text: fs.readFileSync(path.join(dist, u), 'utf8') }));
}

describe("the page's first script", () => {
  it('is a few kilobytes, without the formula engine, the request schemas or React', () => {
    const scripts = firstScripts();
    expect(scripts.length).toBeGreaterThan(1); // the entry and at least the glance's chunk
    const total = scripts.reduce((n, s) => n + s.text.length, 0);
    expect(total).toBeLessThan(40_000);
    for (const { file, text } of scripts) {
      expect(text, file).not.toMatch(/HyperFormula|licenseKey/); // the engine
      expect(text, file).not.toMatch(/ZodError|invalid_type/); // zod
      expect(text, file).not.toMatch(/react\.transitional\.element|__REACT_DEVTOOLS_GLOBAL_HOOK__/); // React
    }
    // …and it is the script that draws the first rows.
    expect(scripts.some((s) => s.text.includes('Opening the workbook'))).toBe(true);
  });
});
