// Typing formulas the way the hands expect, in Debian Chromium against the real server: a click or
// an arrow while a formula waits for a reference inserts that cell (point mode), brackets left open
// are closed on commit, keys typed right after a completion or a pointed cell stay in place, an
// argument hint names the current parameter with its unit and choices, and a formula that cannot be
// read says in plain words where. Bond order of O2 2 and its two unpaired
// electrons (Atkins & de Paula, Physical Chemistry, MO theory of diatomics; recalled from memory).
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
const editorText = () => page.locator('.orb-cell-input').inputValue();



async function formulaOf(a1: string) {
  await clickCell(a1);
  return page.getByLabel('Formula bar').inputValue();
}

it('starts from a workbook with O2 in A1', async () => {
  await signUpWithNewWorkbook(page, server.url, { name: 'Ravi Okafor', email: 'ravi@lab.example', password: 'pi-g-antibonding' }, 'Formulas');
  await page.getByTestId('workbook-title').waitFor();
  await clickCell('A1');
  await page.keyboard.type('O2');
  await page.keyboard.press('Enter');
  await expectCell('A1', 'O2');
}, 60_000);

describe('point mode', () => {
  it('a click on another cell while typing =BONDORDER( inserts its reference; Enter closes the bracket', async () => {
    await clickCell('B1');
    await page.keyboard.type('=BONDORDER(');
    await clickCell('A1');
    await expect.poll(editorText).toBe('=BONDORDER(A1');
    await screenshot(page, 'grid-formula-point-click');
    await page.keyboard.press('Enter');
    await expectCell('B1', '2');
    expect(await formulaOf('B1')).toBe('=BONDORDER(A1)');
  });

  it('arrows move the pointed reference instead of leaving the cell', async () => {
    await clickCell('C2');
    await page.keyboard.type('=UNPAIRED(');
    await page.keyboard.press('ArrowUp');
    await expect.poll(editorText).toBe('=UNPAIRED(C1');
    await page.keyboard.press('ArrowLeft');
    await page.keyboard.press('ArrowLeft');
    await expect.poll(editorText).toBe('=UNPAIRED(A1');
    await page.keyboard.type(')*2');
    await page.keyboard.press('Enter');
    await expectCell('C2', '4');
    expect(await formulaOf('C2')).toBe('=UNPAIRED(A1)*2');
  });

  it('in the formula bar too, a click on a cell inserts its reference and Enter closes the bracket', async () => {
    await clickCell('B3');
    await page.getByLabel('Formula bar').click();
    await page.keyboard.type('=BONDORDER(');
    await clickCell('A1');
    await expect.poll(() => page.getByLabel('Formula bar').inputValue()).toBe('=BONDORDER(A1');
    await page.keyboard.press('Enter');
    await expectCell('B3', '2');
    expect(await formulaOf('B3')).toBe('=BONDORDER(A1)');
  });

  it('in the formula bar, arrows point from the cell in focus and Shift+arrow makes a range', async () => {
    await clickCell('B4');
    await page.getByLabel('Formula bar').click();
    await page.keyboard.type('=UNPAIRED(');
    const bar = () => page.getByLabel('Formula bar').inputValue();
    await page.keyboard.press('ArrowLeft');
    await expect.poll(bar).toBe('=UNPAIRED(A4');
    for (let i = 0; i < 3; i++) await page.keyboard.press('ArrowUp');
    await expect.poll(bar).toBe('=UNPAIRED(A1');
    await page.keyboard.press('Enter');
    await expectCell('B4', '2');
    expect(await formulaOf('B4')).toBe('=UNPAIRED(A1)');
    // A range: Shift extends from where pointing began (two cells of O2's count, summed).
    await clickCell('D4');
    await page.getByLabel('Formula bar').click();
    await page.keyboard.type('=SUM(');
    await page.keyboard.press('ArrowUp');
    await page.keyboard.press('Shift+ArrowLeft');
    await expect.poll(bar).toBe('=SUM(C3:D3');
    await page.keyboard.press('Escape');
    // Escape hands the keyboard back to the grid: typing goes to the cell in focus again.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? null)).not.toBe('Formula bar');
  });

  it('dragging from the pointed cell makes a range, in the cell and in the formula bar', async () => {
    const drag = async (from: string, to: string) => {
      const a = (await cell(from))!;
      const b = (await cell(to))!;
      await page.mouse.move(a.x, a.y);
      await page.mouse.down();
      await page.mouse.move((a.x + b.x) / 2, (a.y + b.y) / 2, { steps: 3 });
      await page.mouse.move(b.x, b.y, { steps: 3 });
      await page.mouse.up();
    };
    await clickCell('F1');
    await page.keyboard.type('=SUM(');
    await drag('C1', 'D2');
    await expect.poll(editorText).toBe('=SUM(C1:D2');
    await page.keyboard.press('Escape');
    await clickCell('F2');
    await page.getByLabel('Formula bar').click();
    await page.keyboard.type('=SUM(');
    await drag('D2', 'C1');
    await expect.poll(() => page.getByLabel('Formula bar').inputValue()).toBe('=SUM(C1:D2');
    await page.keyboard.press('Escape');
  });

  it('outside point mode an arrow still leaves the cell (after a complete value)', async () => {
    await clickCell('D1');
    await page.keyboard.type('=1+1');
    await page.keyboard.press('ArrowDown');
    await expectCell('D1', '2');
    await expect.poll(() => page.getByLabel('Cell address').inputValue()).toBe('D2');
  });
});

