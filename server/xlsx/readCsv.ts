// .csv → one sheet. A CSV field carries text as someone typed it, so each field becomes the input
// unchanged: "12.5" is a number, "TRUE" a boolean, "=A1*2" a formula, "'=x" the text "=x" — the same
// reading the grid gives typed text. Parsing is exceljs's CSV reader (fast-csv underneath).
import { Readable } from 'node:stream';
import ExcelJS from 'exceljs';
import { engineConfig } from '../../functions/engine.js';
import { cellName } from '../../shared/a1.js';
import { SpreadsheetError, type ImportLimits } from './limits.js';
import { extensionOf } from './sniff.js';
import { decodeText, guessDelimiter } from './csvCount.js';
import type { CellTriple, ParsedWorkbook, SkippedCell } from './types.js';
import { defaultSheetName } from '../../shared/workbooks.js';

export function sheetNameFromFilename(filename: string): string {
  const base = filename.replace(/^.*[\\/]/, '').replace(/\.[^.]*$/, '');
  // Spreadsheet sheet names: at most 31 characters, none of [ ] : * ? / \ (common practice, Excel's rule).
  const cleaned = base.replace(/[[\]:*?/\\]/g, '_').trim().slice(0, 31);
  return cleaned || defaultSheetName(1);
}

export async function readCsv(buffer: Buffer, filename: string, limits: ImportLimits): Promise<ParsedWorkbook> {
  const notes: string[] = [];
  const text = decodeText(buffer, notes);
  const delimiter = guessDelimiter(text, extensionOf(filename));
  if (delimiter !== ',') notes.push(`fields are separated by ${delimiter === '\t' ? 'tabs' : `"${delimiter}"`}`);

  let nonEmpty = 0;
  let strayMarks = 0;
  const workbook = new ExcelJS.Workbook();
  let ws: ExcelJS.Worksheet;
  try {
    ws = await workbook.csv.read(Readable.from([text]), {
      // Keep the raw text; past the cell limit keep nothing more (the count alone decides the answer).
      // A byte-order mark inside the text (files joined end to end, say) is no character anyone typed.
      map: (datum: string) => {
        if (datum.includes('\uFEFF')) {
          strayMarks++;
          datum = datum.replace(/\uFEFF/g, '');
        }
        return datum === '' || ++nonEmpty > limits.maxCells ? undefined : datum;
      },
      parserOptions: { delimiter },
    } as never);
  } catch (e) {
    throw new SpreadsheetError('damaged_file', `the CSV could not be read (${e instanceof Error ? e.message : String(e)})`);
  }
  if (nonEmpty > limits.maxCells) {
    throw new SpreadsheetError('too_many_cells', `the file has ${nonEmpty.toLocaleString('en')} cells with content; the limit is ${limits.maxCells.toLocaleString('en')}`);
  }

  if (strayMarks > 0) notes.push(`${strayMarks.toLocaleString('en')} field${strayMarks === 1 ? '' : 's'} held a byte-order mark (U+FEFF) inside the text; it was removed`);
  const name = sheetNameFromFilename(filename);
  const cells: CellTriple[] = [];
  const skipped: SkippedCell[] = [];
  let formulas = 0;
  ws.eachRow({ includeEmpty: false }, (row, rowNumber) => {
    row.eachCell({ includeEmpty: false }, (cell, colNumber) => {
      const input = cell.value;
      if (typeof input !== 'string' || input === '') return;
      const [r, c] = [rowNumber - 1, colNumber - 1];
      if (r >= engineConfig.maxRows! || c >= engineConfig.maxColumns!) {
        skipped.push({ sheet: name, address: cellName(r, c), reason: `outside Orbitab's grid of ${engineConfig.maxRows!.toLocaleString('en')} rows × ${engineConfig.maxColumns!.toLocaleString('en')} columns` });
        return;
      }
      if (input.startsWith('=')) formulas++;
      cells.push([r, c, input]);
    });
  });
  return {
    sheets: [{ name, cells, columnWidths: {}, frozenRows: 0, frozenCols: 0, merged: [] }],
    summary: { sheets: 1, cells: cells.length, formulas, skipped, notes },
  };
}
