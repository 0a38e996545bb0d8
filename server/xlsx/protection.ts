// Sheet roles, locks and protected ranges → sheet protection in the file, as far as the format (and
// exceljs) allow.
// An .xlsx can protect a sheet and mark cells (or whole columns) locked or unlocked; permissions per
// range are tied to a password or to Windows accounts, never to Orbitab users, and exceljs cannot
// write them. So: a locked sheet, or one that makes some member a viewer → the whole sheet protected
// (the file cannot say for whom); protected ranges → the sheet protected
// with only those cells locked. No password is set: in a file this is a reminder of what was
// settled, not a barrier.
import type ExcelJS from 'exceljs';
import { parseCellRange, type CellBounds } from '../../shared/cellRange.js';
import { maxColIndex, maxRowIndex } from '../../shared/workbooks.js';
import type { ExportSheet } from './types.js';

/** Empty cells written just to carry a "locked" flag, per sheet. */
const MAX_EMPTY_LOCKED_CELLS = 10_000;

export interface CellProtectionPlan {
  /** Column styles to write, in order (0: no column styles): locked or not, per column. */
  columnLocks: boolean[];
  /** When set, the locked flag of each written cell. */
  isLocked?: (row: number, col: number) => boolean;
  /** Cells of protected ranges to write even though empty, so they carry the locked flag. */
  extraLockedCells: { row: number; col: number }[];
}

const protectOptions: Partial<ExcelJS.WorksheetProtection> = { selectLockedCells: true, selectUnlockedCells: true, formatColumns: true, formatRows: true };

const area = (b: CellBounds) => (b.bottom - b.top + 1) * (b.right - b.left + 1);
const wholeColumns = (b: CellBounds) => b.top === 0 && b.bottom === maxRowIndex;

function boundsOf(sheet: ExportSheet): CellBounds[] {
  return (sheet.protectedRanges ?? []).map((p) => parseCellRange(p.range)).filter((b): b is CellBounds => b !== null);
}

/** Which ranges get their empty cells written (whole columns are locked by column style instead). */
function cellByCellRanges(ranges: CellBounds[]): Set<CellBounds> {
  const chosen = new Set<CellBounds>();
  let budget = MAX_EMPTY_LOCKED_CELLS;
  for (const b of ranges) {
    if (wholeColumns(b) || area(b) > budget) continue;
    budget -= area(b);
    chosen.add(b);
  }
  return chosen;
}

/** Locked, or closed to some member by a sheet role: the file protects the whole sheet. */
export function wholeSheetProtected(sheet: ExportSheet): boolean {
  return Boolean(sheet.lock) || (sheet.sheetRoles?.viewerNames.length ?? 0) > 0;
}

export async function applyProtection(ws: ExcelJS.Worksheet, sheet: ExportSheet): Promise<CellProtectionPlan> {
  if (wholeSheetProtected(sheet)) {
    await ws.protect('', protectOptions);
    return { columnLocks: [], extraLockedCells: [] };
  }
  const ranges = boundsOf(sheet);
  if (ranges.length === 0) return { columnLocks: [], extraLockedCells: [] };
  await ws.protect('', protectOptions);
  const columnLocks = Array.from({ length: maxColIndex + 1 }, (_, col) => ranges.some((b) => wholeColumns(b) && col >= b.left && col <= b.right));
  const extraLockedCells: { row: number; col: number }[] = [];
  for (const b of cellByCellRanges(ranges)) for (let row = b.top; row <= b.bottom; row++) for (let col = b.left; col <= b.right; col++) extraLockedCells.push({ row, col });
  return {
    columnLocks,
    isLocked: (row, col) => ranges.some((b) => row >= b.top && row <= b.bottom && col >= b.left && col <= b.right),
    extraLockedCells,
  };
}

const names = (list: string[]) => (list.length ? list.join(', ') : 'nobody else');

/** The front sheet's account of what Orbitab enforced and what the file keeps of it. */
export function describeProtection(fileName: string, sheet: ExportSheet): string[] {
  const lines: string[] = [];
  if (sheet.lock) {
    lines.push(
      `${fileName}: locked in Orbitab by ${sheet.lock.lockedByName}${sheet.lock.reason ? ` ("${sheet.lock.reason}")` : ''}; may still edit: ${names(sheet.lock.editorNames)}. ` +
        'In this file the whole sheet is protected without a password: any spreadsheet program can lift it.',
    );
  }
  const roles = sheet.sheetRoles;
  if (roles && (roles.editorNames.length || roles.viewerNames.length)) {
    const parts = [roles.editorNames.length ? `editor: ${roles.editorNames.join(', ')}` : '', roles.viewerNames.length ? `viewer: ${roles.viewerNames.join(', ')}` : ''].filter(Boolean);
    const inFile = wholeSheetProtected(sheet)
      ? 'In this file the whole sheet is protected without a password (the format cannot name Orbitab users): any spreadsheet program can lift it.'
      : 'The file format cannot name Orbitab users, so this is not carried in the file.';
    lines.push(`${fileName}: roles set on this sheet in Orbitab (${parts.join('; ')}). ${inFile}`);
  }
  const cellByCell = cellByCellRanges(boundsOf(sheet));
  for (const p of sheet.protectedRanges ?? []) {
    const b = parseCellRange(p.range);
    let where: string;
    if (!b) where = 'its range could not be read, so it is not protected in this file';
    else if (wholeSheetProtected(sheet)) where = 'the whole sheet is protected in this file';
    else if (wholeColumns(b) || [...cellByCell].some((c) => c.top === b.top && c.left === b.left && c.bottom === b.bottom && c.right === b.right)) {
      where = 'in this file its cells are locked for everyone (sheet protection without a password)';
    } else where = 'in this file its cells holding values are locked; its empty cells are not (the range is too large to write cell by cell)';
    lines.push(`${fileName}!${p.range}: protected range; in Orbitab only ${names(p.editorNames)} may edit it. The file format cannot name Orbitab users, so ${where}.`);
  }
  return lines;
}
