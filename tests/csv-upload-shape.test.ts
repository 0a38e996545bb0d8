// CSV uploads are sized up before any worker reads them: too many cells is refused at once (413
// too_many_cells) from a count of the bytes; a row wider than the reader holds gets Orbitab's own
// message; byte-order marks inside the text do not end up in cells.
import { afterAll, describe, expect, it, vi } from 'vitest';
import { csvShape } from '../server/xlsx/csvCount.js';
import { defaultImportLimits, SpreadsheetError } from '../server/xlsx/limits.js';
import { closeParsePool, parseInWorker } from '../server/xlsx/parseInWorker.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import { ioPool } from '../server/xlsx/workerPool.js';

afterAll(() => closeParsePool());

async function refusal(promise: Promise<unknown>): Promise<SpreadsheetError> {
  try {
    await promise;
  } catch (e) {
    if (e instanceof SpreadsheetError) return e;
    throw e;
  }
  throw new Error('expected a refusal of the file, but it was accepted');
}

describe('counting a CSV from its bytes', () => {
  it('counts the same non-empty cells the reader keeps, for quoting, empty fields, CRLF and blank lines', async () => {
    const samples = [
      'Species,Bond order\nO2,2\nN2,3\n',
      'a,,c\r\n,,\r\n"",x,""""\r\n\r\n"multi\nline",y\n',
      'Name;Value\n"a;b";1\n;\n"c";\n',
      '\uFEFFfirst,second\nthird\n',
      'no newline at end,z',
    ];
    for (const text of samples) {
      const bytes = new TextEncoder().encode(text);
      const delimiter = text.includes(';') ? ';' : ',';
      const read = await readSpreadsheet(Buffer.from(bytes), 'sample.csv');
      expect(csvShape(bytes, delimiter).cells, JSON.stringify(text)).toBe(read.sheets[0].cells.length);
    }
  });

  it('refuses 10.4 million one-character cells (a 20 MB file) with 413 too_many_cells before any worker is asked', async () => {
    const row = Array.from({ length: 1_000 }, () => '1').join(',') + '\n';
    const bytes = Buffer.from(row.repeat(10_400));
    expect(bytes.length).toBeGreaterThan(20_000_000);
    const run = vi.spyOn(ioPool, 'run');
    const e = await refusal(parseInWorker(bytes, 'tiny-cells.csv'));
    expect([e.status, e.code]).toEqual([413, 'too_many_cells']);
    expect(e.message).toMatch(/^the file has more than [\d,]+ cells with content; the limit is 500,000$/);
    expect(run).not.toHaveBeenCalled();
    run.mockRestore();
  });

  it('refuses a row of 100,000 fields with its own message, naming the row and the limits', async () => {
    const bytes = Buffer.from('Header\n' + Array.from({ length: 100_000 }, (_, i) => (i % 100 === 0 ? 'x' : '')).join(',') + '\n');
    const e = await refusal(parseInWorker(bytes, 'wide.csv'));
    expect([e.status, e.code]).toEqual([413, 'too_many_columns']);
    expect(e.message).toBe("row 2 has 100,000 fields; Orbitab reads at most 16,384 fields in a row of a CSV, and its grid has 2,000 columns");
    expect(e.message).not.toMatch(/excel/i);
  });
});

describe('byte-order marks inside a CSV', () => {
  it('removes U+FEFF from cell text anywhere in the file, and says so', async () => {
    // Two exports joined end to end: the second one's mark lands mid-file.
    const text = '\uFEFFSpecies,Bond order\nO2,2\n\uFEFFSpecies,Bond order\nN\uFEFF2,3\n';
    const read = await parseInWorker(Buffer.from(text), 'joined.csv');
    const cells = read.sheets[0].cells;
    expect(cells.map((c) => c[2])).toEqual(['Species', 'Bond order', 'O2', '2', 'Species', 'Bond order', 'N2', '3']);
    expect(cells.some((c) => c[2].includes('\uFEFF'))).toBe(false);
    expect(read.summary.notes).toContain('2 fields held a byte-order mark (U+FEFF) inside the text; it was removed');
  });
});
