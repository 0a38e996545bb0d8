// Headless Debian Chromium through playwright-core, for browser tests.
//
// Usage:
//   const browser = await launchBrowser();             // { context, page, errors, close() }
//   await browser.page.goto(server.url);
//   await screenshot(browser.page, 'sign-in-light');    // tests/artifacts/sign-in-light.png
//   expect(browser.errors).toEqual([]);                 // no uncaught errors in the page
//   (await gridCell(browser.page, 'B2'))?.text;         // what the sheet grid shows in B2
//   await browser.close();                              // also deletes the temporary profile
//
// A persistent context on a fresh temporary profile (not the user's), with the flags that keep
// Chromium from reaching the network on its own (updates, sync, field trials) in CI containers.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { chromium, type BrowserContext, type Page } from 'playwright-core';

export const chromiumPath = '/usr/bin/chromium';
export const artifactsDir = path.resolve(import.meta.dirname, '../artifacts');

export interface LaunchOptions {
  /** Window size; a desktop tool is designed for at least 1280×800. */
  viewport?: { width: number; height: number };
  /** What prefers-color-scheme reports to the page (default light). */
  colorScheme?: 'light' | 'dark';
}

export interface TestBrowser {
  context: BrowserContext;
  /** The context's first tab. */
  page: Page;
  /** Uncaught exceptions and console.error messages from every page, as text (failed HTTP requests excluded: they are often expected, like a 401 before sign-in). */
  errors: string[];
  close(): Promise<void>;
}

export async function launchBrowser(options: LaunchOptions = {}): Promise<TestBrowser> {
  if (!fs.existsSync(chromiumPath)) {
    throw new Error(`${chromiumPath} is missing: install Debian's Chromium (apt-get update && apt-get install -y chromium)`);
  }
  const profileDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-chromium-'));
  let context: BrowserContext;
  try {
    context = await chromium.launchPersistentContext(profileDir, {
      executablePath: chromiumPath,
      headless: true,
      args: ['--no-sandbox', '--disable-gpu', '--disable-quic', '--no-first-run', '--disable-background-networking', '--disable-component-update', '--disable-sync'],
      viewport: options.viewport ?? { width: 1280, height: 800 },
      colorScheme: options.colorScheme ?? 'light',
    });
  } catch (e) {
    fs.rmSync(profileDir, { recursive: true, force: true });
    throw e;
  }

  const errors: string[] = [];
  const watch = (page: Page) => {
    page.on('pageerror', (err) => errors.push(`uncaught: ${err.message}`));
    page.on('console', (msg) => {
      if (msg.type() === 'error' && !msg.text().startsWith('Failed to load resource')) errors.push(`console.error: ${msg.text()}`);
    });
  };
  context.pages().forEach(watch);
  context.on('page', watch);
  const page = context.pages()[0] ?? (await context.newPage());

  return {
    context,
    page,
    errors,
    async close() {
      await context.close().catch(() => undefined);
      fs.rmSync(profileDir, { recursive: true, force: true });
    },
  };
}

/** Saves a screenshot of the viewport as tests/artifacts/<name>.png and returns its path. */
export async function screenshot(page: Page, name: string): Promise<string> {
  if (!/^[\w.-]+$/.test(name)) throw new Error(`screenshot name '${name}' must be letters, digits, '.', '-' or '_'`);
  fs.mkdirSync(artifactsDir, { recursive: true });
  const file = path.join(artifactsDir, `${name}.png`);
  await page.screenshot({ path: file });
  return file;
}

/** A sheet-grid cell as the page shows it: its text, its tooltip and the centre of its box on screen. */
export interface GridCell {
  text: string;
  title: string;
  x: number;
  y: number;
}

/**
 * The grid cell at an A1 address (its column found by header letter, its row by row number), or
 * null while that cell is not rendered (not loaded yet, or scrolled out of the grid's window).
 * Row 1, when frozen, is shown under the column letter in the header: it is read from there.
 */
export async function gridCell(page: Page, a1: string): Promise<GridCell | null> {
  return page.evaluate((address) => {
    const [, letters, digits] = /^([A-Z]+)(\d+)$/.exec(address)!;
    const headerLabel = document.querySelector(`[data-testid="sheet-grid"] .orb-col-header[data-col="${letters}"]`);
    const header = headerLabel?.closest('.dsg-cell') as HTMLElement | null;
    if (!header) return null;
    const frozen = digits === '1' ? (headerLabel!.querySelector('.orb-col-frozen') as HTMLElement | null) : null;
    if (frozen) {
      const r = frozen.getBoundingClientRect();
      return { text: frozen.textContent ?? '', title: frozen.title, x: r.x + r.width / 2, y: r.y + r.height / 2 };
    }
    for (const row of document.querySelectorAll('[data-testid="sheet-grid"] .dsg-row:not(.dsg-row-header)')) {
      const cells = [...row.children] as HTMLElement[];
      if (cells[0]?.textContent !== digits) continue;
      const target = cells.find((c) => c.style.left === header.style.left);
      if (!target) return null;
      const r = target.getBoundingClientRect();
      const inner = target.querySelector('.orb-cell') as HTMLElement | null;
      return { text: inner?.textContent ?? '', title: inner?.title ?? '', x: r.x + r.width / 2, y: r.y + r.height / 2 };
    }
    return null;
  }, a1);
}

/** Signs a new person up through the page and opens a new workbook of theirs with this title. */
export async function signUpWithNewWorkbook(page: Page, serverUrl: string, person: { name: string; email: string; password: string }, title: string): Promise<void> {
  await page.goto(`${serverUrl}/sign-up`);
  await page.getByLabel('Name').fill(person.name);
  await page.getByLabel('Email').fill(person.email);
  await page.getByLabel('Password').fill(person.password);
  await page.getByRole('button', { name: 'Create account' }).click();
  await page.getByRole('button', { name: 'New workbook' }).click();
  await page.getByRole('dialog').getByLabel('Title').fill(title);
  await page.getByRole('button', { name: 'Create and open' }).click();
  await page.waitForURL((u) => u.pathname.startsWith('/workbooks/'));
}
