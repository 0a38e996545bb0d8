// Runs inside a worker thread of workerPool.ts: reads one upload, or computes and writes one export
// and streams its bytes back. Any failure is answered as a refusal; the parent enforces the limits.
import { Writable } from 'node:stream';
import { parentPort } from 'node:worker_threads';
import { watchEvaluation } from '../../functions/engineGuards.js';
import { computeWorkbook } from './engineValues.js';
import { capComputedWorkbook, capValuesPayload } from './longTexts.js';
import { computeValuesIsolated } from '../services/valuesIsolated.js';
import { computedFromStored, decodeValues } from '../values/storedFormat.js';
import { packCells, packedTransfer, packSheets, unpackCells, unpackSheets, type PackedCells, type PackedExportWorkbook } from './packedCells.js';
import { SpreadsheetError, type ImportLimits } from './limits.js';
import { readSpreadsheet } from './read.js';
import type { CellTriple, ExportMode, ExportWorkbook } from './types.js';
import { writeSheetCsv } from './writeCsv.js';
import { writeComputedXlsx } from './writeXlsx.js';
import { computeStructures, useStructures, type StoredStructures } from '../structures/workerResults.js';

export type IoJob =
  /** `stream`: each sheet's cells go back in batches as they are read ({ cells } messages), not in the result. */
  | { kind: 'parse'; buffer: Uint8Array; filename: string; limits: ImportLimits; stream?: boolean }
  | { kind: 'xlsx'; workbook: PackedExportWorkbook; mode: ExportMode; structures?: StoredStructures }
  | { kind: 'csv'; workbook: PackedExportWorkbook; sheetIndex: number; structures?: StoredStructures }
  /** GET …/values of a large workbook (services/valuesInWorker.ts): answered as UTF-8 JSON bytes. */
  | { kind: 'values'; revision: number; sheets: { id: string; name: string; packed: PackedCells }[]; structures?: StoredStructures }
  /** Extended-Hückel results for structures not stored yet (server/structures/structureService.ts). */
  | { kind: 'structures'; inputs: { structure: string; charge?: number }[] };

let structures: ReturnType<typeof useStructures> = { fresh: [], end: () => undefined };

/** The longest /values answer, in characters of JSON. */
const maxValuesChars = 64_000_000;

/** Bytes for the parent, moved rather than copied; the parent writes them to the response. */
function chunkPoster(): Writable {
  return new Writable({
    write(chunk: Buffer, _encoding, done) {
      const bytes = new Uint8Array(chunk.byteLength);
      bytes.set(chunk);
      parentPort!.postMessage({ chunk: bytes }, [bytes.buffer]);
      done();
    },
  });
}

/** An export's values: the revision's stored ones when it has them, otherwise the engine's. */
function computedFor(workbook: ExportWorkbook) {
  const cells = workbook.sheets.map((s) => ({ name: s.name, cells: s.cells }));
  if (workbook.stored) return computedFromStored(cells, workbook.stored.sheetIds, decodeValues(workbook.stored.valuesGzip), workbook.stored.extras);
  return capComputedWorkbook(computeWorkbook(cells));
}

