// A worker for `npm run bench:io`'s parallel check: computes the sheets it is sent with the export's
// engine (server/xlsx/engineValues.ts) and answers with the time taken. Started through
// server/xlsx/ioWorkerBoot.mjs, which registers the TypeScript loader first.
import { parentPort } from 'node:worker_threads';
import { computeWorkbook } from '../server/xlsx/engineValues.js';
import type { CellTriple } from '../server/xlsx/types.js';

parentPort!.on('message', (sheets: { name: string; cells: CellTriple[] }[]) => {
  const started = performance.now();
  computeWorkbook(sheets);
  parentPort!.postMessage({ ms: performance.now() - started });
});
parentPort!.postMessage({ ready: true });
