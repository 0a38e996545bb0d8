// A colleague opens, in Chromium, a workbook holding the formulas that used to stall a tab or run a
// server out of memory: the page loads, those cells show #VALUE! with a message naming the limit, and
// another cell can still be edited and recomputes. Needs `npm run build` first.
import { describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { signUpWithNewWorkbook, screenshot, type TestBrowser } from './helpers/browser.js';
import type { TestServer } from './helpers/server.js';
import { browserSuite, gridHands } from './helpers/browserSuite.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
browserSuite((s) => ({ server, browser, page } = s));

const { cell, expectCell: expectCellWithin } = gridHands(() => page);
const expectCell = (a1: string, text: string) => expectCellWithin(a1, text, 15_000);

describe('a workbook holding hostile formulas in a browser', () => {
  it('opens with those cells in error and the rest editable', async () => {
    await signUpWithNewWorkbook(page, server.url, { name: 'Ines Duarte', email: 'ines@lab.example', password: 'sigma-pi-sigma-star' }, 'Spill screen');
    const id = new URL(page.url()).pathname.split('/')[2];

    // Saved as a colleague's patch would be, then the page is reloaded to open the workbook afresh.
    const headers = { origin: server.url };
    const wb = await (await page.request.get(`${server.url}/api/workbooks/${id}`, { headers })).json();
    const sheetId = wb.sheets[0].id;
    const hostile = ['=SEQUENCE(1000000,2000)', '=SUM(A2:BXX1000000)', '=REPT("ab",200000000)', '=BXX1000000', '=SUM(B:B)', '=B1:B1000000*2'];
    const changes = [...hostile.map((input, row) => ({ sheetId, row, col: 3, input })), { sheetId, row: 0, col: 0, input: '2' }, { sheetId, row: 0, col: 1, input: '=A1*21' }];
    const saved = await page.request.post(`${server.url}/api/workbooks/${id}/patches`, { headers, data: { baseRevision: wb.revision, changes } });
    expect(saved.status()).toBe(200);
    await page.reload();
    await page.getByTestId('workbook-title').waitFor();

    await expectCell('B1', '42');
    for (const a1 of ['D1', 'D2', 'D3', 'D5', 'D6']) await expectCell(a1, '#VALUE!');
    expect((await cell('D1'))?.title).toMatch(/spills 2,000,000,000 cells; at most 100,000/);
    expect((await cell('D5'))?.title).toMatch(/reads 1,000,000 cells \(B:B\); at most 100,000 per formula/);

    const a1 = await cell('A1');
    await page.mouse.click(a1!.x, a1!.y);
    await page.keyboard.type('3');
    await page.keyboard.press('Enter');
    await expectCell('B1', '63');
    await screenshot(page, 'eval-limits-hostile-workbook');
  });
});
