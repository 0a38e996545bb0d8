// Checks an .xlsx zip before exceljs sees it. exceljs inflates every part whole, with no limit, and
// expands merged ranges, data-validation ranges and column spans cell by cell; so a small file can
// ask for gigabytes or never finish (data validations we let exceljs skip: see readXlsx.ts). Here we read the central directory (jszip, no inflating), then
// inflate each part with zlib under a hard output cap, which also catches headers that lie about size.
import zlib from 'node:zlib';
import JSZip from 'jszip';
import { parseRangeName, rangeArea } from '../../shared/a1.js';
import { formatBytes, SpreadsheetError, type ImportLimits } from './limits.js';

export interface ZipInspection {
  entries: number;
  uncompressedBytes: number;
  /** Cells with content (closing </c> tags) per worksheet part. */
  cellTagsByPart: Record<string, number>;
  /** Every part inflated, by name (leading slashes dropped), for the direct reader; null when two names collide that way. */
  parts: Map<string, Buffer> | null;
}

interface JsZipInternals {
  compressedSize: number;
  uncompressedSize: number;
  compression: { magic: string };
  compressedContent: Uint8Array;
}

const DEFLATE = '\x08\x00';
const STORE = '\x00\x00';
const EXCEL_MAX_COLUMNS = 16_384;
const MAX_CHUNK = 64 * 1024 * 1024;

export async function inspectXlsxZip(buffer: Buffer, limits: ImportLimits): Promise<ZipInspection> {
  let zip: JSZip;
  try {
    zip = await JSZip.loadAsync(buffer, { checkCRC32: false, createFolders: false });
  } catch (e) {
    const message = e instanceof Error ? e.message : String(e);
    if (/encrypted/i.test(message)) throw new SpreadsheetError('encrypted_or_legacy', 'the zip archive is encrypted; remove the password and upload again');
    throw new SpreadsheetError('damaged_file', `the zip archive is damaged and cannot be read (${message})`);
  }
  const files = Object.values(zip.files).filter((f) => !f.dir);
  if (files.length > limits.maxZipEntries) {
    throw new SpreadsheetError('too_complex', `the archive holds ${files.length} parts; the limit is ${limits.maxZipEntries}`);
  }
  // Some writers store part names with a leading slash; exceljs strips it, and so do we.
  const partName = (f: JSZip.JSZipObject) => f.name.replace(/^\/+/, '');
  const names = new Set(files.map(partName));
  if (!names.has('xl/workbook.xml')) throw notWorkbook(names);

  let declaredTotal = 0;
  for (const f of files) {
    const d = (f as unknown as { _data: JsZipInternals })._data;
    declaredTotal += d.uncompressedSize;
    if (d.uncompressedSize > limits.ratioCheckFromBytes && d.uncompressedSize / Math.max(1, d.compressedSize) > limits.maxCompressionRatio) {
      throw bomb(`part ${f.name} expands from ${formatBytes(d.compressedSize)} to ${formatBytes(d.uncompressedSize)}, more than ${limits.maxCompressionRatio}× its size`);
    }
  }
  if (declaredTotal > limits.maxUncompressedBytes) {
    throw bomb(`the file would expand to ${formatBytes(declaredTotal)}; the limit is ${formatBytes(limits.maxUncompressedBytes)}`);
  }

  const cellTagsByPart: Record<string, number> = {};
  let realTotal = 0;
  let cells = 0;
  let parts: Map<string, Buffer> | null = new Map();
  for (const f of files) {
    const d = (f as unknown as { _data: JsZipInternals })._data;
    const xml = inflatePart(f.name, d, limits.maxUncompressedBytes - realTotal);
    realTotal += xml.length;
    if (parts?.has(partName(f))) parts = null;
    parts?.set(partName(f), xml);
    if (/^xl\/worksheets\/[^/]+\.xml$/.test(partName(f))) {
      const prefix = namespacePrefix(xml);
      const count = countOccurrences(xml, `</${prefix}c>`);
      cellTagsByPart[f.name] = count;
      cells += count;
      if (cells > limits.maxCells) {
        throw new SpreadsheetError('too_many_cells', `the workbook has more than ${limits.maxCells.toLocaleString('en')} cells with content; the limit is ${limits.maxCells.toLocaleString('en')}`);
      }
      checkExpansions(f.name, xml, prefix, limits);
    }
  }
  return { entries: files.length, uncompressedBytes: realTotal, cellTagsByPart, parts };
}

