// Upload limits and the one error type the reader throws. Every limit is named in the message a user
// sees, so a refused file says what to change.
import { maxUploadBytes } from '../../shared/io.js';
import { maxMergedCells } from '../../shared/sheetSettings.js';

export interface ImportLimits {
  /** The upload itself. */
  maxFileBytes: number;
  /** Parts in the zip (an .xlsx is a zip of XML parts). */
  maxZipEntries: number;
  /** Sum of the uncompressed sizes of all parts: what exceljs would hold in memory as text. */
  maxUncompressedBytes: number;
  /** Uncompressed ÷ compressed for one part larger than `ratioCheckFromBytes`. */
  maxCompressionRatio: number;
  ratioCheckFromBytes: number;
  /** Cells holding a value or formula, over all sheets. */
  maxCells: number;
  /** Cells merged ranges may cover in all: exceljs fills every cell of a merge one by one. */
  maxMergedCells: number;
}

const MiB = 1024 * 1024;

export const defaultImportLimits: ImportLimits = {
  maxFileBytes: maxUploadBytes,
  maxZipEntries: 5_000,
  maxUncompressedBytes: 300 * MiB,
  // Spreadsheet XML compresses about 5–20× (measured on exceljs and LibreOffice output); 200× leaves room
  // for sheets of repeated empty styled cells while a bomb built from one repeated byte runs near 1000×.
  maxCompressionRatio: 200,
  ratioCheckFromBytes: 1 * MiB,
  maxCells: 500_000,
  // The same bound the API puts on one sheet's stored merges, so an imported sheet can be saved back.
  maxMergedCells,
};

export interface WorkerLimits {
  /** V8 old-generation heap for the parse worker. */
  maxOldGenerationSizeMb: number;
  maxYoungGenerationSizeMb: number;
  /** Wall-clock time before the worker is terminated. */
  timeoutMs: number;
}

export const defaultWorkerLimits: WorkerLimits = {
  maxOldGenerationSizeMb: 1536,
  maxYoungGenerationSizeMb: 64,
  timeoutMs: 60_000,
};

/** A positive whole number from the environment, or the default (operators tune limits without a rebuild). */
function envNumber(name: string, fallback: number): number {
  const n = Number(process.env[name]);
  return Number.isFinite(n) && n > 0 ? Math.floor(n) : fallback;
}

/**
 * For recalculating a whole workbook (exports and every /values): every evaluation runs in a worker
 * under these limits, so no formula can take the server down. ORBITAB_COMPUTE_HEAP_MB and
 * ORBITAB_COMPUTE_TIMEOUT_MS set them (README "Operations").
 */
export const recalcWorkerLimits: WorkerLimits = {
  maxOldGenerationSizeMb: envNumber('ORBITAB_COMPUTE_HEAP_MB', 1024),
  maxYoungGenerationSizeMb: 64,
  timeoutMs: envNumber('ORBITAB_COMPUTE_TIMEOUT_MS', 60_000),
};

/**
 * For the values keeper's thread (server/values/keeperThread.ts), which builds engines of up to a
 * million cells in the background and keeps the last one warm: more heap than one recalculation may
 * use, and more time, since nobody waits on it. ORBITAB_KEEPER_HEAP_MB and ORBITAB_KEEPER_TIMEOUT_MS set them.
 */
export const keeperWorkerLimits: WorkerLimits = {
  maxOldGenerationSizeMb: envNumber('ORBITAB_KEEPER_HEAP_MB', 2560),
  maxYoungGenerationSizeMb: 64,
  timeoutMs: envNumber('ORBITAB_KEEPER_TIMEOUT_MS', 300_000),
};

/** Jobs (uploads, exports, /values) one person may have queued or running at once. */
export const maxJobsPerUser = envNumber('ORBITAB_JOBS_PER_USER', 3);

export type SpreadsheetErrorCode =
  | 'not_a_spreadsheet'
  | 'damaged_file'
  | 'encrypted_or_legacy'
  | 'file_too_large'
  | 'decompression_bomb'
  | 'too_many_cells'
  | 'too_many_columns'
  | 'too_complex'
  | 'parse_timeout'
  | 'parse_out_of_memory'
  | 'busy'
  | 'too_many_jobs';

const statusOf: Record<SpreadsheetErrorCode, 400 | 413 | 429 | 503> = {
  not_a_spreadsheet: 400,
  damaged_file: 400,
  encrypted_or_legacy: 400,
  file_too_large: 413,
  decompression_bomb: 413,
  too_many_cells: 413,
  too_many_columns: 413,
  too_complex: 413,
  parse_timeout: 413,
  parse_out_of_memory: 413,
  busy: 503,
  too_many_jobs: 429,
};

/**
 * What a refusal is about: an uploaded file (the file's fault: 400 or 413), or work on a workbook
 * that is already stored (values, an export: the server's limit, so 503, or 429 for too many jobs).
 */
export type RefusalSubject = 'file' | 'values' | 'export';

/**
 * A refusal from reading, computing or writing a spreadsheet. Services throw it; the app's error
 * handler (server/errors.ts) is the one place it becomes `{ error: { code, message } }` with its status.
 */
export class SpreadsheetError extends Error {
  readonly status: 400 | 413 | 429 | 503;
  constructor(
    readonly code: SpreadsheetErrorCode,
    message: string,
    /** Unset until a service says what the work was; the error handler then treats it as a file's. */
    readonly subject?: RefusalSubject,
    /** Advice appended to the message, such as what to try instead. */
    readonly hint = '',
  ) {
    super(message);
    this.name = 'SpreadsheetError';
    this.status = statusOf[code];
  }

  /** The same refusal, saying what work it stopped. */
  about(subject: RefusalSubject, hint = ''): SpreadsheetError {
    return new SpreadsheetError(this.code, this.message, subject, hint);
  }
}

/** Rethrows a spreadsheet refusal as one about `subject`; anything else passes unchanged. */
export function refusalAbout(subject: RefusalSubject, hint = '') {
  return (e: unknown): never => {
    throw e instanceof SpreadsheetError ? e.about(subject, hint) : e;
  };
}

export function formatBytes(bytes: number): string {
  if (bytes >= MiB) return `${+(bytes / MiB).toFixed(1)} MB`;
  if (bytes >= 1024) return `${+(bytes / 1024).toFixed(1)} KB`;
  return `${bytes} bytes`;
}
