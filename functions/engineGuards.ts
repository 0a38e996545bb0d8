// Enforces functions/limits.ts inside HyperFormula, so every engine (browser, server, CLI) refuses
// the same formulas before they cost anything. HyperFormula 3.5 has no setting for these, and the
// expensive part happens before any function runs: each cell of a range becomes a graph vertex when
// the formula is added, and each spilled cell an address-map entry. So the checks sit where the
// engine parses a formula: a formula over a limit becomes a parse-error cell carrying our message
// (its text is kept, nothing is built for it). What only evaluation can know (SEQUENCE sized by a
// cell, REPT and SUBSTITUTE lengths, long text results) is checked when the function runs.
//
// HyperFormula does not export its parser or evaluator classes, so their prototypes are taken from
// a probe engine and patched once. The pinned version is checked, so an upgrade fails loudly
// (tests/eval-limits.test.ts) instead of silently dropping the limits.
import { ArraySize, CellError, ErrorType, FunctionPlugin, HyperFormula, SimpleRangeValue } from 'hyperformula';
import { formulaSizeProblem, rangeProblem, spillProblem, textProblem } from './limits.js';

const GUARDED_VERSION = '3.5.0';

type Ast = { type: string; [key: string]: any };
type Address = { sheet: number; col: number; row: number };

function limitError(message: string) {
  return new CellError(ErrorType.VALUE, message);
}

/** Marks our refusals among parse errors, so the cell shows #VALUE! with our message alone. */
const LIMIT = 'EvaluationLimit';

/** A parse result that HyperFormula stores as an error cell showing `message`, with no dependencies. */
function refused(message: string) {
  return {
    ast: { type: 'ERROR', error: limitError(message) },
    errors: [{ type: LIMIT, message }],
    hasVolatileFunction: false,
    hasStructuralChangeFunction: false,
    dependencies: [],
  };
}

const columnLetters = (col: number): string => {
  let s = '';
  for (let n = col + 1; n > 0; n = Math.floor((n - 1) / 26)) s = String.fromCharCode(65 + ((n - 1) % 26)) + s;
  return s;
};

/** Every node of a parsed formula, without recursion (the tree may be deep). */
function* nodes(root: Ast): Generator<Ast> {
  const stack: unknown[] = [root];
  while (stack.length) {
    const node = stack.pop();
    if (Array.isArray(node)) stack.push(...node);
    else if (node && typeof node === 'object' && typeof (node as Ast).type === 'string') {
      yield node as Ast;
      const n = node as Ast;
      for (const key of ['args', 'left', 'right', 'value', 'expression']) if (n[key] !== undefined) stack.push(n[key]);
    }
  }
}

/** Cells covered by the ranges of a formula, and the largest range written A1-style. */
function rangeCells(ast: Ast, at: Address, maxRows: number, maxColumns: number) {
  let total = 0;
  let largest = { cells: 0, text: '' };
  for (const node of nodes(ast)) {
    let cells = 0;
    let text = '';
    if (node.type === 'CELL_RANGE') {
      const s = node.start.toSimpleCellAddress(at);
      const e = node.end.toSimpleCellAddress(at);
      const rows = Math.abs(e.row - s.row) + 1;
      const cols = Math.abs(e.col - s.col) + 1;
      cells = rows * cols;
      text = `${columnLetters(Math.min(s.col, e.col))}${Math.min(s.row, e.row) + 1}:${columnLetters(Math.max(s.col, e.col))}${Math.max(s.row, e.row) + 1}`;
    } else if (node.type === 'COLUMN_RANGE') {
      // A whole column grows with the sheet: counted at the grid's full height.
      const a = node.start.toSimpleColumnAddress(at).col;
      const b = node.end.toSimpleColumnAddress(at).col;
      cells = (Math.abs(b - a) + 1) * maxRows;
      text = `${columnLetters(Math.min(a, b))}:${columnLetters(Math.max(a, b))}`;
    } else if (node.type === 'ROW_RANGE') {
      const a = node.start.toSimpleRowAddress(at).row;
      const b = node.end.toSimpleRowAddress(at).row;
      cells = (Math.abs(b - a) + 1) * maxColumns;
      text = `${Math.min(a, b) + 1}:${Math.max(a, b) + 1}`;
    } else continue;
    total += cells;
    if (cells > largest.cells) largest = { cells, text };
  }
  return { total, largest: largest.text };
}

let installed = false;

/** Told of each formula as the engine starts reading or evaluating it (sheet id, row, column), or null. */
type EvaluationWatcher = (sheet: number, row: number, col: number) => void;
let watcher: EvaluationWatcher | null = null;

