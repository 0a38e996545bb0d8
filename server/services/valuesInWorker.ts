// GET /api/workbooks/:id/values for a large workbook: computed in a worker of the shared pool
// (server/xlsx/workerPool.ts), so recalculating 100,000 cells never holds the server's event loop.
// The worker answers with the finished JSON as bytes (moved, not copied), which the route sends as is.
// A small workbook is computed here: the trip to a worker would cost more than the work.
import type { ValuesPayload } from '../../shared/workbooks.js';
import { recalcWorkerLimits } from '../xlsx/limits.js';
import { packCells, packedTransfer } from '../xlsx/packedCells.js';
import { ioPool } from '../xlsx/workerPool.js';
import { computeValues, type ValuesInput } from './values.js';

/** At or above this many cells the values are computed in a worker. */
export const VALUES_IN_WORKER_FROM_CELLS = 5_000;

export type ValuesBody = { json: ValuesPayload } | { bytes: Uint8Array };

export async function valuesFor(workbook: ValuesInput): Promise<ValuesBody> {
  const cells = workbook.sheets.reduce((n, s) => n + s.cells.length, 0);
  if (cells < VALUES_IN_WORKER_FROM_CELLS) return { json: computeValues(workbook) };
  const sheets = workbook.sheets.map((s) => ({ id: s.id, name: s.name, packed: packCells(s.cells) }));
  const outcome = await ioPool.run<Uint8Array>({ kind: 'values', revision: workbook.revision, sheets }, sheets.flatMap((s) => packedTransfer(s.packed)), {
    limits: recalcWorkerLimits,
    doing: 'computing the values',
  });
  return { bytes: outcome.result };
}
