// Evaluates stand-alone formulas in a scratch engine, each on its own sheet so that a spilled
// result never collides with the next formula. Used by `cli eval` and by tests.
import { DetailedCellError } from 'hyperformula';
import '../../functions/openchemlibNode.js';
import { createEngine } from '../../functions/engine.js';

export type CellScalar = number | string | boolean;

export type FormulaOutcome =
  | { formula: string; value: CellScalar | CellScalar[][] }
  | { formula: string; error: string; message: string };

function asFormula(text: string): string {
  const trimmed = text.trim();
  return trimmed.startsWith('=') ? trimmed : `=${trimmed}`;
}

export function evaluateStandalone(formulas: string[]): FormulaOutcome[] {
  if (formulas.length === 0) return [];
  const sheets = Object.fromEntries(formulas.map((f, i) => [`F${i + 1}`, [[asFormula(f)]]]));
  const engine = createEngine(sheets);
  try {
    return formulas.map((formula, i) => {
      const values = engine.getSheetValues(engine.getSheetId(`F${i + 1}`)!);
      const cells = values.flat();
      const firstError = cells.find((c) => c instanceof DetailedCellError) as DetailedCellError | undefined;
      if (firstError) return { formula, error: firstError.value, message: firstError.message ?? '' };
      const table = values.map((row) => row.map((c) => (c === null || c === undefined ? '' : (c as CellScalar))));
      if (table.length === 1 && table[0].length === 1) return { formula, value: table[0][0] };
      if (table.length === 0) return { formula, value: '' };
      return { formula, value: table };
    });
  } finally {
    engine.destroy();
  }
}