/**
 * Lets a worker say which cell it was computing when a memory or time limit ended it: the compute
 * pool's workers write each formula's address to memory the server can still read afterwards.
 */
export function watchEvaluation(next: EvaluationWatcher | null): void {
  watcher = next;
}

let internals: { parserProto: any; evaluatorProto: any; Predictor: any; parseErrorProto: any; graphProto: any } | null = null;

/**
 * HyperFormula's parser, evaluator, array-size predictor and parse-error cell, which it does not
 * export: taken from one probe engine, built once (a HyperFormula build is a good part of a page's
 * engine set-up) for every patch of its internals (this file, engineSharedTrees.ts, engineTopSort.ts).
 */
export function hyperFormulaInternals() {
  if (internals) return internals;
  const probe = HyperFormula.buildEmpty({ licenseKey: 'gpl-v3' }) as any;
  probe.addSheet('probe');
  probe.setCellContents({ sheet: probe.getSheetId('probe'), col: 0, row: 0 }, '=(');
  internals = {
    parserProto: Object.getPrototypeOf(probe._parser),
    evaluatorProto: Object.getPrototypeOf(probe._evaluator),
    Predictor: probe._crudOperations.operations.arraySizePredictor.constructor,
    parseErrorProto: Object.getPrototypeOf(probe._dependencyGraph.getCell({ sheet: probe.getSheetId('probe'), col: 0, row: 0 })),
    graphProto: Object.getPrototypeOf(probe._dependencyGraph.graph),
  };
  probe.destroy();
  return internals;
}

/** Patches HyperFormula once so every engine built afterwards enforces the evaluation limits. */
export function installEngineGuards() {
  if (installed) return;
  if (HyperFormula.version !== GUARDED_VERSION)
    throw new Error(`evaluation limits are written against HyperFormula ${GUARDED_VERSION}, found ${HyperFormula.version}: re-check functions/engineGuards.ts`);
  const { parserProto, evaluatorProto, Predictor, parseErrorProto } = hyperFormulaInternals();
  for (const [what, fn] of [
    ['parser.parse', parserProto.parse],
    ['ParsingErrorVertex.getCellValue', parseErrorProto?.getCellValue],
    ['evaluator.evaluateAstToCellValue', evaluatorProto.evaluateAstToCellValue],
    ['FunctionPlugin.calculateSingleCellOfResultArray', (FunctionPlugin.prototype as any).calculateSingleCellOfResultArray],
  ] as const)
    if (typeof fn !== 'function') throw new Error(`HyperFormula internals changed: ${what} is missing`);

  const parseErrorValue = parseErrorProto.getCellValue;
  parseErrorProto.getCellValue = function (this: { errors: { type: string; message: string }[] }) {
    const limit = this.errors.find((e) => e.type === LIMIT);
    return limit ? limitError(limit.message) : parseErrorValue.call(this);
  };

  const predictors = new WeakMap<object, { checkArraySize(ast: Ast, at: Address): ArraySize }>();
  const parse = parserProto.parse;
  parserProto.parse = function (this: any, text: string, at: Address) {
    if (watcher && at) watcher(at.sheet, at.row, at.col);
    const tooBig = formulaSizeProblem(text.startsWith('=') ? text : '=' + text);
    if (tooBig) return refused(tooBig);
    const result = parse.call(this, text, at);
    if (result.errors.length > 0) return result;
    const { maxRows, maxColumns } = this.config;
    const ranges = rangeCells(result.ast, at, maxRows, maxColumns);
    const readsTooMuch = rangeProblem(ranges.total, ranges.largest);
    if (readsTooMuch) return refused(`the formula ${readsTooMuch}`);
    let predictor = predictors.get(this);
    if (!predictor) predictors.set(this, (predictor = new Predictor(this.config, this.functionRegistry)));
    const size = predictor!.checkArraySize(result.ast, at);
    const spillsTooMuch = size.isRef ? null : spillProblem(size.width * size.height);
    if (spillsTooMuch) return refused(`the formula ${spillsTooMuch}`);
    return result;
  };

  // Whatever a formula computes, the cell keeps at most this much.
  const evaluate = evaluatorProto.evaluateAstToCellValue;
  evaluatorProto.evaluateAstToCellValue = function (this: unknown, ast: Ast, state: { formulaAddress?: { sheet: number; row: number; col: number } }) {
    const at = state?.formulaAddress;
    if (watcher && at) watcher(at.sheet, at.row, at.col);
    const value = evaluate.call(this, ast, state);
    if (typeof value === 'string') {
      const problem = textProblem(value.length);
      if (problem) return limitError(`the formula ${problem}`);
    } else if (value instanceof SimpleRangeValue) {
      const problem = spillProblem(value.width() * value.height());
      if (problem) return limitError(`the formula ${problem}`);
    }
    return value;
  };

  // A last net under every function: a string or array past what V8 can hold becomes a cell error,
  // not an exception out of the engine that would take every other cell's value with it.
  const calculate = (FunctionPlugin.prototype as any).calculateSingleCellOfResultArray;
  (FunctionPlugin.prototype as any).calculateSingleCellOfResultArray = function (this: unknown, ...args: unknown[]) {
    try {
      return calculate.apply(this, args);
    } catch (e) {
      if (e instanceof RangeError) return limitError(`the result is too large to hold (${e.message})`);
      throw e;
    }
  };

  HyperFormula.registerFunctionPlugin(guardedBuiltIns());
  installed = true;
}

