// `npm run bench`: runs every benchmark of the project one after another and writes bench/report.md
// and bench/report.json. A benchmark whose file or entry point is missing, or that fails, is named in
// the report; the others still run.
//
// BENCH_ONLY=functions,io   run only these (keys: functions, huckel, open, patches, io, ehtLibrary, stalls);
//                           the report keeps the other sections of the previous report, each marked with when it ran
// BENCH_QUICK=1             small sizes, to try the runner; writes bench/tmp/report-quick.* instead
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import { keepUnrepeated, renderReport, summaryRows, type BenchKey, type BenchOutcome, type BenchReport } from './report.js';

const quick = process.env.BENCH_QUICK === '1';
const only = process.env.BENCH_ONLY?.split(',').map((s) => s.trim()).filter(Boolean);

interface BenchSpec {
  key: BenchKey;
  title: string;
  file: string;
  entry: string;
  args: unknown[];
}

// Sizes are each benchmark's own defaults (the sizes its issue asked for) unless BENCH_QUICK is set.
const benches: BenchSpec[] = [
  // The Hückel section runs on its own below, so the functions benchmark is asked for none (parts: []).
  { key: 'functions', title: 'Cell functions against built-ins', file: 'functions.ts', entry: 'runFunctionsBench', args: quick ? [5_000, 1, []] : [100_000, 2, []] },
  { key: 'huckel', title: 'Hückel functions and the structure cache', file: 'huckel.ts', entry: 'runHuckelBench', args: quick ? [500] : [] },
  { key: 'open', title: 'Opening a large workbook in the browser', file: 'browser-open.ts', entry: 'runOpenBench', args: [quick ? { rows: 1_000, runs: 1, write: false } : { write: false }] },
  { key: 'patches', title: 'Patch load on the real server', file: 'patches.ts', entry: 'runPatchBench', args: [quick ? { connections: 4, durationSeconds: 2 } : {}] },
  { key: 'io', title: 'Import and export against exceljs alone', file: 'io.ts', entry: 'runIoBench', args: [quick ? { rows: 500, repeats: 1 } : {}] },
  { key: 'ehtLibrary', title: 'Extended-Hückel library: server compute, colleague open, page stalls', file: 'ehtLibrary.ts', entry: 'runEhtLibraryBench', args: [quick ? { molecules: 40, write: false } : { write: false }] },
  { key: 'stalls', title: 'Event-loop stalls during import, export and values', file: 'event-loop.ts', entry: 'runEventLoopBench', args: [quick ? { rows: 500 } : {}] },
];

async function runOne(spec: BenchSpec): Promise<BenchOutcome> {
  const base = { key: spec.key, title: spec.title, measuredAt: new Date().toISOString(), loadAverage: Math.round(os.loadavg()[0] * 100) / 100 };
  const file = path.join(import.meta.dirname, spec.file);
  if (!fs.existsSync(file)) return { ...base, status: 'missing', error: `bench/${spec.file} does not exist` };
  const started = performance.now();
  try {
    const mod = (await import(pathToFileURL(file).href)) as Record<string, unknown>;
    const run = mod[spec.entry];
    if (typeof run !== 'function') return { ...base, status: 'missing', error: `bench/${spec.file} does not export ${spec.entry}()` };
    const result = await (run as (...a: unknown[]) => Promise<unknown>)(...spec.args);
    return { ...base, status: 'ok', seconds: (performance.now() - started) / 1000, result };
  } catch (error) {
    const message = error instanceof Error ? error.message.split('\n')[0] : String(error);
    return { ...base, status: 'failed', seconds: (performance.now() - started) / 1000, error: message };
  }
}

function machine(loadAtStart: number): BenchReport['machine'] {
  const cpus = os.cpus();
  return {
    os: `${os.type()} ${os.release()} (${os.arch()})`,
    cpuModel: cpus[0]?.model.trim() ?? 'unknown',
    cpuCount: cpus.length,
    memoryGb: Math.round((os.totalmem() / 1024 ** 3) * 10) / 10,
    node: process.version,
    loadAverageAtStart: Math.round(loadAtStart * 100) / 100,
    loadAverageAtEnd: Math.round(os.loadavg()[0] * 100) / 100,
  };
}

async function main() {
  const startedAt = new Date().toISOString();
  const loadAtStart = os.loadavg()[0];
  const outcomes: BenchOutcome[] = [];
  for (const spec of benches) {
    if (only && !only.includes(spec.key)) continue;
    console.log(`[bench] ${spec.title} …`);
    const outcome = await runOne(spec);
    console.log(`[bench] ${spec.title}: ${outcome.status}${outcome.seconds !== undefined ? ` in ${outcome.seconds.toFixed(1)} s` : ''}${outcome.error ? ` — ${outcome.error}` : ''}`);
    outcomes.push(outcome);
  }
  // A partial run keeps what it did not repeat from the report before it, in the usual order.
  const dir = quick ? path.join(import.meta.dirname, 'tmp') : import.meta.dirname;
  const name = quick ? 'report-quick' : 'report';
  if (only && !quick && fs.existsSync(path.join(dir, `${name}.json`))) {
    const previous = JSON.parse(fs.readFileSync(path.join(dir, `${name}.json`), 'utf8')) as BenchReport;
    outcomes.splice(0, outcomes.length, ...keepUnrepeated(previous, outcomes, benches.map((b) => b.key)));
  }
  const report: BenchReport = {
    startedAt,
    finishedAt: new Date().toISOString(),
    command: `npm run bench${quick ? ' (BENCH_QUICK=1)' : ''}${only ? ` (BENCH_ONLY=${only.join(',')})` : ''}`,
    machine: machine(loadAtStart),
    outcomes,
  };
  fs.mkdirSync(dir, { recursive: true });
  fs.writeFileSync(path.join(dir, `${name}.json`), `${JSON.stringify({ ...report, summary: summaryRows(report) }, null, 2)}\n`);
  fs.writeFileSync(path.join(dir, `${name}.md`), renderReport(report));
  console.log(`[bench] wrote ${path.join(dir, `${name}.md`)} and ${name}.json`);
  return outcomes.every((o) => o.status === 'ok') ? 0 : 1;
}

// Some benchmarks leave worker pools or timers behind; the report is written, so end here.
main().then(
  (code) => process.exit(code),
  (error: unknown) => {
    console.error(error);
    process.exit(1);
  },
);
