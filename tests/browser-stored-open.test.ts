// Opening a large workbook whose values the server stored with its revision: the page shows those
// values at once, says it is still computing while its own engine takes the formulas back in
// slices, and an edit typed before that has finished is saved and computed like any other. Both
// ways the page reads the answers are taken: parsed by the page (this workbook's answers are under
// the size that sends them to the worker), and parsed in the JSON worker and handed over in parts
// (the page told to treat every answer as large, as a workbook of over 4 MB is).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { maxCellsPerPatch } from '../shared/workbooks.js';
import { gridCell, launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
let cookie = '';

/** The server's API as the page would call it, with the session of the person signed up below. */
async function call(method: string, route: string, body?: unknown) {
  const res = await fetch(`${server.url}/api${route}`, {
    method,
    headers: { origin: server.url, cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const session = res.headers.getSetCookie().find((c) => c.startsWith('orbitab_session='));
  if (session) cookie = session.split(';')[0];
  const text = await res.text();
  return { status: res.status, source: res.headers.get('orbitab-values'), body: text ? JSON.parse(text) : null };
}

const SPECIES = ['O2', 'F2', 'C2', 'B2', 'NO', 'CN-'];
const ROWS = 8_000;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser();
  page = browser.page;
  page.setDefaultTimeout(60_000);
  expect((await call('POST', '/auth/sign-up', { name: 'Rosa Ilic', email: 'rosa@lab.example', password: 'sigma-pi-sigma-star' })).status).toBe(201);
  const [name, value] = cookie.split('=');
  await browser.context.addCookies([{ name, value, url: server.url }]);
}, 60_000);

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** How the page read each answer it loaded: 'page' or 'worker' (src/lib/api.ts marks each). */
async function answersParsedIn(p: Page): Promise<Record<string, string>> {
  return p.evaluate(() =>
    Object.fromEntries(
      performance
        .getEntriesByType('mark')
        .filter((e) => e.name.startsWith('orbitab:json-received '))
        .map((e) => [e.name.replace(/^orbitab:json-received \/workbooks\/[^/?]+/, 'workbook'), (e as PerformanceMark).detail?.parsedIn]),
    ),
  );
}

/** Waits until the server has stored the values of the workbook's revision `revision`. */
async function storedValuesOf(workbookId: string, revision: number) {
  await expect.poll(async () => (await call('GET', `/workbooks/${workbookId}/values?stored=only`)).body?.revision, { timeout: 120_000, interval: 250 }).toBe(revision);
}

let workbookId = '';
let revision = 0;

describe('opening a workbook on its stored values', () => {
  it('shows the stored values at once, and an edit typed while it computes is saved and computed', async () => {
    // 8,000 rows × 5 columns: a species and four chemistry formulas reading it.
    workbookId = (await call('POST', '/workbooks', { title: 'Large screen, stored values' })).body.workbook.id as string;
    const sheetId = (await call('GET', `/workbooks/${workbookId}`)).body.sheets[0].id as string;
    const cells: { sheetId: string; row: number; col: number; input: string }[] = [];
    for (let row = 0; row < ROWS; row++) {
      const n = row + 1;
      cells.push({ sheetId, row, col: 0, input: SPECIES[row % SPECIES.length] });
      ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'GROUNDTERM'].forEach((f, i) => cells.push({ sheetId, row, col: i + 1, input: `=${f}(A${n})` }));
    }
    for (let i = 0; i < cells.length; i += maxCellsPerPatch) {
      const res = await call('POST', `/workbooks/${workbookId}/patches`, { baseRevision: revision, changes: cells.slice(i, i + maxCellsPerPatch) });
      expect(res.status).toBe(200);
      revision = res.body.revision;
    }
    // The server computes and stores the revision's values in the background.
    await expect.poll(async () => (await call('GET', `/workbooks/${workbookId}/values?stored=only`)).status, { timeout: 120_000, interval: 250 }).toBe(200);

    await page.goto(`${server.url}/workbooks/${workbookId}`);
    // O2: bond order 2, two unpaired electrons (MO diagram of any general chemistry text).
    await expect.poll(async () => (await gridCell(page, 'B1'))?.text, { timeout: 60_000 }).toBe('2');
    const computing = page.getByTestId('computing-state');
    await computing.waitFor();
    await screenshot(page, 'stored-open-computing');

    // Typed before the page's engine has every formula back: O2 → N2 in A1.
    const a1 = (await gridCell(page, 'A1'))!;
    await page.mouse.click(a1.x, a1.y);
    await page.keyboard.type('N2');
    await page.keyboard.press('Enter');
    const progress = await computing.evaluate((el) => ({ done: Number(el.getAttribute('data-done')), total: Number(el.getAttribute('data-total')) }));
    expect(progress.total).toBe(ROWS * 4);
    expect(progress.done).toBeLessThan(progress.total); // the edit really came before the engine was live

    // Saved, computed here (N2: bond order 3, closed shell), and the computing state gone once live.
    await page.locator('[data-testid="save-state"][data-state="saved"]').waitFor({ timeout: 60_000 });
    await computing.waitFor({ state: 'detached', timeout: 120_000 });
    await expect.poll(async () => (await gridCell(page, 'B1'))?.text).toBe('3');
    await expect.poll(async () => (await gridCell(page, 'C1'))?.text).toBe('0');
    await screenshot(page, 'stored-open-live');

    // Answers of about a megabyte: under the size sent to the worker, so the page parsed them.
    expect(await answersParsedIn(page)).toEqual({ workbook: 'page', 'workbook/values?stored=only': 'page' });

    const saved = await call('GET', `/workbooks/${workbookId}`);
    expect(saved.body.revision).toBe(revision + 1);
    expect(saved.body.sheets[0].cells).toContainEqual([0, 0, 'N2']);
    revision += 1;
    // And the server's values for the new revision say the same.
    await storedValuesOf(workbookId, revision);
    const values = (await call('GET', `/workbooks/${workbookId}/values`)).body;
    expect(values.sheets[0].values).toContainEqual([0, 1, 3]);
  }, 300_000);

  it('opens the same way when the answers are parsed in the worker and handed over in parts', async () => {
    expect(workbookId).not.toBe(''); // made by the test above
    await storedValuesOf(workbookId, revision);
    // The size past which answers go to the worker, lowered for this page only: every answer is "large".
    const workerPage = await browser.context.newPage();
    try {
      await workerPage.addInitScript('window.orbitabLargeAnswerChars = 0');
      workerPage.setDefaultTimeout(60_000);
      await workerPage.goto(`${server.url}/workbooks/${workbookId}`);
      // Stored values at once: F2 in A2, bond order 1 (MO diagram of any general chemistry text).
      await expect.poll(async () => (await gridCell(workerPage, 'B2'))?.text, { timeout: 60_000 }).toBe('1');
      const computing = workerPage.getByTestId('computing-state');
      await computing.waitFor();
      expect(await answersParsedIn(workerPage)).toEqual({ workbook: 'worker', 'workbook/values?stored=only': 'worker' });
      // Every formula came through the parts (40,000 cells, at most 5,000 a part).
      expect(await computing.evaluate((el) => Number(el.getAttribute('data-total')))).toBe(ROWS * 4);

      // Typed before the engine is live: F2 → O2 in A2.
      const a2 = (await gridCell(workerPage, 'A2'))!;
      await workerPage.mouse.click(a2.x, a2.y);
      await workerPage.keyboard.type('O2');
      await workerPage.keyboard.press('Enter');
      const progress = await computing.evaluate((el) => ({ done: Number(el.getAttribute('data-done')), total: Number(el.getAttribute('data-total')) }));
      expect(progress.done).toBeLessThan(progress.total);

      // Saved and computed here: O2 has bond order 2 and two unpaired electrons.
      await workerPage.locator('[data-testid="save-state"][data-state="saved"]').waitFor({ timeout: 60_000 });
      await computing.waitFor({ state: 'detached', timeout: 120_000 });
      await expect.poll(async () => (await gridCell(workerPage, 'B2'))?.text).toBe('2');
      await expect.poll(async () => (await gridCell(workerPage, 'C2'))?.text).toBe('2');
      const saved = await call('GET', `/workbooks/${workbookId}`);
      expect(saved.body.revision).toBe(revision + 1);
      expect(saved.body.sheets[0].cells).toContainEqual([1, 0, 'O2']);
      expect(saved.body.sheets[0].cells).toHaveLength(ROWS * 5);
    } finally {
      await workerPage.close();
    }
  }, 300_000);

  it("draws the first rows from the page's first script, before the app's code and the workbook answer, where the workbook screen draws them", async () => {
    expect(workbookId).not.toBe(''); // made by the tests above
    // A confirmed address: the notice asking to confirm it would sit above the grid in the app only.
    const mail = (await call('GET', '/admin/mail')).body.messages.find((m: { to: string; text: string }) => m.to === 'rosa@lab.example' && m.text.includes('/verify-email/'));
    expect((await call('POST', '/auth/verify', { token: /\/verify-email\/([^\s/]+)/.exec(mail.text)![1] })).status).toBe(200);
    // Markup typed into a cell of the first rows is drawn as text (the glance is plain DOM).
    const wb = (await call('GET', `/workbooks/${workbookId}`)).body;
    const markup = '<img src=x onerror="window.__fromCell=1">';
    const patched = await call('POST', `/workbooks/${workbookId}/patches`, { baseRevision: wb.revision, changes: [{ sheetId: wb.sheets[0].id, row: 0, col: 5, input: markup }] });
    expect(patched.status).toBe(200);
    await storedValuesOf(workbookId, patched.body.revision);
    const heldPage = await browser.context.newPage();
    // The app's code (start.tsx's chunk: React, the router, the workbook screen all come after it) and
    // the workbook answer (asked by the JSON worker) each wait until let go; the first rows come at once.
    const gate = () => {
      let open = () => {};
      const closed = new Promise<void>((resolve) => (open = resolve));
      return { open: () => open(), closed };
    };
    const appCode = gate();
    const workbookAnswer = gate();
    const asked: string[] = [];
    const appCodeAsked: string[] = [];
    const workbookRoute = new RegExp(`/api/workbooks/${workbookId}(\\?.*)?$`);
    const startChunk = /\/assets\/start-[^/]*\.js$/;
    await browser.context.route(workbookRoute, async (route) => {
      asked.push(route.request().url());
      await workbookAnswer.closed;
      await route.continue();
    });
    await heldPage.route(startChunk, async (route) => {
      appCodeAsked.push(route.request().url());
      await appCode.closed;
      await route.continue();
    });
    const firstNumberBox = (scope: string) => heldPage.locator(`${scope} .orb-cell-number`).first().boundingBox();
    try {
      heldPage.setDefaultTimeout(60_000);
      await heldPage.goto(`${server.url}/workbooks/${workbookId}`, { waitUntil: 'commit' });
      // The stored first rows, read-only: N2, O2 (set above), C2 and B2 — bond orders 3, 2, 2, 1 and
      // unpaired electrons 0, 2, 0, 2 (MO diagrams of any general chemistry text).
      const glance = heldPage.locator('[data-glance] [data-testid="sheet-grid"][data-preview]');
      await glance.waitFor();
      await expect.poll(async () => (await glance.locator('.orb-cell-number').allTextContents()).slice(0, 8)).toEqual(['3', '0', '2', '2', '2', '0', '1', '2']);
      // Drawn with none of the app's code: React has not rendered into the page's root.
      expect(appCodeAsked.length).toBeGreaterThan(0);
      expect(await heldPage.evaluate(() => document.getElementById('root')!.childElementCount)).toBe(0);
      expect(await glance.getByText(markup, { exact: true }).count()).toBe(1);
      expect(await heldPage.evaluate(() => ({ images: document.querySelectorAll('[data-glance] img').length, ran: 'fromCell' in window }))).toEqual({ images: 0, ran: false });
      const glanceBox = await firstNumberBox('[data-glance]');
      await screenshot(heldPage, 'stored-open-first-rows');
      // The app's code comes: the workbook screen draws the same rows in the same place and the
      // first script's glance goes (the workbook answer is still held, so the screen shows its own).
      appCode.open();
      await expect.poll(() => heldPage.locator('[data-glance]').count()).toBe(0);
      const own = heldPage.locator('[data-testid="sheet-grid"][data-preview]');
      expect(await own.count()).toBe(1);
      expect(await heldPage.locator('#root [data-testid="sheet-grid"][data-preview]').count()).toBe(1);
      expect((await own.locator('.orb-cell-number').allTextContents()).slice(0, 8)).toEqual(['3', '0', '2', '2', '2', '0', '1', '2']);
      expect(await firstNumberBox('#root')).toEqual(glanceBox);
      // All the while the workbook answer has not been given: nothing but the first rows' answer drew them.
      expect(await heldPage.locator('[data-testid="sheet-grid"]:not([data-preview])').count()).toBe(0);
      workbookAnswer.open();
      // Then the workbook opens as before, and takes an edit.
      const computing = heldPage.getByTestId('computing-state');
      await heldPage.locator('[data-testid="sheet-grid"]:not([data-preview])').waitFor();
      expect(asked.length).toBeGreaterThan(0);
      await computing.waitFor({ state: 'detached', timeout: 120_000 });
      await expect.poll(async () => (await gridCell(heldPage, 'B2'))?.text).toBe('2');
    } finally {
      appCode.open();
      workbookAnswer.open();
      await browser.context.unroute(workbookRoute);
      await heldPage.close();
    }
  }, 300_000);

  it('says a workbook that is not there is not available', async () => {
    await page.goto(`${server.url}/workbooks/no-such-workbook`);
    await page.getByText('This workbook is not available').waitFor();
    expect(await page.locator('[data-testid="sheet-grid"]').count()).toBe(0);
  });
});