/**
 * REPT, SUBSTITUTE and SEQUENCE with their size checked before the result is built. Same metadata
 * and arguments as HyperFormula's own; the bodies follow HyperFormula 3.5's TextPlugin and
 * SequencePlugin.
 */
function guardedBuiltIns() {
  const metadataOf = (name: string) => ({ ...(HyperFormula.getFunctionPlugin(name) as any).implementedFunctions[name] });
  const escapeRegExp = (text: string) => text.replace(/[.*+?^${}()|[\]\\]/g, '\\$&');
  class GuardedBuiltIns extends FunctionPlugin {
    static implementedFunctions = {
      REPT: { ...metadataOf('REPT'), method: 'guardedRept' },
      SUBSTITUTE: { ...metadataOf('SUBSTITUTE'), method: 'guardedSubstitute' },
      SEQUENCE: { ...metadataOf('SEQUENCE'), method: 'guardedSequence' },
    };
    guardedRept(ast: any, state: any) {
      return this.runFunction(ast.args, state, this.metadata('REPT'), (text: string, count: number) => {
        if (count < 0) return new CellError(ErrorType.VALUE, 'REPT: the count must not be negative');
        const problem = textProblem(text.length * Math.trunc(count));
        return problem ? limitError(`REPT ${problem}`) : text.repeat(count);
      });
    }
    guardedSubstitute(ast: any, state: any) {
      return this.runFunction(ast.args, state, this.metadata('SUBSTITUTE'), (text: string, search: string, replacement: string, occurrence?: number) => {
        const pattern = new RegExp(escapeRegExp(search), 'g');
        if (occurrence === undefined) {
          const hits = search === '' ? text.length + 1 : text.split(search).length - 1;
          const problem = textProblem(text.length + hits * (replacement.length - search.length));
          return problem ? limitError(`SUBSTITUTE ${problem}`) : text.replace(pattern, () => replacement);
        }
        if (occurrence < 1) return new CellError(ErrorType.VALUE, 'SUBSTITUTE: the occurrence must be at least 1');
        let i = 0;
        for (let match = pattern.exec(text); match !== null; match = pattern.exec(text)) {
          if (occurrence === ++i) return text.substring(0, match.index) + replacement + text.substring(pattern.lastIndex);
          if (match[0] === '') pattern.lastIndex++;
        }
        return text;
      });
    }
    guardedSequence(ast: any, state: any) {
      return this.runFunction(ast.args, state, this.metadata('SEQUENCE'), (rows: number, cols: number, start: number, step: number) => {
        if (!Number.isFinite(rows) || !Number.isFinite(cols)) return new CellError(ErrorType.VALUE, 'SEQUENCE: rows and columns must be finite');
        const numRows = Math.trunc(rows);
        const numCols = Math.trunc(cols);
        if (numRows < 1 || numCols < 1) return new CellError(ErrorType.VALUE, 'SEQUENCE: rows and columns must be at least 1');
        const problem = spillProblem(numRows * numCols);
        if (problem) return limitError(`SEQUENCE ${problem}`);
        const result: number[][] = [];
        for (let r = 0; r < numRows; r++) {
          const row: number[] = [];
          for (let c = 0; c < numCols; c++) row.push(start + (r * numCols + c) * step);
          result.push(row);
        }
        return SimpleRangeValue.onlyNumbers(result);
      });
    }
  }
  // The size method stays HyperFormula's own (literal sizes); the parse check refuses large ones.
  (GuardedBuiltIns.prototype as any)[metadataOf('SEQUENCE').sizeOfResultArrayMethod] = (HyperFormula.getFunctionPlugin('SEQUENCE') as any).prototype.sequenceArraySize;
  return GuardedBuiltIns;
}
