// The side panels and the Protect dialog in Debian Chromium against the real server: the structure
// panel draws what the cell computes (its parameter set, thiophene with the default set), keeps close
// level labels apart and leaves the grid's columns whole; the chart plots the rows the filter shows,
// titles its axes, names each point, spreads coincident points, comes back after a reload and saves
// as SVG and PNG; Protect starts from the selected range.
import fs from 'node:fs';
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { screenshot, signUpWithNewWorkbook, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s));

const { cell, clickCell } = gridHands(() => page);
async function expectCellText(a1: string, pattern: RegExp) {
  await expect.poll(async () => (await cell(a1))?.text ?? '', { timeout: 15_000, message: `cell ${a1}` }).toMatch(pattern);
}
async function typeColumn(top: string, values: string[]) {
  await clickCell(top);
  for (const v of values) {
    await page.keyboard.type(v);
    await page.keyboard.press('Enter');
  }
}

// A small π screen: names, SMILES, the Hückel gap (|β|) and the π energy (β). Benzene twice (two
// batches) so two points coincide.
const molecules: [string, string][] = [
  ['benzene', 'c1ccccc1'],
  ['pyridine', 'c1ccncc1'],
  ['thiophene', 'c1ccsc1'],
  ['butadiene', 'C=CC=C'],
  ['hexatriene', 'C=CC=CC=C'],
  ['benzene batch 2', 'c1ccccc1'],
];

it('starts from a π screen with the default parameter set and one column on Van-Catledge', async () => {
  await signUpWithNewWorkbook(page, server.url, { name: 'Ilse Marchetti', email: 'ilse@lab.example', password: 'conjugated-ladder-9' }, 'Panels');
  await page.getByTestId('workbook-title').waitFor();
  await typeColumn('A1', ['Molecule', ...molecules.map((m) => m[0])]);
  await typeColumn('B1', ['SMILES', ...molecules.map((m) => m[1])]);
  await typeColumn('C1', ['Gap', ...molecules.map((_, i) => `=PIGAP(B${i + 2})`)]);
  await typeColumn('D1', ['Pi energy', ...molecules.map((_, i) => `=PIENERGY(B${i + 2})`)]);
  await typeColumn('E1', ['Gap VC', ...molecules.map((_, i) => `=PIGAP(B${i + 2},"van-catledge")`)]);
  await expectCellText('E7', /^\d/);
}, 120_000);

