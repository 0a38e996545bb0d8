// The direct .xlsx reader (server/xlsx/readXlsxDirect.ts) against exceljs, the reader it stands in
// for: the same cells, summary and layout on random workbooks exceljs wrote, the shapes other
// programs write (shared formulas without text, inline strings, booleans, errors, styled dates,
// gaps), and the files it hands to exceljs instead.
import ExcelJS from 'exceljs';
import { describe, expect, it } from 'vitest';
import { readSpreadsheet } from '../server/xlsx/read.js';
import { SpreadsheetError } from '../server/xlsx/limits.js';
import type { ParsedWorkbook } from '../server/xlsx/types.js';
import { seededRandom, zipOf } from './helpers/xlsxFixtures.js';

const readBoth = async (file: Buffer): Promise<[ParsedWorkbook, ParsedWorkbook]> => [
  await readSpreadsheet(file, 'f.xlsx'),
  await readSpreadsheet(file, 'f.xlsx', undefined, undefined, { reader: 'exceljs' }),
];
const refusal = (p: Promise<unknown>) => p.then(() => null, (e: unknown) => e);
const withoutTiming = ({ sheets, summary }: ParsedWorkbook) => ({ sheets, summary });

const NS = 'xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main" xmlns:r="http://schemas.openxmlformats.org/officeDocument/2006/relationships"';

