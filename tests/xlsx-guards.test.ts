// Every class of bad upload gets a clear refusal (400/413 with the reason), checked before exceljs
// inflates anything; the worker's memory and time limits hold; damaged files never crash or hang.
import { Worker } from 'node:worker_threads';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { afterAll, describe, expect, it } from 'vitest';
import { defaultImportLimits, SpreadsheetError } from '../server/xlsx/limits.js';
import { closeParsePool, parseInWorker } from '../server/xlsx/parseInWorker.js';
import { readSpreadsheet } from '../server/xlsx/read.js';
import { damagedCopies, gridXlsx, plainXlsx, understateSizes, workbookZipWith, zipOf } from './helpers/xlsxFixtures.js';
import type { FuzzOutcome } from './helpers/fuzzWorker.js';

afterAll(() => closeParsePool());

async function refusal(promise: Promise<unknown>): Promise<SpreadsheetError> {
  try {
    await promise;
  } catch (e) {
    if (e instanceof SpreadsheetError) return e;
    throw new Error(`expected a refusal of the file, got ${String(e)}`);
  }
  throw new Error('expected a refusal of the file, but it was accepted');
}

const MiB = 1024 * 1024;

describe('files that are not spreadsheets', () => {
  it('refuses a picture, naming the formats it reads', async () => {
    const png = Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0, 0, 0, 13]);
    const e = await refusal(readSpreadsheet(png, 'spectrum.png'));
    expect([e.status, e.code]).toEqual([400, 'not_a_spreadsheet']);
    expect(e.message).toMatch(/upload an \.xlsx workbook, a \.csv file, or structures as \.sdf, \.mol or \.xyz/);
  });

  it('refuses text named .xlsx, saying it is not a zip archive', async () => {
    const e = await refusal(readSpreadsheet(Buffer.from('Species,Bond order\nO2,2\n'), 'list.xlsx'));
    expect(e.code).toBe('not_a_spreadsheet');
    expect(e.message).toMatch(/not a zip archive/);
  });

  it('refuses an empty file', async () => {
    expect((await refusal(readSpreadsheet(Buffer.alloc(0), 'empty.csv'))).message).toBe('the file is empty');
  });

  it('tells a word-processor document and an OpenDocument file from a workbook', async () => {
    const docx = await zipOf({ '[Content_Types].xml': '<Types/>', 'word/document.xml': '<document/>' });
    expect((await refusal(readSpreadsheet(docx, 'report.xlsx'))).message).toMatch(/word-processor document/);
    const ods = await zipOf({ mimetype: 'application/vnd.oasis.opendocument.spreadsheet', 'content.xml': '<x/>' });
    expect((await refusal(readSpreadsheet(ods, 'list.ods'))).message).toMatch(/OpenDocument .*save it as \.xlsx/);
  });
});

describe('damaged and encrypted files', async () => {
  const valid = await plainXlsx({ Screening: [['Species', 'Bond order'], ['O2', 2]] });

  it('refuses a truncated zip as damaged (400)', async () => {
    const e = await refusal(readSpreadsheet(valid.subarray(0, Math.floor(valid.length * 0.6)), 'cut.xlsx'));
    expect([e.status, e.code]).toEqual([400, 'damaged_file']);
    expect(e.message).toMatch(/zip archive is damaged/);
  });

  it('refuses an OLE compound file (encrypted workbook or legacy .xls) with what to do', async () => {
    const cfb = Buffer.concat([Buffer.from([0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1]), Buffer.alloc(504, 7)]);
    const e = await refusal(readSpreadsheet(cfb, 'secret.xlsx'));
    expect([e.status, e.code]).toEqual([400, 'encrypted_or_legacy']);
    expect(e.message).toMatch(/encrypted \(password-protected\) workbook or a legacy \.xls; remove the password or save it as \.xlsx/);
  });

  it('refuses a zip whose parts are encrypted', async () => {
    const zip = Buffer.from(valid);
    // General-purpose bit 0 (APPNOTE 4.4.4: "the file is encrypted") in every local and central header.
    for (let i = 0; i + 4 <= zip.length; i++) {
      const sig = zip.readUInt32LE(i);
      if (sig === 0x04034b50) zip[i + 6] |= 1;
      if (sig === 0x02014b50) zip[i + 8] |= 1;
    }
    const e = await refusal(readSpreadsheet(zip, 'locked.xlsx'));
    expect(e.code).toBe('encrypted_or_legacy');
  });
});

