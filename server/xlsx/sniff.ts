// What kind of file arrived, decided from its first bytes (the name only breaks ties for text).
import { formatBytes, SpreadsheetError, type ImportLimits } from './limits.js';

export type SpreadsheetKind = 'xlsx' | 'csv' | 'structures';

/** Structure files (server/structures/readStructures.ts), told apart by their extension. */
export const structureExtensions = ['sdf', 'sd', 'mol', 'xyz'];

const ZIP_LOCAL_HEADER = [0x50, 0x4b, 0x03, 0x04]; // "PK\3\4"
const ZIP_EMPTY = [0x50, 0x4b, 0x05, 0x06];
// OLE2 compound file (MS-CFB §2.2): legacy .xls, and the wrapper Office uses for password-encrypted .xlsx.
const CFB_MAGIC = [0xd0, 0xcf, 0x11, 0xe0, 0xa1, 0xb1, 0x1a, 0xe1];

const startsWith = (buf: Uint8Array, magic: number[]) => buf.length >= magic.length && magic.every((b, i) => buf[i] === b);

export function extensionOf(filename: string): string {
  const m = /\.([A-Za-z0-9]+)$/.exec(filename.trim());
  return m ? m[1].toLowerCase() : '';
}

export function sniffSpreadsheet(buffer: Uint8Array, filename: string, limits: ImportLimits): SpreadsheetKind {
  if (buffer.length > limits.maxFileBytes) {
    throw new SpreadsheetError('file_too_large', `the file is ${formatBytes(buffer.length)}; the limit is ${formatBytes(limits.maxFileBytes)}`);
  }
  if (buffer.length === 0) throw new SpreadsheetError('not_a_spreadsheet', 'the file is empty');
  const ext = extensionOf(filename);
  if (startsWith(buffer, CFB_MAGIC)) {
    throw new SpreadsheetError(
      'encrypted_or_legacy',
      'the file is an OLE compound document: an encrypted (password-protected) workbook or a legacy .xls; remove the password or save it as .xlsx',
    );
  }
  if (startsWith(buffer, ZIP_LOCAL_HEADER) || startsWith(buffer, ZIP_EMPTY)) return 'xlsx';
  if (ext === 'xlsx' || ext === 'xlsm') {
    throw new SpreadsheetError('not_a_spreadsheet', `"${filename}" is named .${ext} but is not a zip archive, so it is not an .xlsx workbook`);
  }
  if (ext === 'csv' || ext === 'tsv' || ext === 'txt') {
    const head = buffer.subarray(0, 64 * 1024);
    if (head.includes(0)) throw new SpreadsheetError('not_a_spreadsheet', `"${filename}" holds binary data, not comma-separated text`);
    return 'csv';
  }
  if (structureExtensions.includes(ext)) {
    if (buffer.subarray(0, 64 * 1024).includes(0)) throw new SpreadsheetError('not_a_spreadsheet', `"${filename}" holds binary data, not a text structure file`);
    return 'structures';
  }
  throw new SpreadsheetError('not_a_spreadsheet', `"${filename}" is not a file Orbitab reads: upload an .xlsx workbook, a .csv file, or structures as .sdf, .mol or .xyz`);
}
