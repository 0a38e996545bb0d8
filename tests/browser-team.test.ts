// Two people on one workbook, each in their own Chromium (separate profiles, separate sessions),
// against the real server: bringing people in from the team panel, an edit in one window appearing in the
// other within a second, a conflict offering both values (both choices), protected ranges and sheet
// locks greying cells and refusing edits with their reason, a live switch to viewer making the grid
// read-only, a sheet role letting that viewer edit one sheet (set on the team board), history
// with a read-only old revision and a restore, the audit log, and an invitation accepted from the
// mail outbox. Screenshots land in tests/artifacts/team-*.png.
import { afterAll, afterEach, beforeAll, describe, expect, it } from 'vitest';
import type { APIRequestContext, Page } from 'playwright-core';
import { launchBrowser, screenshot, type TestBrowser } from './helpers/browser.js';
import { startServer, type TestServer } from './helpers/server.js';

const ada = { name: 'Ada Okafor', email: 'ada@lab.example', password: 'sigma-pi-orbitals' };
const ben = { name: 'Ben Laszlo', email: 'ben@lab.example', password: 'unpaired-spins-2' };
const cy = { name: 'Cy Moreau', email: 'cy@lab.example', password: 'hund-rule-maximum' };

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

/** The grid cell at an A1 address (rows count from the header row; the first cell is the row number). */
function cell(page: Page, a1: string) {
  const m = /^([A-Z])(\d+)$/.exec(a1)!;
  const col = m[1].charCodeAt(0) - 65;
  const row = Number(m[2]) - 1;
  return page.getByTestId('sheet-grid').locator('.dsg-row:not(.dsg-row-header)').nth(row).locator('.dsg-cell').nth(col + 1);
}

async function goTo(page: Page, a1: string) {
  const address = page.getByLabel('Cell address');
  // Cleared first: the box jumps only when its text was changed, and it may already show `a1`.
  await address.fill('');
  await address.fill(a1);
  await address.press('Enter');
  // The grid takes the new cell on its next render; keys typed before that would reach no cell.
  await expect.poll(() => address.inputValue()).toBe(a1);
}

/** Types into a cell the way a person does: select it, type, Enter. */
async function typeInto(page: Page, a1: string, text: string) {
  await goTo(page, a1);
  await page.keyboard.type(text);
  await page.keyboard.press('Enter');
}

const saveState = (page: Page) => page.getByTestId('save-state');

async function openWorkbook(page: Page) {
  await page.goto(`${server.url}/workbooks/${workbookId}`);
  await page.getByTestId('sheet-grid').waitFor();
  await page.locator('[data-testid="live-state"][data-state="live"]').waitFor();
}

beforeAll(async () => {
  server = await startServer();
  // The colleague's window runs the dark theme, so the screenshots show both.
  [owner, editor] = await Promise.all([launchBrowser(), launchBrowser({ colorScheme: 'dark' })]);
  a = owner.page;
  b = editor.page;
  for (const p of [a, b]) p.setDefaultTimeout(10_000);
  await call(owner.context.request, 'POST', '/auth/sign-up', ada);
  await call(editor.context.request, 'POST', '/auth/sign-up', ben);
  // Ben opens the link from his verification mail (read here through the admin's dev inbox), so Ada can add him directly.
  const { messages } = await call(owner.context.request, 'GET', '/admin/mail');
  const mail = messages.find((m: { to: string; text: string }) => m.to === ben.email && m.text.includes('/verify-email/'));
  const token = /\/verify-email\/([A-Za-z0-9_-]{43})/.exec(mail.text)![1];
  await call(editor.context.request, 'POST', '/auth/verify', { token });
  workbookId = (await call(owner.context.request, 'POST', '/workbooks', { title: 'Diatomic screening' })).workbook.id;
  const { sheets } = await call(owner.context.request, 'GET', `/workbooks/${workbookId}`);
  const sheetId = sheets[0].id;
  const at = (row: number, col: number, input: string) => ({ sheetId, row, col, input });
  await call(owner.context.request, 'POST', `/workbooks/${workbookId}/patches`, {
    baseRevision: 0,
    changes: [at(0, 0, 'Species'), at(0, 1, 'Bond order'), at(1, 0, 'N2'), at(1, 1, '=BONDORDER(A2)')],
  });
});

// A failed step leaves both windows on record, to see what each person saw.
afterEach(async (ctx) => {
  if (ctx.task.result?.state !== 'fail') return;
  const name = ctx.task.name.replace(/[^\w]+/g, '-').slice(0, 40);
  await Promise.all([screenshot(a, `team-failed-${name}-owner`), screenshot(b, `team-failed-${name}-other`)]).catch(() => undefined);
});

