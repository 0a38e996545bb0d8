// The PPP-CIS timing of bench/ppp.ts repeated inside headless Chromium, since the cells of a sheet are
// computed in the browser: bench/ppp-browser/entry.ts is bundled by vite (library mode, one module script) and
// run in a blank page through playwright-core.
import { resolve } from 'node:path';
import { build, type Rollup } from 'vite';
import { launchBrowser } from '../tests/helpers/browser.js';
import { median } from './matmulYardstick.js';

export interface BrowserTiming {
  centres: number;
  medianMs: number;
  minMs: number;
}

async function bundle(): Promise<string> {
  const output = (await build({
    configFile: false,
    logLevel: 'error',
    build: {
      write: false,
      minify: true,
      lib: { entry: resolve(import.meta.dirname, 'ppp-browser/entry.ts'), formats: ['es'] },
    },
  })) as Rollup.RollupOutput | Rollup.RollupOutput[];
  const chunk = (Array.isArray(output) ? output[0] : output).output.find((o) => o.type === 'chunk');
  if (!chunk || chunk.type !== 'chunk') throw new Error('vite produced no script for the browser PPP timing');
  return chunk.code;
}

/** Median and minimum wall time per SMILES over `repeats` runs after one warm-up, measured in the page. */
export async function browserPppTiming(
  cases: Record<string, { smiles: string; repeats: number }>,
): Promise<{ chromium: string; referenceMatmulMs: number; timing: Record<string, BrowserTiming> }> {
  const script = await bundle();
  const browser = await launchBrowser();
  try {
    const { page } = browser;
    await page.setContent('<!doctype html><title>PPP timing</title>');
    await page.addScriptTag({ content: script, type: 'module' });
    await page.waitForFunction(() => 'pppTiming' in globalThis);
    const referenceMatmulMs = await page.evaluate(() => (globalThis as unknown as { pppReferenceMatmulMs: () => number }).pppReferenceMatmulMs());
    const timing: Record<string, BrowserTiming> = {};
    for (const [name, { smiles, repeats }] of Object.entries(cases)) {
      const { centres, runs } = await page.evaluate(
        ([s, r]) => (globalThis as unknown as { pppTiming: (s: string, r: number) => { centres: number; runs: number[] } }).pppTiming(s, r),
        [smiles, repeats] as const,
      );
      timing[name] = { centres, medianMs: median(runs), minMs: Math.min(...runs) };
    }
    if (browser.errors.length) throw new Error(`the page reported: ${browser.errors.join('; ')}`);
    return { chromium: browser.context.browser()?.version() ?? 'unknown', referenceMatmulMs, timing };
  } finally {
    await browser.close();
  }
}
