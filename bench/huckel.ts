// Benchmark of the Hückel family on a screening sheet: `npm run bench:huckel`.
//
// 10,000 rows, a SMILES in A (a few hundred distinct generated molecules of 6–40 π centres, cycled in
// a shuffled order) and four Hückel functions across (PIGAP, PIENERGY, DELOCALIZATION, ABSORPTION).
// One run measures, in the same process after a warm-up:
//   cached     full build + evaluation by createEngine() with the per-structure cache on;
//   uncached   the same sheet with the cache off (every cell parses its SMILES and solves again);
//   built-in   the same sheet with LEN in the four columns — the engine's own floor;
//   core       a plain loop calling the four chem-core paths with the cache off, no engine.
// Results go to bench/results/huckel.json. bench/functions.ts can include this as a part through
// `huckelBenchPart`.
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { DetailedCellError } from 'hyperformula';
import { absorptionMaxNm } from '../functions/chem/absorption.js';
import { delocalizationEnergy, frontierGap, piEnergy } from '../functions/chem/huckel.js';
import { clearHuckelCache, huckelCacheStats, huckelModelOf, setHuckelCacheEnabled } from '../functions/chem/huckelCache.js';
import { createEngine, type SheetInput } from '../functions/engine.js';
import { benchmarkMolecules } from './huckelMolecules.js';

export const HUCKEL_BENCH_ROWS = 10_000;
export const HUCKEL_BENCH_FUNCTIONS = ['PIGAP', 'PIENERGY', 'DELOCALIZATION', 'ABSORPTION'];

export interface HuckelBenchResult {
  date: string;
  node: string;
  rows: number;
  distinctMolecules: number;
  piCentresMin: number;
  piCentresMax: number;
  functions: string[];
  formulas: number;
  cachedMs: number;
  uncachedMs: number;
  /** uncached / cached. */
  cacheSpeedup: number;
  builtInMs: number;
  coreLoopUncachedMs: number;
  /** Structures built and solved in the cached run: one per distinct molecule. */
  cachedRun: { piSystemBuilds: number; modelSolves: number; hits: number };
  errorCells: number;
}

