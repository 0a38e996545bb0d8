// Turns the catalog into one HyperFormula FunctionPlugin. Errors are values: a ChemError (or anything
// unexpected) becomes a CellError with its message, never an exception out of the engine.
import {
  ArraySize,
  CellError,
  ErrorType,
  FunctionArgumentType,
  FunctionPlugin,
  HyperFormula,
  SimpleRangeValue,
  type FunctionArgument,
  type ImplementedFunctions,
} from 'hyperformula';
import { catalog } from './catalog/index.js';
import { PENDING_MESSAGE, PendingResult, whileEvaluating } from './structureResults.js';
import { ChemError, type CatalogEntry, type FunctionResult, type ParamSpec, type Scalar, type SpillArg } from './catalog/types.js';

const argumentType: Record<ParamSpec['type'], FunctionArgumentType> = {
  // Numbers arrive as scalars and are coerced in toNumber(), so a bad one gets a message naming the parameter.
  number: FunctionArgumentType.SCALAR,
  integer: FunctionArgumentType.SCALAR,
  string: FunctionArgumentType.STRING,
  boolean: FunctionArgumentType.BOOLEAN,
  range: FunctionArgumentType.RANGE,
  any: FunctionArgumentType.SCALAR,
};

const errorType: Record<ChemError['kind'], ErrorType> = {
  VALUE: ErrorType.VALUE,
  NUM: ErrorType.NUM,
  NA: ErrorType.NA,
  DIV_BY_ZERO: ErrorType.DIV_BY_ZERO,
  REF: ErrorType.REF,
};

function toArgument(p: ParamSpec): FunctionArgument {
  const arg: FunctionArgument = { argumentType: argumentType[p.type] };
  if (p.optional) {
    arg.optionalArg = true;
    if (p.default !== undefined) {
      arg.defaultValue = p.default;
      // An empty middle argument, e.g. ABSORPTION(s,,,"van-catledge"), takes the default rather than 0.
      arg.emptyAsDefault = true;
    }
  }
  return arg;
}

function rangeToTable(value: unknown): Scalar[][] {
  if (value instanceof SimpleRangeValue) {
    return value.rawData().map((row) =>
      row.map((cell) => {
        if (cell instanceof CellError) throw new ChemError(`the range holds an error (${cell.type}${cell.message ? ': ' + cell.message : ''})`);
        if (cell === null || cell === undefined || typeof cell === 'symbol') return '';
        if (typeof cell === 'object') return Number(cell as unknown as number);
        return cell as Scalar;
      }),
    );
  }
  return [[value as Scalar]];
}

/**
 * HyperFormula's precision rounding turns numbers below about 1e-300 into NaN (even its own
 * =1e-300*1), so magnitudes under this floor are returned as 0 — they are 0 to every digit a cell shows.
 */
const SMALLEST_CELL_NUMBER = 1e-290;

function flushTiny(v: unknown): unknown {
  return typeof v === 'number' && v !== 0 && Math.abs(v) < SMALLEST_CELL_NUMBER ? 0 : v;
}

function toCellValue(result: FunctionResult, entry: CatalogEntry): unknown {
  if (Array.isArray(result)) {
    const table = result.map((row) => row.map(flushTiny));
    for (const row of table) for (const v of row) if (typeof v === 'number' && !Number.isFinite(v)) return new CellError(ErrorType.NUM, `${entry.name} gave a number out of range`);
    return SimpleRangeValue.onlyValues(table as any);
  }
  if (typeof result === 'number' && !Number.isFinite(result)) return new CellError(ErrorType.NUM, `${entry.name} gave a number out of range`);
  return flushTiny(result);
}

function spillArgs(ast: any): SpillArg[] {
  return (ast.args ?? []).map((a: any): SpillArg => {
    switch (a?.type) {
      case 'NUMBER':
        return { kind: 'literal', value: a.value };
      case 'STRING':
        return { kind: 'literal', value: a.value };
      case 'EMPTY':
        return { kind: 'empty' };
      case 'CELL_RANGE':
      case 'COLUMN_RANGE':
      case 'ROW_RANGE':
        return {
          kind: 'range',
          rows: Math.abs(a.end.row - a.start.row) + 1,
          cols: Math.abs(a.end.col - a.start.col) + 1,
        };
      default:
        return { kind: 'other' };
    }
  });
}

