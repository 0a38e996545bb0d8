// Export → import gives back the same inputs and the same computed values.
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { computeWorkbook, isEngineError } from '../server/xlsx/engineValues.js';
import { EXPORT_CAUTIONS } from '../server/xlsx/frontSheet.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import { settingsFromParsed } from '../server/xlsx/sheetSettings.js';
import { ABOUT_SHEET_NAME, type CellTriple, type ExportWorkbook, type ParsedSheet } from '../server/xlsx/types.js';
import { exportToBuffer } from './helpers/xlsxFixtures.js';

const screening: CellTriple[] = [
  [0, 0, 'Species'], [0, 1, 'Bond order'], [0, 2, 'Unpaired'], [0, 3, 'Magnetism'], [0, 4, 'Measured on'], [0, 5, 'Ok?'],
  [1, 0, 'O2'], [1, 1, '=BONDORDER(A2)'], [1, 2, '=UNPAIRED(A2)'], [1, 3, '=MAGNETISM(A2)'], [1, 4, '2024-03-01'], [1, 5, 'TRUE'],
  [2, 0, 'N2'], [2, 1, '=BONDORDER(A3)'], [2, 2, '=UNPAIRED(A3)'], [2, 3, '=MAGNETISM(A3)'], [2, 4, '2024-03-02T14:30:00'], [2, 5, 'FALSE'],
  [3, 0, 'Xq2'], [3, 1, '=BONDORDER(A4)'], [3, 3, '14:30:00'], [3, 4, '#N/A'],
  [5, 0, 'Mean bond order'], [5, 1, '=AVERAGE(B2:B3)'], [5, 2, '=IF(C2>0,"paramagnetic","diamagnetic")'],
  [6, 0, -12.5], [6, 1, '6.02214076e+23'], [6, 2, '=1/0'], [6, 3, '=NOSUCHFUNCTION(1)'], [6, 4, '=CONCATENATE(A2,"/",A3)'],
  [7, 0, '=Notes!A1'],
].map(([r, c, v]) => [r, c, String(v)] as CellTriple);

const notes: CellTriple[] = [
  [0, 0, 'Hückel π-system, "quoted", with commas'],
  [1, 0, "'007"],
  [2, 0, "'=not a formula"],
  [3, 0, "'TRUE"],
  [4, 0, '0.1'],
  [5, 0, '=A5*3'],
];

const levels: CellTriple[] = [
  [0, 0, 'O2'],
  [1, 0, '=MOTABLE(A1)'],
  [8, 0, '=SUM(C2:C7)'],
];

const workbook: ExportWorkbook = {
  title: 'Gas-sensor screening (invented)',
  revision: 7,
  exportedBy: 'Ada Analyst',
  exportedAt: new Date('2025-01-15T09:30:00Z'),
  sheets: [
    // Widths in CSS pixels as the grid stores them; 126 px and 98 px are 18 and 14 characters in the file.
    { name: 'Screening', cells: screening, settings: { columnWidths: { 0: 126, 3: 98 }, freezeHeaderRow: true, frozenCols: 1, merged: ['G1:H1'] } },
    { name: 'Notes', cells: notes, settings: {}, lock: { lockedByName: 'Lee Lead', reason: 'settled', editorNames: ['Lee Lead'] } },
    { name: 'Levels', cells: levels, settings: {}, protectedRanges: [{ range: 'A1:C1', editorNames: ['Ada Analyst'] }, { range: 'E:E', editorNames: ['Lee Lead'] }] },
  ],
};

function valuesOf(sheets: { name: string; cells: CellTriple[] }[]) {
  return computeWorkbook(sheets).sheets.map((s) => ({
    name: s.name,
    values: s.cells.map((c) => [c.row, c.col, isEngineError(c.value) ? c.value.value : c.value]),
  }));
}

const sortCells = (cells: CellTriple[]) => [...cells].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
const byName = (sheets: ParsedSheet[], name: string) => sheets.find((s) => s.name === name)!;

describe('xlsx export then import (formulas with cached values)', async () => {
  const file = await exportToBuffer(workbook, { mode: 'formulas' });
  const imported = await readSpreadsheet(file, 'screening.xlsx');

  it('gives back every sheet with the same inputs', () => {
    expect(imported.sheets.map((s) => s.name)).toEqual(['Screening', 'Notes', 'Levels']);
    for (const sheet of workbook.sheets) expect(sortCells(byName(imported.sheets, sheet.name).cells)).toEqual(sortCells(sheet.cells));
  });

  it('computes the same values from the imported inputs, spilled MO table included', () => {
    expect(valuesOf(imported.sheets)).toEqual(valuesOf(workbook.sheets));
  });

  it('does not import its own front sheet as data, and says so', () => {
    expect(imported.sheets.some((s) => s.name === ABOUT_SHEET_NAME)).toBe(false);
    expect(imported.summary.notes.join('\n')).toMatch(/provenance page of an Orbitab export/);
  });

  it('counts sheets, cells and formulas and skips nothing', () => {
    expect(imported.summary).toMatchObject({ sheets: 3, cells: screening.length + notes.length + levels.length, skipped: [] });
    const formulas = [...screening, ...notes, ...levels].filter(([, , i]) => i.startsWith('=')).length;
    expect(imported.summary.formulas).toBe(formulas);
  });

  it('keeps column widths, frozen panes and merged ranges', () => {
    const s = byName(imported.sheets, 'Screening');
    expect(s.columnWidths).toEqual({ 0: 18, 3: 14 });
    expect([s.frozenRows, s.frozenCols]).toEqual([1, 1]);
    expect(s.merged).toEqual(['G1:H1']);
    expect(settingsFromParsed(s, [])).toEqual({ columnWidths: { 0: 126, 3: 98 }, freezeHeaderRow: true, frozenRows: 1, frozenCols: 1, merged: ['G1:H1'] });
  });
});

