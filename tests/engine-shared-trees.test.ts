// Formula cells of one shape share one parsed tree (functions/engineSharedTrees.ts) instead of a copy
// each; what they compute, how they move with rows and what HYPERLINK records stay per cell.
import { describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';
import { hyperFormulaInternals } from '../functions/engineGuards.js';

type Internals = { _dependencyGraph: { getCell(a: { sheet: number; row: number; col: number }): { formula?: object } | undefined } };

const tree = (engine: ReturnType<typeof createEngine>, row: number, col: number) =>
  (engine as unknown as Internals)._dependencyGraph.getCell({ sheet: 0, row, col })?.formula;

describe('formula trees shared between cells of one shape', () => {
  it('shares the tree of a range-free shape down a column, each cell computing its own row', () => {
    const rows = Array.from({ length: 50 }, (_, r) => [r + 1, `=A${r + 1}*2+ROUND(A${r + 1}/3, 2)`, `=SUM(A${r + 1}:A${r + 2})`]);
    const engine = createEngine({ S: rows });
    try {
      expect(tree(engine, 0, 1)).toBeDefined();
      expect(tree(engine, 1, 1)).toBe(tree(engine, 0, 1));
      expect(tree(engine, 49, 1)).toBe(tree(engine, 0, 1));
      // A tree with a range is still copied per cell, as HyperFormula does.
      expect(tree(engine, 1, 2)).not.toBe(tree(engine, 0, 2));
      for (const r of [0, 7, 49]) {
        const a = r + 1;
        expect(engine.getCellValue({ sheet: 0, row: r, col: 1 })).toBeCloseTo(a * 2 + Math.round((a / 3) * 100) / 100, 10);
        expect(engine.getCellValue({ sheet: 0, row: r, col: 2 })).toBe(r === 49 ? 50 : a + a + 1);
      }
    } finally {
      engine.destroy();
    }
  });

  it('keeps reversed ranges put in order', () => {
    const engine = createEngine({ S: [[1, 2, '=SUM(B1:A1)', '=SUM(A1:B1)']] });
    try {
      expect(engine.getCellValue({ sheet: 0, row: 0, col: 2 })).toBe(3);
      expect(engine.getCellFormula({ sheet: 0, row: 0, col: 2 })).toBe('=SUM(A1:B1)');
    } finally {
      engine.destroy();
    }
  });

  it('moves shared formulas with inserted and removed rows, each keeping its own references', () => {
    const engine = createEngine({ S: [[1, '=A1*10'], [2, '=A2*10'], [3, '=A3*10']] });
    try {
      engine.addRows(0, [1, 2]);
      engine.setCellContents({ sheet: 0, row: 1, col: 0 }, [[5], [6]]);
      expect(engine.getCellFormula({ sheet: 0, row: 3, col: 1 })).toBe('=A4*10');
      expect(engine.getCellFormula({ sheet: 0, row: 4, col: 1 })).toBe('=A5*10');
      expect([0, 3, 4].map((r) => engine.getCellValue({ sheet: 0, row: r, col: 1 }))).toEqual([10, 20, 30]);
      engine.removeRows(0, [0, 1]);
      expect(engine.getCellFormula({ sheet: 0, row: 2, col: 1 })).toBe('=A3*10');
      expect(engine.getCellFormula({ sheet: 0, row: 3, col: 1 })).toBe('=A4*10');
      expect([2, 3].map((r) => engine.getCellValue({ sheet: 0, row: r, col: 1 }))).toEqual([20, 30]);
    } finally {
      engine.destroy();
    }
  });

  it('keeps each HYPERLINK cell’s own address (that function writes onto its tree)', () => {
    const engine = createEngine({ S: [['https://a.example', '=HYPERLINK(A1, "a")'], ['https://b.example', '=HYPERLINK(A2, "b")']] });
    try {
      expect(engine.getCellHyperlink({ sheet: 0, row: 0, col: 1 })).toBe('https://a.example');
      expect(engine.getCellHyperlink({ sheet: 0, row: 1, col: 1 })).toBe('https://b.example');
    } finally {
      engine.destroy();
    }
  });

  it('predicts a shared shape\'s result size once, and each cell still spills what it computes', () => {
    const proto = hyperFormulaInternals().Predictor.prototype as { checkArraySizeForAst: (...a: unknown[]) => unknown };
    const ask = proto.checkArraySizeForAst;
    let asked = 0;
    proto.checkArraySizeForAst = function (...a: unknown[]) {
      asked++;
      return ask.apply(this, a);
    };
    try {
      const rows: (string | number | null)[][] = Array.from({ length: 400 }, (_, r) => [r + 1, `=A${r + 1}*2`, null, null, null]);
      // Spilling shapes: range-free (SEQUENCE) in two rows, and one with a range.
      rows[0].push('=SEQUENCE(1, 3)');
      rows[5].push('=SEQUENCE(1, 3)');
      rows[10].push(`=A1:A2*10`);
      const engine = createEngine({ S: rows });
      try {
        // Without the shared prediction each of the 400 cells is asked about twice (the engine and the evaluation limits).
        expect(asked).toBeLessThan(40);
        expect(engine.getCellValue({ sheet: 0, row: 399, col: 1 })).toBe(800);
        for (const r of [0, 5]) expect([5, 6, 7].map((col) => engine.getCellValue({ sheet: 0, row: r, col }))).toEqual([1, 2, 3]);
        expect([10, 11].map((row) => engine.getCellValue({ sheet: 0, row, col: 5 }))).toEqual([10, 20]);
        // A SEQUENCE with no room to spill is an error in that cell only.
        engine.setCellContents({ sheet: 0, row: 5, col: 6 }, 'x');
        expect((engine.getCellValue({ sheet: 0, row: 5, col: 5 }) as { type?: string }).type).toBe('SPILL');
        expect(engine.getCellValue({ sheet: 0, row: 0, col: 6 })).toBe(2);
      } finally {
        engine.destroy();
      }
    } finally {
      proto.checkArraySizeForAst = ask;
    }
  });
});
