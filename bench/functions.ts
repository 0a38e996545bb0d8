// Benchmark of the diatomic cell functions on a screening-sized sheet: `npm run bench:functions`.
//
// One run measures, on the same machine and process:
//   ours      100,000 rows: a species in A, eight diatomic functions across (B…I), full build +
//             evaluation by createEngine();
//   built-in  the same sheet with HyperFormula built-ins of like arity (one text argument) in
//             place of ours, the engine's own floor for 800,000 one-argument formulas;
//   core      a plain loop calling the same eight catalog implementations (chem core plus thin
//             argument handling), no engine: what the science itself costs.
// Target: ours/built-in ≤ 1.5. Results go to bench/results/functions.json (git-ignored).
// Environment: BENCH_ROWS (100000), BENCH_REPEATS (2), BENCH_PARTS=none to skip the extra parts.
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import { DetailedCellError } from 'hyperformula';
import { catalogByName } from '../functions/catalog/index.js';
import { createEngine, type SheetInput } from '../functions/engine.js';
import { huckelBenchPart } from './huckel.js';

/** A realistic screening mix: neutral molecules, ions, radicals and hydrides, H through Ar. */
export const BENCH_SPECIES = [
  'H2', 'H2+', 'He2+', 'HeH+', 'LiH', 'Li2', 'Be2', 'B2', 'C2', 'C2^2-', 'N2', 'N2+', 'N2-', 'O2',
  'O2+', 'O2-', 'O2^2-', 'F2', 'F2+', 'Ne2+', 'CO', 'CO+', 'CN', 'CN-', 'NO', 'NO+', 'NO-', 'BN',
  'BO', 'OH', 'OH-', 'HF', 'CH', 'NH', 'SH', 'SiO', 'SO', 'PN', 'CS', 'Cl2', 'S2', 'P2', 'ClO',
];

export const OUR_FUNCTIONS = ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'SPINMOMENT', 'GROUNDTERM', 'DEGENERACY', 'HOMO', 'ELECTRONS'];
/** One-argument text built-ins, one per column of ours. */
export const BUILT_IN_FUNCTIONS = ['LEN', 'ISTEXT', 'UPPER', 'LOWER', 'TRIM', 'CODE', 'CLEAN', 'PROPER'];
export const TARGET_RATIO = 1.5;

export interface BenchPart {
  name: string;
  run: (rows: number) => Promise<Record<string, number>> | Record<string, number>;
}

/** Further sections of this report, each with its own named timings (the Hückel part: bench/huckel.ts). */
export const extraParts: BenchPart[] = [huckelBenchPart];

export interface FunctionsBenchResult {
  date: string;
  node: string;
  cpu: string;
  /** 1-minute load average at the start; on a shared machine a high value makes timings noisy. */
  loadAverage: number;
  /** Each sheet was built this many times, alternating ours and built-in; the fastest build counts. */
  repeats: number;
  rows: number;
  distinctSpecies: number;
  formulasPerSheet: number;
  oursMs: number;
  builtInMs: number;
  coreLoopMs: number;
  ratio: number;
  targetRatio: number;
  withinTarget: boolean;
  /** Error cells in our sheet; anything but 0 means the timing measured error paths. */
  errorCells: number;
  parts: Record<string, Record<string, number>>;
}

function buildSheet(rows: number, functions: string[]): SheetInput {
  const sheet: SheetInput = new Array(rows);
  for (let r = 0; r < rows; r++) {
    const a1 = `A${r + 1}`;
    sheet[r] = [BENCH_SPECIES[r % BENCH_SPECIES.length], ...functions.map((f) => `=${f}(${a1})`)];
  }
  return sheet;
}

function timeEngine(sheet: SheetInput, countErrors: boolean): { ms: number; errorCells: number } {
  const start = performance.now();
  const engine = createEngine({ Sheet1: sheet });
  const ms = performance.now() - start;
  let errorCells = 0;
  if (countErrors) {
    for (const row of engine.getSheetValues(0)) for (const v of row) if (v instanceof DetailedCellError) errorCells++;
  }
  engine.destroy();
  return { ms, errorCells };
}

function timeCoreLoop(rows: number): number {
  const implementations = OUR_FUNCTIONS.map((name) => {
    const entry = catalogByName.get(name);
    if (!entry) throw new Error(`${name} is not registered in functions/catalog/index.ts`);
    return entry.implementation;
  });
  let sink = 0;
  const start = performance.now();
  for (let r = 0; r < rows; r++) {
    const species = BENCH_SPECIES[r % BENCH_SPECIES.length];
    for (const implementation of implementations) {
      const value = implementation(species);
      sink += typeof value === 'number' ? value : 1;
    }
  }
  const ms = performance.now() - start;
  if (!Number.isFinite(sink)) throw new Error('core loop produced a non-number');
  return ms;
}

