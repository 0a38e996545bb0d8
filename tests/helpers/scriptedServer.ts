// Stand-ins for the save queue's tests: browser storage in memory (that can refuse writes) and a
// scripted server that records patches. Use with vitest fake timers.
import { vi } from 'vitest';
import type { PatchResult } from '../../shared/workbooks.js';
import type { PatchTransport } from '../../src/core/workbook/save/patchQueue.js';
import type { CellInput, KeyValueStorage } from '../../src/core/workbook/save/pendingStore.js';

export class MemoryStorage implements KeyValueStorage {
  data = new Map<string, string>();
  failWrites = false;
  getItem(k: string) {
    return this.data.get(k) ?? null;
  }
  setItem(k: string, v: string) {
    if (this.failWrites) throw new Error('QuotaExceededError');
    this.data.set(k, v);
  }
  removeItem(k: string) {
    this.data.delete(k);
  }
}

export type Sent = { baseRevision: number; changes: CellInput[] };

/**
 * A server stand-in: records patches and answers with whatever the test scripts next, or else stores
 * the patch as the next revision. `commitByColleague` stands for someone else's revision in between.
 */
export function scriptedServer() {
  const sent: Sent[] = [];
  const answers: ((p: Sent) => Promise<PatchResult>)[] = [];
  let revision = 7;
  const transport: PatchTransport = {
    send: (p) => {
      sent.push(structuredClone(p));
      const next = answers.shift();
      return next ? next(p) : Promise.resolve({ revision: ++revision, applied: p.changes.length });
    },
  };
  return { sent, answers, transport, commitByColleague: () => ++revision };
}

/** Lets promise callbacks and the zero-delay timers they set run (several rounds of microtasks). */
export async function settle() {
  for (let i = 0; i < 4; i++) await vi.advanceTimersByTimeAsync(1);
}

export const cell = (row: number, col: number, input: string, sheetId = 's1'): CellInput => ({ sheetId, row, col, input });
