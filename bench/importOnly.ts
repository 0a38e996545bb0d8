// The import half of bench/io.ts alone (`npm run bench:import`): quicker to repeat while working on
// the import path. Same workbook, same warm worker, same file database in WAL mode. Prints each run
// and the fastest of each figure; `timing` says which reader read the file and where its time went.
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { PassThrough } from 'node:stream';
import ExcelJS from 'exceljs';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import { users } from '../server/db/schema.js';
import { exportInWorker } from '../server/xlsx/exportInWorker.js';
import { readAndImport } from '../server/xlsx/importStaged.js';
import { closeParsePool, parseInWorker, warmParsePool } from '../server/xlsx/parseInWorker.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import { benchWorkbook } from './ioWorkload.js';

const repeats = Number(process.env.BENCH_REPEATS ?? 3);
const workbook = benchWorkbook(10_000);
const dbDir = mkdtempSync(join(tmpdir(), 'orbitab-bench-import-'));
const db = openDatabase(join(dbDir, 'bench.db'));
const { ctx } = createApp({ db, config: { ...loadConfig({ NODE_ENV: 'production', LOG_LEVEL: 'silent' }), seed: false } });
db.insert(users).values({ id: 'bench-user', email: 'bench@example.com', name: 'Bench', passwordHash: 'x' }).run();
warmParsePool();
const out = new PassThrough();
const chunks: Buffer[] = [];
out.on('data', (c: Buffer) => chunks.push(c));
await exportInWorker(out, workbook, { kind: 'xlsx', mode: 'formulas' });
const file = Buffer.concat(chunks);
const best = { parse: Infinity, whole: Infinity, tail: Infinity, bare: Infinity };
// The longest the event loop was held during each import (the target for the server is 250 ms).
const stalls: number[] = [];
for (let i = 0; i < repeats + 1; i++) {
  let t = performance.now();
  const alone = await parseInWorker(file, 'bench.xlsx');
  const parseMs = performance.now() - t;
  t = performance.now();
  let readMs = 0;
  const loop = monitorEventLoopDelay({ resolution: 5 });
  loop.enable();
  await readAndImport(ctx, { newWorkbook: { title: `Import ${i}` } }, 'bench-user', { buffer: file, filename: 'bench.xlsx' }, { onRead: () => (readMs = performance.now() - t) });
  const whole = performance.now() - t;
  loop.disable();
  const stallMs = loop.max / 1e6;
  await ctx.values.idle();
  t = performance.now();
  await new ExcelJS.Workbook().xlsx.load(file as unknown as ArrayBuffer);
  const bare = performance.now() - t;
  console.log(`run ${i}: read alone ${parseMs.toFixed(0)}, import ${whole.toFixed(0)} (read done at ${readMs.toFixed(0)}), exceljs alone ${bare.toFixed(0)}, longest stall ${stallMs.toFixed(0)}; ${JSON.stringify(alone.timing)} pack ${alone.stats.packMs.toFixed(0)}`);
  if (i === 0) continue; // warm-up
  stalls.push(stallMs);
  best.parse = Math.min(best.parse, parseMs);
  best.whole = Math.min(best.whole, whole);
  best.tail = Math.min(best.tail, whole - readMs);
  best.bare = Math.min(best.bare, bare);
}
console.log(`best: ${JSON.stringify(Object.fromEntries(Object.entries(best).map(([k, v]) => [k, Math.round(v)])))}, ratio ${(best.whole / best.bare).toFixed(2)}, longest stall ${Math.max(...stalls).toFixed(0)} ms (target ≤ 250)`);
await closeParsePool();
await stopKeeperThread();
db.$client.close();
rmSync(dbDir, { recursive: true, force: true });
