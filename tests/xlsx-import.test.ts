// What the reader takes from files written by other programs: merged cells, rich text, links,
// shared and array formulas, Excel's function prefixes, hidden sheets, the 1904 date system, cells
// past Orbitab's grid, and CSV dialects. Nothing is dropped without a reason in the summary.
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { readSpreadsheet } from '../server/xlsx/read.js';

async function xlsxOf(build: (wb: ExcelJS.Workbook) => void): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  build(wb);
  return Buffer.from(await wb.xlsx.writeBuffer());
}

describe('reading .xlsx written by other programs', () => {
  it('keeps a merged range’s value at its top-left cell and records the range', async () => {
    const file = await xlsxOf((wb) => {
      const ws = wb.addWorksheet('Merged');
      ws.getCell('A1').value = 'Diatomic screen';
      ws.mergeCells('A1:C1');
      ws.getCell('A2').value = 'O2';
    });
    const { sheets } = await readSpreadsheet(file, 'm.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, 'Diatomic screen'], [1, 0, 'O2']]);
    expect(sheets[0].merged).toEqual(['A1:C1']);
  });

  it('flattens rich text, keeps a link’s text and notes its target', async () => {
    const file = await xlsxOf((wb) => {
      const ws = wb.addWorksheet('Text');
      ws.getCell('A1').value = { richText: [{ text: 'O', font: { bold: true } }, { text: '2', font: { vertAlign: 'subscript' } }] };
      ws.getCell('A2').value = { text: 'data sheet', hyperlink: 'https://example.com/sds/o2' };
    });
    const { sheets, summary } = await readSpreadsheet(file, 't.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, 'O2'], [1, 0, 'data sheet']]);
    expect(summary.notes).toContain('Text!A2: link target https://example.com/sds/o2 not kept');
  });

  it('gives every cell of a shared formula its own translated formula', async () => {
    const file = await xlsxOf((wb) => {
      const ws = wb.addWorksheet('Shared');
      ws.getCell('A1').value = 'O2';
      ws.getCell('A2').value = 'N2';
      ws.getCell('B1').value = { formula: 'BONDORDER(A1)', result: 2, shareType: 'shared', ref: 'B1:B2' } as ExcelJS.CellValue;
      ws.getCell('B2').value = { sharedFormula: 'B1', result: 3 } as ExcelJS.CellValue;
    });
    const { sheets, summary } = await readSpreadsheet(file, 's.xlsx');
    expect(sheets[0].cells).toContainEqual([0, 1, '=BONDORDER(A1)']);
    expect(sheets[0].cells).toContainEqual([1, 1, '=BONDORDER(A2)']);
    expect(summary.formulas).toBe(2);
  });

  it('keeps an array formula at its anchor and leaves its area to the engine', async () => {
    const file = await xlsxOf((wb) => {
      const ws = wb.addWorksheet('Array');
      ws.getCell('A1').value = { formula: 'TRANSPOSE({1,2,3})', result: 1, shareType: 'array', ref: 'A1:A3' } as ExcelJS.CellValue;
      ws.getCell('A2').value = 2;
      ws.getCell('A3').value = 3;
      ws.getCell('B1').value = 'kept';
    });
    const { sheets } = await readSpreadsheet(file, 'a.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, '=TRANSPOSE({1,2,3})'], [0, 1, 'kept']]);
  });

  it('drops the _xlfn. prefix Excel writes before newer functions, but not inside text', async () => {
    const file = await xlsxOf((wb) => {
      wb.addWorksheet('Prefixed').getCell('A1').value = { formula: '_xlfn.CONCAT("_xlfn.",_xlfn.TEXTJOIN(",",TRUE,"a","b"))' } as ExcelJS.CellValue;
    });
    const { sheets } = await readSpreadsheet(file, 'p.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, '=CONCAT("_xlfn.",TEXTJOIN(",",TRUE,"a","b"))']]);
  });

  it('imports a hidden sheet visibly and says so', async () => {
    const file = await xlsxOf((wb) => {
      wb.addWorksheet('Shown').getCell('A1').value = 1;
      const hidden = wb.addWorksheet('Backstage', { state: 'hidden' });
      hidden.getCell('A1').value = 2;
    });
    const { sheets, summary } = await readSpreadsheet(file, 'h.xlsx');
    expect(sheets.map((s) => s.name)).toEqual(['Shown', 'Backstage']);
    expect(summary.notes).toContain('sheet "Backstage" was hidden in the file; it is imported visible');
  });

  it('reads dates of a workbook in the 1904 date system as the same calendar dates', async () => {
    const file = await xlsxOf((wb) => {
      wb.properties.date1904 = true;
      const cell = wb.addWorksheet('Dates').getCell('A1');
      cell.value = new Date(Date.UTC(2024, 2, 1));
      cell.numFmt = 'yyyy-mm-dd';
    });
    const { sheets } = await readSpreadsheet(file, 'd.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, '2024-03-01']]);
  });

  it('skips cells past Orbitab’s 2,000 columns, naming each with the reason', async () => {
    const file = await xlsxOf((wb) => {
      const ws = wb.addWorksheet('Wide');
      ws.getCell(1, 1).value = 'in';
      ws.getCell(1, 2001).value = 'out';
    });
    const { sheets, summary } = await readSpreadsheet(file, 'w.xlsx');
    expect(sheets[0].cells).toEqual([[0, 0, 'in']]);
    expect(summary.skipped).toEqual([{ sheet: 'Wide', address: 'BXY1', reason: "outside Orbitab's grid of 1,000,000 rows × 2,000 columns" }]);
  });
});

describe('reading CSV', () => {
  it('takes each field as typed, formulas included', async () => {
    const { sheets, summary } = await readSpreadsheet(Buffer.from('Species,Bond order\r\nO2,=BONDORDER(A2)\r\n"NO, nitric oxide",2.5\r\n'), 'screen.csv');
    expect(sheets[0].name).toBe('screen');
    expect(sheets[0].cells).toEqual([[0, 0, 'Species'], [0, 1, 'Bond order'], [1, 0, 'O2'], [1, 1, '=BONDORDER(A2)'], [2, 0, 'NO, nitric oxide'], [2, 1, '2.5']]);
    expect(summary).toMatchObject({ cells: 6, formulas: 1 });
  });

  it('recognises semicolon-separated files and says so', async () => {
    const { sheets, summary } = await readSpreadsheet(Buffer.from('Species;Charge\nO2;-1\n'), 'eu.csv');
    expect(sheets[0].cells).toEqual([[0, 0, 'Species'], [0, 1, 'Charge'], [1, 0, 'O2'], [1, 1, '-1']]);
    expect(summary.notes).toContain('fields are separated by ";"');
  });

  it('reads a file that is not UTF-8 as Windows-1252 and says so', async () => {
    const latin = Buffer.from([0x48, 0xfc, 0x63, 0x6b, 0x65, 0x6c, 0x0a]); // "Hückel" in Windows-1252
    const { sheets, summary } = await readSpreadsheet(latin, 'old.csv');
    expect(sheets[0].cells).toEqual([[0, 0, 'Hückel']]);
    expect(summary.notes).toContain('the file is not valid UTF-8; it was read as Windows-1252');
  });

  it('drops a byte-order mark and keeps blank lines as empty rows', async () => {
    const { sheets } = await readSpreadsheet(Buffer.from('\uFEFFa\n\nb\n'), 'bom.csv');
    expect(sheets[0].cells).toEqual([[0, 0, 'a'], [2, 0, 'b']]);
  });
});
