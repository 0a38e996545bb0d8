// readSpreadsheet in a worker of the shared pool (workerPool.ts), under its memory and time limits.
// Cheap refusals (size, magic bytes) happen here first, so an obviously wrong upload costs no worker.
import { defaultImportLimits, defaultWorkerLimits, type ImportLimits, type WorkerLimits } from './limits.js';
import { unpackCellsFrom, unpackSheets, type PackedCells, type PackedParsedWorkbook } from './packedCells.js';
import { maxColIndex } from '../../shared/workbooks.js';
import { checkCsvShape, decodeText, guessDelimiter } from './csvCount.js';
import { extensionOf, sniffSpreadsheet } from './sniff.js';
import type { CellTriple, ParsedWorkbook } from './types.js';
import { computePool, ioPool } from './workerPool.js';

/** Cells handed to `onCells` per turn of the event loop. */
const STORE_STEP = 2_048;

export interface ParseResult extends ParsedWorkbook {
  stats: { elapsedMs: number; workerHeapUsedBytes: number; /** Packing the cells for the trip back (packedCells.ts). */ packMs: number };
  /** Sheets (by index) whose cells were handed to `onCells` as they were read; their `cells` hold them all too. */
  streamedSheets: number[];
}

export async function parseInWorker(
  buffer: Uint8Array,
  filename: string,
  options: {
    limits?: ImportLimits;
    workerLimits?: WorkerLimits;
    owner?: string;
    /** Each .xlsx sheet's cells in order, a batch at a time while the rest is still being read. */
    onCells?: (sheet: number, cells: CellTriple[]) => void;
  } = {},
): Promise<ParseResult> {
  const limits = options.limits ?? defaultImportLimits;
  if (sniffSpreadsheet(buffer, filename, limits) === 'csv') {
    const head = decodeText(buffer.subarray(0, 64 * 1024), []);
    checkCsvShape(buffer, guessDelimiter(head, extensionOf(filename)), limits, maxColIndex + 1);
  }
  // A private copy, moved (not copied again) into the worker.
  const copy = new Uint8Array(buffer);
  // The worker sends each sheet's cells packed (packedCells.ts): cheaper to move than 100,000 small arrays.
  const { onCells } = options;
  const collected: CellTriple[][] = [];
  let failed: unknown = null;
  // Batches can arrive faster than they are stored (the direct reader hands a whole sheet on at
  // once, and a port delivers every waiting message in one go), so they queue here and are stored
  // one per turn of the event loop: storing never holds the loop for more than one batch.
  const queue: { sheet: number; packed: PackedCells }[] = [];
  let draining: Promise<void> | null = null;
  const store = (sheet: number, cells: CellTriple[]) => {
    try {
      onCells!(sheet, cells);
    } catch (e) {
      failed = e; // the read is stopped; this error, not the stop, is what the caller gets
      stop.abort();
    }
  };
  const drain = async () => {
    for (let batch = queue.shift(); batch && !failed; batch = queue.shift()) {
      const into = (collected[batch.sheet] ??= []);
      const count = batch.packed.rows.length;
      // A step at a time, unpacked as it is stored (a sheet's 100,000 cells made at once held the
      // loop, and its collector, for one long turn), as importStaged stores a sheet read whole.
      let offset = 0;
      for (let from = 0; (from < count || from === 0) && !failed; from += STORE_STEP) {
        const step = unpackCellsFrom(batch.packed, from, offset, from + STORE_STEP);
        offset = step.at;
        for (const cell of step.cells) into.push(cell);
        store(batch.sheet, step.cells);
        await new Promise<void>((resolve) => setImmediate(resolve));
      }
    }
    draining = null;
  };
  const onProgress = (m: unknown) => {
    const batch = (m as { cells?: { sheet: number; packed: PackedCells } }).cells;
    if (!batch || failed) return;
    queue.push(batch);
    draining ??= drain();
  };
  const stop = new AbortController();
  const outcome = await ioPool.run<PackedParsedWorkbook & { packMs: number; streamed: number[] }>({ kind: 'parse', buffer: copy, filename, limits, stream: onCells !== undefined }, [copy.buffer], {
    limits: options.workerLimits ?? defaultWorkerLimits,
    doing: 'reading the file',
    owner: options.owner,
    onProgress: onCells && onProgress,
    signal: onCells && stop.signal,
  }).catch(async (e: unknown) => {
    // The read failed: what is queued is not stored (the caller discards what was).
    queue.length = 0;
    await draining;
    throw failed ?? e;
  });
  while (draining) await draining;
  if (failed) throw failed;
  const { packMs, streamed, ...packed } = outcome.result;
  const parsed: ParsedWorkbook = unpackSheets(packed);
  for (const i of streamed) parsed.sheets[i].cells = collected[i] ?? [];
  return { ...parsed, streamedSheets: streamed, stats: { elapsedMs: outcome.elapsedMs, workerHeapUsedBytes: outcome.workerHeapUsedBytes, packMs } };
}

/** Stops the idle workers of both pools (tests, shutdown). */
export async function closeParsePool(): Promise<void> {
  await Promise.all([ioPool.close(), computePool.close()]);
}

/** Starts a worker of each pool now rather than at the first upload or /values (server start, benchmarks). */
export function warmParsePool(): void {
  ioPool.warm();
  computePool.warm();
}