describe('size, cell and expansion limits', () => {
  it('refuses a file over the upload limit, saying the limit (413)', async () => {
    const big = Buffer.alloc(defaultImportLimits.maxFileBytes + 1);
    big.write('PK\x03\x04', 'latin1');
    const e = await refusal(readSpreadsheet(big, 'huge.xlsx'));
    expect([e.status, e.code]).toEqual([413, 'file_too_large']);
    expect(e.message).toBe('the file is 20 MB; the limit is 20 MB');
  });

  it('refuses a workbook with more cells than the limit before building them (413)', async () => {
    const file = await gridXlsx(11, 10);
    const e = await refusal(readSpreadsheet(file, 'grid.xlsx', { ...defaultImportLimits, maxCells: 100 }));
    expect([e.status, e.code]).toEqual([413, 'too_many_cells']);
    expect(e.message).toMatch(/more than 100 cells with content; the limit is 100/);
    expect((await readSpreadsheet(file, 'grid.xlsx', { ...defaultImportLimits, maxCells: 110 })).summary.cells).toBe(110);
  });

  it('refuses a CSV with more cells than the limit', async () => {
    const csv = Buffer.from(Array.from({ length: 11 }, () => '1,2,3,4,5,6,7,8,9,10').join('\n'));
    const e = await refusal(readSpreadsheet(csv, 'grid.csv', { ...defaultImportLimits, maxCells: 100 }));
    expect(e.message).toBe('the file has 110 cells with content; the limit is 100');
  });

  it('refuses a part that expands more than 200× as a decompression bomb, by default limits', async () => {
    const bomb = await workbookZipWith('xl/worksheets/sheet1.xml', ' '.repeat(8 * MiB));
    expect(bomb.length).toBeLessThan(64 * 1024);
    const e = await refusal(readSpreadsheet(bomb, 'small.xlsx'));
    expect([e.status, e.code]).toEqual([413, 'decompression_bomb']);
    expect(e.message).toMatch(/^refused as a decompression bomb: part xl\/worksheets\/sheet1\.xml expands from .* to 8 MB, more than 200× its size$/);
  });

  it('catches a part that expands beyond the size its header declares', async () => {
    const honest = await workbookZipWith('xl/worksheets/sheet1.xml', '<worksheet>' + '<row/>'.repeat(200_000) + '</worksheet>');
    const e = await refusal(readSpreadsheet(understateSizes(honest, 1000), 'liar.xlsx'));
    expect(e.code).toBe('decompression_bomb');
    expect(e.message).toMatch(/expands beyond the 1000 bytes its header declares/);
  });

  it('refuses a workbook whose parts add up to more than the uncompressed limit', async () => {
    const file = await gridXlsx(200, 10);
    const e = await refusal(readSpreadsheet(file, 'grid.xlsx', { ...defaultImportLimits, maxUncompressedBytes: 20_000 }));
    expect(e.code).toBe('decompression_bomb');
    expect(e.message).toMatch(/the limit is 19\.5 KB|expands beyond 19\.5 KB|beyond .* at part/);
  });

  it('refuses a merged range the reader would fill cell by cell (a whole sheet)', async () => {
    const sheet = '<worksheet xmlns="http://schemas.openxmlformats.org/spreadsheetml/2006/main"><sheetData/><mergeCells count="1"><mergeCell ref="A1:XFD1048576"/></mergeCells></worksheet>';
    const e = await refusal(readSpreadsheet(await workbookZipWith('xl/worksheets/sheet1.xml', sheet), 'merged.xlsx'));
    expect([e.status, e.code]).toEqual([413, 'too_complex']);
    expect(e.message).toMatch(/merged ranges covering more than 2,000,000 cells/);
  });

  it('reads a workbook whose data-validation rule covers the whole sheet, quickly (rules are not imported)', async () => {
    const wb = new ExcelJS.Workbook();
    const ws = wb.addWorksheet('Screening');
    ws.getCell('A1').value = 'O2';
    ws.getCell('B1').dataValidation = { type: 'list', allowBlank: true, formulae: ['"yes,no"'] };
    const zip = await JSZip.loadAsync(await wb.xlsx.writeBuffer());
    const xml = await zip.file('xl/worksheets/sheet1.xml')!.async('string');
    expect(xml).toContain('sqref="B1"');
    zip.file('xl/worksheets/sheet1.xml', xml.replace('sqref="B1"', 'sqref="A1:XFD1048576"'));
    const file = await zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE' });
    // Expanding that range cell by cell would not finish (the test's time limit would end it).
    const result = await readSpreadsheet(file, 'validated.xlsx');
    expect(result.sheets[0].cells).toEqual([[0, 0, 'O2']]);
  });
});

