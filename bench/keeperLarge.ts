// The values keeper on a large workbook (`npx tsx bench/keeperLarge.ts [rows]`): 100,000 rows × 8
// columns of species and chemistry formulas (800,000 cells, the shape bench/browser-open.ts opens),
// written straight into the database, then the keeper's full build after that revision: its time,
// the process's peak resident set (the keeper's worker thread included), the longest stall of the
// server's event loop meanwhile, and GET …/values answered from the stored values.
// Writes bench/results/keeper-large.json.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import type { AddressInfo } from 'node:net';
import { loadavg, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import { users } from '../server/db/schema.js';
import { nextRevision } from '../server/services/revisionLog.js';
import { workbookSheets } from '../server/services/sheetOps.js';
import { createWorkbook } from '../server/services/workbookStore.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import type { KeeperRun } from '../server/values/keeper.js';
import { storedValues } from '../server/values/store.js';
import { cellInserter } from '../server/xlsx/importStore.js';
import type { CellTriple } from '../server/xlsx/types.js';

const SPECIES = ['O2', 'N2', 'F2', 'CO', 'NO', 'NO+', 'CN-', 'C2', 'B2', 'O2-', 'O2+', 'N2+', 'OH', 'HF', 'CH', 'NH', 'Li2', 'H2', 'He2+', 'CO+'];
const FORMULAS = ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'SPINMOMENT', 'GROUNDTERM', 'DEGENERACY', 'HOMO'];
const MB = 1024 * 1024;

function chemistryCells(rows: number): CellTriple[] {
  const cells: CellTriple[] = [];
  for (let r = 0; r < rows; r++) {
    cells.push([r, 0, SPECIES[r % SPECIES.length]]);
    FORMULAS.forEach((f, i) => cells.push([r, i + 1, `=${f}(A${r + 1})`]));
  }
  return cells;
}

const rows = Number(process.argv[2] ?? 100_000);
const dir = mkdtempSync(join(tmpdir(), 'orbitab-bench-keeper-'));
const db = openDatabase(join(dir, 'bench.db'));
const { app, ctx } = createApp({ db, config: { ...loadConfig({ NODE_ENV: 'production', LOG_LEVEL: 'silent' }), seed: false } });
db.insert(users).values({ id: 'bench-user', email: 'bench@example.com', name: 'Bench', passwordHash: 'x' }).run();
const runs: KeeperRun[] = [];
ctx.values.onRun = (run) => runs.push(run);

const id = createWorkbook(ctx, { id: 'bench-user' }, 'Keeper benchmark: 100,000 rows');
await ctx.values.idle();
const sheetId = workbookSheets(db, id)[0].id;
const cells = chemistryCells(rows);
const revision = db.transaction((tx) => {
  const r = nextRevision(tx, id);
  cellInserter(db.$client)(sheetId, cells, r);
  return r;
});

let peakRss = process.memoryUsage().rss;
let longestStall = 0;
let last = performance.now();
const ticker = setInterval(() => {
  const now = performance.now();
  longestStall = Math.max(longestStall, now - last - 10);
  last = now;
  peakRss = Math.max(peakRss, process.memoryUsage().rss);
}, 10);
const started = performance.now();
ctx.values.noteRevision(id, revision);
await ctx.values.idle();
const keeperMs = performance.now() - started;
clearInterval(ticker);
const stored = storedValues(db, id);

const server = app.listen(0);
await new Promise((r) => server.once('listening', r));
const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
const session = await ctx.lucia.createSession('bench-user', {});
const cookie = `${ctx.lucia.createSessionCookie(session.id).name}=${session.id}`;
const timeValues = async (encoding: string) => {
  let best = Infinity;
  let bytes = 0;
  let source = '';
  for (let i = 0; i < 3; i++) {
    const t = performance.now();
    const res = await fetch(`${base}/api/workbooks/${id}/values`, { headers: { cookie, 'accept-encoding': encoding, origin: base } });
    const body = new Uint8Array(await res.arrayBuffer());
    best = Math.min(best, performance.now() - t);
    bytes = body.byteLength;
    source = `${res.status} ${res.headers.get('orbitab-values')}`;
  }
  return { ms: Math.round(best), bytes, source };
};
const gzip = stored ? await timeValues('gzip') : null;
const identity = stored ? await timeValues('identity') : null;
server.close();

const run = runs.find((r) => r.revision === revision);
const result = {
  cells: cells.length,
  maxKeptCells: ctx.values.maxCells,
  stored: stored !== null,
  keeperMs: Math.round(keeperMs),
  engineMs: run && Math.round(run.engineMs),
  readCompressMs: run && Math.round(run.readMs),
  storedBytes: stored?.valuesGzip.byteLength ?? 0,
  workerHeapMb: run && Math.round(run.heapUsedBytes / MB),
  peakRssMb: Math.round(peakRss / MB),
  longestStallMs: Math.round(longestStall),
  valuesGzip: gzip,
  valuesIdentity: identity,
  loadAverage: loadavg().map((n) => Math.round(n * 100) / 100),
  measuredAt: new Date().toISOString(),
};
console.log(JSON.stringify(result, null, 2));
const out = resolve(dirname(fileURLToPath(import.meta.url)), 'results/keeper-large.json');
mkdirSync(dirname(out), { recursive: true });
writeFileSync(out, `${JSON.stringify(result, null, 2)}\n`);
await stopKeeperThread();
db.$client.close();
rmSync(dir, { recursive: true, force: true });
