// First-start demo data: the invented team and its three workbooks are created once, on an empty
// database only, every seeded formula computes, and the team features hold against the demo data.
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import Database from 'better-sqlite3';
import { beforeAll, describe, expect, it } from 'vitest';
import { demoTeam, demoWorkbooks, seedBanner, seedOnFirstStart, type SeedResult } from '../server/seed/index.js';
import { makeTestApp, type TestApp } from './helpers/app.js';
import { apiClient, startOrbitab } from './helpers/orbitabProcess.js';

const person = (role: 'owner' | 'editor' | 'viewer') => demoTeam.find((p) => p.role === role)!;
const count = (t: TestApp, table: string) => (t.db.$client.prepare(`select count(*) as n from ${table}`).get() as { n: number }).n;

let t: TestApp;
let first: SeedResult;

/** A fresh signed-in session for a demo person (sign-in is rate limited per address, so use sparingly). */
async function freshSignIn(role: 'owner' | 'editor' | 'viewer') {
  const agent = t.agent();
  const res = await agent.post('/api/auth/sign-in').send({ email: person(role).email, password: person(role).password });
  expect(res.status).toBe(200);
  return agent;
}
const sessions = new Map<string, ReturnType<TestApp['agent']>>();
async function signIn(role: 'owner' | 'editor' | 'viewer') {
  if (!sessions.has(role)) sessions.set(role, await freshSignIn(role));
  return sessions.get(role)!;
}

type Loaded = { id: string; title: string; revision: number; sheets: { id: string; name: string; cells: [number, number, string][] }[] };
async function demoBook(title: string): Promise<Loaded> {
  const owner = await signIn('owner');
  const list = (await owner.get('/api/workbooks')).body.workbooks as { id: string; title: string }[];
  return (await owner.get(`/api/workbooks/${list.find((w) => w.title === title)!.id}`)).body as Loaded;
}

beforeAll(async () => {
  t = makeTestApp();
  first = await seedOnFirstStart(t.ctx);
});