/** The job's result, and any buffers to move (not copy) back with it. */
async function run(job: IoJob): Promise<{ result: unknown; transfer?: ArrayBuffer[] }> {
  switch (job.kind) {
    case 'parse': {
      const streamed = new Set<number>();
      let streamPackMs = 0;
      const onCells = job.stream
        ? (sheet: number, cells: CellTriple[]) => {
            const started = performance.now();
            const packed = packCells(cells);
            streamPackMs += performance.now() - started;
            streamed.add(sheet);
            parentPort!.postMessage({ cells: { sheet, packed } }, packedTransfer(packed));
          }
        : undefined;
      const parsed = await readSpreadsheet(Buffer.from(job.buffer.buffer, job.buffer.byteOffset, job.buffer.byteLength), job.filename, job.limits, onCells);
      const packStart = performance.now();
      // Sheets whose cells went out in batches are sent without them.
      const { packed, transfer } = packSheets({ ...parsed, sheets: parsed.sheets.map((s, i) => (streamed.has(i) ? { ...s, cells: [] } : s)) });
      return { result: { ...packed, streamed: [...streamed], packMs: streamPackMs + performance.now() - packStart }, transfer };
    }
    case 'structures':
      return { result: computeStructures(job.inputs) };
    case 'xlsx': {
      const started = performance.now();
      const workbook: ExportWorkbook = unpackSheets(job.workbook);
      const computed = computedFor(workbook);
      const computedAt = performance.now();
      const out = chunkPoster();
      await writeComputedXlsx(out, workbook, computed, { mode: job.mode });
      await new Promise<void>((resolve) => (out.writableFinished ? resolve() : out.once('finish', resolve)));
      return { result: { engineMs: computedAt - started, writeMs: performance.now() - computedAt, fresh: structures.fresh } };
    }
    case 'values': {
      const payload = capValuesPayload(computeValuesIsolated({ revision: job.revision, sheets: job.sheets.map((s) => ({ id: s.id, name: s.name, cells: unpackCells(s.packed) })) }));
      const json = JSON.stringify(payload);
      // Bytes are at most three per UTF-16 unit; checked on the text, before encoding it.
      if (json.length > maxValuesChars) {
        throw new SpreadsheetError('too_complex', `the values come to ${(json.length / 1e6).toFixed(0)} million characters, more than the ${maxValuesChars / 1e6} million one answer may hold (for example formulas that make very long texts)`);
      }
      const bytes = new TextEncoder().encode(json);
      return { result: { bytes, fresh: structures.fresh }, transfer: [bytes.buffer as ArrayBuffer] };
    }
    case 'csv': {
      const started = performance.now();
      const workbook: ExportWorkbook = unpackSheets(job.workbook);
      const computed = computedFor(workbook);
      const computedAt = performance.now();
      await writeSheetCsv(chunkPoster(), computed.sheets[job.sheetIndex].cells);
      return { result: { engineMs: computedAt - started, writeMs: performance.now() - computedAt, fresh: structures.fresh } };
    }
  }
}

parentPort!.on('message', async (job: IoJob & { evaluating?: SharedArrayBuffer }) => {
  // The pool reads this after a memory or time limit has ended the worker: the cell it was on.
  const evaluating = job.evaluating ? new Int32Array(job.evaluating) : null;
  watchEvaluation(
    evaluating &&
      ((sheet, row, col) => {
        Atomics.store(evaluating, 1, sheet);
        Atomics.store(evaluating, 2, row);
        Atomics.store(evaluating, 3, col);
        Atomics.store(evaluating, 0, 1);
      }),
  );
  // Stored structure results for this job; what the job computes anew goes back with its result.
  structures = useStructures('structures' in job ? job.structures : undefined, (structure) => parentPort!.postMessage({ structure }));
  try {
    const { result, transfer } = await run(job);
    parentPort!.postMessage({ done: true, ok: true, result, heapUsedBytes: process.memoryUsage().heapUsed }, transfer ?? []);
  } catch (e) {
    const error =
      e instanceof SpreadsheetError
        ? { code: e.code, message: e.message }
        : // Only the file varies between jobs, so an exception in the reader or writer is the file's doing.
          job.kind === 'values'
          ? { code: 'too_complex', message: `the workbook could not be computed (${e instanceof Error ? e.message : String(e)})` }
          : { code: 'damaged_file', message: `the file could not be ${job.kind === 'parse' ? 'read' : 'written'} (${e instanceof Error ? e.message : String(e)})` };
    parentPort!.postMessage({ done: true, ok: false, error, heapUsedBytes: process.memoryUsage().heapUsed });
  } finally {
    structures.end();
  }
});
parentPort!.postMessage({ ready: true });