describe('structure panel', () => {
  it('computes thiophene with the default set and says where its sulfur values come from', async () => {
    // Before: "#VALUE! the streitwieser parameter set has no value for thiophene-type S".
    await expectCellText('C4', /^\d/);
    await clickCell('C4');
    const panel = page.getByTestId('structure-panel');
    await expect.poll(() => panel.textContent()).toContain('Hückel π levels of c1ccsc1');
    expect(await page.getByTestId('parameter-note').textContent()).toContain('Van-Catledge');
  });

  it('uses the parameter set the formula names (pyridine, van-catledge)', async () => {
    await clickCell('E3');
    const value = Number((await cell('E3'))!.text);
    const panel = page.getByTestId('structure-panel');
    await expect.poll(() => panel.textContent()).toContain('van-catledge');
    const shown = /HOMO–LUMO gap([\d.]+) \|β\|/.exec((await panel.textContent()) ?? '');
    expect(shown, 'the panel shows a gap').not.toBeNull();
    expect(Number(shown![1])).toBeCloseTo(value, 3);
    // The same molecule on the default set is a different number: the panel follows the formula.
    expect(Math.abs(Number((await cell('C3'))!.text) - value)).toBeGreaterThan(0.01);
  });

  it('keeps the labels of nearly equal levels apart (pyridine)', async () => {
    await clickCell('C3');
    const boxes = await page.locator('[data-testid="huckel-ladder"] g[data-level] > text').evaluateAll((els) =>
      els.map((e) => {
        const r = e.getBoundingClientRect();
        return { top: r.top, bottom: r.bottom, left: r.left, right: r.right, text: e.textContent };
      }),
    );
    expect(boxes.length).toBe(6);
    for (let i = 0; i < boxes.length; i++)
      for (let j = i + 1; j < boxes.length; j++) {
        const a = boxes[i];
        const b = boxes[j];
        const overlap = a.left < b.right && b.left < a.right && a.top < b.bottom - 0.5 && b.top < a.bottom - 0.5;
        expect(overlap, `${a.text} and ${b.text} overlap`).toBe(false);
      }
    // The level lines (with their electron arrows) are apart too: one y per level, 18 px or more between (the arrows are 20 units tall).
    const levelYs = await page.locator('[data-testid="huckel-ladder"] g[data-level]').evaluateAll((gs) => gs.map((g) => g.querySelector('line')!.getBoundingClientRect().y).sort((p, q) => p - q));
    for (let k = 1; k < levelYs.length; k++) expect(levelYs[k] - levelYs[k - 1]).toBeGreaterThanOrEqual(18);
    await screenshot(page, 'panels-pyridine-ladder');
  });

  it('ends the grid on a column boundary beside the panel, so no column is cut by it', async () => {
    // Closed, then opened again once the grid is drawn.
    await page.getByRole('button', { name: 'Structure', exact: true }).click();
    await page.getByRole('button', { name: 'Structure', exact: true }).click();
    const aside = page.getByRole('complementary', { name: 'Structure of the selected cell' });
    const cut = async () => {
      const edge = (await aside.boundingBox())!.x;
      return page.evaluate((x) => {
        const boxes = [...document.querySelectorAll('.orb-col-header')].map((h) => ({ col: h.getAttribute('data-col'), ...(h.closest('.dsg-cell') as HTMLElement).getBoundingClientRect().toJSON() }) as { col: string; left: number; right: number });
        // A column's 1 px border line at the edge is the grid's edge, not a cut column.
        return boxes.filter((b) => b.left < x - 2 && b.right > x + 2).map((b) => `${b.col} spans ${Math.round(b.left)}–${Math.round(b.right)} across the panel edge at ${Math.round(x)}`);
      }, edge);
    };
    await expect.poll(cut).toEqual([]);
    const grid = (await page.getByTestId('sheet-grid').boundingBox())!;
    expect(grid.x + grid.width).toBeLessThanOrEqual((await aside.boundingBox())!.x + 1);
    // At another window width too.
    await page.setViewportSize({ width: 1100, height: 800 });
    await expect.poll(cut).toEqual([]);
    await page.setViewportSize({ width: 1280, height: 800 });
    await expect.poll(cut).toEqual([]);
    await screenshot(page, 'panels-structure-layout');
  });
});

