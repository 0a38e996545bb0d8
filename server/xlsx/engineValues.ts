// Computes a workbook once with the shared engine (functions/engine.ts), for export and `cli recalc`:
// each input cell's value, the cells array formulas spill into, and which chemistry functions are used.
import { CellError, DetailedCellError, type CellValue, type HyperFormula } from 'hyperformula';
import { explainCellError } from '../../functions/cellErrors.js';
import '../../functions/openchemlibNode.js';
import { catalogByName } from '../../functions/index.js';
import { arrayAreaAt, buildWorkbookEngine } from '../../functions/workbookEngine.js';
import type { CellTriple } from './types.js';
import { literalNumber } from './xlsxValues.js';

export interface ComputedCell {
  row: number;
  col: number;
  /** The stored input; absent for a cell an array formula spilled into. */
  input?: string;
  value: CellValue;
  /** The engine marked the number as a date, a time or both (typed as e.g. 31/12/2024). */
  dateKind?: 'date' | 'time' | 'datetime';
  /** For an array formula's anchor: the spilled area in rows × columns. */
  spill?: { rows: number; cols: number };
}

export interface ComputedSheet {
  name: string;
  cells: ComputedCell[];
}

export interface FunctionUse {
  name: string;
  family: string;
  source: string;
  cells: number;
}

export interface ComputedWorkbook {
  sheets: ComputedSheet[];
  functionsUsed: FunctionUse[];
}

const FUNCTION_CALL = /([A-Za-z_][A-Za-z0-9_.]*)\s*\(/g;

/** Names of catalog functions called in a formula (text in string literals is ignored). */
export function catalogFunctionsIn(formula: string): string[] {
  const code = formula.includes('"') ? formula.replace(/"(?:[^"]|"")*"/g, '""') : formula;
  const found = new Set<string>();
  for (const m of code.matchAll(FUNCTION_CALL)) {
    const name = m[1].toUpperCase();
    if (catalogByName.has(name)) found.add(name);
  }
  return [...found];
}

function dateKindOf(engine: HyperFormula, address: { sheet: number; row: number; col: number }): ComputedCell['dateKind'] {
  switch (engine.getCellValueDetailedType(address)) {
    case 'NUMBER_DATE':
      return 'date';
    case 'NUMBER_TIME':
      return 'time';
    case 'NUMBER_DATETIME':
      return 'datetime';
    default:
      return undefined;
  }
}

/** Below this share of filled cells a sheet's values are read one by one rather than as one array. */
const DENSE_READ_THRESHOLD = 0.1;

export function computeSheet(engine: HyperFormula, sheet: number, name: string, cells: CellTriple[]): ComputedSheet {
  const out: ComputedCell[] = [];
  // One call for the whole sheet when it is dense enough: the public per-cell getter validates its
  // argument on each of 100,000 calls. The array holds the same exported values, trailing empties trimmed.
  const { width, height } = engine.getSheetDimensions(sheet);
  const all = cells.length >= DENSE_READ_THRESHOLD * width * height ? engine.getSheetValues(sheet) : null;
  const valueAt = (row: number, col: number): CellValue => (all ? (all[row]?.[col] ?? null) : engine.getCellValue({ sheet, row, col }));
  const read = (row: number, col: number, input?: string): ComputedCell => {
    let value = valueAt(row, col);
    // A parse error is written in plain words naming the position, as the grid and /values say it.
    if (value instanceof DetailedCellError && input !== undefined && value.message?.startsWith('Parsing error'))
      value = new DetailedCellError(new CellError(value.type, explainCellError(value, input)), value.value);
    const cell: ComputedCell = input === undefined ? { row, col, value } : { row, col, input, value };
    // A plain decimal literal is read by the engine as a plain number, never as a date or time.
    if (typeof value === 'number' && (input === undefined || literalNumber(input) === null)) {
      const kind = dateKindOf(engine, { sheet, row, col });
      if (kind) cell.dateKind = kind;
    }
    return cell;
  };
  const inOrder = cells.every((c, i) => i === 0 || c[0] > cells[i - 1][0] || (c[0] === cells[i - 1][0] && c[1] > cells[i - 1][1]));
  const sorted = inOrder ? cells : [...cells].sort((a, b) => a[0] - b[0] || a[1] - b[1]);
  let spilled = false;
  for (const [row, col, input] of sorted) {
    const cell = read(row, col, input);
    out.push(cell);
    const area = input.startsWith('=') ? arrayAreaAt(engine, { sheet, row, col }) : null;
    if (!area) continue;
    const { rows, cols } = area;
    cell.spill = { rows, cols };
    for (let r = row; r < row + rows; r++) for (let c = col; c < col + cols; c++) if (r !== row || c !== col) out.push(read(r, c));
    spilled ||= rows > 1 || cols > 1;
  }
  if (spilled) out.sort((a, b) => a.row - b.row || a.col - b.col);
  return { name, cells: out };
}

export function computeWorkbook(sheets: { name: string; cells: CellTriple[] }[]): ComputedWorkbook {
  const engine = buildWorkbookEngine(sheets);
  try {
    const computed = sheets.map((s) => computeSheet(engine, engine.getSheetId(s.name)!, s.name, s.cells));
    return { sheets: computed, functionsUsed: functionsUsedIn(sheets) };
  } finally {
    engine.destroy();
  }
}

/** The catalog functions a workbook's formulas call, with how many cells call each (front sheet). */
export function functionsUsedIn(sheets: { cells: readonly CellTriple[] }[]): FunctionUse[] {
  const uses = new Map<string, number>();
  for (const s of sheets) for (const [, , input] of s.cells) if (input.charCodeAt(0) === 61 /* = */) for (const name of catalogFunctionsIn(input)) uses.set(name, (uses.get(name) ?? 0) + 1);
  return [...uses.entries()]
    .sort((a, b) => a[0].localeCompare(b[0]))
    .map(([name, count]) => {
      const entry = catalogByName.get(name)!;
      return { name, family: entry.family, source: entry.source, cells: count };
    });
}

export function isEngineError(value: CellValue): value is DetailedCellError {
  return value instanceof DetailedCellError;
}
