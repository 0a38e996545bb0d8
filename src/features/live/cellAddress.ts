// "Sheet1!B2" as formulas write it (common practice): a sheet name with anything but letters, digits
// and underscores is quoted, an apostrophe inside doubled.
import { cellName } from '../../core/workbook/model/a1.js';

export function sheetPrefix(sheetName: string): string {
  return /^[A-Za-z_][A-Za-z0-9_]*$/.test(sheetName) ? sheetName : `'${sheetName.replace(/'/g, "''")}'`;
}

export function cellAddressOf(sheetName: string, row: number, col: number): string {
  return `${sheetPrefix(sheetName)}!${cellName(row, col)}`;
}