/**
 * Spreadsheet coercion of one number argument (text that reads as a number, TRUE/FALSE). An empty
 * cell is not read as 0, which would silently give e.g. OVERLAP1S(empty) = 1: a required argument
 * refuses it, naming the parameter, and an optional one takes its default.
 */
function toNumber(value: unknown, param: ParamSpec, entry: CatalogEntry): number | undefined {
  if (value === undefined) return undefined;
  let n: number;
  if (typeof value === 'number') n = value;
  else if (typeof value === 'boolean') n = value ? 1 : 0;
  else if (value === null || typeof value === 'symbol') {
    if (param.optional) return undefined;
    throw new ChemError(`${entry.name}: ${param.name} is empty; give a number${param.unit ? ` (${param.unit})` : ''}`);
  }
  else if (typeof value === 'object' && 'val' in (value as object)) n = Number((value as { val: unknown }).val); // dates, percents
  else {
    const text = String(value).trim();
    n = text === '' ? NaN : Number(text);
    if (!Number.isFinite(n)) throw new ChemError(`${entry.name}: ${param.name} must be a number, not "${String(value).slice(0, 40)}"`);
  }
  if (param.type === 'integer' && !Number.isInteger(n)) throw new ChemError(`${entry.name}: ${param.name} must be a whole number, not ${n}`, 'NUM');
  return n;
}

/** Runs one catalog implementation with errors turned into values. Exported for tests and the CLI. */
export function callEntry(entry: CatalogEntry, args: unknown[]): unknown {
  try {
    for (let i = 0; i < args.length; i++) {
      const t = entry.params[i]?.type;
      if ((t === 'number' || t === 'integer') && args[i] instanceof CellError) return args[i];
    }
    const prepared = args.map((a, i) => {
      const param = entry.params[i];
      if (param?.type === 'range') return rangeToTable(a);
      if (param?.type === 'number' || param?.type === 'integer') return toNumber(a, param, entry);
      return a;
    });
    return toCellValue(entry.implementation(...prepared), entry);
  } catch (e) {
    if (e instanceof ChemError) return new CellError(errorType[e.kind], e.message);
    // Not a failure: the cell waits for a result computed elsewhere, and is evaluated again when it arrives.
    if (e instanceof PendingResult) return new CellError(ErrorType.NA, PENDING_MESSAGE);
    return new CellError(ErrorType.VALUE, `${entry.name} failed: ${e instanceof Error ? e.message : String(e)}`);
  }
}

function methodName(entry: CatalogEntry) {
  return `orbitab_${entry.name}`;
}

export class OrbitabPlugin extends FunctionPlugin {
  static implementedFunctions: ImplementedFunctions = {};
}

for (const entry of catalog) {
  const method = methodName(entry);
  const metadata: ImplementedFunctions[string] = {
    method,
    parameters: entry.params.map(toArgument),
  };
  // A spilling function must not be vectorized: HyperFormula throws "Function returning array cannot be vectorized" out of the engine.
  if (entry.spill || entry.params.some((p) => p.type === 'range')) metadata.vectorizationForbidden = true;
  if (entry.spill) metadata.sizeOfResultArrayMethod = `${method}_size`;
  OrbitabPlugin.implementedFunctions[entry.name] = metadata;
  (OrbitabPlugin.prototype as any)[method] = function (this: FunctionPlugin, ast: any, state: any) {
    return this.runFunction(ast.args, state, this.metadata(entry.name), (...args: unknown[]) => whileEvaluating(state?.formulaAddress, () => callEntry(entry, args)) as any);
  };
  if (entry.spill) {
    const spill = entry.spill;
    (OrbitabPlugin.prototype as any)[`${method}_size`] = function (ast: any) {
      try {
        const { rows, cols } = spill(spillArgs(ast));
        return new ArraySize(cols, rows);
      } catch {
        return ArraySize.error();
      }
    };
  }
}

const translations = {
  enGB: Object.fromEntries(catalog.map((e) => [e.name, e.name])),
  enUS: Object.fromEntries(catalog.map((e) => [e.name, e.name])),
};

let registered = false;
/** Registers the plugin in HyperFormula's global registry. Must run before any engine is built. */
export function registerOrbitabPlugin() {
  if (registered) return;
  HyperFormula.registerFunctionPlugin(OrbitabPlugin, translations);
  registered = true;
}
