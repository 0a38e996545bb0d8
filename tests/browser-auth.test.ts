// The app end to end in Debian Chromium against the real server (production build, fresh database):
// the sign-in guard, sign-up/sign-out/sign-in with the API's own messages, the workbook list, the
// function reference, the theme switch and the admin page for an admin and for a member.
// Screenshots land in tests/artifacts/ (git-ignored) for a look at both themes.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Page } from 'playwright-core';
import { launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

const admin = { name: 'Rosa Lindqvist', email: 'rosa@lab.example', password: 'pi-electrons-4n+2' };
const member = { name: 'Tomás Ferreira', email: 'tomas@lab.example', password: 'paramagnetic-O2' };

let server: TestServer;
let browser: TestBrowser;
let page: Page;

beforeAll(async () => {
  server = await startServer();
  browser = await launchBrowser({ colorScheme: 'light' });
  page = browser.page;
  page.setDefaultTimeout(10_000);
});

afterAll(async () => {
  await browser?.close();
  await server?.stop();
});

const heading = (name: string) => page.getByRole('heading', { name, exact: true });
const pathOf = () => new URL(page.url()).pathname + new URL(page.url()).search;

async function signOut() {
  await page.getByRole('button', { name: /Rosa Lindqvist|Tomás Ferreira/ }).click();
  await page.getByRole('menuitem', { name: 'Sign out' }).click();
  await page.waitForURL((u) => u.pathname === '/sign-in');
}

async function signIn(who: { email: string; password: string }) {
  await page.getByLabel('Email').fill(who.email);
  await page.getByLabel('Password').fill(who.password);
  await page.getByRole('button', { name: 'Sign in' }).click();
}

describe('Orbitab in a browser', () => {
  it('sends a signed-out visitor to sign-in, remembering the page asked for', async () => {
    await page.goto(`${server.url}/admin`);
    await heading('Sign in').waitFor();
    expect(pathOf()).toBe('/sign-in?next=%2Fadmin');
    await screenshot(page, 'auth-sign-in-light');
  });

  it('checks the sign-up form with the shared schema before sending it', async () => {
    await page.getByRole('link', { name: 'Create an account' }).click();
    await heading('Create your account').waitFor();
    await page.getByLabel('Name').fill(admin.name);
    await page.getByLabel('Email').fill('rosa-at-lab');
    await page.getByLabel('Password').fill('short');
    await page.getByRole('button', { name: 'Create account' }).click();
    await page.getByText('Not a valid email address.').waitFor();
    await page.getByText('At least 10 characters.').waitFor();
    expect(await page.getByLabel('Password').getAttribute('aria-invalid')).toBe('true');
    await screenshot(page, 'auth-sign-up-errors-light');
  });

  it('signs the first account up as admin and continues to the page the guard interrupted', async () => {
    await page.getByLabel('Email').fill(admin.email);
    await page.getByLabel('Password').fill(admin.password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await heading('Users').waitFor();
    expect(pathOf()).toBe('/admin');
    const row = page.getByRole('row', { name: /Rosa Lindqvist/ });
    await row.getByText('(you)').waitFor();
    expect(await row.getByLabel('Site role of Rosa Lindqvist').inputValue()).toBe('admin');
    await screenshot(page, 'admin-users-light');
  });

  it('shows an empty workbook list with a way to create the first one', async () => {
    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Workbooks' }).click();
    await heading('No workbooks yet').waitFor();
    await screenshot(page, 'workbooks-empty-light');
  });

  it('creates a workbook and opens it, then renames and deletes it from the list', async () => {
    await page.getByRole('button', { name: 'New workbook' }).click();
    await page.getByRole('dialog').getByLabel('Title').fill('Diatomic screen, batch 1');
    await page.getByRole('button', { name: 'Create and open' }).click();
    await page.waitForURL((u) => u.pathname.startsWith('/workbooks/'));

    await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Workbooks' }).click();
    await page.getByRole('link', { name: 'Diatomic screen, batch 1' }).waitFor();
    await page.getByRole('button', { name: 'Rename Diatomic screen, batch 1' }).click();
    await page.getByLabel('New title for Diatomic screen, batch 1').fill('Diatomic screen, batch 1 (cations)');
    await page.keyboard.press('Enter');
    await page.getByRole('link', { name: 'Diatomic screen, batch 1 (cations)' }).waitFor();
    await screenshot(page, 'workbooks-list-light');

    await page.getByRole('button', { name: 'Delete Diatomic screen, batch 1 (cations)' }).click();
    const confirm = page.getByRole('dialog', { name: 'Delete workbook?' });
    await confirm.getByText('This cannot be undone.').waitFor();
    await screenshot(page, 'workbooks-delete-confirm-light');
    await confirm.getByRole('button', { name: 'Delete workbook' }).click();
    await heading('No workbooks yet').waitFor();
    // Gone on the server too, not just from the page.
    await page.reload();
    await heading('No workbooks yet').waitFor();
  });

  it("signs out, and refuses a wrong password with the API's message", async () => {
    await signOut();
    await page.getByText('You are signed out.').waitFor();
    await signIn({ email: admin.email, password: 'not-the-password' });
    await page.getByRole('alert').getByText('Email or password is not correct.').waitFor();
    expect(pathOf()).toContain('/sign-in');
  });

  it('signs back in and reaches the workbook list', async () => {
    await signIn(admin);
    await heading('Workbooks').waitFor();
    expect(pathOf()).toBe('/');
  });

  it('lists the cell functions by family with the safety cautions, and filters them by search', async () => {
    await page.getByRole('link', { name: 'Functions' }).click();
    await heading('Functions').waitFor();
    await page.getByText('Model estimates, not measurements', { exact: true }).waitFor();
    await page.getByText(/defer to safety data sheets, local regulations and qualified review/).waitFor();
    await heading('OVERLAP1S').waitFor();
    await screenshot(page, 'functions-light');

    await page.getByRole('searchbox', { name: 'Search functions' }).fill('overlap');
    await page.getByText(/functions match “overlap”/).waitFor();
    const shown = await page.locator('article h3').allTextContents();
    expect(shown).toContain('OVERLAP1S');
    // Every function left on the page mentions the word somewhere in its help; the rest are hidden.
    for (const text of await page.locator('article').allInnerTexts()) expect(text.toLowerCase()).toContain('overlap');
    expect(shown.length).toBeLessThan(await countCatalogFunctions());
    await page.getByRole('searchbox', { name: 'Search functions' }).fill('');
  });

  it('switches to the dark theme and keeps it after a reload', async () => {
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('light');
    await page.getByRole('button', { name: 'Switch to dark theme' }).click();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
    await page.reload();
    await heading('Functions').waitFor();
    expect(await page.evaluate(() => document.documentElement.dataset.theme)).toBe('dark');
    await page.getByRole('button', { name: 'Switch to light theme' }).waitFor();
    await screenshot(page, 'functions-dark');
    await page.getByRole('link', { name: 'Users' }).click();
    await heading('Users').waitFor();
    await screenshot(page, 'admin-users-dark');
  });

  it("shows a member the API's refusal on the admin page, and hides the link", async () => {
    await signOut();
    await screenshot(page, 'auth-sign-in-dark');
    await page.getByRole('link', { name: 'Create an account' }).click();
    await page.getByLabel('Name').fill(member.name);
    await page.getByLabel('Email').fill(member.email);
    await page.getByLabel('Password').fill(member.password);
    await page.getByRole('button', { name: 'Create account' }).click();
    await heading('Workbooks').waitFor();
    expect(await page.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Users' }).count()).toBe(0);
    await screenshot(page, 'workbooks-empty-dark');

    await page.goto(`${server.url}/admin`);
    await page.getByText('Only site admins can manage users').waitFor();
    await page.getByText(/site admins only/).waitFor();
    await screenshot(page, 'admin-refused-dark');
  });

  it("lets an admin disable, re-enable and promote another account, kept after a reload", async () => {
    await signOut();
    await signIn(admin);
    await page.getByRole('link', { name: 'Users' }).click();
    const row = page.getByRole('row', { name: /Tomás Ferreira/ });
    await row.getByRole('button', { name: 'Disable' }).click();
    const confirm = page.getByRole('dialog', { name: 'Disable Tomás Ferreira?' });
    await confirm.getByText(/signed out everywhere at once/).waitFor();
    await screenshot(page, 'admin-disable-confirm-dark');
    await confirm.getByRole('button', { name: 'Disable account' }).click();
    await row.getByText('Disabled').waitFor();

    await row.getByRole('button', { name: 'Re-enable' }).click();
    await row.getByText('Active').waitFor();
    // Only a confirmed address can be made admin: Tomás opens the link from his verification mail,
    // read here from the dev inbox the admin sees.
    const { messages } = (await (await page.request.get(`${server.url}/api/admin/mail`)).json()) as { messages: { to: string; text: string }[] };
    const token = /\/verify-email\/([A-Za-z0-9_-]{43})/.exec(messages.find((m) => m.to === member.email)!.text)![1];
    expect((await page.request.post(`${server.url}/api/auth/verify`, { data: { token }, headers: { origin: server.url } })).status()).toBe(200);
    const saved = page.waitForResponse((r) => r.url().includes('/api/admin/users/') && r.request().method() === 'PATCH');
    await row.getByLabel('Site role of Tomás Ferreira').selectOption('admin');
    expect((await saved).status()).toBe(200);

    await page.reload();
    await heading('Users').waitFor();
    expect(await row.getByLabel('Site role of Tomás Ferreira').inputValue()).toBe('admin');
    await row.getByText('Active').waitFor();
  });

  it("follows the system's dark preference when no theme was chosen", async () => {
    const darkSystem = await launchBrowser({ colorScheme: 'dark' });
    try {
      await darkSystem.page.goto(`${server.url}/sign-in`);
      await darkSystem.page.getByRole('heading', { name: 'Sign in' }).waitFor();
      expect(await darkSystem.page.evaluate(() => [document.documentElement.dataset.theme, localStorage.getItem('orbitab.theme')])).toEqual(['dark', null]);
      expect(darkSystem.errors).toEqual([]);
    } finally {
      await darkSystem.close();
    }
  });

  it('raised no uncaught errors in the page along the way', () => {
    expect(browser.errors).toEqual([]);
  });
});

async function countCatalogFunctions(): Promise<number> {
  const { catalog } = await import('../functions/catalog/index.js');
  return catalog.length;
}