// A busy page (the rows of a large sheet loading in slices, the side panel laying out) may paint its
// next frame only after the next keys have been typed. The completion's caret must not wait for that
// frame: placed late, it jumped back before the typed characters (=UNPAIRED(1)A, unreadable).
/** Runs `keys` while the page's animation frames are held back, then lets the held frames run. */
async function withFramesHeld(keys: () => Promise<void>) {
  await page.evaluate(() => {
    const w = window as unknown as { heldFrames: FrameRequestCallback[]; releaseFrames: () => void };
    const real = window.requestAnimationFrame.bind(window);
    w.heldFrames = [];
    window.requestAnimationFrame = (cb) => (w.heldFrames.push(cb), 0);
    w.releaseFrames = () => {
      window.requestAnimationFrame = real;
      for (const cb of w.heldFrames.splice(0)) cb(performance.now());
    };
  });
  try {
    await keys();
  } finally {
    await page.evaluate(() => (window as unknown as { releaseFrames: () => void }).releaseFrames());
  }
}

describe('completing a function name', () => {
  /** Types =UNP, takes the completion with Tab and types A while frames are held, then 1) and Enter. */
  async function completeLate(cell: string, typedText: () => Promise<string>) {
    await page.keyboard.type('=UNP');
    await page.getByRole('listbox', { name: 'Functions' }).getByRole('option', { name: /UNPAIRED/ }).waitFor();
    await withFramesHeld(async () => {
      await page.keyboard.press('Tab');
      await page.keyboard.type('A');
    });
    await page.keyboard.type('1)');
    await expect.poll(typedText).toBe('=UNPAIRED(A1)');
    await page.keyboard.press('Enter');
    await expectCell(cell, '2');
  }

  it('keeps what is typed after Tab in place even when the next frame comes late', async () => {
    await clickCell('G1');
    await completeLate('G1', editorText);
  });

  it('in the formula bar too', async () => {
    await clickCell('G2');
    await page.getByLabel('Formula bar').click();
    await completeLate('G2', () => page.getByLabel('Formula bar').inputValue());
  });

  it('and after a cell pointed at in the formula bar', async () => {
    await clickCell('G3');
    await page.getByLabel('Formula bar').click();
    await page.keyboard.type('=BONDORDER(');
    await withFramesHeld(async () => {
      await clickCell('A1');
      await page.keyboard.type(')');
    });
    await page.keyboard.type('*2');
    await expect.poll(() => page.getByLabel('Formula bar').inputValue()).toBe('=BONDORDER(A1)*2');
    await page.keyboard.press('Enter');
    await expectCell('G3', '4');
  });
});

describe('argument hint', () => {
  it('names the current parameter with its unit, then the next one with its default', async () => {
    await clickCell('E1');
    await page.keyboard.type('=OVERLAP1S(');
    const hint = page.getByTestId('argument-hint');
    await expect.poll(() => hint.textContent()).toMatch(/OVERLAP1S\(distance, \[zeta\], \[unit\]\)/);
    expect(await hint.locator('[aria-current="true"]').textContent()).toBe('distance');
    expect(await hint.textContent()).toMatch(/in bohr/);
    await page.keyboard.type('1.4,');
    await expect.poll(() => hint.locator('[aria-current="true"]').textContent()).toBe('[zeta]');
    expect(await hint.textContent()).toMatch(/default 1/);
    await screenshot(page, 'grid-formula-argument-hint');
    await page.keyboard.press('Escape');
    // Escape hands the keyboard back to the grid: typing goes to the cell in focus again.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? null)).not.toBe('Formula bar');
  });

  it('lists the choices of a text parameter', async () => {
    await clickCell('E2');
    await page.keyboard.type('=GROUNDTERM(A1,');
    await expect.poll(() => page.getByTestId('argument-hint').textContent()).toMatch(/one of "unicode", "ascii"/);
    await page.keyboard.press('Escape');
    // Escape hands the keyboard back to the grid: typing goes to the cell in focus again.
    await expect.poll(() => page.evaluate(() => document.activeElement?.getAttribute('aria-label') ?? null)).not.toBe('Formula bar');
  });
});

describe('a formula that cannot be read', () => {
  it('says in plain words where it goes wrong, never the parser’s token names', async () => {
    await clickCell('F1');
    await page.keyboard.type('=1+*2');
    await page.keyboard.press('Enter');
    await expectCell('F1', '#ERROR!');
    await clickCell('F1');
    const said = await page.getByTestId('cell-error').textContent();
    expect(said).toMatch(/character 4/);
    expect(said).not.toMatch(/Parsing error|token|-->/);
  });

  it('raised no uncaught errors in the page', () => {
    expect(browser.errors).toEqual([]);
  });
});
