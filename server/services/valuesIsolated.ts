// computeValues for the worker (server/xlsx/ioWorker.ts), which must answer for any stored workbook:
// when the engine throws for the workbook as a whole (a formula its parser cannot hold, say), the
// formulas that make it throw are found by halving the set of formula cells, each is answered with
// its own cell error, and the rest of the workbook is computed without them.
import type { ValueEntry, ValuesPayload } from '../../shared/workbooks.js';
import { computeValues, type ValuesInput } from './values.js';

/** Enough to isolate a few bad cells among 100,000 formulas (about 17 probes per culprit). */
const MAX_PROBES = 200;

type FormulaCell = { sheet: number; row: number; col: number };

function throws(workbook: ValuesInput, picked: FormulaCell[]): boolean {
  const bySheet = workbook.sheets.map(() => [] as [number, number, string][]);
  for (const c of picked) bySheet[c.sheet].push(workbook.sheets[c.sheet].cells.find((e) => e[0] === c.row && e[1] === c.col)!);
  try {
    computeValues({ revision: workbook.revision, sheets: workbook.sheets.map((s, i) => ({ ...s, cells: bySheet[i].sort((a, b) => a[0] - b[0] || a[1] - b[1]) })) });
    return false;
  } catch {
    return true;
  }
}

function culprits(workbook: ValuesInput, cells: FormulaCell[], budget: { probes: number }): FormulaCell[] {
  if (cells.length === 0 || budget.probes-- <= 0) return [];
  if (!throws(workbook, cells)) return [];
  if (cells.length === 1) return cells;
  const half = Math.ceil(cells.length / 2);
  return [...culprits(workbook, cells.slice(0, half), budget), ...culprits(workbook, cells.slice(half), budget)];
}

export function computeValuesIsolated(workbook: ValuesInput): ValuesPayload {
  try {
    return computeValues(workbook);
  } catch (failure) {
    const formulas: FormulaCell[] = [];
    workbook.sheets.forEach((s, sheet) => {
      for (const [row, col, input] of s.cells) if (input.startsWith('=')) formulas.push({ sheet, row, col });
    });
    const bad = culprits(workbook, formulas, { probes: MAX_PROBES });
    if (bad.length === 0) throw failure;
    const reason = failure instanceof Error ? failure.message : String(failure);
    const isBad = (sheet: number, row: number, col: number) => bad.some((b) => b.sheet === sheet && b.row === row && b.col === col);
    const rest = computeValues({ ...workbook, sheets: workbook.sheets.map((s, i) => ({ ...s, cells: s.cells.filter(([r, c]) => !isBad(i, r, c)) })) });
    return {
      ...rest,
      sheets: rest.sheets.map((s, i) => {
        const errors: ValueEntry[] = bad
          .filter((b) => b.sheet === i)
          .map((b) => [b.row, b.col, { error: '#ERROR!', message: `this formula could not be computed (${reason}); shorten it or split it over several cells` }]);
        return { ...s, values: [...s.values, ...errors].sort((a, b) => a[0] - b[0] || a[1] - b[1]) };
      }),
    };
  }
}
