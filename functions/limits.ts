// How much work one cell may ask of the engine. The same numbers hold in the browser, on the server
// and in the CLI (all build their engine with functions/engine.ts), so a workbook that opens in one
// opens in the others. Each refusal is a cell error whose message names the limit; the rest of the
// workbook keeps computing. Figures behind each number: DEVELOPERS.md, "Evaluation limits".
// A leaf module: it imports nothing, so the catalog, the chemistry cache and shared/ may all use it.

export const evaluationLimits = {
  /**
   * Cells one formula may spill. HyperFormula writes every spilled cell into its address map: a
   * 1,000 × 1,000 SEQUENCE took 6.8 s and 250 MB, a 100,000-cell one 0.7–1.4 s.
   */
  maxSpillCells: 100_000,
  /**
   * Cells the ranges of one formula may cover in total (a whole column counts as the grid's full
   * height). HyperFormula gives every cell of a range its own vertex and edge, empty or not:
   * 100,000 cells took ~2 s and 80 MB to build, 1,000,000 cells 13 s and 600 MB.
   */
  maxRangeCells: 100_000,
  /**
   * Characters of text one formula may produce: 32,767 is the usual spreadsheet cell limit
   * (common practice); REPT("ab",200000000) would otherwise hold 400 MB in one cell.
   */
  maxTextLength: 32_767,
  /**
   * π centres a Hückel-family function solves, and rows of a SECULAR/ORBITAL matrix. The dense
   * eigensolver is O(n³): 200 centres ~0.2 s, 300 ~0.5–1 s, 600 ~6.6 s, 3,000 about 6 minutes.
   */
  maxPiCentres: 200,
  maxMatrixSize: 200,
  /**
   * Heavy atoms in a SMILES before its π system is perceived (ring perception alone took 2.8 s
   * for 3,000 atoms and 0.8 s for 600).
   */
  maxSmilesAtoms: 400,
  /**
   * Operators in one formula. HyperFormula's parser and its tree walks recurse once per chained
   * operator: =1+1+… overflowed Node 20's default stack at 1,250 operands (1,100 still parsed).
   * Argument lists do not deepen the recursion and are not counted.
   */
  maxFormulaOperators: 500,
  /**
   * The science core keeps its own method's bounds beside the method (functions/chem imports
   * nothing of ours); they are listed here so this table is the whole picture, and
   * tests/eval-limits.test.ts checks that the two agree. PPP-CIS: 60 π centres (the CIS of 40
   * centres is ~50–120 ms of CPU, bench/ppp.ts). Extended Hückel: 300 valence basis functions and
   * 150 atoms (about one second per solve, bench/eht.ts).
   */
  maxPppCentres: 60,
  maxEhtBasisFunctions: 300,
  maxEhtAtoms: 150,
} as const;

/** 2000000000 → "2,000,000,000": limits are quoted the same way everywhere. */
export function count(n: number): string {
  return n.toLocaleString('en');
}

export function spillProblem(cells: number): string | null {
  const max = evaluationLimits.maxSpillCells;
  return cells > max ? `spills ${count(cells)} cells; at most ${count(max)}` : null;
}

export function rangeProblem(cells: number, largest: string): string | null {
  const max = evaluationLimits.maxRangeCells;
  return cells > max ? `reads ${count(cells)} cells (${largest}); at most ${count(max)} per formula` : null;
}

export function textProblem(length: number): string | null {
  const max = evaluationLimits.maxTextLength;
  return length > max ? `makes text of ${count(length)} characters; at most ${count(max)}` : null;
}

export function piCentresProblem(centres: number): string | null {
  const max = evaluationLimits.maxPiCentres;
  return centres > max ? `the π system has ${count(centres)} centres; at most ${count(max)} are solved` : null;
}

export function smilesAtomsProblem(atoms: number): string | null {
  const max = evaluationLimits.maxSmilesAtoms;
  return atoms > max ? `the SMILES has ${count(atoms)} heavy atoms; at most ${count(max)} are read` : null;
}

export function matrixProblem(rows: number, cols: number): string | null {
  const max = evaluationLimits.maxMatrixSize;
  return rows > max || cols > max ? `the matrix range is ${count(rows)} × ${count(cols)}; at most ${max} × ${max}` : null;
}

/**
 * Operators in a formula, outside "string literals": each may be one more level of the parser's
 * recursion. A sign, a percent or an exponent's sign counts too; <= counts twice. The bound is
 * coarse on purpose.
 */
export function formulaOperatorCount(formula: string): number {
  let n = 0;
  let inString = false;
  for (let i = 1; i < formula.length; i++) {
    const ch = formula[i];
    if (ch === '"') inString = !inString;
    else if (!inString && '+-*/^&=<>%'.includes(ch)) n++;
  }
  return n;
}

export function formulaSizeProblem(formula: string): string | null {
  const n = formulaOperatorCount(formula);
  const max = evaluationLimits.maxFormulaOperators;
  return n > max ? `the formula has ${count(n)} operators; at most ${count(max)}` : null;
}
