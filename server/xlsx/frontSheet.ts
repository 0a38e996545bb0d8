// The first sheet of every export: where the file came from, what it holds, the models behind the
// chemistry functions it uses, and the cautions that travel with those results.
import type ExcelJS from 'exceljs';
import { cautionLines } from '../../shared/cautions.js';
import type { FunctionUse } from './engineValues.js';
import { ABOUT_SHEET_MARK, type ExportMode, type ExportWorkbook } from './types.js';

/** The app's one caution (shared/cautions.ts), a row per sentence. */
export const EXPORT_CAUTIONS = cautionLines;

export interface AboutSheetFacts {
  workbook: ExportWorkbook;
  mode: ExportMode;
  functionsUsed: FunctionUse[];
  /** Per sheet: name in the file, cells written, and any renaming the file format forced. */
  sheets: { name: string; originalName: string; cells: number }[];
  /** Lines about locks and protected ranges, already worded. */
  protection: string[];
  /** Merged ranges that could not be written, and why. */
  omissions: string[];
}

export async function writeAboutSheet(ws: ExcelJS.Worksheet, facts: AboutSheetFacts): Promise<void> {
  const { workbook, mode } = facts;
  ws.columns = [{ width: 30 }, { width: 22 }, { width: 10 }, { width: 100 }];
  const bold = { bold: true };
  let rowNumber = 0;
  const line = (values: (string | number)[], font?: Partial<ExcelJS.Font>) => {
    const row = ws.getRow(++rowNumber);
    row.values = values;
    if (font) row.font = font;
    row.commit();
  };
  const gap = () => line([]);

  line([ABOUT_SHEET_MARK], { bold: true, size: 14 });
  gap();
  line(['Workbook', workbook.title]);
  line(['Revision', workbook.revision ?? 'none: recalculated from a file, not stored in Orbitab']);
  line(['Exported by', workbook.exportedBy]);
  line(['Exported at (UTC)', workbook.exportedAt.toISOString()]);
  line([
    'Contents',
    mode === 'formulas'
      ? 'Formulas, each with the value Orbitab computed cached beside it. Other programs do not know Orbitab’s functions: they show the cached value until they recalculate, then an error such as #NAME?.'
      : 'Values only: each cell holds the value Orbitab computed; no formulas.',
  ]);
  gap();
  line(['Sheet', 'Cells'], bold);
  for (const s of facts.sheets) line([s.name, s.cells, '', s.name !== s.originalName ? `named "${s.originalName}" in Orbitab; renamed to fit the file format` : '']);
  gap();
  line(['Cautions'], bold);
  for (const text of EXPORT_CAUTIONS) line(['', text]);
  gap();
  line(['Chemistry functions used', 'Family', 'Cells', 'Model and published source'], bold);
  if (facts.functionsUsed.length === 0) line(['(none: no cell calls an Orbitab chemistry function)']);
  for (const f of facts.functionsUsed) line([f.name, f.family, f.cells, f.source]);
  gap();
  line(['Locks and protected ranges'], bold);
  if (facts.protection.length === 0) line(['(none)']);
  for (const text of facts.protection) line(['', text]);
  if (facts.omissions.length) {
    gap();
    line(['Not written'], bold);
    for (const text of facts.omissions) line(['', text]);
  }
  await ws.commit();
}
