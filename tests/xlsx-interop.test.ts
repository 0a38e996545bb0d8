// Interoperability with a real spreadsheet program (Debian's libreoffice-calc, run headless):
// LibreOffice opens Orbitab's values-only export and every value matches the engine's; an .xlsx
// that LibreOffice wrote imports with its values, dates and formulas. Skipped where soffice is absent.
import { execFile, spawnSync } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { promisify } from 'node:util';
import { afterAll, describe, expect, it } from 'vitest';
import { computeWorkbook, isEngineError, type ComputedCell } from '../server/xlsx/engineValues.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import type { CellTriple, ExportWorkbook } from '../server/xlsx/types.js';
import { fileErrorLiteral, isoTextToDate } from '../server/xlsx/xlsxValues.js';
import { exportToBuffer } from './helpers/xlsxFixtures.js';

const soffice = spawnSync('soffice', ['--version'], { encoding: 'utf8', timeout: 60_000 });
const available = soffice.status === 0;
if (!available) console.log('xlsx-interop: skipped — soffice (Debian package libreoffice-calc) is not installed');

const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-interop-'));
afterAll(() => fs.rmSync(dir, { recursive: true, force: true }));

/** Runs one headless conversion with a private profile, so parallel runs cannot share a lock. */
async function convert(file: string, filter: string, extra: string[] = []): Promise<void> {
  await promisify(execFile)(
    'soffice',
    [`-env:UserInstallation=file://${path.join(dir, 'profile')}`, '--headless', ...extra, '--convert-to', filter, '--outdir', dir, file],
    { timeout: 180_000 },
  );
}

/** CSV → rows of raw fields, with Orbitab's own CSV reader (fields arrive as typed text). */
async function csvRows(file: string): Promise<Map<string, string>> {
  const parsed = await readSpreadsheet(fs.readFileSync(file), path.basename(file));
  return new Map(parsed.sheets[0].cells.map(([r, c, text]) => [`${r},${c}`, text]));
}

/** What the engine's value should look like in LibreOffice's CSV (unformatted numbers, dates as shown). */
function matches(cell: ComputedCell, text: string | undefined): boolean {
  const v = cell.value;
  if (isEngineError(v)) return text === fileErrorLiteral(v.value);
  if (typeof v === 'boolean') return text === (v ? 'TRUE' : 'FALSE');
  if (typeof v === 'number') {
    // LibreOffice writes unformatted numbers to about 13 significant digits.
    const n = Number(text);
    return Number.isFinite(n) && Math.abs(n - v) <= 1e-12 * Math.max(1, Math.abs(v));
  }
  if (typeof v === 'string') {
    if (isoTextToDate(v)) return text === v.replace('T', ' ');
    return text === v;
  }
  return text === undefined || text === '';
}

const workbook: ExportWorkbook = {
  title: 'Combustion radicals (invented)',
  revision: 3,
  exportedBy: 'Test',
  exportedAt: new Date('2025-01-15T09:30:00Z'),
  sheets: [
    {
      name: 'Radicals',
      settings: { freezeHeaderRow: true },
      cells: (
        [
          [0, 0, 'Species'], [0, 1, 'Unpaired'], [0, 2, 'Bond order'], [0, 3, 'Measured on'], [0, 4, 'Note'],
          [1, 0, 'OH'], [1, 1, '=UNPAIRED(A2)'], [1, 2, '=BONDORDER(A2)'], [1, 3, '2024-03-01'], [1, 4, 'flame zone, "lean"'],
          [2, 0, 'NO'], [2, 1, '=UNPAIRED(A3)'], [2, 2, '=BONDORDER(A3)'], [2, 3, '2024-03-02T14:30:00'], [2, 4, "'=not a formula"],
          [3, 0, 'O2'], [3, 1, '=UNPAIRED(A4)'], [3, 2, '=BONDORDER(A4)'], [3, 4, 'Hückel π, ±, Å'],
          [4, 0, 'Xq2'], [4, 1, '=UNPAIRED(A5)'], [4, 3, '=1/0'], [4, 4, 'TRUE'],
          [5, 0, 'Total'], [5, 1, '=SUM(B2:B4)'], [5, 2, '=AVERAGE(C2:C4)'], [5, 3, '=1/3'], [5, 4, '6.02214076e+23'],
        ] as CellTriple[]
      ),
    },
    { name: 'Levels', settings: {}, cells: [[0, 0, 'O2'], [1, 0, '=MOTABLE(A1)'], [8, 0, '-0.5'], [8, 1, '=A9*2']] },
  ],
};

