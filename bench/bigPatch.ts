// How long one large patch holds the server's event loop: `npm run bench:big-patch`.
//
// A patch is applied synchronously (one better-sqlite3 transaction), so while it runs no other
// request is served; the project's target is ≤ 250 ms per request. For each size (BENCH_SIZES,
// default 10,000 / 20,000 / 30,000 / 50,000 changed cells) a fresh workbook's sheet is first
// filled with that many cells (10 columns, as a screening list is), then one patch rewrites every one
// of them, as deleting the first column of such a sheet does. Timed, synchronously:
//   applyPatch   the service call alone (locks and ranges check, conflict reads, writes, the
//                revision's record, the live event to one watcher that serialises it as the stream does);
//   request      what the route does on the loop: JSON.parse of the body, its validation, applyPatch.
//                Above maxCellsPerPatch cells the action goes as parts (server/services/stagedActions.ts):
//                each part is its own request (full parts, then a short one); `request` is then the last
//                part, which applies the whole action, and `part` the longest of the earlier parts (which only hold their cells).
// The database is a file in WAL mode, as the server opens it. The values keeper is stopped: its
// notification is a constant-time call and its work runs later, off the request. Each size is run
// BENCH_REPEATS times (default 3); the median and the worst are reported. Results: bench/results/big-patch.json.
import { mkdirSync, mkdtempSync, rmSync, writeFileSync } from 'node:fs';
import { cpus, loadavg, tmpdir } from 'node:os';
import { dirname, join, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import { users } from '../server/db/schema.js';
import { applyPatch } from '../server/services/patches.js';
import { workbookSheets } from '../server/services/sheetOps.js';
import { createWorkbook } from '../server/services/workbookStore.js';
import { takePatchPart } from '../server/services/stagedActions.js';
import { actionPartSizes, maxCellsPerAction, maxCellsPerPatch, patchSchemaUpTo, type CellChange, type PatchInput } from '../shared/workbooks.js';
import { plainPatch } from '../shared/plainPatch.js';
import { screeningCells } from './ioWorkload.js';

/** As the route checks a body, with the limit raised to the size under test. */
const validated = (body: unknown, limit: number) => plainPatch(body, limit) ?? patchSchemaUpTo(limit).parse(body);

export const TARGET_MS = 250;
const RESULTS_PATH = resolve(dirname(fileURLToPath(import.meta.url)), 'results/big-patch.json');

export interface BigPatchRow {
  cells: number;
  bodyBytes: number;
  applyMs: { median: number; worst: number };
  requestMs: { median: number; worst: number };
  /** CPU time (user + system, median), which a busy shared machine inflates far less than wall time. */
  applyCpuMs: number;
  requestCpuMs: number;
  /** Parts the request went as (1: a plain patch), and the longest earlier part's hold (median), in ms. */
  parts: number;
  partMs: number;
  partCpuMs: number;
}

export interface BigPatchResult {
  date: string;
  node: string;
  cpu: string;
  /** 1-minute load average at the start: the machine is shared, so timings are noisy. */
  loadAverage: number;
  repeats: number;
  maxCellsPerPatch: number;
  maxCellsPerAction: number;
  rows: BigPatchRow[];
}

const ms = (t: number) => Math.round(t * 10) / 10;
const median = (xs: number[]) => [...xs].sort((a, b) => a - b)[Math.floor((xs.length - 1) / 2)];

/** `n` cells of the screening list (10 columns), as changes to `sheetId`. */
function sheetOf(sheetId: string, n: number): CellChange[] {
  return screeningCells(Math.ceil(n / 10))
    .slice(0, n)
    .map(([row, col, input]) => ({ sheetId, row, col, input }));
}

/** Every cell takes its right-hand neighbour's input (the last column is cleared), as deleting column A does. */
function shiftedLeft(cells: CellChange[]): CellChange[] {
  const at = new Map(cells.map((c) => [`${c.row}:${c.col}`, c.input]));
  return cells.map((c) => ({ ...c, input: at.get(`${c.row}:${c.col + 1}`) ?? '' }));
}

export function runBigPatchBench(sizes: number[], repeats: number): BigPatchResult {
  const loadAverage = Math.round(loadavg()[0] * 100) / 100;
  const dir = mkdtempSync(join(tmpdir(), 'orbitab-big-patch-'));
  const db = openDatabase(join(dir, 'bench.db'));
  const { ctx } = createApp({ db, config: { ...loadConfig({ NODE_ENV: 'production', LOG_LEVEL: 'silent' }), seed: false } });
  ctx.values.stop();
  db.insert(users).values({ id: 'bench-user', email: 'bench@example.com', name: 'Bench', passwordHash: 'x' }).run();
  const rows: BigPatchRow[] = [];
  try {
    for (const n of sizes) {
      const apply: number[] = [];
      const request: number[] = [];
      const applyCpu: number[] = [];
      const requestCpu: number[] = [];
      const partHold: number[] = [];
      const partCpu: number[] = [];
      let bodyBytes = 0;
      for (let r = 0; r < repeats * 2; r++) {
        const viaRequest = r % 2 === 1;
        const workbookId = createWorkbook(ctx, { id: 'bench-user' }, `Big patch ${n} ${r}`);
        const sheetId = workbookSheets(db, workbookId)[0].id;
        const filled = sheetOf(sheetId, n);
        const seeded = applyPatch(ctx, workbookId, 'bench-user', { baseRevision: 0, changes: filled });
        const watcher = ctx.events.subscribe(workbookId, (event) => void JSON.stringify(event));
        const changes = shiftedLeft(filled);
        // As the save queue sends it: one body, or parts of at most maxCellsPerPatch cells.
        // Past the action limit (the grid refuses such an action) one body of all the cells is timed,
        // to show what the limit avoids.
        const sizes = n > maxCellsPerAction ? [n] : actionPartSizes(n, maxCellsPerPatch);
        const parts = sizes.length;
        const starts = sizes.map((_, i) => sizes.slice(0, i).reduce((a, b) => a + b, 0));
        const bodies = sizes.map((size, i) =>
          JSON.stringify({ baseRevision: seeded.revision, changes: changes.slice(starts[i], starts[i] + size), ...(parts > 1 ? { part: { actionId: `a${r}`, index: i, count: parts } } : {}) }),
        );
        bodyBytes = Buffer.byteLength(JSON.stringify({ baseRevision: seeded.revision, changes }));
        const take = (body: string) => {
          const parsed = JSON.parse(body) as PatchInput & { part?: { actionId: string; index: number; count: number } };
          const patch = validated(parsed, parts > 1 ? maxCellsPerPatch : n);
          return parsed.part ? takePatchPart(ctx, workbookId, 'bench-user', patch, parsed.part) : applyPatch(ctx, workbookId, 'bench-user', patch);
        };
        if (viaRequest) {
          let longest = 0;
          let longestCpu = 0;
          for (const body of bodies.slice(0, -1)) {
            const p0 = performance.now();
            const pc = process.cpuUsage();
            take(body);
            const used = process.cpuUsage(pc);
            longest = Math.max(longest, performance.now() - p0);
            longestCpu = Math.max(longestCpu, (used.user + used.system) / 1000);
          }
          partHold.push(longest);
          partCpu.push(longestCpu);
        }
        globalThis.gc?.(); // the setting-up's garbage is not the patch's
        const c0 = process.cpuUsage();
        const t0 = performance.now();
        const result = viaRequest ? take(bodies.at(-1)!) : applyPatch(ctx, workbookId, 'bench-user', { baseRevision: seeded.revision, changes });
        const took = performance.now() - t0;
        const cpu = process.cpuUsage(c0);
        watcher();
        if (!('revision' in result) || result.revision !== seeded.revision + 1) throw new Error(`expected one revision, got ${JSON.stringify(result)}`);
        (viaRequest ? request : apply).push(took);
        (viaRequest ? requestCpu : applyCpu).push((cpu.user + cpu.system) / 1000);
      }
      rows.push({ cells: n, bodyBytes, applyMs: { median: ms(median(apply)), worst: ms(Math.max(...apply)) }, requestMs: { median: ms(median(request)), worst: ms(Math.max(...request)) }, applyCpuMs: ms(median(applyCpu)), requestCpuMs: ms(median(requestCpu)), parts: n > maxCellsPerAction ? 1 : actionPartSizes(n, maxCellsPerPatch).length, partMs: ms(median(partHold)), partCpuMs: ms(median(partCpu)) });
    }
  } finally {
    db.$client.close();
    rmSync(dir, { recursive: true, force: true });
  }
  return { date: new Date().toISOString(), node: process.version, cpu: cpus()[0]?.model ?? 'unknown', loadAverage, repeats, maxCellsPerPatch, maxCellsPerAction, rows };
}

export function formatReport(r: BigPatchResult): string {
  return [
    `big patch: one action rewriting every cell of a filled sheet (${r.node}, ${r.cpu}, load ${r.loadAverage} at start, ${r.repeats} repeats, ${r.maxCellsPerPatch} cells a part, ${r.maxCellsPerAction} an action)`,
    `  cells    body MB   applyPatch ms (median / worst, cpu)   (last) request ms (median / worst, cpu)   parts   earlier part ms (longest, cpu)`,
    ...r.rows.map(
      (x) =>
        `  ${String(x.cells).padStart(6)}   ${(x.bodyBytes / 2 ** 20).toFixed(2).padStart(7)}   ${`${x.applyMs.median} / ${x.applyMs.worst}, ${x.applyCpuMs}`.padStart(35)}   ${`${x.requestMs.median} / ${x.requestMs.worst}, ${x.requestCpuMs}`.padStart(39)}   ${String(x.parts).padStart(5)}   ${`${x.partMs}, ${x.partCpuMs}`.padStart(30)}${x.requestMs.median > TARGET_MS ? `  over ${TARGET_MS} ms` : ''}${x.cells > r.maxCellsPerAction ? '  (over the action limit: the grid refuses it)' : ''}`,
    ),
  ].join('\n');
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const sizes = (process.env.BENCH_SIZES ?? '10000,20000,30000,50000').split(',').map(Number);
  const result = runBigPatchBench(sizes, Number(process.env.BENCH_REPEATS ?? 3));
  mkdirSync(dirname(RESULTS_PATH), { recursive: true });
  writeFileSync(RESULTS_PATH, `${JSON.stringify(result, null, 2)}\n`);
  console.log(formatReport(result));
  console.log(`  written to ${RESULTS_PATH}`);
}