describe('chart', () => {
  const chart = () => page.getByTestId('chart-panel');
  it('plots gap against π energy with axis titles and units, names in the tips, coincident points apart', async () => {
    await page.getByRole('button', { name: 'Freeze row 1' }).click();
    await page.getByRole('button', { name: 'Chart', exact: true }).click();
    await chart().getByLabel('X column').selectOption({ label: 'D · Pi energy' });
    await chart().getByLabel('Y column').selectOption({ label: 'C · Gap' });
    await expect.poll(() => chart().getByTestId('chart-count').textContent()).toContain('6 points');
    expect(await chart().getByTestId('chart-count').textContent()).toContain('2 points that coincide are drawn slightly apart');
    const text = (await chart().getByTestId('chart-plot').textContent()) ?? '';
    expect(text).toContain('Gap (|β|)');
    expect(text).toContain('Pi energy (β)');
    expect(await chart().getByLabel('Names column').inputValue()).toBe('0');
    // Every point has a mark of its own: no two drawn at the same spot.
    // Every point has a mark of its own: no two drawn at the same spot (polled: the chart sizes itself after mounting).
    const marks = () => chart().locator('.recharts-scatter-symbol').evaluateAll((els) => els.map((e) => { const r = e.getBoundingClientRect(); return `${Math.round(r.x)},${Math.round(r.y)}`; }));
    await expect.poll(async () => new Set(await marks()).size).toBe(6);
    expect(await marks()).toHaveLength(6);
    for (const mark of await chart().locator('.recharts-scatter-symbol').all()) await mark.hover();
    await expect.poll(() => page.getByTestId('chart-tip').textContent()).toMatch(/(benzene|pyridine|thiophene|butadiene|hexatriene).*row \d/);
    await screenshot(page, 'panels-chart');
  });

  it('plots only the rows the filter shows', async () => {
    await clickCell('A2');
    await page.getByRole('button', { name: 'Filter…' }).click();
    await page.getByLabel('Cells contain').fill('benzene');
    await page.getByRole('button', { name: 'Apply' }).click();
    await expect.poll(() => chart().getByTestId('chart-count').textContent()).toContain('2 points from the rows the filter shows');
    await page.getByRole('button', { name: 'Clear the filter' }).click();
    await expect.poll(() => chart().getByTestId('chart-count').textContent()).toContain('6 points');
  });

  it('saves as SVG and PNG', async () => {
    const [svgDownload] = await Promise.all([page.waitForEvent('download'), chart().getByRole('button', { name: 'Save as SVG' }).click()]);
    const svg = fs.readFileSync((await svgDownload.path())!, 'utf8');
    expect(svg).toMatch(/^<svg[^>]+xmlns="http:\/\/www.w3.org\/2000\/svg"/);
    expect(svg).toContain('Gap (|β|)');
    expect(svg).not.toContain('var(--');
    const [pngDownload] = await Promise.all([page.waitForEvent('download'), chart().getByRole('button', { name: 'Save as PNG' }).click()]);
    const png = fs.readFileSync((await pngDownload.path())!);
    expect([...png.subarray(0, 8)]).toEqual([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a]);
    expect(png.length).toBeGreaterThan(2000);
    expect(svgDownload.suggestedFilename()).toMatch(/\.svg$/);
  });

  it('comes back as it was after the workbook is opened again', async () => {
    // The settings save after a short pause; wait for the stored sheet to carry the chart.
    const id = new URL(page.url()).pathname.split('/').pop()!;
    await expect
      .poll(async () => page.evaluate(async (wid) => ((await (await fetch(`/api/workbooks/${wid}`)).json()) as { sheets: { settings?: { chart?: unknown } }[] }).sheets[0].settings?.chart ?? null, id), { timeout: 10_000 })
      .toEqual({ x: 3, y: 2, kind: 'scatter', label: 0 });
    await page.reload();
    await page.getByTestId('workbook-title').waitFor();
    await page.getByRole('button', { name: 'Chart', exact: true }).click();
    expect(await chart().getByLabel('X column').inputValue()).toBe('3');
    expect(await chart().getByLabel('Y column').inputValue()).toBe('2');
    await expect.poll(() => chart().getByTestId('chart-count').textContent()).toContain('6 points');
  });
});

describe('Protect dialog', () => {
  it('starts from the selected range, with no example text that looks filled in', async () => {
    await expectCellText('A3', /pyridine/);
    await clickCell('A3');
    await clickCell('B5', { modifiers: ['Shift'] });
    await page.getByRole('button', { name: 'Protect' }).click();
    const field = page.getByRole('dialog').getByLabel('Range to protect');
    expect(await field.inputValue()).toBe('A3:B5');
    expect(await field.getAttribute('placeholder')).toBeNull();
    // No example text in the lock's reason either: an empty field looks empty.
    expect(await page.getByRole('dialog').getByLabel('Why lock it?').getAttribute('placeholder')).toBeNull();
    await screenshot(page, 'panels-protect');
    await page.getByRole('dialog').getByRole('button', { name: 'Done' }).click();
  });
});