describe('demo data on first start', () => {
  it('creates an owner, an editor and a viewer with @example.com addresses, and three workbooks', () => {
    expect(first.seeded).toBe(true);
    expect(count(t, 'users')).toBe(3);
    expect(count(t, 'workbooks')).toBe(3);
    expect(demoTeam.map((p) => p.role)).toEqual(['owner', 'editor', 'viewer']);
    for (const p of demoTeam) expect(p.email).toMatch(/@example\.com$/);
  });

  it('marks the demo accounts verified, so the demo team can share with each other at once', () => {
    const unverified = t.db.$client.prepare('select count(*) as n from users where email_verified_at is null').get() as { n: number };
    expect(unverified.n).toBe(0);
  });

  it('prints each sign-in and its password once, and says the passwords are public', () => {
    const banner = seedBanner(first)!;
    for (const p of demoTeam) {
      expect(banner.split(p.password).length - 1).toBe(1);
      expect(banner).toContain(p.email);
    }
    expect(banner).toContain('ORBITAB_SEED=0');
    expect(banner).toContain('public');
  });

  it('lists the same sign-ins in the README Quick start as it prints', () => {
    const readme = fs.readFileSync(path.join(import.meta.dirname, '..', 'README.md'), 'utf8');
    for (const p of demoTeam) expect(readme).toMatch(new RegExp(`\\| ${p.role}[^|]*\\| \`${p.email.replace(/\./g, '\\.')}\` \\| \`${p.password}\` \\|`));
  });

  it('does nothing the second time: same accounts, workbooks and revisions, no banner', async () => {
    const revisions = count(t, 'revisions');
    const again = await seedOnFirstStart(t.ctx);
    expect(again).toEqual({ seeded: false, reason: 'the database already has accounts' });
    expect(seedBanner(again)).toBeNull();
    expect([count(t, 'users'), count(t, 'workbooks'), count(t, 'revisions')]).toEqual([3, 3, revisions]);
  });

  it('does nothing on a database where someone has already signed up', async () => {
    const other = makeTestApp();
    await other.signUp('early.bird@example.com');
    expect((await seedOnFirstStart(other.ctx)).seeded).toBe(false);
    expect(count(other, 'workbooks')).toBe(0);
  });

  it('lets the demo owner sign in with the printed password (and not with a wrong one) and shows the three workbooks', async () => {
    const wrong = await t.agent().post('/api/auth/sign-in').send({ email: person('owner').email, password: 'not the demo password' });
    expect(wrong.status).toBe(401);
    const owner = await signIn('owner');
    const list = (await owner.get('/api/workbooks')).body.workbooks as { title: string; role: string }[];
    expect(list.map((w) => w.title).sort()).toEqual(demoWorkbooks.map((b) => b.title).sort());
    expect(list.every((w) => w.role === 'owner')).toBe(true);
  });

  it('computes every seeded formula without an error, except the one error kept on purpose', async () => {
    const owner = await signIn('owner');
    const list = (await owner.get('/api/workbooks')).body.workbooks as { id: string; title: string }[];
    let formulas = 0;
    for (const book of demoWorkbooks) {
      const id = list.find((w) => w.title === book.title)!.id;
      const loaded = (await owner.get(`/api/workbooks/${id}`)).body as Loaded;
      const values = await owner.get(`/api/workbooks/${id}/values`);
      expect(values.status).toBe(200);
      for (const sheet of book.sheets) {
        const stored = loaded.sheets.find((s) => s.name === sheet.name)!;
        const computed = new Map((values.body.sheets.find((s: { name: string }) => s.name === sheet.name).values as [number, number, unknown][]).map(([r, c, v]) => [`${String.fromCharCode(65 + c)}${r + 1}`, v]));
        for (const [row, col, input] of stored.cells) {
          if (!input.startsWith('=')) continue;
          formulas++;
          const address = `${String.fromCharCode(65 + col)}${row + 1}`;
          const value = computed.get(address);
          const expectedError = sheet.deliberateErrors?.[address];
          if (expectedError) expect(value, `${book.title} ${sheet.name}!${address}`).toMatchObject({ error: '#VALUE!', message: expect.stringContaining(expectedError) });
          else expect(value !== undefined && (typeof value !== 'object' || value === null), `${book.title} ${sheet.name}!${address} ${input} → ${JSON.stringify(value)}`).toBe(true);
        }
      }
    }
    expect(formulas).toBeGreaterThan(200);
  });
});

