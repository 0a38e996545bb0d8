// One user action is one undo step and one revision, and after every step the screen and the
// server's stored cells agree: a block delete, a paste repeated over a taller selection, sorts with
// a header row and undo, and a column delete undone. Each step reads the stored cells back through
// GET /api/workbooks/:id. Bond orders from MO theory: O2 2, N2 3, F2 1, CO 3 (Atkins & de Paula,
// Physical Chemistry, MO theory of diatomics; recalled from memory).
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { cellName } from '../shared/a1.js';
import { screenshot, signUpWithNewWorkbook, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s), { permissions: ['clipboard-read', 'clipboard-write'] });

const { cell, clickCell, expectCell } = gridHands(() => page);

async function selectBlock(start: string, keys: string[], range: string) {
  await clickCell(start);
  for (const k of keys) await page.keyboard.press(k);
  await expect.poll(() => page.getByLabel('Cell address').inputValue()).toBe(range);
}

async function typeRows(start: string, rows: string[][]) {
  await clickCell(start);
  for (const row of rows) {
    for (const [i, text] of row.entries()) {
      await page.keyboard.type(text);
      await page.keyboard.press(i === row.length - 1 ? 'Enter' : 'Tab');
    }
  }
}

/** The stored inputs of the first sheet, by A1 address, as the server holds them. */
async function stored(): Promise<Record<string, string>> {
  const id = new URL(page.url()).pathname.split('/')[2];
  const body = await page.evaluate(async (wb) => (await fetch(`/api/workbooks/${wb}`)).json(), id);
  const out: Record<string, string> = {};
  for (const c of body.sheets[0].cells as { row: number; col: number; input: string }[] | [number, number, string][]) {
    const [row, col, input] = Array.isArray(c) ? c : [c.row, c.col, c.input];
    if (input !== '') out[cellName(row, col)] = input;
  }
  return out;
}

async function revision(): Promise<number> {
  const id = new URL(page.url()).pathname.split('/')[2];
  return page.evaluate(async (wb) => (await (await fetch(`/api/workbooks/${wb}`)).json()).revision as number, id);
}

/** Waits until the server holds exactly these inputs and the page says Saved. */
async function expectStored(expected: Record<string, string>) {
  await expect.poll(stored, { timeout: 10_000 }).toEqual(expected);
  await expect.poll(() => page.getByTestId('save-state').getAttribute('data-state')).toBe('saved');
}

/** The grid shows these texts (empty string: shows nothing). */
async function expectShown(expected: Record<string, string>) {
  for (const [a1, text] of Object.entries(expected)) {
    await expect.poll(async () => (await cell(a1))?.text, { timeout: 10_000, message: `cell ${a1}` }).toBe(text);
  }
}

const screen = {
  A1: 'Species', B1: 'Bond order',
  A2: 'O2', B2: '=BONDORDER(A2)',
  A3: 'N2', B3: '=BONDORDER(A3)',
  A4: 'F2', B4: '=BONDORDER(A4)',
};

it('starts from a small screen of three species under a header row', async () => {
  await signUpWithNewWorkbook(page, server.url, { name: 'Ilse Marsh', email: 'ilse@lab.example', password: 'sigma-g-bonding' }, 'Undo');
  await page.getByTestId('workbook-title').waitFor();
  await typeRows('A1', [['Species', 'Bond order'], ['O2', '=BONDORDER(A2)'], ['N2', '=BONDORDER(A3)'], ['F2', '=BONDORDER(A4)']]);
  await expectShown({ B2: '2', B3: '3', B4: '1' });
  await expectStored(screen);
}, 60_000);

describe('undo per action, with the server checked after each step', () => {
  it('deleting a block is one revision, and one undo brings every row back', async () => {
    const before = await revision();
    await clickCell('A2');
    await clickCell('B4', { modifiers: ['Shift'] });
    await page.keyboard.press('Delete');
    await expectShown({ A2: '', B3: '', A4: '' });
    await expectStored({ A1: 'Species', B1: 'Bond order' });
    expect(await revision()).toBe(before + 1);
    await page.keyboard.press('Control+z');
    await expectShown({ A2: 'O2', B2: '2', A3: 'N2', B3: '3', A4: 'F2', B4: '1' });
    await expectStored(screen);
    expect(await revision()).toBe(before + 2);
  });

  it('one copied row pasted over a taller selection fills every row, and one undo takes it all back', async () => {
    await selectBlock('A2', ['Shift+ArrowRight'], 'A2:B2');
    await page.keyboard.press('Control+c');
    await expect.poll(() => page.evaluate(() => navigator.clipboard.readText())).toBe('O2\t2');
    await selectBlock('A5', ['Shift+ArrowDown', 'Shift+ArrowDown', 'Shift+ArrowRight'], 'A5:B7');
    await page.keyboard.press('Control+v');
    await expectShown({ A5: 'O2', B5: '2', A6: 'O2', B6: '2', A7: 'O2', B7: '2' });
    await expectStored({ ...screen, A5: 'O2', B5: '=BONDORDER(A5)', A6: 'O2', B6: '=BONDORDER(A6)', A7: 'O2', B7: '=BONDORDER(A7)' });
    await page.keyboard.press('Control+z');
    await expectShown({ A5: '', B6: '', A7: '' });
    await expectStored(screen);
  });

  it('a paste that cannot repeat evenly says why', async () => {
    await selectBlock('A2', ['Shift+ArrowDown'], 'A2:A3');
    await page.keyboard.press('Control+c');
    await expect.poll(() => page.evaluate(() => navigator.clipboard.readText())).toBe('O2\nN2');
    await selectBlock('D1', ['Shift+ArrowDown', 'Shift+ArrowDown'], 'D1:D3');
    await page.keyboard.press('Control+v');
    await expect.poll(() => page.getByTestId('sheet-message').textContent()).toMatch(/not a whole multiple/);
    await expectStored({ ...screen, D1: 'O2', D2: 'N2' });
    await page.keyboard.press('Control+z');
    await expectStored(screen);
  });
});

