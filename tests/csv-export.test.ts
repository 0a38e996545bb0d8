// CSV export of one sheet: RFC 4180 quoting, and text that would run as a formula elsewhere escaped
// with a leading apostrophe (OWASP "CSV Injection" guidance), numbers left as numbers.
import { PassThrough, Writable } from 'node:stream';
import { describe, expect, it } from 'vitest';
import { computeWorkbook, type ComputedCell } from '../server/xlsx/engineValues.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import type { CellTriple } from '../server/xlsx/types.js';
import { csvField, escapeFormulaTrigger, writeSheetCsv } from '../server/xlsx/writeCsv.js';

async function csvOf(cells: CellTriple[]): Promise<string> {
  const computed = computeWorkbook([{ name: 'S', cells }]).sheets[0].cells;
  const out = new PassThrough();
  const chunks: Buffer[] = [];
  out.on('data', (c: Buffer) => chunks.push(c));
  await writeSheetCsv(out, computed);
  return Buffer.concat(chunks).toString('utf8');
}

describe('the formula-injection rule', () => {
  it.each([
    ['=HYPERLINK("http://example.com")', '\'=HYPERLINK("http://example.com")'],
    ['+cmd', "'+cmd"],
    ['-2+3+cmd', "'-2+3+cmd"],
    ['@SUM(A1)', "'@SUM(A1)"],
    ['\tleading tab', "'\tleading tab"],
    ['\rleading return', "'\rleading return"],
  ])('prefixes %j with an apostrophe', (text, escaped) => {
    expect(escapeFormulaTrigger(text)).toBe(escaped);
  });

  it('leaves ordinary text alone', () => {
    for (const text of ['O2', 'superoxide O2-', 'a=b', '', "'already quoted"]) expect(escapeFormulaTrigger(text)).toBe(text);
  });
});

describe('RFC 4180 fields', () => {
  it('quotes fields holding a comma, a quote or a line break, doubling quotes', () => {
    expect(csvField('plain')).toBe('plain');
    expect(csvField('NO, nitric oxide')).toBe('"NO, nitric oxide"');
    expect(csvField('the "π" system')).toBe('"the ""π"" system"');
    expect(csvField('two\nlines')).toBe('"two\nlines"');
  });
});

describe('writeSheetCsv', () => {
  it('writes computed values, not formulas, in a grid with CRLF line ends and a byte-order mark', async () => {
    const csv = await csvOf([
      [0, 0, 'Species'], [0, 1, 'Bond order'], [0, 2, 'Formula text'],
      [1, 0, 'O2'], [1, 1, '=BONDORDER(A2)'], [1, 2, "'=BONDORDER(A2)"],
      [2, 0, 'N2'], [2, 1, '=BONDORDER(A3)'],
      [4, 1, '-5'], [4, 2, "'-5"],
    ]);
    // O2 bond order 2, N2 bond order 3 (Atkins & de Paula, Physical Chemistry, "Molecular structure").
    expect(csv).toBe('\uFEFFSpecies,Bond order,Formula text\r\nO2,2,\'=BONDORDER(A2)\r\nN2,3,\r\n,,\r\n,-5,\'-5\r\n');
  });

  it('writes booleans, errors, ISO dates and times as text a spreadsheet reads back', async () => {
    const csv = await csvOf([[0, 0, 'TRUE'], [0, 1, '=1/0'], [0, 2, '2024-03-01'], [0, 3, '=BONDORDER("Xq2")'], [0, 4, '6.02214076e+23'], [0, 5, '14:30'], [0, 6, '31/12/2024']]);
    expect(csv).toBe('\uFEFFTRUE,#DIV/0!,2024-03-01,#VALUE!,6.02214076e+23,14:30:00,2024-12-31\r\n');
  });

  it('reads back through the CSV importer to the same values, escaped text still text', async () => {
    const cells: CellTriple[] = [[0, 0, "'=2+3"], [0, 1, '=2+3'], [1, 0, 'NO, "nitric" oxide'], [1, 1, '-0.5'], [2, 0, "'@risk"]];
    const parsed = await readSpreadsheet(Buffer.from(await csvOf(cells)), 'back.csv');
    const values = (c: CellTriple[]) => computeWorkbook([{ name: 'S', cells: c }]).sheets[0].cells.map((x) => [x.row, x.col, x.value]);
    expect(values(parsed.sheets[0].cells)).toEqual([[0, 0, '=2+3'], [0, 1, 5], [1, 0, 'NO, "nitric" oxide'], [1, 1, -0.5], [2, 0, '@risk']]);
  });

  it('streams a 100,000-row sheet in pieces, waiting for a slow reader to drain', async () => {
    const cells: ComputedCell[] = Array.from({ length: 100_000 }, (_, r) => ({ row: r, col: 0, input: String(r), value: r }));
    let bytes = 0;
    let drains = 0;
    const slowReader = new Writable({
      highWaterMark: 16 * 1024,
      write(chunk: Buffer, _encoding, done) {
        bytes += chunk.length;
        setImmediate(done);
      },
    });
    slowReader.on('drain', () => drains++);
    await writeSheetCsv(slowReader, cells);
    expect(drains).toBeGreaterThan(10);
    expect(bytes).toBe(3 + cells.reduce((n, c) => n + c.input!.length + 2, 0));
  });
});