function inflatePart(name: string, d: JsZipInternals, budget: number): Buffer {
  const content = Buffer.from(d.compressedContent.buffer, d.compressedContent.byteOffset, d.compressedContent.byteLength);
  if (d.compression.magic === STORE) {
    if (content.length > budget) throw bomb(`the file expands beyond ${formatBytes(budget)} at part ${name}`);
    return content;
  }
  if (d.compression.magic !== DEFLATE) throw new SpreadsheetError('damaged_file', `part ${name} uses a compression method other than deflate`);
  // One byte more than the header claims (or the remaining budget): inflating further proves it lied.
  const cap = Math.min(d.uncompressedSize, budget) + 1;
  let xml: Buffer;
  try {
    // One output chunk as large as the part (up to 64 MB) spares zlib gathering and joining 16 KB pieces.
    xml = zlib.inflateRawSync(content, { maxOutputLength: cap, chunkSize: Math.max(64, Math.min(cap, MAX_CHUNK)) });
  } catch (e) {
    if ((e as NodeJS.ErrnoException).code === 'ERR_BUFFER_TOO_LARGE') {
      throw bomb(`part ${name} expands beyond the ${formatBytes(d.uncompressedSize)} its header declares`);
    }
    throw new SpreadsheetError('damaged_file', `part ${name} is damaged (${(e as Error).message})`);
  }
  if (xml.length !== d.uncompressedSize) {
    throw new SpreadsheetError('damaged_file', `part ${name} is damaged: it holds ${xml.length} bytes, its header says ${d.uncompressedSize}`);
  }
  return xml;
}

function namespacePrefix(xml: Buffer): string {
  const head = xml.subarray(0, 4096).toString('latin1');
  const m = /<(?:([A-Za-z_][\w.-]*):)?worksheet[\s>]/.exec(head);
  return m?.[1] ? `${m[1]}:` : '';
}

function countOccurrences(haystack: Buffer, needle: string): number {
  let n = 0;
  for (let i = haystack.indexOf(needle); i !== -1; i = haystack.indexOf(needle, i + needle.length)) n++;
  return n;
}

/** exceljs fills every cell of a merged range and every column of a <col> span. */
function checkExpansions(part: string, xml: Buffer, prefix: string, limits: ImportLimits) {
  let expanded = 0;
  const mergeTag = `<${prefix}mergeCell `;
  for (let i = xml.indexOf(mergeTag); i !== -1; i = xml.indexOf(mergeTag, i + mergeTag.length)) {
    const element = xml.subarray(i, Math.min(xml.length, i + 512)).toString('latin1');
    const r = parseRangeName(/\sref="([^"]*)"/.exec(element)?.[1] ?? '');
    if (r) expanded += rangeArea(r);
    if (expanded > limits.maxMergedCells) {
      throw new SpreadsheetError(
        'too_complex',
        `${part} has merged ranges covering more than ${limits.maxMergedCells.toLocaleString('en')} cells, which the reader would fill one by one`,
      );
    }
  }
  const colTag = `<${prefix}col `;
  for (let i = xml.indexOf(colTag); i !== -1; i = xml.indexOf(colTag, i + colTag.length)) {
    const element = xml.subarray(i, Math.min(xml.length, i + 512)).toString('latin1');
    const max = Number(/\smax="(\d+)"/.exec(element)?.[1] ?? 0);
    if (max > EXCEL_MAX_COLUMNS) throw new SpreadsheetError('damaged_file', `${part} declares column ${max}; a worksheet has at most ${EXCEL_MAX_COLUMNS}`);
  }
}

function notWorkbook(names: Set<string>): SpreadsheetError {
  if (names.has('content.xml') && names.has('mimetype')) {
    return new SpreadsheetError('not_a_spreadsheet', 'this is an OpenDocument file (.ods); save it as .xlsx and upload again');
  }
  if (names.has('word/document.xml')) return new SpreadsheetError('not_a_spreadsheet', 'this is a word-processor document (.docx), not a workbook');
  if (names.has('ppt/presentation.xml')) return new SpreadsheetError('not_a_spreadsheet', 'this is a presentation (.pptx), not a workbook');
  return new SpreadsheetError('not_a_spreadsheet', 'this zip archive has no xl/workbook.xml, so it is not an .xlsx workbook');
}

function bomb(detail: string): SpreadsheetError {
  return new SpreadsheetError('decompression_bomb', `refused as a decompression bomb: ${detail}`);
}
