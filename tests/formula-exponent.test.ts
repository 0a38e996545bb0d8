// Numbers as chemists write them: 6.022E23 with a capital E, in typed formulas and in files other
// programs wrote. The stored text stays as written; every engine is given it with a lowercase e,
// the only form HyperFormula reads (functions/formulaTokens.ts).
import { execFile } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';
import { lowercaseExponents } from '../functions/formulaTokens.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import type { CellEntry, ComputedValue } from '../shared/workbooks.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { allowedActions } from '../shared/permissions.js';
import { makeTestApp } from './helpers/app.js';

afterAll(() => closeParsePool());

describe('lowercaseExponents', () => {
  it('lowers the exponent mark of number literals only', () => {
    expect(lowercaseExponents('=6.022E23*2')).toBe('=6.022e23*2');
    expect(lowercaseExponents('=2.5E-3')).toBe('=2.5e-3');
    expect(lowercaseExponents('={1E3;2}')).toBe('={1e3;2}');
    expect(lowercaseExponents('=1.5E+3+.5E2')).toBe('=1.5e+3+.5e2');
  });

  it('leaves references, sheet names, strings and plain text alone', () => {
    for (const same of ['=E3', '=A1E3', '="1E3"', '=Sheet1E3!A1', "='1E3'!A1", '=SUM(E1:E3)*2', '6.022E23', '=CONCAT("x", "2E5")&E3', '=1E3A']) {
      expect(lowercaseExponents(same), same).toBe(same);
    }
  });
});

describe('the engine', () => {
  it('computes formulas with capital exponents and still reads E3 as a cell', () => {
    const engine = createEngine({ Sheet1: [['=6.022E23*2', '=2.5E-3', '={1E3;2}', '=E3', '="1E3"', '=Sheet1E3!A1']], Sheet1E3: [[7]] });
    try {
      const row = [0, 1, 2, 3, 4, 5].map((col) => engine.getCellValue({ sheet: 0, row: 0, col }));
      // Independent arithmetic: 6.022 × 10^23 × 2 and 2.5 × 10^-3.
      expect(row[0]).toBeCloseTo(2 * 6.022 * 10 ** 23, -10);
      expect(row[1]).toBe(0.0025);
      expect([row[2], engine.getCellValue({ sheet: 0, row: 1, col: 2 })]).toEqual([1000, 2]);
      expect(row[3]).toBeNull(); // E3 is an empty cell, not a number
      expect(row[4]).toBe('1E3');
      expect(row[5]).toBe(7);
    } finally {
      engine.destroy();
    }
  });
});

describe('typed in the grid', () => {
  it('shows the value and keeps the text as typed', () => {
    const m = new WorkbookModel({ id: 'wb', title: 'Moles', revision: 0, role: 'owner', actions: allowedActions(['owner']), sheets: [{ id: 's1', name: 'Sheet1', position: 0, settings: {}, cells: [] }] });
    m.edit([{ sheetId: 's1', row: 0, col: 0, input: '=2.5E-3*4' }]);
    expect(m.input('s1', 0, 0)).toBe('=2.5E-3*4');
    expect(m.view('s1', 0, 0)?.display).toBe('0.01');
  });
});

const valuesOf = (body: { sheets: { values: [number, number, ComputedValue][] }[] }) => new Map(body.sheets[0].values.map(([r, c, v]) => [`${r},${c}`, v]));

describe('through the API', async () => {
  const t = makeTestApp();
  const { agent } = await t.signUp('ann@lab.test', 'Ann Analyst');

  it('stores a typed formula as written and computes it on the server', async () => {
    const id = (await agent.post('/api/workbooks').send({ title: 'Moles' }).expect(201)).body.workbook.id as string;
    const sheetId = (await agent.get(`/api/workbooks/${id}`).expect(200)).body.sheets[0].id as string;
    const changes = ['=6.022E23*2', '=2.5E-3', '={1E3;2}'].map((input, col) => ({ sheetId, row: 0, col, input }));
    await agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: 0, changes }).expect(200);
    const stored = (await agent.get(`/api/workbooks/${id}`).expect(200)).body.sheets[0].cells as CellEntry[];
    expect(stored.map((c) => c[2])).toEqual(['=6.022E23*2', '=2.5E-3', '={1E3;2}']);
    const values = valuesOf((await agent.get(`/api/workbooks/${id}/values`).expect(200)).body);
    expect(values.get('0,0')).toBeCloseTo(1.2044e24, -10);
    expect([values.get('0,1'), values.get('0,2'), values.get('1,2')]).toEqual([0.0025, 1000, 2]);
  });

  // A file another program wrote: LibreOffice Calc saves 6.022E23 in a formula as "6.022E+023".
  const soffice = '/usr/bin/soffice';
  it.skipIf(!fs.existsSync(soffice))('imports an xlsx written by LibreOffice Calc and computes its exponent formulas (skipped without soffice)', async () => {
    const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-lo-'));
    try {
      fs.writeFileSync(path.join(dir, 'moles.csv'), 'Avogadro,=6.022E23*2\ndilute,=B1*1E-24\ntext,="1E3"\n');
      // A private profile so a concurrent soffice elsewhere on the machine does not hold ours.
      await promisify(execFile)(soffice, [`-env:UserInstallation=file://${dir}/profile`, '--headless', '--convert-to', 'xlsx', '--outdir', dir, path.join(dir, 'moles.csv')], { timeout: 120_000 });
      const file = fs.readFileSync(path.join(dir, 'moles.xlsx'));

      const upload = await agent.post('/api/imports').attach('file', file, 'moles.xlsx');
      expect(upload.status, JSON.stringify(upload.body)).toBe(201);
      const id = upload.body.workbookId as string;
      const stored = new Map(((await agent.get(`/api/workbooks/${id}`).expect(200)).body.sheets[0].cells as CellEntry[]).map(([r, c, input]) => [`${r},${c}`, input]));
      expect(stored.get('0,1')).toMatch(/^=6\.022E\+0*23\*2$/); // the file's own text, capital E kept
      const values = valuesOf((await agent.get(`/api/workbooks/${id}/values`).expect(200)).body);
      expect(values.get('0,1')).toBeCloseTo(1.2044e24, -10);
      expect(values.get('1,1')).toBeCloseTo(1.2044, 10);
      expect(values.get('2,1')).toBe('1E3');
    } finally {
      fs.rmSync(dir, { recursive: true, force: true });
    }
  }, 180_000);
});