describe('the parse worker', () => {
  it('reads an upload in a worker and answers with sheets and a summary', async () => {
    const result = await parseInWorker(await plainXlsx({ Screening: [['Species'], ['O2']] }), 'ok.xlsx');
    expect(result.sheets[0].cells).toEqual([[0, 0, 'Species'], [1, 0, 'O2']]);
    expect(result.stats.workerHeapUsedBytes).toBeGreaterThan(0);
  });

  it('stops a parse that runs past its time limit, and the next upload is read normally', async () => {
    const file = await gridXlsx(3000, 20);
    const e = await refusal(parseInWorker(file, 'slow.xlsx', { workerLimits: { maxOldGenerationSizeMb: 1536, maxYoungGenerationSizeMb: 64, timeoutMs: 30 } }));
    expect([e.status, e.code]).toEqual([413, 'parse_timeout']);
    expect(e.message).toMatch(/took longer than 0\.03 s and was stopped/);
    expect((await parseInWorker(await plainXlsx({ S: [[1]] }), 'next.xlsx')).summary.cells).toBe(1);
  });

  it('ends a parse that needs more memory than its limit without harming the server', async () => {
    // 400,000 cells: the direct reader reads 200,000 within 64 MB (exceljs could not), twice that it cannot.
    const file = await gridXlsx(20_000, 20);
    const e = await refusal(parseInWorker(file, 'heavy.xlsx', { workerLimits: { maxOldGenerationSizeMb: 64, maxYoungGenerationSizeMb: 16, timeoutMs: 120_000 } }));
    expect([e.status, e.code]).toEqual([413, 'parse_out_of_memory']);
    expect(e.message).toMatch(/needed more than the 64 MB of memory a file may use/);
    expect((await parseInWorker(await plainXlsx({ S: [[1]] }), 'next.xlsx')).summary.cells).toBe(1);
  });
});

describe('fuzzing with truncated and corrupted copies of a valid workbook', async () => {
  const valid = await plainXlsx({
    Screening: [['Species', 'Bond order', 'Measured on'], ['O2', { formula: 'BONDORDER(A2)', result: 2 } as ExcelJS.CellValue, new Date('2024-03-01')], ['N2', 3, true]],
    Notes: [['free text, "quoted"'], [{ richText: [{ text: 'rich ' }, { text: 'text' }] } as ExcelJS.CellValue]],
  });

  it('answers every one of 240 damaged files with a result or a 4xx refusal, none taking over 5 s', async () => {
    const copies = damagedCopies(valid, 240, 20250115);
    const worker = new Worker(new URL('../server/xlsx/ioWorkerBoot.mjs', import.meta.url), {
      workerData: { entry: new URL('./helpers/fuzzWorker.ts', import.meta.url).href },
      resourceLimits: { maxOldGenerationSizeMb: 512 },
    });
    const outcomes: FuzzOutcome[] = [];
    try {
      await new Promise<void>((resolve, reject) => {
        const deadline = setTimeout(() => reject(new Error(`stalled after ${outcomes.length} files; next: ${copies[outcomes.length]?.label}`)), 240_000);
        worker.on('message', (m: FuzzOutcome | 'done' | { ready: true }) => {
          if (m === 'done') return clearTimeout(deadline), resolve();
          if ('ready' in m) return worker.postMessage(copies.map((c) => ({ label: c.label, bytes: new Uint8Array(c.bytes) })));
          outcomes.push(m);
        });
        worker.on('error', (e) => (clearTimeout(deadline), reject(e)));
      });
    } finally {
      await worker.terminate();
    }
    expect(outcomes).toHaveLength(240);
    const bad = outcomes.filter((o) => !o.ok && !(o.refusal && (o.status === 400 || o.status === 413)));
    expect(bad).toEqual([]);
    // The damage is real: most copies are refused, and each refusal names what is wrong.
    const refused = outcomes.filter((o) => !o.ok);
    expect(refused.length).toBeGreaterThan(120);
    for (const o of refused) expect(o.ok === false && o.message.length).toBeGreaterThan(10);
  }, 300_000);

  it('answers damaged files sent through the upload worker with a refusal or a result', async () => {
    for (const copy of damagedCopies(valid, 6, 7)) {
      const outcome = await parseInWorker(copy.bytes, 'fuzzed.xlsx').then(
        () => 'read',
        (e) => (e instanceof SpreadsheetError && e.status < 500 ? 'refused' : `failed: ${String(e)}`),
      );
      expect(['read', 'refused'], copy.label).toContain(outcome);
    }
  }, 120_000);
});