/** A workbook as XML parts, the way a program other than exceljs lays them out. */
function handMade(sheets: { name: string; body: string; state?: string }[], extra: Record<string, string> = {}, workbookPr = ''): Promise<Buffer> {
  const parts: Record<string, string> = {
    '[Content_Types].xml': '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/></Types>',
    'xl/workbook.xml': `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<workbook ${NS}>${workbookPr}<sheets>${sheets
      .map((s, i) => `<sheet name="${s.name}" sheetId="${i + 1}"${s.state ? ` state="${s.state}"` : ''} r:id="rId${i + 1}"/>`)
      .join('')}</sheets></workbook>`,
    'xl/_rels/workbook.xml.rels': `<?xml version="1.0" encoding="UTF-8"?>\n<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships">${sheets
      .map((_, i) => `<Relationship Id="rId${i + 1}" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/worksheet" Target="worksheets/sheet${i + 1}.xml"/>`)
      .join('')}</Relationships>`,
    ...extra,
  };
  sheets.forEach((s, i) => (parts[`xl/worksheets/sheet${i + 1}.xml`] = `<?xml version="1.0" encoding="UTF-8" standalone="yes"?>\n<worksheet ${NS}>${s.body}</worksheet>`));
  return zipOf(parts);
}

const STYLES = `<styleSheet ${NS}><numFmts count="1"><numFmt numFmtId="164" formatCode="yyyy\\-mm\\-dd hh:mm"/></numFmts><fonts count="1"><font><sz val="11"/><name val="Calibri"/></font></fonts><fills count="1"><fill><patternFill patternType="none"/></fill></fills><borders count="1"><border><left/><right/><top/><bottom/><diagonal/></border></borders><cellStyleXfs count="1"><xf numFmtId="0" fontId="0" fillId="0" borderId="0"/></cellStyleXfs><cellXfs count="4"><xf numFmtId="0" fontId="0"/><xf numFmtId="14" fontId="0" applyNumberFormat="1"/><xf numFmtId="164" fontId="0"><alignment horizontal="left"/></xf><xf numFmtId="2" fontId="0"/></cellXfs></styleSheet>`;
const STRINGS = `<sst ${NS} count="4" uniqueCount="4"><si><t>Species</t></si><si><t xml:space="preserve"> lean &amp; "rich" </t></si><si><r><rPr><b/></rPr><t>O</t></r><r><rPr><vertAlign val="subscript"/></rPr><t>2</t></r><rPh sb="0" eb="1"><t>ignored</t></rPh></si><si><t>line_x000D_break</t></si></sst>`;

describe('files laid out as other programs write them', () => {
  it('reads shared formulas without text, inline and rich strings, booleans, errors, styled dates and gaps', async () => {
    const sheet = `<dimension ref="A1:Z100"/><sheetViews><sheetView workbookViewId="0"><pane xSplit="1" ySplit="2" topLeftCell="B3" state="frozen"/></sheetView></sheetViews><cols><col min="2" max="3" width="20.5" customWidth="1"/><col min="5" max="5" hidden="1"/></cols><sheetData>
<row r="1" spans="1:6"><c r="A1" t="s"><v>0</v></c><c r="B1" t="s"><v>1</v></c><c r="C1" t="s"><v>2</v></c><c r="D1" t="s"><v>3</v></c><c r="E1" s="3"/></row>
<row r="2"><c r="A2"><v>2</v></c><c r="B2"><f t="shared" ref="B2:B4" si="0">A2*2+$A$2</f><v>6</v></c><c r="C2" t="inlineStr"><is><t>inline &lt;text&gt;</t></is></c><c r="D2" t="inlineStr"><is><r><t>N</t></r><r><rPr><b/></rPr><t>2</t></r></is></c></row>
<row r="3"><c r="A3"><v>1.5E-3</v></c><c r="B3"><f t="shared" si="0"/><v>3</v></c><c r="C3" t="b"><v>1</v></c><c r="D3" t="b"><v>0</v></c><c r="E3" t="e"><v>#DIV/0!</v></c></row>
<row r="4"><c r="A4" s="1"><v>45352</v></c><c r="B4"><f t="shared" si="0"/></c><c r="C4" s="2"><v>45352.75</v></c><c r="D4" s="3"><v>0.1</v></c></row>
<row r="7"><c r="E7" t="str"><f>_xlfn.CONCAT("a",_xlfn.TEXTJOIN(",",TRUE,"b"))</f><v>ab</v></c><c r="F7"><f>6.022E+23*2</f><v>1.2044E+24</v></c><c r="G7" t="str"><v>007</v></c></row>
<row r="100"><c r="Z100"><v>-0</v></c></row>
</sheetData><mergeCells count="1"><mergeCell ref="A7:D8"/></mergeCells>`;
    const file = await handMade([{ name: 'Screen', body: sheet }], { 'xl/sharedStrings.xml': STRINGS, 'xl/styles.xml': STYLES });
    const [direct, viaExceljs] = await readBoth(file);
    expect(direct.timing).toMatchObject({ reader: 'direct' });
    expect(direct.sheets[0].cells).toEqual([
      [0, 0, 'Species'], [0, 1, ' lean & "rich" '], [0, 2, 'O2'], [0, 3, 'line\rbreak'],
      [1, 0, '2'], [1, 1, '=A2*2+$A$2'], [1, 2, 'inline <text>'], [1, 3, 'N2'],
      [2, 0, '0.0015'], [2, 1, '=A3*2+$A$2'], [2, 2, 'TRUE'], [2, 3, 'FALSE'], [2, 4, '#DIV/0!'],
      // 45352 is 2024-03-01 in the 1900 date system (serial days from 1899-12-30; common practice).
      [3, 0, '2024-03-01'], [3, 1, '=A4*2+$A$2'], [3, 2, '2024-03-01T18:00:00'], [3, 3, '0.1'],
      [6, 4, '=CONCAT("a",TEXTJOIN(",",TRUE,"b"))'], [6, 5, '=6.022E+23*2'], [6, 6, "'007"],
      [99, 25, '0'],
    ]);
    expect(direct.sheets[0]).toMatchObject({ name: 'Screen', frozenRows: 2, frozenCols: 1, merged: ['A7:D8'], columnWidths: { 1: 20.5, 2: 20.5, 4: 9 } });
    expect(direct.summary).toMatchObject({ sheets: 1, cells: 21, formulas: 5, skipped: [] });
    expect(withoutTiming(direct)).toEqual(withoutTiming(viaExceljs));
  });

  it('keeps a merged range’s covered cells out, a link’s text with a note, and a hidden sheet visible', async () => {
    const sheet = `<sheetData><row r="1"><c r="A1" t="inlineStr"><is><t>head</t></is></c><c r="B1" t="inlineStr"><is><t>covered</t></is></c></row><row r="2"><c r="A2" t="inlineStr"><is><t>safety data</t></is></c><c r="B2"><v>12</v></c></row></sheetData><mergeCells count="1"><mergeCell ref="A1:B1"/></mergeCells><hyperlinks><hyperlink ref="A2" r:id="rId1"/><hyperlink ref="B2" location="Other!A1"/></hyperlinks>`;
    const rels = '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Type="http://schemas.openxmlformats.org/officeDocument/2006/relationships/hyperlink" Target="https://example.com/sds" TargetMode="External"/></Relationships>';
    const file = await handMade([{ name: 'Shown', body: '<sheetData><row r="1"><c r="A1"><v>1</v></c></row></sheetData>' }, { name: 'Links', body: sheet, state: 'hidden' }], { 'xl/worksheets/_rels/sheet2.xml.rels': rels });
    const [direct, viaExceljs] = await readBoth(file);
    expect(direct.timing).toMatchObject({ reader: 'direct' });
    expect(direct.sheets[1].cells).toEqual([[0, 0, 'head'], [1, 0, 'safety data'], [1, 1, '12']]);
    expect(direct.summary.notes).toEqual(['sheet "Links" was hidden in the file; it is imported visible', 'Links!A2: link target https://example.com/sds not kept']);
    expect(withoutTiming(direct)).toEqual(withoutTiming(viaExceljs));
  });

  it('reads dates of a 1904 workbook as the same calendar dates', async () => {
    const file = await handMade([{ name: 'D', body: '<sheetData><row r="1"><c r="A1" s="1"><v>43890</v></c></row></sheetData>' }], { 'xl/styles.xml': STYLES }, '<workbookPr date1904="1"/>');
    const [direct, viaExceljs] = await readBoth(file);
    // 43890 days after 1904-01-01 is 2024-03-01 (1462 days separate the two systems; common practice).
    expect(direct.sheets[0].cells).toEqual([[0, 0, '2024-03-01']]);
    expect(withoutTiming(direct)).toEqual(withoutTiming(viaExceljs));
  });
});

describe('files the direct reader hands to exceljs', () => {
  it('cells out of order: read by exceljs, which puts them in order', async () => {
    const file = await handMade([{ name: 'S', body: '<sheetData><row r="2"><c r="A2"><v>2</v></c></row><row r="1"><c r="A1"><v>1</v></c></row></sheetData>' }]);
    const [direct, viaExceljs] = await readBoth(file);
    expect(direct.timing).toMatchObject({ reader: 'exceljs', fallback: 'cells out of order' });
    expect(direct.sheets[0].cells).toEqual([[0, 0, '1'], [1, 0, '2']]);
    expect(withoutTiming(direct)).toEqual(withoutTiming(viaExceljs));
  });

  it('a namespace prefix on the worksheet: handed to exceljs, which refuses it as before', async () => {
    const file = await zipOf({
      'xl/workbook.xml': `<workbook ${NS}><sheets><sheet name="P" sheetId="1" r:id="rId1"/></sheets></workbook>`,
      'xl/_rels/workbook.xml.rels': '<Relationships xmlns="http://schemas.openxmlformats.org/package/2006/relationships"><Relationship Id="rId1" Target="worksheets/sheet1.xml"/></Relationships>',
      'xl/worksheets/sheet1.xml': '<x:worksheet xmlns:x="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><x:sheetData><x:row r="1"><x:c r="A1"><x:v>1</x:v></x:c></x:row></x:sheetData></x:worksheet>',
    });
    const [direct, viaExceljs] = await Promise.all([refusal(readSpreadsheet(file, 'p.xlsx')), refusal(readSpreadsheet(file, 'p.xlsx', undefined, undefined, { reader: 'exceljs' }))]);
    expect(direct).toBeInstanceOf(SpreadsheetError);
    expect((direct as SpreadsheetError).message).toBe((viaExceljs as SpreadsheetError).message);
  });

  it('overlapping merged ranges: refused as damaged, in exceljs’s words, as before', async () => {
    const file = await handMade([{ name: 'M', body: '<sheetData><row r="1"><c r="A1"><v>1</v></c></row></sheetData><mergeCells count="2"><mergeCell ref="A1:B2"/><mergeCell ref="B2:C3"/></mergeCells>' }]);
    const direct = await refusal(readSpreadsheet(file, 'm.xlsx'));
    const viaExceljs = await refusal(readSpreadsheet(file, 'm.xlsx', undefined, undefined, { reader: 'exceljs' }));
    expect(direct).toBeInstanceOf(SpreadsheetError);
    expect((direct as SpreadsheetError).code).toBe('damaged_file');
    expect((direct as SpreadsheetError).message).toBe((viaExceljs as SpreadsheetError).message);
  });
});

/** A random workbook exceljs writes: values of every kind, formulas (plain, shared, array), merges, links, layout. */
async function randomWorkbook(seed: number): Promise<Buffer> {
  const random = seededRandom(seed);
  const pick = <T>(xs: readonly T[]) => xs[Math.floor(random() * xs.length)];
  const int = (n: number) => Math.floor(random() * n);
  const texts = ['O2', 'N2+', '007', 'TRUE', '#N/A', '=cmd', "'quoted", ' lead', 'trail ', 'a < b & c > "d"', 'Hückel π ±', '1,5', '12%', '$3', '2024-03-01', 'x_x000D_y', '', 'E3'];
  const wb = new ExcelJS.Workbook();
  if (random() < 0.3) wb.properties.date1904 = true;
  const sheets = 1 + int(3);
  for (let s = 0; s < sheets; s++) {
    const ws = wb.addWorksheet(`Sheet ${s + 1}`, { state: random() < 0.15 ? 'hidden' : 'visible', views: random() < 0.4 ? [{ state: 'frozen', xSplit: int(3), ySplit: int(4) }] : [] });
    const rows = 1 + int(30);
    const cols = 1 + int(8);
    for (let c = 1; c <= cols; c++) if (random() < 0.3) ws.getColumn(c).width = 5 + int(300) / 10;
    const taken = new Set<string>();
    for (let r = 1; r <= rows; r++) {
      for (let c = 1; c <= cols; c++) {
        if (random() < 0.35) continue; // gaps
        const cell = ws.getCell(r, c);
        taken.add(cell.address);
        switch (int(11)) {
          case 0:
            cell.value = pick([0, -1, 2.5, 1e-7, 6.02214076e23, -0.000123, 12345678901234, Math.PI]);
            break;
          case 1:
            cell.value = pick(texts);
            break;
          case 2:
            cell.value = { richText: [{ text: pick(texts), font: { bold: true } }, { text: pick(texts) }] };
            break;
          case 3:
            cell.value = random() < 0.5;
            break;
          case 4:
            cell.value = { error: pick(['#N/A', '#DIV/0!', '#REF!', '#NAME?', '#VALUE!']) } as ExcelJS.CellErrorValue;
            break;
          case 5:
            cell.value = new Date(Date.UTC(1990 + int(40), int(12), 1 + int(28), int(24), int(60)));
            cell.numFmt = pick(['yyyy-mm-dd', 'dd/mm/yyyy hh:mm', 'h:mm:ss']);
            break;
          case 6:
            cell.value = { formula: pick(['A1*2', 'SUM(A1:B3)', '"x"&A1', '_xlfn.CONCAT("a","b")', '6.022E23*2', 'IF(A1>0,"pos","neg")']), result: 1 } as ExcelJS.CellValue;
            break;
          case 7:
            cell.value = { text: pick(texts) || 'link', hyperlink: `https://example.com/${int(100)}` } as ExcelJS.CellValue;
            break;
          case 8:
            cell.value = int(1000) / 8;
            cell.numFmt = pick(['0.00', '#,##0', '0%', '@']);
            break;
          default:
            cell.value = pick(texts);
        }
      }
    }
    // A shared formula down a fresh column, and an array formula in another.
    const sharedCol = cols + 1;
    const length = 1 + int(5);
    ws.getCell(1, sharedCol).value = { formula: `A1*${1 + int(9)}+$B$1`, result: 0, shareType: 'shared', ref: `${ws.getCell(1, sharedCol).address}:${ws.getCell(length, sharedCol).address}` } as ExcelJS.CellValue;
    for (let r = 2; r <= length; r++) ws.getCell(r, sharedCol).value = { sharedFormula: ws.getCell(1, sharedCol).address, result: 0 } as ExcelJS.CellValue;
    if (random() < 0.5) {
      const at = ws.getCell(1, sharedCol + 1);
      at.value = { formula: 'TRANSPOSE({1,2,3})', result: 1, shareType: 'array', ref: `${at.address}:${ws.getCell(3, sharedCol + 1).address}` } as ExcelJS.CellValue;
      ws.getCell(2, sharedCol + 1).value = 2;
    }
    if (random() < 0.5) {
      const top = rows + 2 + int(3);
      ws.mergeCells(top, 1, top + int(2), 2 + int(2));
      ws.getCell(top, 1).value = 'merged head';
    }
    if (random() < 0.1) ws.getCell(1, 2001).value = 'past the grid';
  }
  return Buffer.from(await wb.xlsx.writeBuffer());
}

describe('the direct reader and exceljs on random workbooks exceljs wrote', () => {
  it('give the same cells, summary and layout on 60 workbooks', async () => {
    for (let seed = 1; seed <= 60; seed++) {
      const file = await randomWorkbook(seed);
      const [direct, viaExceljs] = await readBoth(file);
      expect(direct.timing, `seed ${seed}`).toMatchObject({ reader: 'direct' });
      expect(withoutTiming(direct), `seed ${seed}`).toEqual(withoutTiming(viaExceljs));
    }
  }, 120_000);
});