describe('what the demo sheets show', () => {
  const computed = new Map<string, { name: string; values: [number, number, unknown][] }[]>();
  const cellValue = async (title: string, sheet: string, address: string) => {
    if (!computed.has(title)) {
      const book = await demoBook(title);
      computed.set(title, (await (await signIn('owner')).get(`/api/workbooks/${book.id}/values`)).body.sheets);
    }
    const values = computed.get(title)!.find((s) => s.name === sheet)!.values;
    const col = address.charCodeAt(0) - 65;
    const row = Number(address.slice(1)) - 1;
    return values.find(([r, c]) => r === row && c === col)?.[2];
  };

  // Bond orders 2, 1.5 and 1 for O2, superoxide and peroxide, and 3 for CO and NO+: the standard
  // MO-theory results in inorganic chemistry textbooks (e.g. Housecroft & Sharpe, Inorganic Chemistry, ch. 2; from memory).
  it('gives the textbook bond orders for dioxygen, superoxide, peroxide, nitrosonium and CO on the screening sheet', async () => {
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'D2')).toBe(2);
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'D3')).toBe(1.5);
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'D4')).toBe(1);
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'D7')).toBe(3);
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'D9')).toBe(3);
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'J2')).toBe('EPR-active: look for a signal');
    expect(await cellValue('Gas-sensor screen: adsorbed diatomics', 'Screening', 'J4')).toBe('EPR-silent');
  });

  // Ground terms X²Π (OH), X³Σ⁻ (NH), X²Σ⁺ (CN), X¹Σg⁺ (C2): Huber & Herzberg, Constants of Diatomic Molecules (1979; from memory).
  it('gives the spectroscopic ground terms and degeneracies of the flame radicals', async () => {
    const title = 'Flame radicals: ground terms for partition functions';
    expect([await cellValue(title, 'Radicals', 'B2'), await cellValue(title, 'Radicals', 'C2')]).toEqual(['²Π', 4]);
    expect([await cellValue(title, 'Radicals', 'B4'), await cellValue(title, 'Radicals', 'C4')]).toEqual(['³Σ⁻', 3]);
    expect(await cellValue(title, 'Radicals', 'B5')).toBe('²Σ⁺');
    expect(await cellValue(title, 'Radicals', 'B6')).toBe('¹Σg⁺');
    // λ = 10⁷/ν̃ nm for ν̃ in cm⁻¹ (vacuum wavelength); E = hcν̃ with hc = 1.239841984e-4 eV·cm (CODATA 2018).
    expect(await cellValue(title, 'Radicals', 'G2')).toBeCloseTo(1e7 / 32400, 6);
    const bandEv = 32400 * 1.239841984e-4;
    expect(await cellValue(title, 'Radicals', 'H2')).toBeCloseTo(bandEv, 6);
    expect(await cellValue(title, 'Radicals', 'I2')).toBeCloseTo(Math.exp(-bandEv / (8.617333262e-5 * 2200)), 12);
  });

  // Simple Hückel: benzene's frontier levels at x = ±1 (gap 2|β|, delocalization 2β), butadiene's at
  // x = ±0.618 (gap 1.236|β|): Streitwieser, Molecular Orbital Theory for Organic Chemists (1961), ch. 2.
  it('gives the simple-Hückel gaps and delocalization of benzene and butadiene on the dye sheet', async () => {
    const title = 'Dye candidates: Hückel π screen';
    // Butadiene's frontier levels are x = ±(√5 − 1)/2 exactly (Streitwieser tabulates 0.618), gap √5 − 1.
    expect(await cellValue(title, 'Candidates', 'C3')).toBeCloseTo(Math.sqrt(5) - 1, 5);
    expect(await cellValue(title, 'Candidates', 'C7')).toBeCloseTo(2, 9);
    expect(await cellValue(title, 'Candidates', 'E7')).toBeCloseTo(2, 9);
    expect(await cellValue(title, 'Candidates', 'F7')).toBe('aromatic');
    expect(await cellValue(title, 'Candidates', 'H17')).toBe('no estimate');
  });
});

