// The database's disk as the API sees it: a full disk (SQLITE_FULL, ENOSPC) or an I/O error
// (SQLITE_IOERR_*, EIO) becomes a clear 507 or 503 naming the trouble instead of "internal error",
// and /api/health reports that writes fail: from the last such failure (remembered for a minute)
// or from the free space on the database's file system.
import fs from 'node:fs';
import path from 'node:path';

export interface StorageFailure {
  status: 507 | 503;
  code: 'storage_full' | 'storage_error';
  message: string;
}

/** The storage trouble behind an error, or null for any other error. */
export function storageFailureOf(err: unknown): StorageFailure | null {
  const code = (err as { code?: unknown })?.code;
  if (typeof code !== 'string') return null;
  if (code === 'SQLITE_FULL' || code === 'ENOSPC') {
    return { status: 507, code: 'storage_full', message: "the server's disk is full, so nothing was saved; try again later and tell the site's administrator" };
  }
  if (code.startsWith('SQLITE_IOERR') || code === 'EIO' || code === 'SQLITE_READONLY' || code === 'EROFS') {
    return { status: 503, code: 'storage_error', message: "the server could not write to its disk, so nothing was saved; try again later and tell the site's administrator" };
  }
  return null;
}

/** How long a write failure keeps /api/health saying writes fail, after the last one (ORBITAB_STORAGE_FAILURE_MS). */
const rememberFailureMs = Number(process.env.ORBITAB_STORAGE_FAILURE_MS) > 0 ? Number(process.env.ORBITAB_STORAGE_FAILURE_MS) : 30_000;
/** Less free space than this on the database's file system counts as full. */
export const minFreeBytes = 1024 * 1024;

export interface StorageHealth {
  /** Records the error when it is a storage failure; returns what it is, or null. */
  noteFailure(err: unknown): StorageFailure | null;
  status(): { writes: 'ok' } | { writes: 'failing'; reason: string; since?: string };
}

export function createStorageHealth(databasePath: string): StorageHealth {
  let last: { at: number; failure: StorageFailure; detail: string } | null = null;
  const dir = databasePath === ':memory:' || databasePath === '' ? null : path.dirname(path.resolve(databasePath));
  return {
    noteFailure(err) {
      const failure = storageFailureOf(err);
      if (failure) last = { at: Date.now(), failure, detail: err instanceof Error ? err.message : String(err) };
      return failure;
    },
    status() {
      if (last && Date.now() - last.at < rememberFailureMs) {
        return { writes: 'failing', reason: `${last.failure.code === 'storage_full' ? 'the disk is full' : 'a disk error'} (${last.detail})`, since: new Date(last.at).toISOString() };
      }
      if (dir) {
        try {
          const s = fs.statfsSync(dir);
          const free = s.bavail * s.bsize;
          if (free < minFreeBytes) return { writes: 'failing', reason: `the disk holding the database has ${free.toLocaleString('en')} bytes free` };
        } catch {
          // A file system that cannot report its space says nothing about writes.
        }
      }
      return { writes: 'ok' };
    },
  };
}