describe('change log', () => {
  const dialog = () => page.getByRole('dialog', { name: 'Change log' });
  it('lists each change with its cells before → after, "1 change", and folds display changes', async () => {
    await clickCell('F2');
    await page.keyboard.type('reference');
    await page.keyboard.press('Enter');
    await expectCellText('F2', /^reference$/);
    // Saved first: the log lists what the server holds, and the edit must be in it.
    await page.locator('[data-testid="save-state"][data-state="saved"]').waitFor();
    await page.getByRole('button', { name: 'Change log' }).click();
    const latest = dialog().getByRole('listitem').first();
    await expect.poll(() => latest.textContent()).toContain('Edited 1 cell');
    expect(await latest.textContent()).toContain('1 change');
    const row = latest.getByRole('table').getByRole('row').first();
    expect((await row.textContent())?.replace(/\s+/g, ' ')).toBe('F2(empty)→reference');
    // Freeze row 1 and the chart's choices were each saved; they read as one folded entry.
    const folded = dialog().getByRole('listitem').filter({ hasText: /^#\d+(–\d+)?Display of/ });
    await expect.poll(() => folded.count()).toBeGreaterThanOrEqual(1);
    expect(await folded.first().textContent()).toMatch(/changed( \(\d+ times\))?: .*row 1 frozen/);
    await screenshot(page, 'panels-change-log');
  });

  it('brings back one sheet as it was and leaves the other sheet alone', async () => {
    await dialog().getByRole('button', { name: 'Close' }).click();
    const firstTab = (await page.getByRole('tab').first().textContent())?.trim() ?? '';
    await page.getByRole('button', { name: 'Add a sheet' }).click();
    await expect.poll(() => page.getByRole('tab').count()).toBe(2);
    await clickCell('A1');
    await page.keyboard.type('kept');
    await page.keyboard.press('Enter');
    await expectCellText('A1', /^kept$/);
    await page.getByRole('tab', { name: firstTab }).click();
    await expectCellText('F2', /^reference$/);

    await page.getByRole('button', { name: 'Change log' }).click();
    const first = dialog().getByRole('listitem', { name: 'Change #1', exact: true });
    await first.getByRole('button', { name: `Bring back “${firstTab}” as after #1…` }).click();
    await dialog().getByRole('button', { name: 'Bring it back' }).click();
    await dialog().getByText(/Brought back as entry #\d+/).waitFor();
    await dialog().getByRole('button', { name: 'Close' }).click();
    // Revision #1 holds the first cells typed (the save queue may have sent a few in one patch):
    // the first sheet is exactly those now, and the second keeps its cell.
    const id = new URL(page.url()).pathname.split('/').pop()!;
    const { stored, first: firstPatch } = await page.evaluate(async (wid) => {
      const book = (await (await fetch(`/api/workbooks/${wid}`)).json()) as { sheets: { id: string; cells: [number, number, string][] }[] };
      const rev = (await (await fetch(`/api/workbooks/${wid}/revisions/1`)).json()) as { patch: { changes: { sheetId: string; row: number; col: number; after: string }[] } };
      const firstSheet = book.sheets[0].id;
      return {
        stored: book.sheets.map((sh) => sh.cells),
        first: rev.patch.changes.filter((c) => c.sheetId === firstSheet && c.after !== '').map((c) => [c.row, c.col, c.after]).sort((p, q) => (p[0] as number) - (q[0] as number) || (p[1] as number) - (q[1] as number)),
      };
    }, id);
    expect(firstPatch[0]).toEqual([0, 0, 'Molecule']);
    expect(stored).toEqual([firstPatch, [[0, 0, 'kept']]]);
    await screenshot(page, 'panels-sheet-brought-back');
    await expectCellText('A1', /^Molecule$/);
    await expectCellText('E7', /^$/); // the last column typed, long after #1
    const other = (await page.getByRole('tab').nth(1).textContent())?.trim() ?? '';
    await page.getByRole('tab', { name: other }).click();
    await expectCellText('A1', /^kept$/);
  });
});
