// The workbook grid end to end in Debian Chromium against the real server (production build, fresh
// database): typing species and chemistry formulas, computed values and error messages, function
// autocomplete, saving and reloading, undo, unsent changes kept across a reload, pasting
// tab-separated text, copying out, the MO diagram panel, the address box and the export menu.
// Screenshots go to tests/artifacts/.
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { signUpWithNewWorkbook, screenshot, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s), { permissions: ['clipboard-read', 'clipboard-write'] });

const { cell, clickCell, expectCell } = gridHands(() => page);

/** Types a row of inputs from the active cell: Tab between cells, Enter at the end. */
async function typeRow(inputs: string[]) {
  for (const [i, input] of inputs.entries()) {
    await page.keyboard.type(input);
    await page.keyboard.press(i === inputs.length - 1 ? 'Enter' : 'Tab');
  }
}

async function waitSaved() {
  await page.locator('[data-testid="save-state"][data-state="saved"]').waitFor();
}

async function reloadWorkbook() {
  await page.reload();
  await page.getByTestId('workbook-title').waitFor();
}

describe('the workbook grid in a browser', () => {
  it('creates a workbook from the list and opens an empty sheet', async () => {
    await signUpWithNewWorkbook(page, server.url, { name: 'Ines Duarte', email: 'ines@lab.example', password: 'sigma-pi-sigma-star' }, 'Diatomic screen, grid test');
    await expect.poll(() => page.getByTestId('workbook-title').textContent()).toBe('Diatomic screen, grid test');
    await expectCell('A1', '');
    await waitSaved();
  });

  it('computes chemistry formulas as they are typed (O2 bond order 2 and two unpaired electrons; N2 bond order 3, closed shell)', async () => {
    await clickCell('A1');
    await typeRow(['O2', '=BONDORDER(A1)', '=UNPAIRED(A1)']);
    await page.keyboard.press('Home');
    await typeRow(['N2', '=BONDORDER(A2)', '=UNPAIRED(A2)']);
    await page.keyboard.press('Home');
    await typeRow(['Xq2', '=BONDORDER(A3)']);
    await expectCell('B1', '2');
    await expectCell('C1', '2');
    await expectCell('B2', '3');
    await expectCell('C2', '0');
    await expectCell('B3', '#VALUE!');
    await screenshot(page, 'grid-typed-values');
  });

  it('shows an error’s message on hover and in the bar when the cell is selected', async () => {
    expect((await cell('B3'))?.title).toMatch(/unknown element 'Xq'/);
    await clickCell('B3');
    await expect.poll(() => page.getByTestId('cell-error').textContent()).toMatch(/#VALUE! unknown element 'Xq'/);
    expect(await page.getByLabel('Formula bar').inputValue()).toBe('=BONDORDER(A3)');
    await screenshot(page, 'grid-error-message');
  });

  it('offers our functions with signature and summary while a formula is typed', async () => {
    await clickCell('D2');
    await page.keyboard.type('=UNP');
    const list = page.getByRole('listbox', { name: 'Functions' });
    await list.getByRole('option', { name: /UNPAIRED/ }).waitFor();
    expect(await list.textContent()).toMatch(/UNPAIRED\(species/);
    await screenshot(page, 'grid-autocomplete');
    await page.keyboard.press('Tab');
    // The completion is in the cell (name and open bracket) before the argument is typed.
    await expect.poll(() => page.locator('.orb-cell-input').inputValue()).toBe('=UNPAIRED(');
    await page.keyboard.type('A1)');
    await expect.poll(() => page.locator('.orb-cell-input').inputValue()).toBe('=UNPAIRED(A1)');
    await page.keyboard.press('Enter');
    await expectCell('D2', '2');
  });

  it('saves every change and shows the same values after a reload', async () => {
    await waitSaved();
    await reloadWorkbook();
    await expectCell('A1', 'O2');
    await expectCell('B1', '2');
    await expectCell('C2', '0');
    await expectCell('D2', '2');
  });

  it('undoes an edit with Ctrl+Z, recomputing and saving the undo', async () => {
    await clickCell('A1');
    await typeRow(['F2']);
    await expectCell('B1', '1'); // F2: bond order 1
    await clickCell('C5');
    await page.keyboard.press('Control+z');
    await expectCell('A1', 'O2');
    await expectCell('B1', '2');
    await page.keyboard.press('Control+y');
    await expectCell('A1', 'F2');
    await page.keyboard.press('Control+z');
    await expectCell('A1', 'O2');
    await waitSaved();
    await reloadWorkbook();
    await expectCell('A1', 'O2');
  });

  it('keeps changes the server has not acknowledged across a reload, then sends them', async () => {
    await page.route('**/api/workbooks/*/patches', (route) => route.abort('connectionrefused'));
    await clickCell('A4');
    await typeRow(['CO', '=BONDORDER(A4)']);
    await expect.poll(() => page.getByTestId('save-state').textContent()).toMatch(/Offline — 2 changes waiting/);
    await screenshot(page, 'grid-offline-waiting');
    await reloadWorkbook();
    await expectCell('B4', '3');
    await page.unroute('**/api/workbooks/*/patches');
    await page.getByTestId('sheet-message').waitFor();
    await waitSaved();
    await reloadWorkbook();
    await expectCell('A4', 'CO');
    await expectCell('B4', '3');
  });

  it('pastes a block of tab-separated text, quoted cells included, with formulas computed', async () => {
    await page.evaluate(() => navigator.clipboard.writeText('CO\t=BONDORDER(E1)\nNO+\t=BONDORDER(E2)\n"C2"\t=UNPAIRED(E3)\n'));
    await clickCell('E1');
    await page.keyboard.press('Control+v');
    await expectCell('E3', 'C2');
    await expectCell('F1', '3'); // CO: triple bond
    await expectCell('F2', '3'); // NO+: isoelectronic with N2
    await expectCell('F3', '0'); // C2: KK σg² σu*² πu⁴, closed shell in this model
    await screenshot(page, 'grid-after-paste');
  });

  it('copies a block out as tab-separated values other programs read', async () => {
    await clickCell('A1');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Shift+ArrowRight');
    await expect.poll(() => page.getByLabel('Cell address').inputValue()).toBe('A1:B2');
    await page.keyboard.press('Control+c');
    expect(await page.evaluate(() => navigator.clipboard.readText())).toBe('O2\t2\nN2\t3');
  });

  it('draws the MO diagram of the selected species in the side panel, with the caution note', async () => {
    await clickCell('A1');
    const diagram = page.getByRole('img', { name: 'Molecular orbital diagram of O2' });
    await diagram.waitFor();
    const panel = page.getByTestId('structure-panel');
    expect(await panel.textContent()).toMatch(/Bond order\s*2/);
    expect(await panel.textContent()).toMatch(/2 \(paramagnetic\)/);
    expect(await diagram.locator('[data-character="antibonding"]').count()).toBeGreaterThan(0);
    expect(await page.getByTestId('safety-note').textContent()).toMatch(/safety data sheets/);
    await screenshot(page, 'grid-mo-diagram');
    await clickCell('F2');
    await page.getByRole('img', { name: /diagram of NO\+/ }).waitFor();
  });

  it('moves like a desktop spreadsheet: Tab, Tab, Enter back to the first column; Ctrl+End; Ctrl+Home; PageDown', async () => {
    const address = () => page.getByLabel('Cell address').inputValue();
    await clickCell('A6');
    await page.keyboard.press('Tab');
    await page.keyboard.press('Tab');
    await page.keyboard.press('Enter');
    await expect.poll(address).toBe('A7');
    await page.keyboard.press('Control+End');
    await expect.poll(address).toBe('F4'); // the last used row (4) and column (F)
    await page.keyboard.press('Control+Home');
    await expect.poll(address).toBe('A1');
    await page.keyboard.press('PageDown');
    await expect.poll(async () => Number((await address()).slice(1))).toBeGreaterThan(10);
    await page.keyboard.press('Control+Home');
  });

  it('goes back to the grid on Enter in the address box when no other address was typed', async () => {
    // G: the last column the grid shows beside the side panel at 1280 px (the panel snaps to a column edge).
    await clickCell('G1');
    await page.getByLabel('Cell address').click();
    await page.keyboard.press('Enter');
    await page.keyboard.type('NO');
    await page.keyboard.press('Enter');
    await expectCell('G1', 'NO');
    await expect.poll(() => page.getByLabel('Cell address').inputValue()).toBe('G2');
    await clickCell('G1');
    await page.keyboard.press('Delete');
    await expectCell('G1', '');
  });

  it('fills a formula down with Ctrl+D, its reference following each row', async () => {
    await clickCell('G1');
    await typeRow(['=B1*10']);
    await clickCell('G1');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Control+d');
    await expectCell('G2', '30');
    await expectCell('G3', '#VALUE!');
    await clickCell('G2');
    expect(await page.getByLabel('Formula bar').inputValue()).toBe('=B2*10');
  });

  it('inserts and deletes a row, formulas following their cells', async () => {
    await clickCell('A2');
    await page.getByRole('button', { name: '+ Row' }).click();
    await expectCell('A3', 'N2');
    await expectCell('B3', '3');
    await clickCell('B3');
    expect(await page.getByLabel('Formula bar').inputValue()).toBe('=BONDORDER(A3)');
    await clickCell('A2');
    await page.getByRole('button', { name: '− Row' }).click();
    await expectCell('A2', 'N2');
    await expectCell('G2', '30');
  });

  it('sorts a block by the active column', async () => {
    await clickCell('F1');
    await page.keyboard.press('Shift+ArrowLeft');
    await page.keyboard.press('Shift+ArrowDown');
    await page.keyboard.press('Shift+ArrowDown');
    await page.getByRole('button', { name: 'Sort ↑' }).click();
    await expectCell('E1', 'C2');
    await expectCell('F1', '0');
    await expectCell('F3', '3');
  });

  it('filters rows by a value of a column, keeping true row numbers', async () => {
    await clickCell('A2');
    await page.getByRole('button', { name: 'Filter…' }).click();
    await page.getByRole('dialog', { name: 'Filter column A' }).getByRole('button', { name: /^N2/ }).click();
    await expect.poll(() => page.getByTestId('active-filter').textContent()).toMatch(/A = “N2”/);
    await expectCell('A2', 'N2');
    expect(await cell('A1')).toBeNull(); // row 1 is hidden
    await screenshot(page, 'grid-filtered');
    await page.getByRole('button', { name: 'Clear the filter' }).click();
    await expectCell('A1', 'O2');
  });

  it('freezes the header row, shows numbers to a chosen precision and keeps both after a reload', async () => {
    // Display settings are saved after a short pause: wait for the save that carries both choices.
    const saved = page.waitForResponse((r) => {
      const body = r.request().postData() ?? '';
      return r.request().method() === 'PATCH' && /\/sheets\/[^/]+$/.test(r.url()) && body.includes('"freezeHeaderRow":true') && body.includes('"precision":2');
    });
    await page.getByRole('button', { name: 'Freeze row 1' }).click();
    await page.getByLabel('Decimal places').selectOption('2');
    await expectCell('B2', '3.00');
    await expect.poll(() => page.locator('.orb-col-header[data-col="A"] .orb-col-frozen').textContent()).toBe('O2');
    await screenshot(page, 'grid-frozen-precision');
    expect((await saved).status()).toBe(200);
    await reloadWorkbook();
    await expectCell('B2', '3.00');
    await expectCell('A1', 'O2'); // still frozen: row 1 shown in the header
    // Changed again after the reload: these choices must be the ones the next reload shows.
    const savedAgain = page.waitForResponse((r) => {
      const body = r.request().postData() ?? '';
      return r.request().method() === 'PATCH' && /\/sheets\/[^/]+$/.test(r.url()) && body.includes('"freezeHeaderRow":false') && body.includes('"precision":null');
    });
    await page.getByLabel('Decimal places').selectOption('auto');
    await page.getByRole('button', { name: 'Freeze row 1' }).click();
    await expectCell('B1', '2');
    expect((await savedAgain).status()).toBe(200);
    await reloadWorkbook();
    await expectCell('B2', '3');
    await expectCell('B1', '2');
    expect(await page.locator('.orb-col-frozen').count()).toBe(0);
    expect(await page.getByLabel('Decimal places').inputValue()).toBe('auto');
  });

  it('widens a column by dragging its header edge', async () => {
    const handle = page.getByRole('separator', { name: 'Width of column A' });
    const box = (await handle.boundingBox())!;
    const before = (await page.locator('.orb-col-header[data-col="A"]').boundingBox())!.width;
    await page.mouse.move(box.x + box.width / 2, box.y + box.height / 2);
    await page.mouse.down();
    await page.mouse.move(box.x + 80, box.y + box.height / 2, { steps: 5 });
    await page.mouse.up();
    await expect.poll(async () => (await page.locator('.orb-col-header[data-col="A"]').boundingBox())!.width).toBeGreaterThan(before + 60);
  });

  it('plots two columns in the chart panel', async () => {
    await page.getByRole('button', { name: 'Chart' }).click();
    const panel = page.getByTestId('chart-panel');
    await panel.getByLabel('X column').selectOption({ label: 'B' });
    await panel.getByLabel('Y column').selectOption({ label: 'C' });
    // B and C hold numbers together in rows 1 and 2 only (B3 is an error, C4 is empty).
    await expect.poll(() => panel.textContent()).toMatch(/2 points; 2 rows without two numbers left out/);
    await screenshot(page, 'grid-chart');
    // Y against X with the line of agreement, and how far apart they lie: rows 1–2 hold (2, 2) and (3, 0),
    // so Y − X is 0 and −3: mean −1.5, RMS √4.5 = 2.12.
    await panel.getByLabel('Chart type').selectOption('compare');
    await expect.poll(() => panel.getByTestId('chart-agreement').textContent()).toMatch(/mean -1\.50, RMS 2\.12/);
    await screenshot(page, 'grid-chart-compare');
    await panel.getByLabel('Chart type').selectOption('scatter');
    await page.getByRole('button', { name: 'Structure' }).click();
  });

  it('adds and renames a sheet tab', async () => {
    await page.getByRole('button', { name: 'Add a sheet' }).click();
    await page.getByRole('tab', { name: 'Screen2', selected: true }).waitFor();
    await page.getByRole('tab', { name: 'Screen2' }).dblclick();
    await page.getByLabel('Sheet name').fill('Limits');
    await page.keyboard.press('Enter');
    await page.getByRole('tab', { name: 'Limits' }).waitFor();
    await reloadWorkbook();
    await page.getByRole('tab', { name: 'Limits' }).waitFor();
    await page.getByRole('tab', { name: 'Screen1' }).click();
    await expectCell('A1', 'O2');
  });

  it('shows a spilled array in the cells it fills, and keeps those cells read-only', async () => {
    await clickCell('B6');
    await typeRow(['=MOTABLE("N2")']);
    await expectCell('C6', 'bonding'); // σg(2s) of N2 is bonding, with 2 electrons
    await expectCell('D6', '2');
    await expectCell('B11', 'σu*(2p)');
    await clickCell('C6');
    await expect.poll(() => page.getByText('View only — filled by an array formula in another cell.').count()).toBe(1);
    await page.keyboard.type('9');
    await page.keyboard.press('Enter');
    await expectCell('C6', 'bonding');
    await screenshot(page, 'grid-spilled-array');
  });

  it('looks right in the dark theme too', async () => {
    await page.emulateMedia({ colorScheme: 'dark' });
    await page.evaluate(() => localStorage.removeItem('orbitab.theme'));
    await reloadWorkbook();
    await clickCell('B3');
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
    // The grid's cells are painted dark with light text (relative luminance, WCAG 2.x formula).
    const luminance = (css: string) => {
      const [r, g, b] = css.match(/[\d.]+/g)!.slice(0, 3).map((v) => Number(v) / 255).map((c) => (c <= 0.03928 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4));
      return 0.2126 * r + 0.7152 * g + 0.0722 * b;
    };
    const colours = await page.evaluate(() => {
      const cellText = [...document.querySelectorAll('[data-testid="sheet-grid"] .orb-cell')].find((e) => (e.textContent ?? '').trim() !== '');
      let el: Element | null = cellText ?? null;
      let bg = 'rgba(0, 0, 0, 0)';
      const text = el ? getComputedStyle(el).color : '';
      while (el && /rgba\(0, 0, 0, 0\)|transparent/.test(bg)) {
        bg = getComputedStyle(el).backgroundColor;
        el = el.parentElement;
      }
      return { bg, text };
    });
    expect(luminance(colours.bg), JSON.stringify(colours)).toBeLessThan(0.1);
    expect(luminance(colours.text), JSON.stringify(colours)).toBeGreaterThan(0.4);
    await screenshot(page, 'grid-dark');
    await page.emulateMedia({ colorScheme: 'light' });
  });

  it('offers the workbook as .xlsx, values-only .xlsx and the sheet as .csv, and downloads the .xlsx', async () => {
    await page.getByRole('button', { name: 'Export' }).click();
    const menu = page.getByRole('menu', { name: 'Export' });
    const items = await menu.getByRole('menuitem').allTextContents();
    expect(items.map((t) => /^[^(]*\([^)]*\)/.exec(t)?.[0])).toEqual(['Workbook (.xlsx)', 'Values only (.xlsx)', 'Sheet “Screen1” (.csv)']);
    const [download] = await Promise.all([page.waitForEvent('download'), menu.getByRole('menuitem', { name: /^Workbook \(\.xlsx\)/ }).click()]);
    expect(download.suggestedFilename()).toMatch(/\.xlsx$/);
    // An .xlsx file is a ZIP package, which begins with the local-file-header signature "PK" (common practice).
    expect(fs.readFileSync((await download.path())!).subarray(0, 2).toString('latin1')).toBe('PK');
  });

  it('shows the predicted π→π* bands of a π system and the known disagreement of a diatomic species', async () => {
    await page.getByRole('tab', { name: 'Limits' }).click();
    await clickCell('A1');
    await typeRow(['c1ccc2cccc2cc1']);
    await typeRow(['BN']);
    await clickCell('A1');
    const bands = page.getByRole('img', { name: 'Predicted π→π* bands of c1ccc2cccc2cc1' });
    await bands.waitFor();
    // Azulene's visible band: PPP-CIS puts S1 near 610 nm (observed ≈ 580 nm; docs/spectra.md).
    expect(await page.getByTestId('structure-panel').textContent()).toMatch(/S1\s*6\d\d nm/);
    expect(await bands.locator('line[data-nm]').count()).toBeGreaterThan(3);
    // The broadened curve follows the width the user sets.
    const curve = bands.getByTestId('ppp-curve');
    const narrow = await curve.getAttribute('d');
    await page.getByLabel('Band width (FWHM)').fill('0.8');
    await expect.poll(() => curve.getAttribute('data-width-ev')).toBe('0.8');
    expect(await curve.getAttribute('d')).not.toBe(narrow);
    await screenshot(page, 'grid-ppp-bands');
    await clickCell('A2');
    await page.getByRole('img', { name: 'Molecular orbital diagram of BN' }).waitFor();
    expect(await page.getByTestId('model-caveat').textContent()).toMatch(/Experiment: X ³Π/);
    await page.getByRole('tab', { name: 'Screen1' }).click();
  });

  it('raised no uncaught errors in the page', () => {
    expect(browser.errors).toEqual([]);
  });
});
