// Desktop-spreadsheet habits of the hands, in Debian Chromium against the real server: F2 and a
// double-click edit with the caret at the end, a click on the active cell only selects it,
// Ctrl+Arrow stops at the edge of the data, a double-click on the fill handle fills down beside
// the data, and a block typed in the address box is selected. Bond orders from MO theory: O2 2,
// N2 3, F2 1, CO 3 (Atkins & de Paula, Physical
// Chemistry, MO theory of diatomics; recalled from memory).
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, signUpWithNewWorkbook, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s));

it('starts from a sheet of four species and a bond order', async () => {
  await signUpWithNewWorkbook(page, server.url, { name: 'Noor Haddad', email: 'noor@lab.example', password: 'pi-star-antibonding' }, 'Habits');
  await page.getByTestId('workbook-title').waitFor();
  // A1:A4 species, B1 a bond order.
  await clickCell('A1');
  for (const s of ['O2', 'N2', 'F2', 'CO']) {
    await page.keyboard.type(s);
    await page.keyboard.press('Enter');
  }
  await clickCell('B1');
  await page.keyboard.type('=BONDORDER(A1)');
  await page.keyboard.press('Enter');
  await expectCell('B1', '2');
}, 60_000);

const { cell, clickCell, expectCell } = gridHands(() => page);
const address = () => page.getByLabel('Cell address').inputValue();
const editorOpen = () => page.locator('.orb-cell-input').count();



describe('editing habits', () => {
  it('F2 opens the cell with the caret at the end, so typing adds to the formula', async () => {
    await clickCell('B1');
    await page.keyboard.press('F2');
    await page.keyboard.type('+1');
    await page.keyboard.press('Enter');
    await expectCell('B1', '3');
  });

  it('a double-click opens the cell with the caret at the end too', async () => {
    await clickCell('B1', { clickCount: 2 });
    await expect.poll(editorOpen).toBe(1);
    await page.keyboard.type('+1');
    await page.keyboard.press('Enter');
    await expectCell('B1', '4');
  });

  it('a single click on the active cell only selects it; typing then replaces the cell', async () => {
    await clickCell('A4');
    await clickCell('A4');
    expect(await editorOpen()).toBe(0);
    await page.keyboard.type('NO');
    await page.keyboard.press('Enter');
    await expectCell('A4', 'NO');
  });
});

describe('data edges', () => {
  it('Ctrl+ArrowDown stops at the last filled row and Ctrl+ArrowUp comes back', async () => {
    await clickCell('A1');
    await page.keyboard.press('Control+ArrowDown');
    await expect.poll(address).toBe('A4');
    await page.keyboard.press('Control+ArrowUp');
    await expect.poll(address).toBe('A1');
  });

  it('double-clicking the fill handle fills down to the end of the neighbouring column’s data', async () => {
    await clickCell('B1');
    await page.keyboard.press('F2');
    await page.keyboard.press('Control+a');
    await page.keyboard.type('=BONDORDER(A1)');
    await page.keyboard.press('Enter');
    await clickCell('B1');
    const handle = page.locator('.dsg-expand-rows-indicator');
    await handle.dblclick();
    await expectCell('B2', '3');
    await expectCell('B3', '1');
    await expectCell('B4', '2.5'); // NO: bond order 2.5 (same source)
    await expectCell('B5', '');
    await screenshot(page, 'grid-fill-handle-double-click');
  });

  it('reaches a frozen row 1 from the keyboard: ArrowUp from row 2, typing replaces, the address box goes there', async () => {
    await page.getByRole('button', { name: 'Freeze row 1' }).click();
    const frozen = (col: string) => page.locator(`.orb-col-header[data-col="${col}"] .orb-col-frozen`).textContent();
    await expect.poll(() => frozen('A')).toBe('O2');
    await clickCell('A2');
    await page.keyboard.press('ArrowUp');
    await expect.poll(address).toBe('A1');
    await page.keyboard.type('Cl2');
    await page.keyboard.press('Enter');
    await expect.poll(() => frozen('A')).toBe('Cl2');
    await expect.poll(address).toBe('A2'); // Enter moved down into the grid
    await page.getByLabel('Cell address').click();
    await page.getByLabel('Cell address').fill('C1');
    await page.getByLabel('Cell address').press('Enter');
    await expect.poll(address).toBe('C1');
    await page.keyboard.type('=BONDORDER(A1)');
    await page.keyboard.press('Enter');
    await expect.poll(() => frozen('C')).toBe('1'); // Cl2: bond order 1 (same source)
    await page.getByRole('button', { name: 'Freeze row 1' }).click();
  });

  it('a block typed in the address box becomes the selection, and the keys act on it', async () => {
    await clickCell('E5');
    for (const s of ['N2', 'O2']) {
      await page.keyboard.type(s);
      await page.keyboard.press('Enter');
    }
    await expectCell('E6', 'O2');
    const box = page.getByLabel('Cell address');
    await box.click();
    await box.fill('f6:e5');
    await box.press('Enter');
    await expect.poll(address).toBe('E5:F6');
    // The keyboard is back in the grid: Delete clears the block instead of editing the box's text.
    await page.keyboard.press('Delete');
    await expectCell('E5', '');
    await expectCell('E6', '');
    await expect.poll(address).toBe('E5:F6');
  });

  it('an address the box cannot read is refused with a reason, and Escape hands the keys back', async () => {
    const box = page.getByLabel('Cell address');
    await box.click();
    await box.fill('E0');
    await box.press('Enter');
    await expect.poll(() => page.getByTestId('sheet-message').textContent()).toContain('"E0" is not a cell or a block of cells');
    await box.press('Escape');
    await expect.poll(address).toBe('E5:F6');
  });

  it('raised no uncaught errors in the page', () => {
    expect(browser.errors).toEqual([]);
  });
});
