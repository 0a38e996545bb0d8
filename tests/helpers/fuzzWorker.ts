// Runs readSpreadsheet over many damaged files inside a worker thread, so that a file which made the
// reader loop forever would stall only this worker, which the test can then terminate.
import { parentPort } from 'node:worker_threads';
import { SpreadsheetError } from '../../server/xlsx/limits.js';
import { readSpreadsheet } from '../../server/xlsx/read.js';

export type FuzzOutcome = { label: string; ms: number } & ({ ok: true; cells: number } | { ok: false; code: string; status: number; message: string; refusal: boolean });

parentPort!.on('message', async (files: { label: string; bytes: Uint8Array }[]) => {
  for (const f of files) {
    const started = performance.now();
    let outcome: FuzzOutcome;
    try {
      const r = await readSpreadsheet(Buffer.from(f.bytes), 'fuzzed.xlsx');
      outcome = { label: f.label, ms: performance.now() - started, ok: true, cells: r.summary.cells };
    } catch (e) {
      const refusal = e instanceof SpreadsheetError;
      outcome = {
        label: f.label,
        ms: performance.now() - started,
        ok: false,
        refusal,
        code: refusal ? e.code : 'thrown',
        status: refusal ? e.status : 0,
        message: e instanceof Error ? e.message : String(e),
      };
    }
    parentPort!.postMessage(outcome);
  }
  parentPort!.postMessage('done');
});
parentPort!.postMessage({ ready: true });
