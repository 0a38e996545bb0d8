// The writer gives cells one shared style object per (number format, locked, value type) so exceljs
// does not render a style per cell (server/xlsx/writeXlsx.ts, SharedStyles). Sharing must not change
// what any cell shows: formats and protection flags stay per cell, whatever order the kinds come in.
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import type { CellTriple, ExportWorkbook } from '../server/xlsx/types.js';
import { exportToBuffer } from './helpers/xlsxFixtures.js';

// Invented rows; each row mixes the kinds in a different order, so whichever kind meets a style
// object first, the later kinds must still get their own format.
const kinds = ['42.5', 'batch 7', '2024-05-06', '2024-05-06T08:15:00', '09:45:00', 'TRUE', '=DATE(2024,5,7)', '=2*21', '="text"'];
const rows = 300;
const cells: CellTriple[] = [];
for (let r = 0; r < rows; r++) for (let k = 0; k < kinds.length; k++) cells.push([r, k, kinds[(k + r) % kinds.length]]);

const workbook: ExportWorkbook = {
  title: 'Style sharing (invented)',
  revision: 3,
  exportedBy: 'Test',
  exportedAt: new Date('2025-02-01T10:00:00Z'),
  sheets: [
    { name: 'Mixed', cells, settings: {} },
    { name: 'Guarded', cells, settings: {}, protectedRanges: [{ range: 'B2:C4', editorNames: ['Someone'] }] },
  ],
};

const expectedFormat: Record<string, string> = {
  '42.5': 'General',
  'batch 7': 'General',
  '2024-05-06': 'yyyy-mm-dd',
  '2024-05-06T08:15:00': 'yyyy-mm-dd hh:mm:ss',
  '09:45:00': 'hh:mm:ss',
  TRUE: 'General',
  '=DATE(2024,5,7)': 'yyyy-mm-dd',
  '=2*21': 'General',
  '="text"': 'General',
};

describe('shared cell styles in the .xlsx writer', async () => {
  const file = await exportToBuffer(workbook, { mode: 'formulas' });
  const wb = new ExcelJS.Workbook();
  await wb.xlsx.load(file as unknown as ArrayBuffer);

  it('keeps each cell’s own number format, in every order the kinds arrive', () => {
    const sheet = wb.getWorksheet('Mixed')!;
    const wrong: string[] = [];
    for (const [r, c, input] of cells) {
      const numFmt = sheet.getCell(r + 1, c + 1).numFmt ?? 'General';
      if (numFmt !== expectedFormat[input]) wrong.push(`${sheet.getCell(r + 1, c + 1).address} ${input}: ${numFmt}`);
    }
    expect(wrong).toEqual([]);
  });

  // A sheet with protected ranges gives its columns a style, so its cells take the per-cell path;
  // the flags and the formats must come out right there too.
  it('keeps the locked flag per cell next to the formats (protected range B2:C4 locked, the rest open)', () => {
    const sheet = wb.getWorksheet('Guarded')!;
    for (const [r, c, input] of cells) {
      const cell = sheet.getCell(r + 1, c + 1);
      const inRange = r >= 1 && r <= 3 && c >= 1 && c <= 2;
      expect(cell.protection?.locked !== false, `${cell.address}`).toBe(inRange);
      expect(cell.numFmt ?? 'General', `${cell.address}`).toBe(expectedFormat[input]);
    }
  });

  it('writes a handful of cell formats for thousands of cells', async () => {
    const JSZip = (await import('jszip')).default;
    const styles = await (await JSZip.loadAsync(file)).file('xl/styles.xml')!.async('string');
    const xfs = /<cellXfs count="(\d+)"/.exec(styles);
    expect(Number(xfs?.[1])).toBeLessThanOrEqual(16);
  });
});
