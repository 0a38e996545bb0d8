// Stand-ins for the save queue's tests: browser storage in memory (that can refuse writes) and a
// scripted server that records patches. Use with vitest fake timers.
import { vi } from 'vitest';
import type { PatchPart, PatchPartResult, PatchResult } from '../../shared/workbooks.js';
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

export type Sent = { baseRevision: number; changes: CellInput[]; part?: PatchPart };

/**
 * A server stand-in: records patches and answers with whatever the test scripts next, or else stores
 * the patch as the next revision. `commitByColleague` stands for someone else's revision in between.
 */
export function scriptedServer() {
  const sent: Sent[] = [];
  const answers: ((p: Sent) => Promise<PatchResult | PatchPartResult>)[] = [];
  let revision = 7;
  // Parts of one action are held, as the server does, and the last one stores them as one revision.
  let held = 0;
  const transport: PatchTransport = {
    send: (p) => {
      sent.push(structuredClone(p));
      const next = answers.shift();
      if (next) return next(p);
      if (p.part && p.part.index + 1 < p.part.count) {
        held = (p.part.index === 0 ? 0 : held) + p.changes.length;
        return Promise.resolve({ staged: { actionId: p.part.actionId, received: p.part.index + 1, count: p.part.count, cells: held } });
      }
      const applied = (p.part ? held : 0) + p.changes.length;
      held = 0;
      return Promise.resolve({ revision: ++revision, applied });
    },
  };
  return { sent, answers, transport, commitByColleague: () => ++revision };
}

/** Lets promise callbacks and the zero-delay timers they set run (several rounds of microtasks). */
export async function settle() {
  for (let i = 0; i < 4; i++) await vi.advanceTimersByTimeAsync(1);
}

export const cell = (row: number, col: number, input: string, sheetId = 's1'): CellInput => ({ sheetId, row, col, input });