describe('the exported file as another program sees it', async () => {
  const file = await exportToBuffer(workbook, { mode: 'formulas' });
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(file as unknown as ArrayBuffer);
  const sheet = wb.getWorksheet('Screening')!;

  it('caches the engine value beside each formula: O2 bond order 2 with 2 unpaired electrons, N2 bond order 3 with none', () => {
    // Textbook MO results for O2 and N2 (Atkins & de Paula, Physical Chemistry, "Molecular structure").
    expect(sheet.getCell('B2').value).toEqual({ formula: 'BONDORDER(A2)', result: 2 });
    expect(sheet.getCell('C2').value).toEqual({ formula: 'UNPAIRED(A2)', result: 2 });
    expect(sheet.getCell('B3').value).toEqual({ formula: 'BONDORDER(A3)', result: 3 });
    expect((sheet.getCell('C3').value as ExcelJS.CellFormulaValue).formula).toBe('UNPAIRED(A3)');
  });

  it('writes errors as error values, with the engine’s explanation as a note', () => {
    expect(sheet.getCell('C7').value).toEqual({ formula: '1/0', result: { error: '#DIV/0!' } });
    expect((sheet.getCell('B4').value as ExcelJS.CellFormulaValue).result).toEqual({ error: '#VALUE!' });
    expect(String(sheet.getCell('B4').note ?? '')).toMatch(/Xq/);
    expect(sheet.getCell('E4').value).toEqual({ error: '#N/A' });
  });

  it('writes ISO date text as real dates, and a time of day as a time, each with its format', () => {
    expect(sheet.getCell('E2').value).toEqual(new Date('2024-03-01T00:00:00Z'));
    expect(sheet.getCell('E2').numFmt).toBe('yyyy-mm-dd');
    expect(sheet.getCell('E3').value).toEqual(new Date('2024-03-02T14:30:00Z'));
    expect(sheet.getCell('E3').numFmt).toBe('yyyy-mm-dd hh:mm:ss');
    // 14:30 is 0.6041… of a day; exceljs shows serials below 1 as times on 1899-12-30.
    expect(sheet.getCell('D4').value).toEqual(new Date('1899-12-30T14:30:00Z'));
    expect(sheet.getCell('D4').numFmt).toBe('hh:mm:ss');
  });

  it('marks a spilled result as an array formula over its whole area', () => {
    const anchor = wb.getWorksheet('Levels')!.getCell('A2').value as ExcelJS.CellFormulaValue & { ref?: string; shareType?: string };
    expect(anchor).toMatchObject({ formula: 'MOTABLE(A1)', shareType: 'array', ref: 'A2:C7' });
  });

  it('starts with a front sheet naming workbook, revision, exporter, time, the models used and the cautions', () => {
    const about = wb.worksheets[0];
    expect(about.name).toBe(ABOUT_SHEET_NAME);
    const text = about.getSheetValues().flat().filter(Boolean).map(String).join('\n');
    for (const expected of ['Gas-sensor screening (invented)', 'Ada Analyst', '2025-01-15T09:30:00.000Z', 'BONDORDER', 'MOTABLE', ...EXPORT_CAUTIONS]) {
      expect(text).toContain(expected);
    }
    expect(text).toMatch(/Revision\n7/);
    expect(text).toMatch(/Atkins/); // the catalog's published source for the diatomic functions
  });

  it('protects a locked sheet, and only the protected range of a sheet with one', () => {
    expect((wb.getWorksheet('Notes') as unknown as { sheetProtection?: { sheet?: boolean } }).sheetProtection?.sheet).toBe(true);
    const levelsSheet = wb.getWorksheet('Levels')!;
    expect((levelsSheet as unknown as { sheetProtection?: { sheet?: boolean } }).sheetProtection?.sheet).toBe(true);
    expect(levelsSheet.getCell('A1').protection?.locked).not.toBe(false); // inside A1:C1
    expect(levelsSheet.getCell('B1').protection?.locked).not.toBe(false); // empty, inside A1:C1
    expect(levelsSheet.getCell('A9').protection?.locked).toBe(false);
    // A whole-column range is locked through the column's style (locked is the format's default), empty cells included.
    expect(levelsSheet.getColumn(5).style?.protection?.locked).not.toBe(false);
    expect(levelsSheet.getColumn(6).style?.protection?.locked).toBe(false);
    const about = wb.worksheets[0].getSheetValues().flat().filter(Boolean).map(String).join('\n');
    expect(about).toMatch(/Levels!A1:C1: protected range; in Orbitab only Ada Analyst may edit it\. The file format cannot name Orbitab users/);
    expect(about).toMatch(/Notes: locked in Orbitab by Lee Lead \("settled"\)/);
  });
});

describe('values-only export', async () => {
  const file = await exportToBuffer(workbook, { mode: 'values' });
  const imported = await readSpreadsheet(file, 'values.xlsx');

  it('holds no formulas, and its imported values equal the computed ones', () => {
    expect(imported.summary.formulas).toBe(0);
    const original = valuesOf(workbook.sheets);
    const back = valuesOf(imported.sheets);
    expect(back).toEqual(original);
  });

  it('keeps text that looks like a number, a boolean or a formula as text', () => {
    const n = byName(imported.sheets, 'Notes').cells;
    expect(n).toContainEqual([1, 0, "'007"]);
    expect(n).toContainEqual([2, 0, "'=not a formula"]);
    expect(n).toContainEqual([3, 0, "'TRUE"]);
  });
});
