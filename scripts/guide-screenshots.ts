// Takes the screenshots of docs/guide.md: the main job from a blank workbook to an export, on the
// real server (built client, demo team seeded) in Debian Chromium. `npm run docs:guide` builds the
// client first; the PNGs land in docs/guide/, clipped to the part each step is about to stay small.
import fs from 'node:fs';
import path from 'node:path';
import type { Page } from 'playwright-core';
import { demoTeam } from '../server/seed/demoTeam.js';
import { gridCell, launchBrowser } from '../tests/helpers/browser.js';
import { repoRoot, startServer } from '../tests/helpers/server.js';

const outDir = path.join(repoRoot, 'docs/guide');
const owner = demoTeam.find((p) => p.role === 'owner')!;
const editor = demoTeam.find((p) => p.role === 'editor')!;

/** From just above the workbook's title bar down `height` px, the page's full width. */
async function belowTitle(page: Page, height: number) {
  const title = (await page.getByTestId('workbook-title').boundingBox())!;
  return { x: 0, y: Math.max(0, title.y - 10), width: 1200, height };
}

async function shot(page: Page, name: string, clip?: { x: number; y: number; width: number; height: number }) {
  await page.getByText('Saved', { exact: true }).waitFor(); // no "Saving…" in the pictures
  const file = path.join(outDir, `${name}.png`);
  await page.screenshot({ path: file, clip, animations: 'disabled', caret: 'hide' });
  console.log(`${path.relative(repoRoot, file)}  ${(fs.statSync(file).size / 1024).toFixed(0)} kB`);
}

async function click(page: Page, a1: string, modifiers: 'Shift'[] = []) {
  const c = await gridCell(page, a1);
  if (!c) throw new Error(`cell ${a1} is not on screen`);
  for (const m of modifiers) await page.keyboard.down(m);
  await page.mouse.click(c.x, c.y);
  for (const m of modifiers) await page.keyboard.up(m);
}

async function typeDown(page: Page, top: string, values: string[]) {
  await click(page, top);
  for (const v of values) {
    await page.keyboard.type(v);
    await page.keyboard.press('Enter');
  }
}

async function cellText(page: Page, a1: string, pattern: RegExp) {
  for (let i = 0; i < 200; i++) {
    if (pattern.test((await gridCell(page, a1))?.text ?? '')) return;
    await page.waitForTimeout(50);
  }
  throw new Error(`cell ${a1} never showed ${pattern}`);
}

const server = await startServer({ env: { ORBITAB_SEED: '1' } });
const browser = await launchBrowser({ viewport: { width: 1200, height: 760 } });
const page = browser.page;
page.setDefaultTimeout(15_000);
try {
  fs.mkdirSync(outDir, { recursive: true });
  await page.goto(`${server.url}/sign-in`);
  await page.getByLabel('Email').fill(owner.email);
  await page.getByLabel('Password').fill(owner.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
  await page.getByRole('heading', { name: 'Workbooks' }).waitFor();
  await page.getByRole('button', { name: 'New workbook' }).click();
  await page.getByRole('dialog').getByLabel('Title').fill('Adsorbate screen');
  await page.getByRole('button', { name: 'Create and open' }).click();
  await page.waitForURL((u) => u.pathname.startsWith('/workbooks/'));
  await page.getByTestId('workbook-title').waitFor();

  // 1. Build a screen: a title row and the species.
  const species = ['CO', 'NO', 'O2', 'N2', 'CN', 'NO+', 'O2-', 'C2'];
  await typeDown(page, 'A1', ['Species', ...species]);
  await typeDown(page, 'B1', ['Bond order', '=BONDORDER(A2)']);
  await typeDown(page, 'C1', ['Unpaired', '=UNPAIRED(A2)']);
  await typeDown(page, 'D1', ['Ground term', '=GROUNDTERM(A2)']);
  await page.getByRole('button', { name: 'Freeze row 1' }).click();
  await cellText(page, 'D2', /Σ/);
  await click(page, 'B2');
  await shot(page, '1-build', await belowTitle(page, 400));

  // 2. Fill: select B2:D9 and fill down from the first row.
  await click(page, 'B2');
  await click(page, 'D9', ['Shift']);
  await page.getByRole('button', { name: 'Fill ↓' }).click();
  await cellText(page, 'D9', /Σ|Π|Δ/);
  await shot(page, '2-fill', await belowTitle(page, 400));

  // 3. Sort by bond order, largest first (one cell of the column selected: the whole table sorts).
  await click(page, 'A12');
  await click(page, 'B3');
  await page.getByRole('button', { name: 'Sort ↓' }).click();
  await cellText(page, 'B4', /^3$/);
  await cellText(page, 'A9', /^O2-$/);
  await shot(page, '3-sort', await belowTitle(page, 400));

  // 4. Chart: unpaired electrons against bond order, named by species.
  await page.getByRole('button', { name: 'Chart', exact: true }).click();
  const chart = page.getByTestId('chart-panel');
  await chart.getByLabel('X column').selectOption({ label: 'B · Bond order' });
  await chart.getByLabel('Y column').selectOption({ label: 'C · Unpaired' });
  await chart.locator('.recharts-scatter-symbol').first().waitFor();
  await chart.locator('.recharts-scatter-symbol').last().hover();
  await page.getByTestId('chart-tip').waitFor();
  await shot(page, '4-chart', { ...(await belowTitle(page, 480)), x: 420, width: 780 });

  // 5. Share with a colleague as an editor.
  await page.getByRole('button', { name: 'Team', exact: true }).click();
  const share = page.getByRole('dialog');
  await share.getByLabel('Bring someone in (e-mail)').fill(editor.email);
  await shot(page, '5-share', (await share.boundingBox()) ?? undefined);
  await share.getByRole('button', { name: 'Add to team', exact: true }).click();
  await share.getByText(editor.name).first().waitFor();
  await share.getByRole('button', { name: 'Close' }).click();

  // 6. Lock: protect the title row from the selection.
  await click(page, 'A2');
  await page.getByRole('button', { name: 'Freeze row 1' }).click(); // unfreeze so row 1 can be selected by mouse
  await click(page, 'A1');
  await click(page, 'D1', ['Shift']);
  await page.getByRole('button', { name: 'Protect' }).click();
  const protect = page.getByRole('dialog');
  await protect.getByLabel('Range to protect').waitFor();
  await shot(page, '6-lock', (await protect.boundingBox()) ?? undefined);
  await protect.getByRole('button', { name: 'Protect range' }).click();
  await protect.getByRole('listitem', { name: 'Range A1:D1' }).waitFor();
  await protect.getByRole('button', { name: 'Done' }).click();

  // 7. Export with the computed values.
  await page.getByRole('button', { name: 'Export' }).click();
  const menu = page.getByRole('menu', { name: 'Export' });
  await menu.waitFor();
  const box = (await menu.boundingBox())!;
  const top = (await belowTitle(page, 0)).y;
  const left = Math.max(0, box.x - 260);
  await shot(page, '7-export', { x: left, y: top, width: Math.min(1200 - left, box.x + box.width + 12 - left), height: box.y + box.height + 12 - top });
} finally {
  await browser.close();
  await server.stop();
}