afterAll(async () => {
  await Promise.all([owner?.close(), editor?.close()]);
  await server?.stop();
});

describe('two people on one workbook', () => {
  it('brings people in from the team panel: an account joins at once, anyone else is invited', async () => {
    await openWorkbook(a);
    await a.getByRole('button', { name: 'Team', exact: true }).click();
    const dialog = a.getByRole('dialog', { name: 'Team · Diatomic screening' });
    await dialog.getByLabel('Bring someone in (e-mail)').fill(ben.email);
    await dialog.getByRole('button', { name: 'Add to team' }).click();
    await dialog.getByText('Ben Laszlo joined as editor; their row is on the board below.').waitFor();
    await dialog.getByLabel('Bring someone in (e-mail)').fill(cy.email);
    await dialog.getByLabel('Workbook role', { exact: true }).selectOption('viewer');
    await dialog.getByRole('button', { name: 'Add to team' }).click();
    await dialog.getByText(/an invitation was e-mailed/).waitFor();
    await dialog.getByRole('row', { name: `Invitation to ${cy.email}` }).waitFor();
    expect(await dialog.getByLabel('Workbook role of Ben Laszlo').inputValue()).toBe('editor');
    expect(await dialog.getByLabel('Ben Laszlo on Screen1').inputValue()).toBe(''); // no role set on the sheet: the workbook role holds
    await dialog.getByRole('button', { name: 'Close' }).click();
  });

  it('shows who else is here, on which sheet and cell, on the team board', async () => {
    await openWorkbook(b);
    await goTo(b, 'C3');
    await a.getByTestId('also-here').getByText('+1 here').waitFor();
    await a.getByTestId('also-here').click();
    const board = a.getByRole('dialog', { name: 'Team · Diatomic screening' });
    await board.getByTestId(/^now-at-/).getByText('Screen1!C3').waitFor();
    await board.getByRole('columnheader', { name: /^Screen1 · 1 here$/ }).waitFor();
    await board.getByRole('button', { name: 'Close' }).click();
  });

  it('shows an edit made in one window in the other, computed there too', async () => {
    expect(await cell(b, 'B2').textContent()).toBe('3'); // N2: bond order 3, O2: 2 (Atkins & de Paula, Physical Chemistry, MO theory; from memory)
    await typeInto(a, 'A2', 'O2');
    // How fast is a benchmark's business (bench/patches.ts); here: it arrives, and is computed there.
    await cell(b, 'A2').getByText('O2', { exact: true }).waitFor();
    await cell(b, 'B2').getByText('2', { exact: true }).waitFor(); // O2: bond order 2
    await screenshot(b, 'team-live-edit-other-window');
  });

  async function conflictOn(a1: string, mine: string, theirs: string) {
    await editor.context.setOffline(true);
    await typeInto(b, a1, mine);
    await saveState(b).and(b.locator('[data-state="offline"]')).waitFor();
    await typeInto(a, a1, theirs);
    await saveState(a).and(a.locator('[data-state="saved"]')).waitFor();
    await editor.context.setOffline(false);
    const dialog = b.getByRole('dialog', { name: 'This cell was changed by someone else' });
    await dialog.waitFor();
    const row = dialog.getByRole('listitem', { name: `Conflict in Screen1!${a1}` });
    expect(await row.locator('[data-value="theirs"]').textContent()).toBe(theirs);
    expect(await row.locator('[data-value="mine"]').textContent()).toBe(mine);
    return dialog;
  }

  it('offers both values when two people change one cell, and “Keep mine” saves mine over theirs', async () => {
    const dialog = await conflictOn('A3', 'CO', 'NO');
    await screenshot(b, 'team-conflict-dialog');
    await dialog.getByRole('button', { name: 'Keep mine' }).click();
    await saveState(b).and(b.locator('[data-state="saved"]')).waitFor();
    await cell(a, 'A3').getByText('CO', { exact: true }).waitFor();
    expect(await cell(b, 'A3').textContent()).toBe('CO');
  });

  it('“Take theirs” shows theirs and sets mine aside where it can still be copied', async () => {
    const dialog = await conflictOn('A4', 'F2', 'NO+');
    await dialog.getByRole('button', { name: 'Take theirs' }).click();
    await cell(b, 'A4').getByText('NO+', { exact: true }).waitFor();
    const setAside = b.getByRole('region', { name: 'Inputs set aside' });
    await setAside.getByRole('button', { name: 'Show' }).click();
    await setAside.getByText('F2', { exact: true }).waitFor();
    await saveState(b).and(b.locator('[data-state="saved"]')).waitFor();
    expect(await cell(a, 'A4').textContent()).toBe('NO+');
    await screenshot(b, 'team-conflict-set-aside');
  });

  it('greys a protected range for everyone not named on it and refuses edits there', async () => {
    await a.getByRole('button', { name: 'Protect', exact: true }).click();
    const dialog = a.getByRole('dialog', { name: 'Protect “Screen1”' });
    await dialog.getByLabel('Range to protect').fill('A1:C1');
    await dialog.getByRole('button', { name: 'Protect range' }).click();
    await dialog.getByRole('listitem', { name: 'Range A1:C1' }).waitFor();
    await screenshot(a, 'team-protect-dialog');
    await dialog.getByRole('button', { name: 'Done' }).click();

    const banner = b.getByRole('status', { name: 'Sheet protection' });
    await banner.getByText(/Protected range A1:C1: greyed cells are read-only for you/).waitFor();
    for (const a1 of ['A1', 'B1', 'C1']) expect(await cell(b, a1).getAttribute('class')).toContain('dsg-cell-disabled');
    expect(await cell(b, 'D1').getAttribute('class')).not.toContain('dsg-cell-disabled');
    await typeInto(b, 'A1', 'Ion');
    expect(await cell(b, 'A1').textContent()).toBe('Species');
    await goTo(b, 'A1');
    await b.getByText('View only — A1:C1 is protected by Ada Okafor. Editors of the range: Ada Okafor.').first().waitFor();
    // The owner, named on the range, still edits it.
    await typeInto(a, 'C1', 'Notes');
    await cell(b, 'C1').getByText('Notes', { exact: true }).waitFor();
    await screenshot(b, 'team-protected-range-other-window');
  });

  it('greys a locked sheet, says who locked it, when and why, and refuses every edit', async () => {
    await a.getByRole('button', { name: 'Protect', exact: true }).click();
    const dialog = a.getByRole('dialog', { name: 'Protect “Screen1”' });
    await dialog.getByLabel('Why lock it?').fill('Reference values checked against the tables');
    await dialog.getByRole('button', { name: 'Lock sheet' }).click();
    await dialog.getByRole('button', { name: 'Unlock' }).waitFor();
    await dialog.getByRole('button', { name: 'Done' }).click();

    await b.getByRole('status', { name: 'Sheet protection' }).getByText(/Locked by Ada Okafor on .*: “Reference values checked against the tables”/).waitFor();
    // The tab carries the lock too, with the banner's summary (who, when, why) on hover.
    const lockedTab = b.getByRole('tab', { name: 'Screen1 (locked, view only for you)' });
    const why = 'View only — Ada Okafor locked this sheet: “Reference values checked against the tables”. Editors here: Ada Okafor.';
    expect(await lockedTab.getAttribute('title')).toMatch(new RegExp(`^${why.replace(/[.*+?^${}()|[\]\\]/g, '\\$&')}`));
    expect(await cell(b, 'E9').getAttribute('class')).toContain('dsg-cell-disabled');
    // Typing into a read-only cell says why, instead of being silently ignored.
    await typeInto(b, 'E9', 'CN-');
    expect(await cell(b, 'E9').textContent()).toBe('');
    expect(await b.getByTestId('sheet-message').textContent()).toContain(why);
    // Rows too: the tools are disabled before anyone clicks, with the lock's reason on hover.
    const a2 = await cell(b, 'A2').textContent();
    await goTo(b, 'A2');
    const insertRow = b.getByRole('button', { name: '+ Row' });
    expect(await insertRow.isDisabled()).toBe(true);
    expect(await insertRow.getAttribute('title')).toContain(why);
    expect(await cell(b, 'A2').textContent()).toBe(a2);
    // Deleting or renaming the tab would be refused: disabled, saying why.
    const del = b.getByRole('button', { name: 'Delete', exact: true });
    expect([await del.isDisabled(), await del.getAttribute('title')]).toEqual([true, why]);
    // Unlocking would be refused (an editor lifts only locks on sheets they created): disabled, saying why.
    await b.getByRole('button', { name: 'Protect', exact: true }).click();
    const theirs = b.getByRole('dialog', { name: 'Protect “Screen1”' });
    const unlock = theirs.getByRole('button', { name: 'Unlock' });
    expect(await unlock.isDisabled()).toBe(true);
    expect(await unlock.locator('xpath=..').getAttribute('title')).toMatch(/only on sheets you created, and "Screen1" is someone else's/);
    await theirs.getByRole('button', { name: 'Done' }).click();
    expect(await saveState(b).getAttribute('data-state')).toBe('saved');
    await screenshot(b, 'team-locked-sheet-other-window');
    expect(editor.errors).toEqual([]);

    await a.getByRole('button', { name: 'Protect', exact: true }).click();
    await dialog.getByRole('button', { name: 'Unlock' }).click();
    await dialog.getByLabel('Why lock it?').waitFor();
    await dialog.getByRole('button', { name: 'Done' }).click();
    await b.getByText(/Protected range A1:C1: greyed cells/).waitFor();
    await b.getByRole('button', { name: 'Rename', exact: true }).and(b.locator(':not([disabled])')).waitFor();
    await b.getByRole('tab', { name: 'Screen1', exact: true }).waitFor();
    expect(await cell(b, 'E9').getAttribute('class')).not.toContain('dsg-cell-disabled');
  });

  it('makes the grid read-only at once when the owner makes an editor a viewer', async () => {
    await a.getByRole('button', { name: 'Team', exact: true }).click();
    const dialog = a.getByRole('dialog', { name: 'Team · Diatomic screening' });
    await dialog.getByLabel('Workbook role of Ben Laszlo').selectOption('viewer');
    await b.getByText('read-only', { exact: true }).waitFor();
    await dialog.getByRole('button', { name: 'Close' }).click();
    expect(await cell(b, 'D7').getAttribute('class')).toContain('dsg-cell-disabled');
    await typeInto(b, 'D7', 'O2-');
    expect(await cell(b, 'D7').textContent()).toBe('');
    expect(await b.getByLabel('Formula bar').isDisabled()).toBe(true);
    await expect(b.getByRole('button', { name: 'Change log' }).isVisible()).resolves.toBe(true);
    await expect(b.getByRole('button', { name: 'Export' }).isVisible()).resolves.toBe(true); // viewers export too
    await screenshot(b, 'team-viewer-read-only');
  });

  it('lets the owner give a viewer one sheet on the team board: that tab opens to them, the others stay greyed and refuse', async () => {
    const { sheet } = await call(owner.context.request, 'POST', `/workbooks/${workbookId}/sheets`, { name: 'Measurements' });
    await a.getByRole('tab', { name: 'Measurements' }).waitFor();
    await a.getByRole('button', { name: 'Team', exact: true }).click();
    const dialog = a.getByRole('dialog', { name: 'Team · Diatomic screening' });
    const cellRole = dialog.getByLabel('Ben Laszlo on Measurements');
    await cellRole.selectOption('editor');
    await dialog.getByLabel('Ben Laszlo on Measurements').and(a.locator('[title^="Edits — set on this sheet by Ada Okafor"]')).waitFor();
    await screenshot(a, 'team-panel');
    await dialog.getByRole('button', { name: 'Close' }).click();

    // Ben, still a workbook viewer: Measurements opens to him, Screen1 is marked view-only with why.
    await b.getByRole('tab', { name: 'Measurements', exact: true }).click();
    await b.locator('[data-testid="sheet-grid"] .dsg-cell:not(.dsg-cell-disabled)').first().waitFor();
    await typeInto(b, 'A1', 'Cp (J/mol/K)');
    await saveState(b).and(b.locator('[data-state="saved"]')).waitFor();
    await a.getByRole('tab', { name: 'Measurements', exact: true }).click();
    await cell(a, 'A1').getByText('Cp (J/mol/K)', { exact: true }).waitFor();
    const sheet1 = b.getByRole('tab', { name: 'Screen1 (view only for you)' });
    expect(await sheet1.getAttribute('title')).toContain('View only — you view this workbook; an owner can open a sheet to you in the team panel.');
    await sheet1.click();
    expect(await cell(b, 'D8').getAttribute('class')).toContain('dsg-cell-disabled');
    await typeInto(b, 'D8', 'O3');
    expect(await cell(b, 'D8').textContent()).toBe('');
    // Typing says why, once: the workbook role that makes this sheet view-only.
    await b.getByTestId('sheet-message').getByText(/^View only — you view this workbook/).waitFor();
    // Decimals on a sheet he only views: his screen only, no error, nothing saved.
    await b.getByLabel('Decimal places').selectOption('2');
    expect(await b.getByTestId('sheet-message').textContent()).not.toMatch(/not saved/);
    await screenshot(b, 'team-sheet-role-other-window');

    // The server agrees with the greying: his patch to Screen1 is refused, naming the sheet.
    const { sheets, revision } = await call(editor.context.request, 'GET', `/workbooks/${workbookId}`);
    const res = await editor.context.request.fetch(`${server.url}/api/workbooks/${workbookId}/patches`, {
      method: 'POST',
      data: { baseRevision: revision, changes: [{ sheetId: sheets[0].id, row: 7, col: 3, input: 'O3' }] },
      headers: { origin: server.url },
    });
    expect(res.status()).toBe(403);
    expect((await res.json()).error.message).toMatch(/^Screen1!D8 is on sheet "Screen1": you are a viewer of sheet "Screen1"/);
    expect(sheet.id).toBe(sheets[1].id);
    await a.getByRole('tab', { name: 'Screen1', exact: true }).click();
  });

  it('lists changes with author, time and cells before → after, and brings the workbook back for everyone', async () => {
    await a.getByRole('button', { name: 'Change log' }).click();
    const dialog = a.getByRole('dialog', { name: 'Change log' });
    const changes = dialog.getByRole('list', { name: 'Changes' });
    await changes.getByRole('listitem', { name: 'Change #1', exact: true }).waitFor();
    expect(await changes.getByRole('listitem', { name: 'Change #2', exact: true }).textContent()).toContain('Ada Okafor');
    const first = changes.getByRole('listitem', { name: 'Change #1', exact: true });
    expect(await first.getByRole('table').textContent()).toContain('A2(empty)→N2');
    await screenshot(a, 'team-history-view');
    await first.getByRole('button', { name: 'Bring back the whole workbook…' }).click();
    await dialog.getByRole('button', { name: 'Bring it back' }).click();
    await dialog.getByText(/Brought back as entry #\d+/).waitFor();
    await dialog.getByRole('button', { name: 'Close' }).click();
    await cell(b, 'A2').getByText('N2', { exact: true }).waitFor();
    await cell(a, 'A2').getByText('N2', { exact: true }).waitFor();
    expect(await cell(b, 'A3').textContent()).toBe('');
  });

  it('shows the owner the audit log of sharing, roles, protection and restores', async () => {
    await a.getByRole('button', { name: 'Audit' }).click();
    const log = a.getByRole('dialog', { name: 'Audit log' }).getByRole('list', { name: 'Audit entries' });
    for (const line of [/added Ben Laszlo as an editor/, /invited cy@lab.example by e-mail as a viewer/, /protected A1:C1 on sheet “Screen1”/, /Ada Okafor locked sheet “Screen1”/, /changed Ben Laszlo from editor to viewer/, /made Ben Laszlo an editor on sheet “Measurements”/, /restored revision #1/]) {
      await log.getByText(line).waitFor();
    }
    await screenshot(a, 'team-audit-log');
    await a.getByRole('button', { name: 'Close' }).click();
    expect(await b.getByRole('button', { name: 'Audit' }).count()).toBe(0); // a viewer does not see it
  });

  it('lets a site admin read the invitation in the mail outbox, and the invitee accept it', async () => {
    await a.getByRole('navigation', { name: 'Main' }).getByRole('link', { name: 'Mail' }).click();
    const message = a.getByRole('list', { name: 'Messages' }).getByRole('listitem').filter({ hasText: cy.email });
    const link = await message.getByRole('link', { name: /\/invitations\// }).getAttribute('href');
    await screenshot(a, 'team-mail-outbox');

    await editor.context.clearCookies();
    await b.goto(link!);
    await b.getByText(`Ada Okafor invited ${cy.email} to the workbook “Diatomic screening” as a viewer.`).waitFor();
    await screenshot(b, 'team-invitation-signed-out');
    await b.getByRole('link', { name: 'Create account' }).click();
    await b.getByLabel('Name').fill(cy.name);
    await b.getByLabel('Email').fill(cy.email);
    await b.getByLabel('Password').fill(cy.password);
    await b.getByRole('button', { name: 'Create account' }).click();
    await b.getByRole('button', { name: 'Accept and open the workbook' }).click();
    await b.getByTestId('workbook-title').getByText('Diatomic screening').waitFor();
    await b.getByText('read-only', { exact: true }).waitFor();
    await a.goto(link!);
    await a.getByText(/already been used/).waitFor();
    expect([...owner.errors, ...editor.errors]).toEqual([]);
  });
});