describe('sessions and authorization against the demo data', () => {
  const gasSensor = 'Gas-sensor screen: adsorbed diatomics';
  const sheetOf = (book: Loaded, name: string) => book.sheets.find((s) => s.name === name)!;

  it('refuses every write by the viewer (403) on each demo workbook, and lets them read the values', async () => {
    const viewer = await signIn('viewer');
    for (const book of demoWorkbooks) {
      const loaded = await demoBook(book.title);
      const res = await viewer.post(`/api/workbooks/${loaded.id}/patches`).send({ baseRevision: loaded.revision, changes: [{ sheetId: loaded.sheets[0].id, row: 40, col: 0, input: 'O2' }] });
      expect(res.status).toBe(403);
      expect(res.body.error.message).toBe('as a viewer you cannot edit cells');
      expect((await viewer.get(`/api/workbooks/${loaded.id}/values`)).status).toBe(200);
    }
  });

  it('refuses the editor on the locked "Settled" sheet, naming who locked it and why', async () => {
    const book = await demoBook(gasSensor);
    const editor = await signIn('editor');
    const res = await editor.post(`/api/workbooks/${book.id}/patches`).send({ baseRevision: book.revision, changes: [{ sheetId: sheetOf(book, 'Settled').id, row: 1, col: 4, input: 'reopened' }] });
    expect(res.status).toBe(403);
    expect(res.body.error.message).toContain('locked by Teodora Vance');
    expect(res.body.error.message).toContain('Agreed at the sensor-materials review');
    const unlock = await editor.delete(`/api/workbooks/${book.id}/sheets/${sheetOf(book, 'Settled').id}/lock`);
    expect(unlock.status).toBe(403);
  });

  it('refuses the editor on the protected header row but lets them edit the rows below it', async () => {
    const book = await demoBook(gasSensor);
    const editor = await signIn('editor');
    const screening = sheetOf(book, 'Screening').id;
    const header = await editor.post(`/api/workbooks/${book.id}/patches`).send({ baseRevision: book.revision, changes: [{ sheetId: screening, row: 0, col: 3, input: 'BO' }] });
    expect(header.status).toBe(403);
    expect(header.body.error.message).toContain('protected range Screening!A1:J1');
    const body = await editor.post(`/api/workbooks/${book.id}/patches`).send({ baseRevision: book.revision, changes: [{ sheetId: screening, row: 13, col: 0, input: 'C2^2-' }] });
    expect(body.status).toBe(200);
  });

  it('lets the owner, who locked it, still edit the settled sheet', async () => {
    const book = await demoBook(gasSensor);
    const owner = await signIn('owner');
    const res = await owner.post(`/api/workbooks/${book.id}/patches`).send({ baseRevision: book.revision, changes: [{ sheetId: sheetOf(book, 'Settled').id, row: 6, col: 0, input: 'N2' }] });
    expect(res.status).toBe(200);
  });

  it('hides the demo workbooks from someone outside the team (404, not 403)', async () => {
    const { agent: outsider } = await t.signUp('passer.by@example.com');
    expect((await outsider.get('/api/workbooks')).body.workbooks).toEqual([]);
    for (const book of demoWorkbooks) {
      const loaded = await demoBook(book.title);
      expect((await outsider.get(`/api/workbooks/${loaded.id}`)).status).toBe(404);
      expect((await outsider.get(`/api/workbooks/${loaded.id}/values`)).status).toBe(404);
    }
  });

  it('ends the session on sign-out: the owner\'s old cookie no longer opens the workbooks', async () => {
    const owner = await freshSignIn('owner');
    expect((await owner.post('/api/auth/sign-out')).status).toBe(204);
    expect((await owner.get('/api/workbooks')).status).toBe(401);
  });
});

describe('ORBITAB_SEED in the real server', () => {
  it('starts empty with ORBITAB_SEED=0, then seeds on the next start with ORBITAB_SEED=1 and prints the sign-ins once, never into the logs', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-seed-'));
    const databasePath = path.join(dir, 'orbitab.sqlite');
    try {
      const off = await startOrbitab(databasePath, { ORBITAB_SEED: '0' });
      off.child.kill('SIGTERM');
      expect((await off.exited).code).toBe(0);
      expect(off.output()).not.toContain('demo team');
      const db = new Database(databasePath, { readonly: true });
      expect((db.prepare('select count(*) as n from users').get() as { n: number }).n).toBe(0);
      db.close();

      const on = await startOrbitab(databasePath, { ORBITAB_SEED: '1', LOG_LEVEL: 'info' });
      try {
        const client = apiClient(on.url);
        expect((await client.post('/api/auth/sign-in', { email: person('owner').email, password: person('owner').password })).status).toBe(200);
        expect((await client.get('/api/workbooks')).body.workbooks).toHaveLength(3);
      } finally {
        on.child.kill('SIGTERM');
        await on.exited;
      }
      const printed = on.output();
      expect(printed).toContain('Orbitab created a demo team and 3 demo workbooks');
      for (const p of demoTeam) expect(printed.split(p.password).length - 1).toBe(1); // the banner only
      const logLines = printed.split('\n').filter((line) => line.startsWith('{'));
      expect(logLines.some((line) => line.includes('"demo data seeded"'))).toBe(true);
      // Structured logs carry counts, never passwords or cell contents.
      expect(logLines.some((line) => line.includes('BONDORDER') || line.includes('orbitab-demo-'))).toBe(false);
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }, 90_000);
});
