// Things the hands look for that were missing, in Debian Chromium against the real server: a menu on
// right-click for cells, row numbers, column letters and sheet tabs with the toolbar's actions;
// adding the sheets of a file to the open workbook; and a jump to a cell that leaves it in full view
// beside the row numbers.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, signUpWithNewWorkbook, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s));

const { cell, clickCell, expectCell } = gridHands(() => page);
const address = () => page.getByLabel('Cell address').inputValue();



async function jump(to: string) {
  await page.getByLabel('Cell address').click();
  await page.getByLabel('Cell address').fill(to);
  await page.getByLabel('Cell address').press('Enter');
  await expect.poll(address).toBe(to);
}

it('starts from three species in column A', async () => {
  await signUpWithNewWorkbook(page, server.url, { name: 'Mira Castell', email: 'mira@lab.example', password: 'delta-g-orbital' }, 'Menus');
  await page.getByTestId('workbook-title').waitFor();
  await clickCell('A1');
  for (const s of ['O2', 'N2', 'F2']) {
    await page.keyboard.type(s);
    await page.keyboard.press('Enter');
  }
  await expectCell('A3', 'F2');
}, 60_000);

describe('a jump to a cell', () => {
  it('leaves column A in full view beside the row numbers after coming back from far right', async () => {
    await jump('Z40');
    await jump('A2');
    // Read from the grid's own boxes: column A's header cell and the row numbers' column.
    const [cellLeft, gutterRight] = await page.evaluate(() => {
      const header = document.querySelector('.orb-col-header[data-col="A"]')!.closest('.dsg-cell')!.getBoundingClientRect();
      const row = [...document.querySelectorAll('[data-testid="sheet-grid"] .dsg-row:not(.dsg-row-header)')].find((r) => r.children[0]?.textContent === '2')!;
      return [header.left, row.children[0].getBoundingClientRect().right];
    });
    expect(cellLeft).toBeGreaterThanOrEqual(gutterRight - 1);
    await screenshot(page, 'grid-jump-back-to-a2');
  });
});

describe('right-click menus', () => {
  it('a cell’s menu inserts a row above with the toolbar’s command', async () => {
    await clickCell('A2', { button: 'right' });
    const menu = page.getByRole('menu', { name: 'Cell actions' });
    await menu.waitFor();
    await screenshot(page, 'grid-cell-menu');
    await menu.getByRole('menuitem', { name: 'Insert rows above' }).click();
    await expectCell('A3', 'N2');
    await expectCell('A2', '');
    expect(await menu.count()).toBe(0);
  });

  it('a row number’s menu deletes that row', async () => {
    const gutter = await page.evaluate(() => {
      const r = document.querySelector('[data-testid="sheet-grid"] [data-gutter-row="1"]')!.getBoundingClientRect();
      return { x: r.x + r.width / 2, y: r.y + r.height / 2 };
    });
    await page.mouse.click(gutter.x, gutter.y, { button: 'right' });
    await page.getByRole('menu', { name: 'Row actions' }).getByRole('menuitem', { name: 'Delete rows' }).click();
    await expectCell('A2', 'N2');
  });

  it('a column letter’s menu inserts a column to the left', async () => {
    const header = page.locator('.orb-col-header[data-col="A"]');
    await header.click({ button: 'right' });
    await page.getByRole('menu', { name: 'Column actions' }).getByRole('menuitem', { name: 'Insert columns to the left' }).click();
    await expectCell('B1', 'O2');
    await expectCell('A1', '');
    await page.keyboard.press('Control+z');
    await expectCell('A1', 'O2');
  });

  it('Esc closes a menu without doing anything', async () => {
    await clickCell('A1', { button: 'right' });
    await page.getByRole('menu', { name: 'Cell actions' }).waitFor();
    await page.keyboard.press('Escape');
    await expect.poll(() => page.getByRole('menu').count()).toBe(0);
    await expectCell('A1', 'O2');
  });

  it('a sheet tab’s menu renames the sheet', async () => {
    await page.getByRole('tab').first().click({ button: 'right' });
    await page.getByRole('menu', { name: 'Sheet actions' }).getByRole('menuitem', { name: 'Rename…' }).click();
    await page.getByLabel('Sheet name').fill('Diatomics');
    await page.getByLabel('Sheet name').press('Enter');
    await expect.poll(() => page.getByRole('tab').first().textContent()).toBe('Diatomics');
  });
});

describe('adding sheets from a file to the open workbook', () => {
  it('a CSV becomes a new sheet here and opens', async () => {
    await page.getByRole('button', { name: 'Sheets from a file…' }).click();
    const dialog = page.getByRole('dialog');
    await dialog.getByLabel('Spreadsheet file').setInputFiles({ name: 'ions.csv', mimeType: 'text/csv', buffer: Buffer.from('Species,Bond order\nNO+,=BONDORDER(A2)\n') });
    await dialog.getByRole('button', { name: 'Close' }).click();
    await expect.poll(() => page.getByRole('tab').count()).toBe(2);
    await expect.poll(() => page.getByRole('tab', { selected: true }).textContent()).toMatch(/ions/);
    await expectCell('B2', '3'); // NO+ is isoelectronic with N2: bond order 3 (Atkins & de Paula; recalled from memory)
    await screenshot(page, 'grid-sheet-from-file');
  });

  it('raised no uncaught errors in the page', () => {
    expect(browser.errors).toEqual([]);
  });
});
