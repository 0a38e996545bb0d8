// How a revision's values are kept (the revision_values table): the /values answer as gzip-compressed
// JSON, served as it is, plus the few facts an export needs beyond it. An export of a stored
// revision rebuilds from these the same computed cells the engine would give (engineValues.ts).
import { gunzipSync, gzipSync } from 'node:zlib';
import { CellError, DetailedCellError, ErrorType, type CellValue } from 'hyperformula';
import type { CellTriple } from '../xlsx/types.js';
import { firstColsShown, firstRowsShown, type ComputedValue, type StoredValueExtras, type ValueEntry, type ValuesPayload } from '../../shared/workbooks.js';
import { functionsUsedIn, type ComputedCell, type ComputedSheet, type ComputedWorkbook } from '../xlsx/engineValues.js';

/** Fast compression: about 8× smaller for a sheet of numbers, in a tenth of the time level 6 takes. */
const GZIP_LEVEL = 1;

/** Compressed into bytes of their own (a small Buffer may share Node's pool, which must not be moved to another thread). */
export function encodeValues(payload: ValuesPayload): Uint8Array {
  const gzip = gzipSync(JSON.stringify(payload), { level: GZIP_LEVEL });
  const bytes = new Uint8Array(gzip.byteLength);
  bytes.set(gzip);
  return bytes;
}

/** What store.ts keeps as first_rows: the workbook's non-empty cells, and each sheet's values in the rows and columns the first screen shows. */
export interface StoredFirstRows {
  cells: number;
  sheets: Record<string, ValueEntry[]>;
}

/** JSON of StoredFirstRows for a revision's values and its count of non-empty cells. */
export function firstRowsJson(payload: ValuesPayload, cells: number): string {
  const bySheet: Record<string, ValueEntry[]> = {};
  for (const sheet of payload.sheets) {
    const first: ValueEntry[] = [];
    // In reading order: the rows shown come first.
    for (const entry of sheet.values) {
      if (entry[0] >= firstRowsShown) break;
      if (entry[1] < firstColsShown) first.push(entry);
    }
    bySheet[sheet.id] = first;
  }
  return JSON.stringify({ cells, sheets: bySheet } satisfies StoredFirstRows);
}

export function decodeValues(gzip: Uint8Array): ValuesPayload {
  return JSON.parse(gunzipSync(gzip).toString('utf8')) as ValuesPayload;
}

/** The engine's error types by the code a cell shows (HyperFormula's ErrorType and its display text). */
const errorTypes: Record<string, ErrorType> = {
  '#DIV/0!': ErrorType.DIV_BY_ZERO,
  '#N/A': ErrorType.NA,
  '#NAME?': ErrorType.NAME,
  '#NUM!': ErrorType.NUM,
  '#REF!': ErrorType.REF,
  '#VALUE!': ErrorType.VALUE,
  '#CYCLE!': ErrorType.CYCLE,
  '#SPILL!': ErrorType.SPILL,
  '#LIC!': ErrorType.LIC,
  '#ERROR!': ErrorType.ERROR,
};

const key = (row: number, col: number) => row * 4096 + col;
const keys = (list: [number, number, ...unknown[]][] | undefined) => new Set((list ?? []).map(([r, c]) => key(r, c)));

/**
 * The computed cells of each sheet, as engineValues.ts computeWorkbook gives them, from a sheet's
 * inputs and the revision's stored values. `sheetIds` names the stored sheet of each input sheet.
 */
export function computedFromStored(sheets: { name: string; cells: readonly CellTriple[] }[], sheetIds: string[], payload: ValuesPayload, extras: StoredValueExtras): ComputedWorkbook {
  const byId = new Map(payload.sheets.map((s) => [s.id, s]));
  const computed: ComputedSheet[] = sheets.map((sheet, i) => {
    const id = sheetIds[i];
    const stored = byId.get(id);
    if (!stored) throw new Error(`no stored values for sheet "${sheet.name}"`);
    const more = extras.sheets[id] ?? {};
    const empties = keys(more.emptyTexts);
    const bare = keys(more.bareErrors);
    const dates = new Map((more.dates ?? []).map(([r, c, kind]) => [key(r, c), kind]));
    const spills = new Map((more.spills ?? []).map(([r, c, rows, cols]) => [key(r, c), { rows, cols }]));
    const asValue = (k: number, v: ComputedValue | undefined): CellValue => {
      if (v === undefined) return empties.has(k) ? '' : null;
      if (typeof v !== 'object') return v;
      return new DetailedCellError(new CellError(errorTypes[v.error] ?? ErrorType.ERROR, bare.has(k) ? undefined : v.message), v.error);
    };
    // Stored values and inputs are both in row-major order: read them side by side (no lookup table
    // of 100,000 entries), with spilled cells, which have no input, looked up by position.
    const values = stored.values;
    let at = 0;
    let spilledAt: Map<number, ComputedValue> | null = null;
    const valueAt = (row: number, col: number): CellValue => {
      const k = key(row, col);
      while (at < values.length && key(values[at][0], values[at][1]) < k) at++;
      if (at < values.length && values[at][0] === row && values[at][1] === col) return asValue(k, values[at][2]);
      return asValue(k, undefined);
    };
    const spilledValue = (row: number, col: number): CellValue => {
      spilledAt ??= new Map(values.map(([r, c, v]) => [key(r, c), v]));
      const k = key(row, col);
      return asValue(k, spilledAt.get(k));
    };
    const withKind = (cell: ComputedCell): ComputedCell => {
      if (dates.size > 0) {
        const kind = dates.get(key(cell.row, cell.col));
        if (kind) cell.dateKind = kind;
      }
      return cell;
    };
    const inOrder = sheet.cells.every((c, j) => j === 0 || c[0] > sheet.cells[j - 1][0] || (c[0] === sheet.cells[j - 1][0] && c[1] > sheet.cells[j - 1][1]));
    const sorted = inOrder ? sheet.cells : [...sheet.cells].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
    const out: ComputedCell[] = new Array(sorted.length);
    const spilledCells: ComputedCell[] = [];
    for (let j = 0; j < sorted.length; j++) {
      const [row, col, input] = sorted[j];
      const cell = withKind({ row, col, input, value: valueAt(row, col) });
      out[j] = cell;
      if (spills.size === 0) continue;
      const spill = spills.get(key(row, col));
      if (!spill) continue;
      cell.spill = spill;
      for (let r = row; r < row + spill.rows; r++) for (let c = col; c < col + spill.cols; c++) if (r !== row || c !== col) spilledCells.push(withKind({ row: r, col: c, value: spilledValue(r, c) }));
    }
    if (spilledCells.length === 0) return { name: sheet.name, cells: out };
    return { name: sheet.name, cells: [...out, ...spilledCells].sort((a, b) => a.row - b.row || a.col - b.col) };
  });
  return { sheets: computed, functionsUsed: extras.functionsUsed ?? functionsUsedIn(sheets) };
}
