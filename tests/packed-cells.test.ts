// Cells packed for a worker's trip come back the same, whole or a step at a time.
import { describe, expect, it } from 'vitest';
import { packCells, unpackCells, unpackCellsFrom } from '../server/xlsx/packedCells.js';
import type { CellTriple } from '../server/xlsx/types.js';

function randomCells(n: number, seed: number): CellTriple[] {
  let s = seed;
  const next = () => (s = (s * 1103515245 + 12345) % 2147483648) / 2147483648;
  const texts = ['', 'H2O', '=A1*2', 'β-carotene', '=MOCONFIG("O2-")', '6.022e23', 'a'.repeat(300)];
  return Array.from({ length: n }, (_, i): CellTriple => [i, Math.floor(next() * 20), texts[Math.floor(next() * texts.length)] + (next() < 0.5 ? String(i) : '')]);
}

describe('packed cells', () => {
  it('unpack whole to the cells that were packed', () => {
    const cells = randomCells(5_000, 7);
    expect(unpackCells(packCells(cells))).toEqual(cells);
  });

  it('unpack in steps of any size to the same cells, in order', () => {
    const cells = randomCells(3_001, 11);
    const packed = packCells(cells);
    for (const step of [1, 7, 2_048, 3_001, 10_000]) {
      const out: CellTriple[] = [];
      let at = 0;
      for (let from = 0; from < cells.length; from += step) {
        const part = unpackCellsFrom(packed, from, at, from + step);
        at = part.at;
        out.push(...part.cells);
      }
      expect(out).toEqual(cells);
    }
  });

  it('an empty batch unpacks to no cells', () => {
    expect(unpackCellsFrom(packCells([]), 0, 0, 2_048).cells).toEqual([]);
  });
});
