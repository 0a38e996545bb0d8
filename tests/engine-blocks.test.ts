// engineBlocks (functions/workbookEngine.ts) gathers cells to write into rectangles, so the page puts
// formulas back a block per call rather than a cell per call. Written as blocks, the engine must end
// exactly as it does written cell by cell, in the order given.
import { describe, expect, it } from 'vitest';
import { buildWorkbookEngine, engineBlocks } from '../functions/workbookEngine.js';
import { seededRandom as rng } from './helpers/seededRandom.js';

type Cell = { engineId: number; row: number; col: number; content: string | number | null };

function contents(engine: ReturnType<typeof buildWorkbookEngine>, sheets: number) {
  return Array.from({ length: sheets }, (_, sheet) => engine.getSheetSerialized(sheet));
}

describe('engineBlocks', () => {
  it('makes one block of rows that each run along the same columns', () => {
    const cells: Cell[] = [];
    for (let row = 4; row < 104; row++) for (let col = 1; col < 8; col++) cells.push({ engineId: 0, row, col, content: `=A${row + 1}*${col}` });
    const blocks = engineBlocks(cells);
    expect(blocks).toHaveLength(1);
    expect(blocks[0]).toMatchObject({ engineId: 0, row: 4, col: 1 });
    expect(blocks[0].rows).toHaveLength(100);
    expect(blocks[0].rows[7]).toEqual(cells.slice(49, 56).map((c) => c.content));
  });

  it('breaks blocks at a gap, a new sheet, a different span or a cell out of order', () => {
    const at = (engineId: number, row: number, col: number): Cell => ({ engineId, row, col, content: `${engineId}:${row}:${col}` });
    const blocks = engineBlocks([at(0, 0, 0), at(0, 0, 1), at(0, 1, 0), at(0, 1, 1), at(0, 2, 0), at(0, 3, 0), at(1, 4, 0), at(1, 4, 2), at(1, 3, 2)]);
    expect(blocks.map((b) => [b.engineId, b.row, b.col, b.rows.map((r) => r.length)])).toEqual([
      [0, 0, 0, [2, 2]],
      [0, 2, 0, [1, 1]],
      [1, 4, 0, [1]],
      [1, 4, 2, [1]],
      [1, 3, 2, [1]],
    ]);
  });

  it('leaves an engine exactly as writing the cells one by one does (200 random write lists)', () => {
    const random = rng(4242);
    for (let round = 0; round < 200; round++) {
      const start = [
        { name: 'S1', table: [[1, 2, 3], ['=A1+B1', null, '=C1*2']] },
        { name: 'S2', table: [['=S1!A1*10']] },
      ];
      const cells: Cell[] = [];
      const n = 1 + Math.floor(random() * 40);
      let row = Math.floor(random() * 4);
      let col = Math.floor(random() * 4);
      for (let i = 0; i < n; i++) {
        const r = random();
        // Mostly the next cell along or the start of the next row, as the page puts formulas back; sometimes a jump back or a repeat.
        if (r < 0.5) col++;
        else if (r < 0.8) {
          row++;
          col = Math.floor(random() * 2);
        } else if (r < 0.9) {
          row = Math.floor(random() * 6);
          col = Math.floor(random() * 5);
        }
        const kind = random();
        const content = kind < 0.15 ? null : kind < 0.5 ? Math.floor(random() * 100) : `=A1+${Math.floor(random() * 9)}+S1!C2`;
        cells.push({ engineId: random() < 0.8 ? 0 : 1, row, col, content });
      }
      const byCell = buildWorkbookEngine(start);
      const byBlock = buildWorkbookEngine(start);
      for (const c of cells) byCell.setCellContents({ sheet: c.engineId, row: c.row, col: c.col }, [[c.content]]);
      const blocks = engineBlocks(cells);
      for (const b of blocks) byBlock.setCellContents({ sheet: b.engineId, row: b.row, col: b.col }, b.rows);
      expect(contents(byBlock, 2)).toEqual(contents(byCell, 2));
      expect(byBlock.getAllSheetsValues()).toEqual(byCell.getAllSheetsValues());
      expect(blocks.reduce((k, b) => k + b.rows.length * b.rows[0].length, 0)).toBe(cells.length);
      byCell.destroy();
      byBlock.destroy();
    }
  });
});
