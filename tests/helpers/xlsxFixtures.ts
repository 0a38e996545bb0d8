// Files for the import/export tests, made in the test run: workbooks written by exceljs, zips made
// by jszip, and damaged copies made with a seeded random generator (so a failure can be replayed).
import { PassThrough } from 'node:stream';
import ExcelJS from 'exceljs';
import JSZip from 'jszip';
import { writeWorkbookXlsx, type WriteOptions } from '../../server/xlsx/writeXlsx.js';
import type { ExportWorkbook } from '../../server/xlsx/types.js';
import { seededRandom } from './seededRandom.js';

export async function exportToBuffer(workbook: ExportWorkbook, options: WriteOptions): Promise<Buffer> {
  const out = new PassThrough();
  const chunks: Buffer[] = [];
  out.on('data', (c: Buffer) => chunks.push(c));
  const ended = new Promise((resolve) => out.on('end', resolve));
  await writeWorkbookXlsx(out, workbook, options);
  await ended;
  return Buffer.concat(chunks);
}

/** A plain workbook written by exceljs itself (not by Orbitab's writer): rows of values per sheet. */
export async function plainXlsx(sheets: Record<string, ExcelJS.CellValue[][]>): Promise<Buffer> {
  const wb = new ExcelJS.Workbook();
  for (const [name, rows] of Object.entries(sheets)) {
    const ws = wb.addWorksheet(name);
    rows.forEach((values, r) => values.forEach((v, c) => v !== null && v !== undefined && (ws.getCell(r + 1, c + 1).value = v)));
  }
  return Buffer.from(await wb.xlsx.writeBuffer());
}

/** A numeric grid of rows × cols as .xlsx. */
export async function gridXlsx(rows: number, cols: number): Promise<Buffer> {
  return plainXlsx({ Grid: Array.from({ length: rows }, (_, r) => Array.from({ length: cols }, (_, c) => r * cols + c)) });
}

export async function zipOf(entries: Record<string, string | Uint8Array>, level = 6): Promise<Buffer> {
  const zip = new JSZip();
  for (const [name, data] of Object.entries(entries)) zip.file(name, data);
  return zip.generateAsync({ type: 'nodebuffer', compression: 'DEFLATE', compressionOptions: { level } });
}

const CONTENT_TYPES =
  '<?xml version="1.0" encoding="UTF-8"?><Types xmlns="http://schemas.openxmlformats.org/package/2006/content-types"><Default Extension="xml" ContentType="application/xml"/></Types>';

/** The smallest zip that names itself a workbook, plus one big part. */
export function workbookZipWith(partName: string, part: string | Uint8Array): Promise<Buffer> {
  return zipOf({ '[Content_Types].xml': CONTENT_TYPES, 'xl/workbook.xml': '<workbook/>', [partName]: part }, 9);
}

/**
 * Rewrites the uncompressed size of every entry larger than `size` to `size`, in the local headers
 * and the central directory (APPNOTE 4.3.7 and 4.3.12): a zip whose headers understate how far a part expands.
 */
export function understateSizes(zip: Buffer, size: number): Buffer {
  const out = Buffer.from(zip);
  for (let i = 0; i + 28 <= out.length; i++) {
    const sig = out.readUInt32LE(i);
    const at = sig === 0x04034b50 ? i + 22 : sig === 0x02014b50 ? i + 24 : -1;
    if (at >= 0 && out.readUInt32LE(at) > size) out.writeUInt32LE(size, at);
  }
  return out;
}

export { seededRandom };

export interface DamagedCopy {
  label: string;
  bytes: Buffer;
}

/** Truncated copies and copies with random bytes overwritten, flipped or a block zeroed. */
export function damagedCopies(valid: Buffer, count: number, seed: number): DamagedCopy[] {
  const random = seededRandom(seed);
  const pick = (n: number) => Math.floor(random() * n);
  const copies: DamagedCopy[] = [];
  for (let i = 0; i < count; i++) {
    const bytes = Buffer.from(valid);
    switch (i % 4) {
      case 0: {
        const at = 1 + pick(valid.length - 1);
        copies.push({ label: `truncated at byte ${at}`, bytes: bytes.subarray(0, at) });
        continue;
      }
      case 1: {
        const n = 1 + pick(16);
        for (let k = 0; k < n; k++) bytes[pick(bytes.length)] = pick(256);
        copies.push({ label: `${n} random bytes overwritten`, bytes });
        continue;
      }
      case 2: {
        const at = pick(bytes.length);
        bytes[at] ^= 1 << pick(8);
        copies.push({ label: `one bit flipped at byte ${at}`, bytes });
        continue;
      }
      default: {
        const at = pick(bytes.length);
        const len = 1 + pick(512);
        bytes.fill(0, at, Math.min(bytes.length, at + len));
        copies.push({ label: `${len} bytes zeroed at ${at}`, bytes });
      }
    }
  }
  return copies;
}