/** Deterministic shuffle (mulberry32) so every run sees the same sheet. */
function shuffled<T>(items: T[], seed: number): T[] {
  let t = seed >>> 0;
  const next = () => {
    t = (t + 0x6d2b79f5) >>> 0;
    let r = Math.imul(t ^ (t >>> 15), 1 | t);
    r = (r + Math.imul(r ^ (r >>> 7), 61 | r)) ^ r;
    return ((r ^ (r >>> 14)) >>> 0) / 4294967296;
  };
  const out = [...items];
  for (let i = out.length - 1; i > 0; i--) {
    const j = Math.floor(next() * (i + 1));
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

function buildSheet(column: string[], functions: string[]): SheetInput {
  return column.map((smiles, r) => [smiles, ...functions.map((f) => `=${f}(A${r + 1})`)]);
}

function timeEngine(sheet: SheetInput): { ms: number; errorCells: number } {
  const start = performance.now();
  const engine = createEngine({ Sheet1: sheet });
  const ms = performance.now() - start;
  let errorCells = 0;
  for (const row of engine.getSheetValues(0)) for (const v of row) if (v instanceof DetailedCellError) errorCells++;
  engine.destroy();
  return { ms, errorCells };
}

function coreLoop(column: string[]): number {
  const start = performance.now();
  let sink = 0;
  for (const smiles of column) {
    const structure = [[smiles]];
    const gapModel = huckelModelOf(structure);
    sink += frontierGap(gapModel, gapModel.electrons).gap;
    const energyModel = huckelModelOf(structure);
    sink += piEnergy(energyModel, energyModel.electrons);
    sink += delocalizationEnergy(huckelModelOf(structure));
    const absorptionModel = huckelModelOf(structure);
    sink += absorptionMaxNm(frontierGap(absorptionModel, absorptionModel.electrons).gap);
  }
  if (!Number.isFinite(sink)) throw new Error('core loop produced a non-finite sum');
  return performance.now() - start;
}

export async function runHuckelBench(rows = HUCKEL_BENCH_ROWS): Promise<HuckelBenchResult> {
  const molecules = benchmarkMolecules();
  const sizes = molecules.map((s) => huckelModelOf([[s]]).levels.length);
  const order = shuffled(molecules, 4801);
  const column = Array.from({ length: rows }, (_, r) => order[r % order.length]);
  const ours = buildSheet(column, HUCKEL_BENCH_FUNCTIONS);

  // Warm-up: load openchemlib and let the JIT settle on a small sheet.
  setHuckelCacheEnabled(false);
  timeEngine(ours.slice(0, 500));

  const uncached = timeEngine(ours);
  const coreLoopUncachedMs = coreLoop(column);

  setHuckelCacheEnabled(true);
  clearHuckelCache();
  const cached = timeEngine(ours);
  const cachedRun = huckelCacheStats();

  const builtIn = timeEngine(buildSheet(column, HUCKEL_BENCH_FUNCTIONS.map(() => 'LEN')));

  return {
    date: new Date().toISOString(),
    node: process.version,
    rows,
    distinctMolecules: molecules.length,
    piCentresMin: Math.min(...sizes),
    piCentresMax: Math.max(...sizes),
    functions: HUCKEL_BENCH_FUNCTIONS,
    formulas: rows * HUCKEL_BENCH_FUNCTIONS.length,
    cachedMs: Math.round(cached.ms),
    uncachedMs: Math.round(uncached.ms),
    cacheSpeedup: Number((uncached.ms / cached.ms).toFixed(2)),
    builtInMs: Math.round(builtIn.ms),
    coreLoopUncachedMs: Math.round(coreLoopUncachedMs),
    cachedRun,
    errorCells: cached.errorCells + uncached.errorCells,
  };
}

/** The shape bench/functions.ts takes for its extra sections. */
export const huckelBenchPart = {
  name: 'huckel',
  run: async (): Promise<Record<string, number>> => {
    const r = await runHuckelBench();
    return { rows: r.rows, cachedMs: r.cachedMs, uncachedMs: r.uncachedMs, cacheSpeedup: r.cacheSpeedup, builtInMs: r.builtInMs, coreLoopUncachedMs: r.coreLoopUncachedMs };
  },
};

export function printHuckelBench(r: HuckelBenchResult) {
  console.log(`Hückel benchmark: ${r.rows} rows × ${r.functions.join(', ')}; ${r.distinctMolecules} distinct molecules, ${r.piCentresMin}–${r.piCentresMax} π centres`);
  console.table({
    'ours, cache on': { ms: r.cachedMs, 'per formula µs': Math.round((1000 * r.cachedMs) / r.formulas) },
    'ours, cache off': { ms: r.uncachedMs, 'per formula µs': Math.round((1000 * r.uncachedMs) / r.formulas) },
    'built-in LEN': { ms: r.builtInMs, 'per formula µs': Math.round((1000 * r.builtInMs) / r.formulas) },
    'core loop, cache off': { ms: r.coreLoopUncachedMs, 'per formula µs': Math.round((1000 * r.coreLoopUncachedMs) / r.formulas) },
  });
  console.log(`cache saves ${r.uncachedMs - r.cachedMs} ms (${r.cacheSpeedup}× faster); cached run built ${r.cachedRun.piSystemBuilds} π systems and solved ${r.cachedRun.modelSolves} models; error cells: ${r.errorCells}`);
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const result = await runHuckelBench();
  printHuckelBench(result);
  const out = resolve(dirname(fileURLToPath(import.meta.url)), 'results', 'huckel.json');
  mkdirSync(dirname(out), { recursive: true });
  writeFileSync(out, JSON.stringify(result, null, 2) + '\n');
  console.log(`wrote ${out}`);
}