const maybeGc = () => (globalThis as { gc?: () => void }).gc?.();

/** `parts` defaults to extraParts; pass [] when a caller runs those sections itself. */
export async function runFunctionsBench(rows = 100_000, repeats = 2, parts: BenchPart[] = extraParts): Promise<FunctionsBenchResult> {
  for (const name of OUR_FUNCTIONS) if (!catalogByName.has(name)) throw new Error(`${name} is not registered yet in functions/catalog/index.ts`);
  const loadAverage = loadavg()[0];
  // Warm both paths (JIT, parser caches) on a small sheet so neither pays for it alone.
  timeEngine(buildSheet(2_000, OUR_FUNCTIONS), false);
  timeEngine(buildSheet(2_000, BUILT_IN_FUNCTIONS), false);
  // Alternate the two sheets and keep the fastest of each: other work on the machine only ever
  // adds time, so the minimum is the least disturbed measurement.
  const builtIn = { ms: Infinity, errorCells: 0 };
  const ours = { ms: Infinity, errorCells: 0 };
  for (let i = 0; i < repeats; i++) {
    maybeGc();
    builtIn.ms = Math.min(builtIn.ms, timeEngine(buildSheet(rows, BUILT_IN_FUNCTIONS), false).ms);
    maybeGc();
    const run = timeEngine(buildSheet(rows, OUR_FUNCTIONS), i === 0);
    ours.ms = Math.min(ours.ms, run.ms);
    if (i === 0) ours.errorCells = run.errorCells;
  }
  maybeGc();
  let coreLoopMs = Infinity;
  for (let i = 0; i < repeats; i++) coreLoopMs = Math.min(coreLoopMs, timeCoreLoop(rows));
  const partResults: FunctionsBenchResult['parts'] = {};
  for (const part of parts) partResults[part.name] = await part.run(rows);
  const ratio = ours.ms / builtIn.ms;
  return {
    date: new Date().toISOString(),
    node: process.version,
    cpu: `${cpus()[0]?.model ?? 'unknown'} × ${cpus().length}`,
    loadAverage: Math.round(loadAverage * 100) / 100,
    repeats,
    rows,
    distinctSpecies: BENCH_SPECIES.length,
    formulasPerSheet: rows * OUR_FUNCTIONS.length,
    oursMs: Math.round(ours.ms),
    builtInMs: Math.round(builtIn.ms),
    coreLoopMs: Math.round(coreLoopMs),
    ratio: Math.round(ratio * 100) / 100,
    targetRatio: TARGET_RATIO,
    withinTarget: ratio <= TARGET_RATIO,
    errorCells: ours.errorCells,
    parts: partResults,
  };
}

export const RESULTS_PATH = resolve(dirname(fileURLToPath(import.meta.url)), 'results', 'functions.json');

export function formatReport(r: FunctionsBenchResult): string {
  return [
    `functions bench: ${r.rows.toLocaleString('en')} rows × ${OUR_FUNCTIONS.length} functions, ${r.distinctSpecies} distinct species (${r.node}, ${r.cpu})`,
    `  best of ${r.repeats} alternating builds; load average at start ${r.loadAverage}`,
    `  ours (createEngine, build + evaluate)   ${r.oursMs} ms`,
    `  built-ins of like arity (LEN, UPPER…)   ${r.builtInMs} ms`,
    `  plain loop over the chem core           ${r.coreLoopMs} ms`,
    `  ratio ours / built-in                   ${r.ratio} (target ≤ ${r.targetRatio}: ${r.withinTarget ? 'met' : 'NOT met'})`,
    `  error cells in our sheet                ${r.errorCells}`,
    ...Object.entries(r.parts).map(([name, timings]) => `  ${name}: ${JSON.stringify(timings)}`),
  ].join('\n');
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const rows = Number(process.env.BENCH_ROWS ?? 100_000);
  const repeats = Number(process.env.BENCH_REPEATS ?? 2);
  const result = await runFunctionsBench(rows, repeats, process.env.BENCH_PARTS === 'none' ? [] : extraParts);
  mkdirSync(dirname(RESULTS_PATH), { recursive: true });
  writeFileSync(RESULTS_PATH, `${JSON.stringify(result, null, 2)}\n`);
  console.log(formatReport(result));
  console.log(`  written to ${RESULTS_PATH}`);
}
