// A new team's first minute, in Debian Chromium against the real server on an empty database with
// seeding on: sign in as the demo owner with the README's password, see the three demo workbooks,
// open each and find it computing; the locked sheet says why; a new workbook offers a starter
// template. Screenshots go to tests/artifacts/demo-*.png.
import type { Page } from 'playwright-core';
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { demoTeam, demoWorkbooks } from '../server/seed/index.js';
import { gridCell, launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
const owner = demoTeam.find((p) => p.role === 'owner')!;

beforeAll(async () => {
  server = await startServer({ env: { ORBITAB_SEED: '1' } });
  browser = await launchBrowser();
  page = browser.page;
  page.setDefaultTimeout(20_000);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

/** Waits for the grid cell at an A1 address to show `text`. */
const expectCell = (a1: string, text: string) =>
  expect.poll(async () => (await gridCell(page, a1))?.text, { timeout: 20_000, message: `cell ${a1}` }).toBe(text);

async function openWorkbook(title: string) {
  await page.goto(server.url);
  await page.getByRole('link', { name: title }).click();
  await expect.poll(() => page.getByTestId('workbook-title').textContent()).toBe(title);
}

describe('the demo a new team sees', () => {
  it('signs the demo owner in with the password from the README and lists the three demo workbooks', async () => {
    await page.goto(`${server.url}/sign-in`);
    await page.getByLabel('Email').fill(owner.email);
    await page.getByLabel('Password').fill(owner.password);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'Workbooks' }).waitFor();
    for (const book of demoWorkbooks) await page.getByRole('link', { name: book.title }).waitFor();
    await screenshot(page, 'demo-workbook-list');
  });

  it('computes the gas-sensor screen: O2 bond order 2 and paramagnetic, superoxide 1.5, peroxide diamagnetic', async () => {
    await openWorkbook('Gas-sensor screen: adsorbed diatomics');
    await expectCell('D2', '2');
    await expectCell('F2', 'paramagnetic');
    await expectCell('D3', '1.5');
    await expectCell('F4', 'diamagnetic');
    expect(await page.getByTestId('safety-note').count()).toBe(1);
    await screenshot(page, 'demo-gas-sensor');
  });

  it('shows the settled sheet as locked, with the reason', async () => {
    await page.getByRole('tab', { name: 'Settled' }).click();
    await page.getByRole('status', { name: 'Sheet protection' }).getByText(/Agreed at the sensor-materials review/).waitFor();
    await expectCell('D2', '³Σg⁻');
    await screenshot(page, 'demo-settled-locked');
  });

  it('computes the flame radicals: OH ground term ²Π with degeneracy 4', async () => {
    await openWorkbook('Flame radicals: ground terms for partition functions');
    await expectCell('B2', '²Π');
    await expectCell('C2', '4');
    await screenshot(page, 'demo-flame-radicals');
  });

  it('computes the dye candidates: benzene aromatic with a π gap of 2|β|', async () => {
    await openWorkbook('Dye candidates: Hückel π screen');
    await expectCell('F7', 'aromatic');
    await expectCell('C7', '2.000'); // the sheet shows three decimals
    await screenshot(page, 'demo-dye-candidates');
  });

  it('offers a starter template in a new workbook and computes it when chosen', async () => {
    await page.goto(server.url);
    await page.getByRole('button', { name: 'New workbook' }).click();
    await page.getByRole('dialog').getByLabel('Title').fill('Fresh screen');
    await page.getByRole('button', { name: 'Create and open' }).click();
    const starter = page.getByTestId('starter-templates');
    await starter.waitFor();
    await screenshot(page, 'demo-starter-offer');
    await starter.getByRole('button', { name: 'Diatomic species screen' }).click();
    await expectCell('C2', '2');
    await expectCell('E2', 'paramagnetic');
    expect(await starter.count()).toBe(0);
    await page.locator('[data-testid="save-state"][data-state="saved"]').waitFor();
    await screenshot(page, 'demo-starter-applied');
    expect(browser.errors).toEqual([]);
  });
});
