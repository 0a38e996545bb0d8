// The caution that goes with computed chemistry results: one text (shared/cautions.ts), shown once in
// the function reference, once under the workbook grid, and once on every export's front sheet.
import ExcelJS from 'exceljs';
import { createElement } from 'react';
import { renderToStaticMarkup } from 'react-dom/server';
import { describe, expect, it } from 'vitest';
import { cautionLines, cautionText, cautionTitle } from '../shared/cautions.js';
import { ABOUT_SHEET_NAME } from '../server/xlsx/types.js';
import { SafetyNote } from '../src/features/diagram/SafetyNote.js';
import { FunctionReferencePage } from '../src/features/reference/FunctionReferencePage.js';
import { makeTestApp } from './helpers/app.js';

const occurrences = (haystack: string, needle: string) => haystack.split(needle).length - 1;
// React escapes apostrophes and quotes in markup; compare against the text as HTML shows it.
const asHtml = (text: string) => text.replace(/&/g, '&amp;').replace(/"/g, '&quot;').replace(/'/g, '&#x27;');

describe('the caution text', () => {
  it('says which models give the results, that they are not measurements and not a basis for safety decisions', () => {
    expect(cautionText).toContain('qualitative molecular-orbital filling, two-centre LCAO, simple Hückel theory');
    expect(cautionText).toContain('not measurements');
    expect(cautionText).toContain('not a basis for safety decisions');
    expect(cautionTitle).toBe('Model estimates, not measurements');
  });

  it('names the hazardous kinds of species and where to turn instead', () => {
    for (const words of ['fluorine', 'superoxides', 'peroxides', 'safety data sheets', 'local regulations', 'qualified review']) expect(cautionText).toContain(words);
  });
});

describe('where the caution is shown', () => {
  it('appears once on the function reference page, under its title', () => {
    const html = renderToStaticMarkup(createElement(FunctionReferencePage));
    expect(occurrences(html, asHtml(cautionText))).toBe(1);
    expect(occurrences(html, cautionTitle)).toBe(1);
  });

  it('appears as the note under computed results on the workbook page', () => {
    const html = renderToStaticMarkup(createElement(SafetyNote));
    expect(occurrences(html, asHtml(cautionText))).toBe(1);
    expect(html).toContain('data-testid="safety-note"');
  });

  it('appears once, sentence by sentence, on the front sheet of an exported workbook', async () => {
    const { signUp } = makeTestApp();
    const { agent } = await signUp('export.reader@example.com');
    const id = (await agent.post('/api/workbooks').send({ title: 'Peroxide check' })).body.workbook.id as string;
    const sheetId = (await agent.get(`/api/workbooks/${id}`)).body.sheets[0].id as string;
    await agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: 0, changes: [{ sheetId, row: 0, col: 0, input: 'O2^2-' }, { sheetId, row: 0, col: 1, input: '=BONDORDER(A1)' }] });
    const res = await agent.get(`/api/workbooks/${id}/export?format=xlsx`).buffer(true).parse((r, done) => {
      const chunks: Buffer[] = [];
      r.on('data', (c: Buffer) => chunks.push(c)).on('end', () => done(null, Buffer.concat(chunks)));
    });
    expect(res.status).toBe(200);
    const book = new ExcelJS.Workbook();
    await book.xlsx.load(res.body as unknown as ArrayBuffer);
    const front = book.worksheets[0];
    expect(front.name).toBe(ABOUT_SHEET_NAME);
    const texts: string[] = [];
    front.eachRow((row) => row.eachCell((cell) => texts.push(String(cell.value))));
    for (const line of cautionLines) expect(texts.filter((t) => t === line)).toHaveLength(1);
    // The data sheet itself carries no caution text: it is said once, on the front sheet.
    const data: string[] = [];
    book.worksheets[1].eachRow((row) => row.eachCell((cell) => data.push(String(cell.value))));
    expect(data.some((t) => t.includes('safety data sheets'))).toBe(false);
  });
});
