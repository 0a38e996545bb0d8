// One wording for each cell error: the grid (cellView) and the server's /values explain the same
// engine error in the same words, and our functions' own messages come first in both.
import { describe, expect, it } from 'vitest';
import { cellErrorExplanations } from '../functions/cellErrors.js';
import { buildWorkbookEngine } from '../functions/workbookEngine.js';
import { computeValues } from '../server/services/values.js';
import { cellView } from '../src/core/workbook/model/cellView.js';

const inputs = ['=1/0', '=NOSUCHFUNCTION(1)', '=A3', '=BONDORDER("Xq2")'];

describe('cell errors in one wording', () => {
  it('reads the same in the grid and in /values', () => {
    const cells = inputs.map((input, row) => [row, 0, input] as [number, number, string]);
    const server = computeValues({ revision: 1, sheets: [{ id: 's', name: 'S', cells }] }).sheets[0].values;
    const engine = buildWorkbookEngine([{ name: 'S', cells }]);
    try {
      const grid = inputs.map((input, row) => cellView(input, engine.getCellValue({ sheet: 0, row, col: 0 }), null));
      expect(server).toHaveLength(inputs.length);
      for (const [row, , value] of server) {
        expect(value).toMatchObject({ error: grid[row]!.errorCode, message: grid[row]!.errorMessage });
      }
      // Division by zero has no engine message: the shared explanation is used.
      expect(grid[0]!.errorMessage).toBe(cellErrorExplanations['#DIV/0!']);
      // Our functions name what is wrong.
      expect(grid[3]!.errorMessage).toMatch(/Xq/);
    } finally {
      engine.destroy();
    }
  });
});
