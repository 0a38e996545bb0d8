// .xlsx → sheets of cell inputs, read straight from the parts the zip guard has already inflated,
// without building exceljs's workbook model: only what Orbitab keeps (values, formulas, sheet names
// and visibility, column widths, frozen panes, merged ranges, link texts) is read. The whole workbook
// is read before the first cell is handed on, so a file this reader gives up on (NotDirect) can still
// go to exceljs with nothing sent twice; readXlsx.ts does that.
import { engineConfig } from '../../functions/engine.js';
import type { CellReading } from './cellInput.js';
import { ReadTally, SheetCells } from './sheetCollector.js';
import { locateSheetData, readLayout, scanCells, type CellContext } from './sheetXml.js';
import { ABOUT_SHEET_MARK, ABOUT_SHEET_NAME, WORKBOOK_CREATOR, type ParsedSheet } from './types.js';
import { readDateStyles, readSharedStrings, readWorkbookInfo, type Parts } from './xlsxParts.js';
import { partText } from './xmlText.js';

const maxColumns = engineConfig.maxColumns!;

export interface DirectRead {
  sheets: ParsedSheet[];
  tally: ReadTally;
  /** Reading the workbook-wide parts (sheet list, styles, shared strings), then the sheets. */
  partsMs: number;
  sheetsMs: number;
}

export function readXlsxDirect(parts: Parts): DirectRead {
  const started = performance.now();
  const info = readWorkbookInfo(parts);
  const ctx: CellContext = { strings: readSharedStrings(parts), dateStyles: readDateStyles(parts), date1904: info.date1904 };
  const partsAt = performance.now();

  const tally = new ReadTally();
  const sheets: ParsedSheet[] = [];
  for (const entry of info.sheets) {
    const data = locateSheetData(partText(parts.get(entry.part)!));
    const layout = readLayout(data, parts, entry, maxColumns);
    if (info.creator === WORKBOOK_CREATOR && entry.name.startsWith(ABOUT_SHEET_NAME) && firstCellText(data, layout, ctx) === ABOUT_SHEET_MARK) {
      tally.notes.push(`sheet "${entry.name}" is the provenance page of an Orbitab export and was not imported as data`);
      continue;
    }
    if (entry.state && entry.state !== 'visible') tally.notes.push(`sheet "${entry.name}" was hidden in the file; it is imported visible`);
    const sheet: ParsedSheet = { name: entry.name, cells: [], columnWidths: layout.columnWidths, frozenRows: layout.frozenRows, frozenCols: layout.frozenCols, merged: layout.merged };
    const collector = new SheetCells(tally, sheet, sheets.length);
    scanCells(data, layout, ctx, (r, c, reading) => collector.take(r, c, reading));
    sheets.push(sheet);
  }
  return { sheets, tally, partsMs: partsAt - started, sheetsMs: performance.now() - partsAt };
}

/** A1's text, as exceljs's `cell.text` gives it for a text cell (the provenance page's mark). */
function firstCellText(data: ReturnType<typeof locateSheetData>, layout: ReturnType<typeof readLayout>, ctx: CellContext): string | undefined {
  let text: string | undefined;
  try {
    scanCells(data, layout, ctx, (r, c, reading: CellReading) => {
      if (r === 0 && c === 0 && reading.kind === 'text') text = reading.text;
      throw STOP;
    });
  } catch (e) {
    if (e !== STOP) throw e;
  }
  return text;
}

const STOP = Symbol('first cell read');