describe.skipIf(!available)('LibreOffice and Orbitab files', () => {
  it('opens the values-only export with every value equal to the engine’s', async () => {
    const xlsx = path.join(dir, 'export.xlsx');
    fs.writeFileSync(xlsx, await exportToBuffer(workbook, { mode: 'values' }));
    // CSV filter tokens: comma, double quote, UTF-8, …, not "as shown", no formulas, every sheet to its own file.
    await convert(xlsx, 'csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,false,false,false,-1');
    const computed = computeWorkbook(workbook.sheets);
    let compared = 0;
    for (const sheet of computed.sheets) {
      const fields = await csvRows(path.join(dir, `export-${sheet.name}.csv`));
      for (const cell of sheet.cells) {
        const text = fields.get(`${cell.row},${cell.col}`);
        expect(matches(cell, text), `${sheet.name} row ${cell.row + 1} col ${cell.col + 1}: engine ${String(cell.value)}, LibreOffice "${text}"`).toBe(true);
        compared++;
      }
      // Nothing extra: LibreOffice sees no value the engine did not compute.
      const computedAt = new Set(sheet.cells.map((c) => `${c.row},${c.col}`));
      expect([...fields.keys()].filter((k) => !computedAt.has(k))).toEqual([]);
    }
    expect(compared).toBe(28 + 4 + 17); // inputs of both sheets + the 6×3 MO table minus its anchor
  }, 300_000);

  it('imports an .xlsx that LibreOffice made from CSV, with numbers, dates, text and formulas', async () => {
    const csv = path.join(dir, 'made-by-lo.csv');
    fs.writeFileSync(csv, 'Species,Bond order,Measured on,Note\nO2,2,2024-03-01,"paramagnetic, two unpaired"\nN2,3,2024-03-02,diamagnetic\nMean,=AVERAGE(B2:B3),,TRUE\n');
    await convert(csv, 'xlsx', ['--infilter=CSV:44,34,76,1']);
    const parsed = await readSpreadsheet(fs.readFileSync(path.join(dir, 'made-by-lo.xlsx')), 'made-by-lo.xlsx');
    expect(parsed.summary).toMatchObject({ sheets: 1, cells: 15, formulas: 1, skipped: [] });
    // Read by the direct reader, not handed to exceljs.
    expect(parsed.timing).toMatchObject({ reader: 'direct' });
    expect(parsed.sheets[0].cells).toEqual([
      [0, 0, 'Species'], [0, 1, 'Bond order'], [0, 2, 'Measured on'], [0, 3, 'Note'],
      [1, 0, 'O2'], [1, 1, '2'], [1, 2, '2024-03-01'], [1, 3, 'paramagnetic, two unpaired'],
      [2, 0, 'N2'], [2, 1, '3'], [2, 2, '2024-03-02'], [2, 3, 'diamagnetic'],
      [3, 0, 'Mean'], [3, 1, '=AVERAGE(B2:B3)'], [3, 3, 'TRUE'],
    ]);
    const mean = computeWorkbook(parsed.sheets).sheets[0].cells.find((c) => c.row === 3 && c.col === 1)!;
    expect(mean.value).toBe(2.5);
  }, 300_000);
});
