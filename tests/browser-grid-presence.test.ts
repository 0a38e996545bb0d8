// Where a colleague is, shown in the grid itself: two people in their own Chromium on one workbook;
// the cell the other one is on is ringed in their colour with their first name, and the ring follows
// them. Presence travels on the live stream (server/services/presence.ts).
import { afterAll, beforeAll, expect, it } from 'vitest';
import type { APIRequestContext, Page } from 'playwright-core';
import { gridCell, launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

const ada = { name: 'Ada Okafor', email: 'ada@lab.example', password: 'sigma-pi-orbitals' };
const ben = { name: 'Ben Laszlo', email: 'ben@lab.example', password: 'unpaired-spins-2' };

let server: TestServer;
let owner: TestBrowser;
let editor: TestBrowser;
let a: Page;
let b: Page;
let workbookId: string;

async function call(request: APIRequestContext, method: string, path: string, data?: unknown) {
  const res = await request.fetch(`${server.url}/api${path}`, { method, data, headers: { origin: server.url } });
  const body = res.status() === 204 ? null : await res.json();
  if (!res.ok()) throw new Error(`${method} ${path} → ${res.status()} ${JSON.stringify(body)}`);
  return body;
}

async function open(page: Page) {
  await page.goto(`${server.url}/workbooks/${workbookId}`);
  await page.getByTestId('sheet-grid').waitFor();
  await page.locator('[data-testid="live-state"][data-state="live"]').waitFor();
}

async function click(page: Page, a1: string) {
  let c = await gridCell(page, a1);
  await expect.poll(async () => (c = await gridCell(page, a1)) !== null).toBe(true);
  await page.mouse.click(c!.x, c!.y);
}

beforeAll(async () => {
  server = await startServer();
  [owner, editor] = await Promise.all([launchBrowser(), launchBrowser()]);
  a = owner.page;
  b = editor.page;
  for (const p of [a, b]) p.setDefaultTimeout(10_000);
  await call(owner.context.request, 'POST', '/auth/sign-up', ada);
  await call(editor.context.request, 'POST', '/auth/sign-up', ben);
  const { messages } = await call(owner.context.request, 'GET', '/admin/mail');
  const mail = messages.find((m: { to: string; text: string }) => m.to === ben.email && m.text.includes('/verify-email/'));
  await call(editor.context.request, 'POST', '/auth/verify', { token: /\/verify-email\/([A-Za-z0-9_-]{43})/.exec(mail.text)![1] });
  workbookId = (await call(owner.context.request, 'POST', '/workbooks', { title: 'Presence' })).workbook.id;
  await call(owner.context.request, 'POST', `/workbooks/${workbookId}/members`, { email: ben.email, role: 'editor' });
  await Promise.all([open(a), open(b)]);
}, 120_000);

afterAll(async () => {
  await Promise.all([owner?.close(), editor?.close()]);
  await server?.stop();
});

/** The presence mark Ada sees, with the distance from its centre to the centre of a cell she sees. */
async function markNear(a1: string) {
  const mark = a.getByTestId('presence-mark');
  if ((await mark.count()) !== 1) return null;
  const box = (await mark.boundingBox())!;
  const c = (await gridCell(a, a1))!;
  return { label: await mark.getAttribute('aria-label'), dx: Math.abs(box.x + box.width / 2 - c.x), dy: Math.abs(box.y + box.height / 2 - c.y) };
}

it('rings the cell a colleague is on, named, and follows them', async () => {
  await click(b, 'C3');
  await expect.poll(() => markNear('C3'), { timeout: 10_000 }).toMatchObject({ label: 'Ben Laszlo is on C3' });
  const near = (await markNear('C3'))!;
  expect(near.dx).toBeLessThan(2);
  expect(near.dy).toBeLessThan(2);
  expect(await a.getByTestId('presence-mark').textContent()).toBe('Ben');
  await screenshot(a, 'grid-presence-colleague');
  await click(b, 'A5');
  await expect.poll(async () => (await markNear('A5'))?.label, { timeout: 10_000 }).toBe('Ben Laszlo is on A5');
  // Ben does not see a mark for himself.
  expect(await b.getByTestId('presence-mark').count()).toBe(0);
}, 60_000);

it('raised no uncaught errors in either page', () => {
  expect([...owner.errors, ...editor.errors]).toEqual([]);
});
