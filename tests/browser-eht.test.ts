// Extended-Hückel formulas in the browser: the page never computes a structure itself. Pasted
// formulas show "computing…" (a pending state, not an error) and a progress line, then the values the
// server computed, with no long task over a second on the page meanwhile. A reload reads the stored
// results. Screenshots go to tests/artifacts/.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import '../functions/openchemlibNode.js';
import { computeEhtResult, type EhtSummary } from '../functions/chem/ehtSummary.js';
import { gridCell, launchBrowser, signUpWithNewWorkbook, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;

/** Watches the page from its first script: the longest long task, and whether pending cells or the progress line were ever shown. */
function watchPage() {
  const w = window as unknown as { __longest: number; __sawPending: boolean; __progress: string[] };
  w.__longest = 0;
  w.__sawPending = false;
  w.__progress = [];
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) w.__longest = Math.max(w.__longest, e.duration);
  }).observe({ type: 'longtask', buffered: false });
  new MutationObserver(() => {
    if (document.querySelector('[data-cell-kind="pending"]')) w.__sawPending = true;
    const line = document.querySelector('[data-testid="structure-progress"]')?.textContent;
    if (line && w.__progress.at(-1) !== line) w.__progress.push(line);
  }).observe(document, { subtree: true, childList: true, characterData: true, attributes: true });
}

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  page = browser.page;
  page.setDefaultTimeout(30_000);
  await browser.context.grantPermissions(['clipboard-read', 'clipboard-write'], { origin: server.url });
  await page.addInitScript(watchPage);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const molecules = ['C=C', 'O=C=O', 'N#N', 'CC=O', 'c1ccncc1'];
const expectedHomo = (smiles: string) => ((computeEhtResult(smiles) as EhtSummary).frontier as { homoEv: number }).homoEv;

async function cellText(a1: string) {
  return (await gridCell(page, a1))?.text;
}

describe('extended-Hückel formulas in the browser', () => {
  it('shows pending cells and progress, then the server’s values, without holding the page', async () => {
    await signUpWithNewWorkbook(page, server.url, { name: 'Hana Orbit', email: 'hana@lab.example', password: 'sigma-pi-sigma-star' }, 'EHT pending test');
    await page.getByTestId('workbook-title').waitFor();
    // Long tasks of the page's own start-up are not what this test is about.
    await page.evaluate(() => ((window as unknown as { __longest: number }).__longest = 0));
    const rows = molecules.map((m, i) => `${m}\t=EHTHOMO(A${i + 1})\t=EHTGAP(A${i + 1})\t=EHTCHARGE(A${i + 1},1)`).join('\n');
    await page.evaluate((text) => navigator.clipboard.writeText(text), rows);
    const a1 = await gridCell(page, 'A1');
    await page.mouse.click(a1!.x, a1!.y);
    await page.keyboard.press('Control+v');

    for (const [i, m] of molecules.entries()) {
      await expect.poll(() => cellText(`B${i + 1}`), { timeout: 120_000, message: `EHTHOMO of ${m}` }).toMatch(/^-?\d/);
      expect(Number(await cellText(`B${i + 1}`))).toBeCloseTo(expectedHomo(m), 3);
    }
    await expect.poll(() => cellText('D5'), { timeout: 60_000 }).toMatch(/^-?\d/);
    const seen = await page.evaluate(() => {
      const w = window as unknown as { __longest: number; __sawPending: boolean; __progress: string[] };
      return { __longest: w.__longest, __sawPending: w.__sawPending, __progress: w.__progress };
    });
    expect(seen.__sawPending).toBe(true);
    expect(seen.__progress.some((line) => /Extended Hückel: \d+ of 5 structures/.test(line))).toBe(true);
    expect(seen.__longest).toBeLessThan(1_000);
    // Done: the progress line goes away.
    await expect.poll(() => page.getByTestId('structure-progress').count()).toBe(0);
    await screenshot(page, 'eht-values');
  }, 300_000);

  it('shows the level ladder of the selected molecule with each level’s largest contributions', async () => {
    const b1 = await gridCell(page, 'B1');
    await page.mouse.click(b1!.x, b1!.y);
    const ladder = page.getByTestId('eht-ladder');
    await ladder.waitFor();
    expect(await page.getByTestId('structure-panel').textContent()).toMatch(/Extended-Hückel levels of C=C/);
    // Ethylene's HOMO is the C=C π bond: the two carbons' 2p, half each (as EHTHOMOMAKEUP says).
    expect(await ladder.locator('[data-role="HOMO"]').textContent()).toMatch(/HOMO\s*C1 2p 0\.50; C2 2p 0\.50/);
    expect(await ladder.locator('[data-role="LUMO"]').count()).toBe(1);
    await screenshot(page, 'eht-ladder');
  });

  it('shows the stored values again after a reload', async () => {
    await page.reload();
    await page.getByTestId('workbook-title').waitFor();
    await expect.poll(() => cellText('B1'), { timeout: 30_000 }).toMatch(/^-?\d/);
    expect(Number(await cellText('B1'))).toBeCloseTo(expectedHomo('C=C'), 3);
  });
});
