// Formula cells of one shape share one parsed tree (functions/engineSharedTrees.ts) instead of a copy
// each; what they compute, how they move with rows and what HYPERLINK records stay per cell.
import { describe, expect, it } from 'vitest';
import { createEngine } from '../functions/engine.js';

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
});
