// When a memory or time limit ends a computation, the refusal says which cell the engine was on, so
// the analyst knows where to look (the worker writes each formula's address to shared memory).
import { afterAll, describe, expect, it } from 'vitest';
import { cellAddress } from '../shared/a1.js';
import { packCells, packedTransfer } from '../server/xlsx/packedCells.js';
import { computePool } from '../server/xlsx/workerPool.js';
import { SpreadsheetError } from '../server/xlsx/limits.js';

afterAll(() => computePool.close());

describe('a computation stopped by its time limit', () => {
  it('names the cell it was computing', async () => {
    // 5,000 formulas each summing 5,000 cells: seconds of work, far more than the limit allows.
    const cells: [number, number, string][] = [];
    for (let r = 0; r < 5000; r++) cells.push([r, 0, String(r)], [r, 1, `=SUM(A$1:A$5000)*${r}`]);
    const sheets = [{ id: 's1', name: 'Wide screen', packed: packCells(cells) }];
    const run = computePool.run({ kind: 'values', revision: 1, sheets }, sheets.flatMap((s) => packedTransfer(s.packed)), {
      limits: { maxOldGenerationSizeMb: 512, maxYoungGenerationSizeMb: 32, timeoutMs: 700 },
      doing: 'computing the values',
      describeCell: (sheet, row, col) => cellAddress(sheets[sheet].name, row, col),
    });
    const error = await run.then(
      () => null,
      (e: unknown) => e,
    );
    expect(error).toBeInstanceOf(SpreadsheetError);
    const message = (error as SpreadsheetError).message;
    expect(message, message).toMatch(/took longer than 0\.7 s and was stopped.*; the engine was at 'Wide screen'!B\d+$/);
  }, 60_000);
});
