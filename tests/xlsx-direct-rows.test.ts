// The export writes most rows straight as XML (server/xlsx/directRows.ts) instead of through
// exceljs's cell objects. The file must be the one exceljs itself writes: every part of it (sheets,
// shared strings, styles, comments, workbook) byte for byte, for random workbooks that mix every
// kind of value the export writes with notes, merges, protection, column widths and frozen panes.
import JSZip from 'jszip';
import { describe, expect, it } from 'vitest';
import type { CellTriple, ExportSheet, ExportWorkbook } from '../server/xlsx/types.js';
import { exportToBuffer } from './helpers/xlsxFixtures.js';
import { seededRandom } from './helpers/seededRandom.js';

/** Inputs of every kind the writer meets (invented); the engine computes the formulas. */
const INPUTS = [
  '42.5',
  '-0',
  '6.02214076e+23',
  '1e-300',
  '0.1',
  'plain text',
  'a & b < c > d "quoted" \'single\'',
  'tab\there, newline\nthere',
  'σ/π ordering, Ψ²',
  '  spaced  ',
  'TRUE',
  'FALSE',
  '2024-05-06',
  '2024-05-06T08:15:00',
  '09:45:00',
  '=1/0',
  '=NA()',
  '=NOSUCHFUNCTION(1)',
  '=2*21',
  '="x&y<z"',
  '=""',
  '=TRUE()',
  '=1=2',
  '=DATE(2024,5,7)',
  '=SEQUENCE(2,2)',
  '=BONDORDER("O2")',
  '=GROUNDTERM("NO")',
  '=UNPAIRED("B2")',
  '=CONCATENATE("<",A1,">")',
  '=SUM(A1:B2)',
];

function randomSheet(random: () => number, name: string): ExportSheet {
  const rows = 5 + Math.floor(random() * 60);
  const cols = 1 + Math.floor(random() * 8);
  const cells: CellTriple[] = [];
  const taken = new Set<string>();
  for (let r = 0; r < rows; r++) {
    if (random() < 0.15) continue; // gaps between rows
    for (let c = 0; c < cols; c++) {
      if (random() < 0.3) continue;
      // Leave room for the 2 × 2 spills: nothing right of or below a SEQUENCE.
      if (taken.has(`${r},${c}`)) continue;
      const input = INPUTS[Math.floor(random() * INPUTS.length)];
      if (input.startsWith('=SEQUENCE')) {
        if (['0,1', '1,0', '1,1'].some((d) => { const [dr, dc] = d.split(',').map(Number); return taken.has(`${r + dr},${c + dc}`) || cells.some(([rr, cc]) => rr === r + dr && cc === c + dc); })) continue;
        for (const [dr, dc] of [[0, 1], [1, 0], [1, 1]]) taken.add(`${r + dr},${c + dc}`);
      }
      taken.add(`${r},${c}`);
      cells.push([r, c, input]);
    }
  }
  cells.sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  const settings: ExportSheet['settings'] = {};
  if (random() < 0.5) settings.columnWidths = { 0: 80 + Math.floor(random() * 100), 3: 140 };
  if (random() < 0.3) {
    settings.frozenRows = 1;
    settings.frozenCols = random() < 0.5 ? 1 : 0;
  }
  // A merge over empty cells below the data, or over a row of its own: exceljs holds those rows.
  if (random() < 0.4) settings.merged = [`K${rows + 3}:L${rows + 5}`, `M2:N3`];
  const sheet: ExportSheet = { name, cells, settings };
  const kind = random();
  if (kind < 0.2) sheet.protectedRanges = [{ range: 'B2:C4', editorNames: ['Someone'] }];
  else if (kind < 0.3) sheet.protectedRanges = [{ range: 'C:C', editorNames: ['Someone'] }];
  else if (kind < 0.4) sheet.lock = { lockedByName: 'Lead', reason: 'checked', editorNames: [] };
  return sheet;
}

async function partsOf(file: Buffer): Promise<Map<string, string>> {
  const zip = await JSZip.loadAsync(file);
  const parts = new Map<string, string>();
  for (const f of Object.values(zip.files)) if (!f.dir) parts.set(f.name, await f.async('string'));
  return parts;
}

async function bothWays(workbook: ExportWorkbook, mode: 'formulas' | 'values') {
  const direct = await partsOf(await exportToBuffer(workbook, { mode }));
  const viaExceljs = await partsOf(await exportToBuffer(workbook, { mode, directRows: false }));
  return { direct, viaExceljs };
}

const workbookOf = (sheets: ExportSheet[]): ExportWorkbook => ({ title: 'Direct rows (invented)', revision: 7, exportedBy: 'Test', exportedAt: new Date('2025-03-01T09:00:00Z'), sheets });

describe('rows written straight as XML', () => {
  it('give the same file as exceljs, part for part, over 40 random workbooks in both modes', async () => {
    const random = seededRandom(20261205);
    let sheetsWithNotes = 0;
    for (let n = 0; n < 40; n++) {
      const sheets = Array.from({ length: 1 + Math.floor(random() * 3) }, (_, i) => randomSheet(random, `Sheet ${i + 1}`));
      const mode = n % 2 ? 'values' : 'formulas';
      const { direct, viaExceljs } = await bothWays(workbookOf(sheets), mode);
      expect([...direct.keys()].sort(), `workbook ${n}`).toEqual([...viaExceljs.keys()].sort());
      for (const [name, text] of viaExceljs) expect(direct.get(name), `workbook ${n} (${mode}), part ${name}`).toBe(text);
      sheetsWithNotes += [...direct.keys()].filter((k) => k.includes('comments')).length;
    }
    // The mix did reach rows that take exceljs's own path (error notes).
    expect(sheetsWithNotes).toBeGreaterThan(10);
  }, 120_000);

  it('give the same file past the note limit, where error rows go straight again', async () => {
    const cells: CellTriple[] = [];
    for (let r = 0; r < 1_100; r++) cells.push([r, 0, '=1/0'], [r, 1, String(r)], [r, 2, 'label']);
    const { direct, viaExceljs } = await bothWays(workbookOf([{ name: 'Errors', cells, settings: {} }]), 'formulas');
    for (const [name, text] of viaExceljs) expect(direct.get(name), name).toBe(text);
    expect(direct.get('xl/worksheets/sheet2.xml')).toContain('<c r="A1100"');
  }, 60_000);

  it('write the cells’ XML for the kinds they take (a check that does not lean on exceljs)', async () => {
    const cells: CellTriple[] = [
      [0, 0, '1.5'],
      [0, 1, 'a<b'],
      [0, 2, 'TRUE'],
      [0, 3, '=2*21'],
      [0, 4, '="x&y"'],
      [1, 0, '=SEQUENCE(2,1)'],
    ];
    const { direct } = await bothWays(workbookOf([{ name: 'Kinds', cells, settings: {} }]), 'formulas');
    const sheet = direct.get('xl/worksheets/sheet2.xml')!;
    expect(sheet).toContain('<row r="1" spans="1:5" x14ac:dyDescent="0.25"><c r="A1"><v>1.5</v></c><c r="B1" t="s"><v>');
    expect(sheet).toContain('<c r="C1" t="b"><v>1</v></c><c r="D1"><f>2*21</f><v>42</v></c><c r="E1" t="str"><f>&quot;x&amp;y&quot;</f><v>x&amp;y</v></c></row>');
    expect(sheet).toContain('<c r="A2"><f t="array" ref="A2:A3">SEQUENCE(2,1)</f><v>1</v></c>');
    expect(direct.get('xl/sharedStrings.xml')).toContain('a&lt;b');
  });
});
