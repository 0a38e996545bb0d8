// Accounts in a browser against the real server (production build, fresh database, the built-in
// fake SMTP server as mail transport): sign-up → the verification mail read through the admin mail
// API → the link opened → confirmed; forgot password → the reset mail → a new password → the old
// session gone. Also: the security headers let the app itself run (the theme script's CSP hash).
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { request, type APIRequestContext, type Page } from 'playwright-core';
import { launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

const admin = { name: 'Noor Haddad', email: 'noor@lab.example', password: 'sextet-of-electrons' };
const member = { name: 'Piet Kramer', email: 'piet@lab.example', password: 'lone-pair-donor-3' };
const newPassword = 'antibonding-orbital-9';

let server: TestServer;
let browser: TestBrowser;
let page: Page;
/** A second browser context: the admin, who reads the dev inbox through the API. */
let adminApi: APIRequestContext;

/** The newest link of a kind in the mail to `email`, as the site admin reads it from GET /api/admin/mail. */
async function mailedLink(email: string, kind: 'verify-email' | 'reset-password'): Promise<string | undefined> {
  const res = await adminApi.fetch(`${server.url}/api/admin/mail`);
  const { messages } = (await res.json()) as { messages: { to: string; text: string }[] };
  for (const m of messages) {
    const found = m.to === email ? new RegExp(`https?://\\S+/${kind}/[A-Za-z0-9_-]{43}`).exec(m.text) : null;
    if (found) return found[0];
  }
  return undefined;
}

/** Waits for a mail (the reset mail is sent after the answer) by asking the inbox again on each animation frame of the page. */
async function waitForLink(email: string, kind: 'verify-email' | 'reset-password'): Promise<string> {
  for (;;) {
    const link = await mailedLink(email, kind);
    if (link) return link;
    await page.evaluate(() => new Promise((r) => requestAnimationFrame(r)));
  }
}

/** The link as the server built it (from its configured origin), opened on the address the test reaches it by. */
const onServer = (link: string) => `${server.url}${new URL(link).pathname}`;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser({ colorScheme: 'light' });
  page = browser.page;
  page.setDefaultTimeout(10_000);
  // The first account is the site admin; it signs up through the API in its own context.
  adminApi = await request.newContext();
  const res = await adminApi.fetch(`${server.url}/api/auth/sign-up`, { method: 'POST', data: admin, headers: { origin: server.url } });
  expect(res.status()).toBe(201);
});

afterAll(async () => {
  await adminApi?.dispose();
  await browser?.close();
  await server?.stop();
});

describe('accounts in a browser', () => {
  it('serves the app under its content security policy, with the theme script allowed by hash', async () => {
    const res = await page.goto(`${server.url}/sign-in`);
    const csp = res!.headers()['content-security-policy'];
    expect(csp).toMatch(/script-src 'self' 'sha256-/);
    expect(csp).toMatch(/frame-ancestors 'none'/);
    await page.getByRole('heading', { name: 'Sign in' }).waitFor();
    // The inline script ran (it sets the theme before the first paint).
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('light');
  });

  it('signs up, shows the address as unconfirmed, and confirms it from the mailed link', async () => {
    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.getByLabel('Name').fill(member.name);
    await page.getByLabel('Email').fill(member.email);
    await page.getByLabel('Password').fill(member.password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Address not confirmed yet').waitFor();
    await screenshot(page, 'accounts-unconfirmed');

    const link = await waitForLink(member.email, 'verify-email');
    // Built from the server's own origin (http://localhost:PORT by default), not from the request.
    expect(link.startsWith(`http://localhost:${server.port}/verify-email/`)).toBe(true);
    await page.goto(onServer(link));
    await page.getByText('Address confirmed').waitFor();
    await screenshot(page, 'accounts-confirmed');
    await page.getByRole('link', { name: 'Go to your workbooks' }).click();
    await page.getByRole('heading', { name: 'No workbooks yet' }).waitFor();
    expect(await page.getByText('Address not confirmed yet').count()).toBe(0);
  });

  it('resets a forgotten password by the mailed link, and the session that was open ends', async () => {
    // A second window still signed in as the member, to see it signed out by the reset.
    const otherApi = await request.newContext();
    await otherApi.fetch(`${server.url}/api/auth/sign-in`, { method: 'POST', data: { email: member.email, password: member.password }, headers: { origin: server.url } });
    expect((await otherApi.fetch(`${server.url}/api/auth/me`)).status()).toBe(200);

    await page.context().clearCookies();
    await page.goto(`${server.url}/sign-in`);
    await page.getByRole('link', { name: 'Forgot your password?' }).click();
    await page.getByLabel('Email').fill(member.email);
    await page.getByRole('button', { name: 'Send the link' }).click();
    await page.getByText('Check your mail').waitFor();

    const link = await waitForLink(member.email, 'reset-password');
    await page.goto(onServer(link));
    await page.getByLabel('New password', { exact: true }).fill(newPassword);
    await page.getByRole('button', { name: 'Save the new password' }).click();
    await page.getByText('Your new password is saved. Sign in with it.').waitFor();
    expect((await otherApi.fetch(`${server.url}/api/auth/me`)).status()).toBe(401);

    await page.getByLabel('Email').fill(member.email);
    await page.getByLabel('Password').fill(newPassword);
    await page.getByRole('button', { name: 'Sign in' }).click();
    await page.getByRole('heading', { name: 'No workbooks yet' }).waitFor();
    await otherApi.dispose();
    expect(browser.errors).toEqual([]);
  });
});
