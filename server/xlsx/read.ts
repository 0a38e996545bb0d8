// readSpreadsheet: the one entry point for an uploaded file. Pure (no Express, no database); the
// routes run it inside a worker thread (parseInWorker.ts), the CLI and tests call it directly.
import { defaultImportLimits, SpreadsheetError, type ImportLimits } from './limits.js';
import { readCsv } from './readCsv.js';
import { readXlsx, type CellBatchSink, type XlsxReadOptions } from './readXlsx.js';
import { extensionOf, sniffSpreadsheet } from './sniff.js';
import { readStructures } from '../structures/readStructures.js';
import type { ParsedWorkbook } from './types.js';

/** `onCells`: an .xlsx's cells are also handed over in batches as they are read (readXlsx.ts). */
export async function readSpreadsheet(
  buffer: Buffer,
  filename: string,
  limits: ImportLimits = defaultImportLimits,
  onCells?: CellBatchSink,
  options: XlsxReadOptions = {},
): Promise<ParsedWorkbook> {
  const kind = sniffSpreadsheet(buffer, filename, limits);
  try {
    if (kind === 'structures') return readStructures(buffer, filename, extensionOf(filename));
    return await (kind === 'xlsx' ? readXlsx(buffer, limits, onCells, options) : readCsv(buffer, filename, limits));
  } catch (e) {
    if (e instanceof SpreadsheetError) throw e;
    // Only the file varies between calls, so an exception deep in a reader is the file's doing.
    throw new SpreadsheetError('damaged_file', `the file could not be read (${e instanceof Error ? e.message : String(e)})`);
  }
}
