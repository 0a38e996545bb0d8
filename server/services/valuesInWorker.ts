// GET /api/workbooks/:id/values: computed in a worker of the compute pool (server/xlsx/workerPool.ts)
// under its memory and time limits, whatever the workbook's size: a formula that spills a billion
// cells or sums a million-row range then costs one worker, never the server's event loop or heap.
// The worker answers with the finished JSON as bytes (moved, not copied), which the route sends as is.
import { cellAddress } from '../../shared/a1.js';
import type { AppContext } from '../context.js';
import { recalcWorkerLimits, refusalAbout } from '../xlsx/limits.js';
import { packCells, packedTransfer } from '../xlsx/packedCells.js';
import { computePool } from '../xlsx/workerPool.js';
import type { WorkbookAccess } from './access.js';
import type { ValuesInput } from './values.js';
import type { FreshStructure } from '../structures/workerResults.js';
import { jobStructures, type JobStructures } from '../structures/structureService.js';
import { loadWorkbookInSlices } from './workbookSlices.js';

export type ValuesBody = { bytes: Uint8Array };

/** `owner`: the user asking, for the per-person cap on queued jobs. */
export async function valuesFor(workbook: ValuesInput, owner?: string, structures?: JobStructures): Promise<ValuesBody> {
  const sheets = workbook.sheets.map((s) => ({ id: s.id, name: s.name, packed: packCells(s.cells) }));
  // Extended-Hückel results go along as stored; the worker computes (and we then store) only the missing ones.
  const outcome = await computePool.run<{ bytes: Uint8Array; fresh: FreshStructure[] }>({ kind: 'values', revision: workbook.revision, sheets, structures: structures?.stored }, sheets.flatMap((s) => packedTransfer(s.packed)), {
    limits: recalcWorkerLimits,
    doing: 'computing the values',
    owner,
    onProgress: (m) => {
      const structure = (m as { structure?: FreshStructure }).structure;
      if (structure) structures?.save([structure]);
    },
    describeCell: (sheet, row, col) => (workbook.sheets[sheet] ? cellAddress(workbook.sheets[sheet].name, row, col) : `a cell of sheet ${sheet + 1}`),
  });
  structures?.save(outcome.result.fresh);
  return { bytes: outcome.result.bytes };
}

/** The stored workbook's computed values as the JSON body of /values; a refusal is about the values. */
export async function workbookValues(ctx: AppContext, access: WorkbookAccess, owner: string): Promise<Buffer> {
  const workbook = await loadWorkbookInSlices(ctx, access);
  const { bytes } = await valuesFor(workbook, owner, jobStructures(ctx, access.workbook.id)).catch(refusalAbout('values'));
  return Buffer.from(bytes.buffer, bytes.byteOffset, bytes.byteLength);
}