describe('sort keeps a header row when row 1 is not frozen', () => {
  it('sorts the species under the header and offers to include it', async () => {
    await clickCell('B3');
    await page.getByRole('button', { name: 'Sort ↓' }).click();
    await expectShown({ A1: 'Species', A2: 'N2', A3: 'O2', A4: 'F2' });
    await expectStored({ ...screen, A2: 'N2', A3: 'O2', A4: 'F2' });
    await expect(page.getByRole('button', { name: 'Sort row 1 with the data' }).isVisible()).resolves.toBe(true);
    await screenshot(page, 'grid-sort-header-kept');
  });

  it('sort, sort, undo, a sort that changes nothing, undo: screen and server agree at each step', async () => {
    const steps: [() => Promise<void>, Record<string, string>][] = [
      [() => page.getByRole('button', { name: 'Sort ↑' }).click(), { A2: 'F2', A3: 'O2', A4: 'N2' }],
      [() => page.getByRole('button', { name: 'Sort ↓' }).click(), { A2: 'N2', A3: 'O2', A4: 'F2' }],
      [() => page.keyboard.press('Control+z'), { A2: 'F2', A3: 'O2', A4: 'N2' }],
      [() => page.getByRole('button', { name: 'Sort ↑' }).click(), { A2: 'F2', A3: 'O2', A4: 'N2' }],
      [() => page.keyboard.press('Control+z'), { A2: 'N2', A3: 'O2', A4: 'F2' }],
    ];
    const bond: Record<string, string> = { O2: '2', N2: '3', F2: '1' };
    for (const [act, order] of steps) {
      await clickCell('B3');
      await act();
      const shown: Record<string, string> = { A1: 'Species' };
      const kept: Record<string, string> = { A1: 'Species', B1: 'Bond order' };
      for (const [a1, species] of Object.entries(order)) {
        shown[a1] = species;
        shown[`B${a1.slice(1)}`] = bond[species];
        kept[a1] = species;
        kept[`B${a1.slice(1)}`] = `=BONDORDER(${a1})`;
      }
      await expectShown(shown);
      await expectStored(kept);
    }
  });

  it('the choice sorts row 1 with the data, as one step', async () => {
    await clickCell('B3');
    await page.getByRole('button', { name: 'Sort ↑' }).click();
    await page.getByRole('button', { name: 'Sort row 1 with the data' }).click();
    // Ascending puts numbers before text: the header (text in B) goes last.
    await expectShown({ A1: 'F2', A2: 'O2', A3: 'N2', A4: 'Species' });
    await page.keyboard.press('Control+z');
    await expectShown({ A1: 'Species', A2: 'N2', A3: 'O2', A4: 'F2' });
    await expectStored({ A1: 'Species', B1: 'Bond order', A2: 'N2', B2: '=BONDORDER(A2)', A3: 'O2', B3: '=BONDORDER(A3)', A4: 'F2', B4: '=BONDORDER(A4)' });
  });
});

describe('a column delete undone', () => {
  it('− Column leaves #REF! in the formulas, and undo brings the species and formulas back on screen and server', async () => {
    const kept = { A1: 'Species', B1: 'Bond order', A2: 'N2', B2: '=BONDORDER(A2)', A3: 'O2', B3: '=BONDORDER(A3)', A4: 'F2', B4: '=BONDORDER(A4)' };
    await clickCell('A2');
    await page.getByRole('button', { name: '− Column' }).click();
    await expectShown({ A1: 'Bond order', A2: '#REF!' });
    await expectStored({ A1: 'Bond order', A2: '=BONDORDER(#REF!)', A3: '=BONDORDER(#REF!)', A4: '=BONDORDER(#REF!)' });
    await page.keyboard.press('Control+z');
    await expectShown({ A1: 'Species', A2: 'N2', B2: '3', B3: '2', B4: '1' });
    await expectStored(kept);
    await page.keyboard.press('Control+y');
    await expectStored({ A1: 'Bond order', A2: '=BONDORDER(#REF!)', A3: '=BONDORDER(#REF!)', A4: '=BONDORDER(#REF!)' });
    await page.keyboard.press('Control+z');
    await expectStored(kept);
    await expectShown({ A2: 'N2', B2: '3' });
  });

  it('raised no uncaught errors in the page', () => {
    expect(browser.errors).toEqual([]);
  });
});
