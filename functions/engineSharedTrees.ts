// HyperFormula 3.5 parses each formula shape once (its cache keys formulas by their relative form, so
// =BONDORDER(A1) down 100,000 rows is one parse) but then rebuilds the cached tree for every cell:
// ParserWithCaching.convertReversedRangesToRegularRanges copies each call and operator node to put
// reversed ranges (B5:A1) in order. A 100,000 × 8 chemistry sheet kept 700,000 such copies, about
// 20 MB of the page's heap, made while the workbook opened. A tree with no range in it comes back
// equal to the cached one, so it is handed back as it is and shared by every cell of that shape.
// HyperFormula never changes a tree in place except HYPERLINK, which writes its address onto its own
// call node; a tree calling it is still copied.
import { hyperFormulaInternals } from './engineGuards.js';

interface TreeNode {
  type: string;
  procedureName?: string;
  value?: unknown;
  left?: unknown;
  right?: unknown;
  expression?: unknown;
  args?: unknown[];
}

const RANGES = new Set(['CELL_RANGE', 'COLUMN_RANGE', 'ROW_RANGE']);
/** Per cached tree: whether it must still be copied. Trees come from HyperFormula's cache, so each is asked about once. */
const mustCopy = new WeakMap<object, boolean>();

function needsCopy(node: unknown): boolean {
  if (!node || typeof node !== 'object') return false;
  const known = mustCopy.get(node);
  if (known !== undefined) return known;
  const n = node as TreeNode;
  const children = [n.value, n.left, n.right, n.expression, ...(n.args ?? []).flat()];
  const copy = RANGES.has(n.type) || (n.type === 'FUNCTION_CALL' && n.procedureName === 'HYPERLINK') || children.some(needsCopy);
  mustCopy.set(node, copy);
  return copy;
}

interface Size {
  width: number;
  height: number;
  isRef: boolean;
}
/**
 * Predicted result sizes of range-free trees, per engine settings. HyperFormula predicts the size of
 * every formula cell's result from its tree before placing it (and the evaluation limits ask again,
 * engineGuards.ts); for a tree without ranges the prediction reads the tree alone, never the cell's
 * address, so cells sharing a tree share it. Unshared, this was about 350 MB of short-lived objects
 * while 700,000 formulas were put back in a page.
 */
const sizes = new WeakMap<object, WeakMap<object, Size>>();

let installed = false;

/** Patches HyperFormula once so engines built afterwards share range-free formula trees, and their predicted result sizes, between cells. */
export function installSharedTrees(): void {
  if (installed) return;
  const internals = hyperFormulaInternals();
  const parserProto = internals.parserProto as { convertReversedRangesToRegularRanges?: (ast: object) => object };
  const convert = parserProto.convertReversedRangesToRegularRanges;
  if (typeof convert !== 'function') throw new Error('HyperFormula internals changed: parser.convertReversedRangesToRegularRanges is missing (functions/engineSharedTrees.ts)');
  parserProto.convertReversedRangesToRegularRanges = function (this: unknown, ast: object) {
    return needsCopy(ast) ? convert.call(this, ast) : ast;
  };
  const predictorProto = internals.Predictor.prototype as { checkArraySize?: (this: { config: object }, ast: object, at: unknown) => Size };
  const predict = predictorProto.checkArraySize;
  if (typeof predict !== 'function') throw new Error('HyperFormula internals changed: ArraySizePredictor.checkArraySize is missing (functions/engineSharedTrees.ts)');
  predictorProto.checkArraySize = function (ast, at) {
    let known = sizes.get(this.config);
    if (!known) sizes.set(this.config, (known = new WeakMap()));
    const size = known.get(ast);
    // A fresh copy each time, as HyperFormula makes one: nothing it is handed is shared with another cell.
    if (size) return new (size.constructor as new (w: number, h: number, r: boolean) => Size)(size.width, size.height, size.isRef);
    const predicted = predict.call(this, ast, at);
    if (!needsCopy(ast)) known.set(ast, predicted);
    return predicted;
  };
  installed = true;
}
