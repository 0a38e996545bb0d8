// One server and one headless Chromium for a browser test file, and the hands every grid test uses:
// find a cell by its A1 address, click it (any button, count or held keys), wait for its text.
import { afterAll, beforeAll, expect } from 'vitest';
import type { Page } from 'playwright-core';
import { gridCell, launchBrowser, type TestBrowser } from './browser.js';
import { startServer, type TestServer } from './server.js';

export interface BrowserSuite {
  server: TestServer;
  browser: TestBrowser;
  page: Page;
}

/** Starts the server and the browser before the file's tests and closes both after them. */
export function browserSuite(ready: (suite: BrowserSuite) => void, options: { permissions?: string[] } = {}): void {
  let suite: BrowserSuite | undefined;
  beforeAll(async () => {
    const server = await startServer();
    const browser = await launchBrowser();
    browser.page.setDefaultTimeout(15_000);
    if (options.permissions) await browser.context.grantPermissions(options.permissions, { origin: server.url });
    suite = { server, browser, page: browser.page };
    ready(suite);
  }, 120_000);
  afterAll(async () => {
    await suite?.browser.close();
    await suite?.server.stop();
  });
}

export interface ClickOptions {
  button?: 'left' | 'right';
  clickCount?: number;
  modifiers?: ('Shift' | 'Control')[];
}

/** The grid as a hand finds it on the page `pageOf()` returns (read when called: the page is made in beforeAll). */
export function gridHands(pageOf: () => Page) {
  const cell = (a1: string) => gridCell(pageOf(), a1);
  return {
    cell,
    async clickCell(a1: string, options: ClickOptions = {}) {
      const page = pageOf();
      const c = await cell(a1);
      if (!c) throw new Error(`cell ${a1} is not on screen`);
      // A cell rendered past the grid's edge (under the side panel) would take no click: say so.
      const inGrid = await page.evaluate(([x, y]) => document.elementFromPoint(x, y)?.closest('[data-testid="sheet-grid"]') != null, [c.x, c.y]);
      if (!inGrid) throw new Error(`cell ${a1} is covered by another part of the page`);
      for (const m of options.modifiers ?? []) await page.keyboard.down(m);
      await page.mouse.click(c.x, c.y, { button: options.button, clickCount: options.clickCount });
      for (const m of options.modifiers ?? []) await page.keyboard.up(m);
    },
    async expectCell(a1: string, text: string, timeout = 10_000) {
      await expect.poll(async () => (await cell(a1))?.text, { timeout, message: `cell ${a1}` }).toBe(text);
    },
  };
}
