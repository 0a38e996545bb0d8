// Computing and writing an export in a worker of the shared pool, streaming its bytes to `output`
// as they come: the engine's recalculation of a large workbook (a second or more for 100,000 cells)
// then never holds the server's event loop.
import { cellAddress } from '../../shared/a1.js';
import type { Writable } from 'node:stream';
import { formatBytes, recalcWorkerLimits, SpreadsheetError, type WorkerLimits } from './limits.js';
import type { ExportMode, ExportWorkbook } from './types.js';
import { packSheets } from './packedCells.js';
import { computePool } from './workerPool.js';
import type { FreshStructure } from '../structures/workerResults.js';
import type { JobStructures } from '../structures/structureService.js';

/** An export larger than this is stopped: no workbook of 500,000 cells comes near it, a formula making huge texts does. */
export const maxExportBytes = 256 * 1024 * 1024;
/** Bytes the response may hold unsent before the export is stopped (the client stopped reading). */
export const maxUnsentExportBytes = 64 * 1024 * 1024;

export type ExportFormat = { kind: 'xlsx'; mode: ExportMode } | { kind: 'csv'; sheetIndex: number };

export interface ExportStats {
  bytes: number;
  elapsedMs: number;
  /** Inside the worker: the engine's recalculation, then writing the file. */
  engineMs: number;
  writeMs: number;
  workerHeapUsedBytes: number;
}

/**
 * Streams the file into `output` and ends it. `onFirstByte` runs before the first write, so a
 * caller can still answer with a JSON error when the export fails before any byte is sent.
 */
export async function exportInWorker(output: Writable, workbook: ExportWorkbook, format: ExportFormat, options: { workerLimits?: WorkerLimits; onFirstByte?: () => void; owner?: string; structures?: JobStructures } = {}): Promise<ExportStats> {
  let bytes = 0;
  const stop = new AbortController();
  // Cells go packed (packedCells.ts): cloning 100,000 small arrays into the worker costs more than packing them.
  const { packed, transfer } = packSheets(workbook);
  const structures = options.structures?.stored;
  const job = format.kind === 'xlsx' ? { kind: 'xlsx', workbook: packed, mode: format.mode, structures } : { kind: 'csv', workbook: packed, sheetIndex: format.sheetIndex, structures };
  const outcome = await computePool.run<{ engineMs: number; writeMs: number; fresh: FreshStructure[] }>(job, transfer, {
    owner: options.owner,
    signal: stop.signal,
    limits: options.workerLimits ?? recalcWorkerLimits,
    doing: 'writing the export',
    describeCell: (sheet, row, col) => (workbook.sheets[sheet] ? cellAddress(workbook.sheets[sheet].name, row, col) : `a cell of sheet ${sheet + 1}`),
    onProgress: (m) => {
      const structure = (m as { structure?: FreshStructure }).structure;
      if (structure) return options.structures?.save([structure]);
      const chunk = (m as { chunk?: Uint8Array }).chunk;
      if (!chunk || output.destroyed || stop.signal.aborted) return;
      if (bytes + chunk.byteLength > maxExportBytes) {
        return stop.abort(new SpreadsheetError('too_complex', `the export came to more than ${formatBytes(maxExportBytes)} (for example formulas that make very long texts)`));
      }
      if (output.writableLength > maxUnsentExportBytes) {
        return stop.abort(new SpreadsheetError('too_complex', `the download was not being read; ${formatBytes(output.writableLength)} were waiting`));
      }
      if (bytes === 0) options.onFirstByte?.();
      bytes += chunk.byteLength;
      // No backpressure to the worker: an export is bounded by its compressed size (a few MB for
      // 100,000 cells), which the response buffers when the network is slower than the writer; the
      // two bounds above stop the rest.
      output.write(chunk);
    },
  });
  await new Promise<void>((resolve) => (output.destroyed ? resolve() : output.end(resolve)));
  const { fresh, ...timing } = outcome.result;
  options.structures?.save(fresh);
  return { bytes, elapsedMs: outcome.elapsedMs, ...timing, workerHeapUsedBytes: outcome.workerHeapUsedBytes };
}
