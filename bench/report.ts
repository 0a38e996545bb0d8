// Turns the outcomes of every benchmark into bench/report.md: one summary table with the ratios and
// targets each issue set, a section per benchmark, and the machine it ran on. Pure: run-all.ts runs
// the benchmarks; tests/bench-report.test.ts checks the wording from made-up outcomes.

export type BenchKey = 'functions' | 'huckel' | 'open' | 'patches' | 'io' | 'ehtLibrary' | 'stalls';

export interface BenchOutcome {
  key: BenchKey;
  title: string;
  /** missing: its file or function does not exist yet; failed: it threw. */
  status: 'ok' | 'missing' | 'failed';
  seconds?: number;
  error?: string;
  result?: unknown;
  /** When this benchmark ran and the 1-minute load average then (a report may keep sections of an earlier run). */
  measuredAt?: string;
  loadAverage?: number;
}

export interface MachineInfo {
  os: string;
  cpuModel: string;
  cpuCount: number;
  memoryGb: number;
  node: string;
  /** 1-minute load averages; on a shared machine a high value makes every timing noisy. */
  loadAverageAtStart: number;
  loadAverageAtEnd: number;
}

export interface BenchReport {
  startedAt: string;
  finishedAt: string;
  command: string;
  machine: MachineInfo;
  outcomes: BenchOutcome[];
}

export interface SummaryRow {
  bench: string;
  measure: string;
  value: string;
  target: string;
  /** null: reported, no target. */
  met: boolean | null;
}

// The result shapes belong to each benchmark's own file; read them loosely so a renamed field
// shows up as "not reported" in the table instead of crashing the report.
type Loose = Record<string, any>;
const num = (v: unknown, digits = 2) => (typeof v === 'number' && Number.isFinite(v) ? Number(v.toFixed(digits)).toLocaleString('en') : 'not reported');
const ms = (v: unknown) => (typeof v === 'number' && Number.isFinite(v) ? `${num(v, 0)} ms` : 'not reported');
/** "1.24× (1,240 ms vs 1,000 ms)", or "not reported" when the ratio is missing. */
const ratioText = (ratio: unknown, a: unknown, b: unknown) => (typeof ratio === 'number' ? `${num(ratio)}× (${ms(a)} vs ${ms(b)})` : 'not reported');

function functionsRows(r: Loose): SummaryRow[] {
  return [
    {
      bench: 'Cell functions',
      measure: `ours / built-in, build + evaluate ${num(r.formulasPerSheet, 0)} formulas`,
      value: ratioText(r.ratio, r.oursMs, r.builtInMs),
      target: '≤ 1.5×',
      met: typeof r.ratio === 'number' ? r.ratio <= 1.5 && r.errorCells === 0 : null,
    },
  ];
}

function huckelRows(r: Loose): SummaryRow[] {
  const saved = typeof r.uncachedMs === 'number' && typeof r.cachedMs === 'number' ? r.uncachedMs - r.cachedMs : undefined;
  return [
    {
      bench: 'Hückel',
      measure: `structure cache saving, ${num(r.formulas, 0)} formulas over ${num(r.distinctMolecules, 0)} molecules`,
      value: `${num(r.cacheSpeedup)}× faster (${ms(r.cachedMs)} vs ${ms(r.uncachedMs)}; ${ms(saved)} saved)`,
      target: 'cache on faster than off',
      met: typeof r.cacheSpeedup === 'number' ? r.cacheSpeedup > 1 && r.errorCells === 0 : null,
    },
    {
      bench: 'Hückel',
      measure: 'ours (cache on) / built-in LEN on the same sheet',
      value: typeof r.cachedMs === 'number' && typeof r.builtInMs === 'number' ? `${num(r.cachedMs / r.builtInMs)}×` : 'not reported',
      target: '—',
      met: null,
    },
  ];
}

function openRows(r: Loose): SummaryRow[] {
  return [
    {
      bench: 'Browser open',
      measure: `${num(r.rows, 0)} × ${num(r.cols, 0)} workbook, chemistry / plain numbers, first computed rows (median)`,
      value: ratioText(r.ratio, r.chemistry?.medianMs, r.numbers?.medianMs),
      target: '≤ 1×',
      met: typeof r.ratio === 'number' ? r.ratio <= 1 : null,
    },
    {
      bench: 'Browser open',
      measure: 'whole workbook editable, chemistry (median)',
      value: ms(r.chemistry?.readyMedianMs),
      target: '—',
      met: null,
    },
    {
      bench: 'Browser open',
      measure: 'whole workbook editable, chemistry / plain numbers (median)',
      value: ratioText(r.editableRatio, r.chemistry?.readyMedianMs, r.numbers?.readyMedianMs),
      target: '≤ 1.5×',
      met: typeof r.editableRatio === 'number' ? r.editableRatio <= 1.5 : null,
    },
    {
      bench: 'Browser open',
      measure: 'every formula computed in the page, chemistry (median); longest stall',
      value: `${ms(r.chemistry?.liveMedianMs)}; ${ms(r.chemistry?.longestStallMs)}${r.chemistry?.openedOnStoredValues === false ? ' (not opened on stored values)' : ''}`,
      target: '—',
      met: null,
    },
    ...(r.large
      ? [
          {
            bench: 'Browser open',
            measure: `${num(r.large.rows, 0)} × ${num(r.large.cols, 0)} chemistry workbook: first rows; editable; every formula computed`,
            value: `${ms(r.large.firstRowsMs)}; ${ms(r.large.editableMs)}; ${ms(r.large.liveMs)}${r.large.openedOnStoredValues ? '' : ' (not opened on stored values)'}`,
            target: 'report',
            met: null,
          },
          {
            bench: 'Browser open',
            measure: `${num(r.large.rows, 0)} × ${num(r.large.cols, 0)} chemistry workbook: the page's longest stall`,
            value: ms(r.large.longestStallMs),
            target: `≤ ${num(r.large.stallTargetMs, 0)} ms`,
            met: typeof r.large.longestStallMs === 'number' ? r.large.longestStallMs <= r.large.stallTargetMs : null,
          },
        ]
      : []),
  ];
}

function patchRows(r: Loose): SummaryRow[] {
  const v = (r.verification ?? {}) as Loose;
  return [
    { bench: 'Patch load', measure: `throughput, ${num(r.connections, 0)} connections for ${num(r.durationSeconds, 0)} s`, value: `${num(r.requestsPerSecond, 1)} req/s`, target: '—', met: null },
    { bench: 'Patch load', measure: 'latency p95 (p50, p99)', value: `${ms(r.latencyMs?.p95)} (${ms(r.latencyMs?.p50)}, ${ms(r.latencyMs?.p99)})`, target: '—', met: null },
    {
      bench: 'Patch load',
      measure: 'acknowledged changes found in the database afterwards',
      value: `${num(v.foundInDatabase, 0)} of ${num(v.acknowledgedChanges, 0)}`,
      target: 'all',
      met: Array.isArray(v.missing) ? v.missing.length === 0 && v.distinctRevisions === true : null,
    },
  ];
}

function ioRows(r: Loose): SummaryRow[] {
  const part = (name: 'export' | 'import'): SummaryRow[] => {
    const p = (r[name] ?? {}) as Loose;
    return [
      {
        bench: 'Import/export',
        measure: `${name} of ${num(r.cells, 0)} cells, ours / exceljs alone`,
        value: ratioText(p.ratio, p.oursMs, p.bareMs),
        target: '≤ 1.5×',
        met: typeof p.ratio === 'number' ? p.ratio <= 1.5 : null,
      },
      { bench: 'Import/export', measure: `${name} peak memory (RSS), ours / exceljs alone`, value: `${num(p.peakRssMb, 0)} MB / ${num(p.bareRssMb, 0)} MB`, target: '—', met: null },
    ];
  };
  // Where the time goes, so a ratio outside its target can be read against what it is made of.
  const e = (r.export ?? {}) as Loose;
  const i = (r.import ?? {}) as Loose;
  const par = (e.parallelEngine ?? {}) as Loose;
  const parts: SummaryRow[] = [];
  if (typeof e.engineOnlyRatio === 'number') {
    parts.push({ bench: 'Import/export', measure: "export: the engine's recalculation alone / exceljs's whole write", value: ratioText(e.engineOnlyRatio, e.engineMs, e.bareMs), target: '—', met: null });
    parts.push({ bench: 'Import/export', measure: 'export: our writer alone, given the values / exceljs alone', value: ratioText(e.writerOnlyRatio, e.writerOnlyMs, e.bareMs), target: '—', met: null });
  }
  if (typeof e.floorRatio === 'number') {
    parts.push({ bench: 'Import/export', measure: 'export lower bound: (engine alone + our writer alone) / exceljs alone', value: `${num(e.floorRatio)}×`, target: '—', met: null });
  }
  // Results from before the direct reader carry no `reader`: exceljs read them.
  const direct = i.reader === 'direct';
  if (typeof i.floorRatio === 'number') {
    parts.push({
      bench: 'Import/export',
      measure: direct
        ? 'import lower bound: (zip guard, inflating every part + packing + SQLite alone) / exceljs alone'
        : 'import lower bound: (exceljs alone + zip guard + packing + SQLite alone) / exceljs alone',
      value: `${num(i.floorRatio)}× (SQLite alone ${ms(i.rawInsertMs)})`,
      target: '—',
      met: null,
    });
  }
  if (typeof par.speedup === 'number') {
    parts.push({ bench: 'Import/export', measure: 'recalculation split over two workers (two halves at once / whole in one)', value: `${num(par.speedup)}× faster (${ms(par.halvesAtOnceMs)} vs ${ms(par.wholeMs)})`, target: '—', met: null });
  }
  if (typeof i.loadMs === 'number') {
    parts.push({
      bench: 'Import/export',
      measure: 'import: where the time goes',
      value: direct
        ? `zip guard, inflating every part ${ms(i.guardMs)}, workbook parts ${ms(i.loadMs)}, sheets into cells ${ms(i.cellsMs)}, packing ${ms(i.packMs)}, reading in all ${ms(i.parseMs)}; storing ${ms(i.storeMs)}`
        : `zip guard ${ms(i.guardMs)}, exceljs load ${ms(i.loadMs)}, our pass ${ms(i.cellsMs)}, packing ${ms(i.packMs)}, reading in all ${ms(i.parseMs)}; storing ${ms(i.storeMs)}`,
      target: '—',
      met: null,
    });
  }
  const st = (r.stored ?? {}) as Loose;
  const kb = (n: unknown) => (typeof n === 'number' ? `${num(n / 1024, 0)} KB` : 'not reported');
  if (typeof st.exportRatio === 'number') {
    parts.push(
      {
        bench: 'Stored values',
        measure: `export of an unchanged ${num(r.cells, 0)}-cell workbook from its stored values / exceljs alone`,
        value: ratioText(st.exportRatio, st.exportMs, e.bareMs),
        target: `≤ ${num(st.exportTargetRatio)}×`,
        met: st.exportRatio <= st.exportTargetRatio,
      },
      { bench: 'Stored values', measure: 'values brought up to date after an import (full build, read, compress, store)', value: ms(st.buildMs), target: '—', met: null },
      {
        bench: 'Stored values',
        measure: 'values brought up to date after a one-cell patch (warm engine)',
        value: `${ms(st.patchMs)} (engine ${ms(st.patchEngineMs)}, read + compress ${ms(st.patchReadMs)}; ${num(st.patchChangedCells, 0)} cells changed)`,
        target: '—',
        met: null,
      },
      { bench: 'Stored values', measure: `one stored revision of ${num(r.cells, 0)} cells (database bytes; as JSON)`, value: `${kb(st.storedBytes)}; ${kb(st.jsonBytes)}`, target: 'report', met: null },
      { bench: 'Stored values', measure: "keeper worker's heap with the workbook warm", value: `${num(st.warmHeapMb, 0)} MB`, target: '—', met: null },
    );
  }
  return [...part('export'), ...part('import'), ...parts];
}

function stallRows(r: Loose): SummaryRow[] {
  const phases = (Array.isArray(r.phases) ? r.phases : []) as Loose[];
  return phases.map((p) => ({
    bench: 'Event-loop stalls',
    measure: `longest stall during the ${p.phase} of ${num(r.cells, 0)} cells (request ${ms(p.elapsedMs)}, status ${p.status})`,
    value: ms(p.maxStallMs),
    target: `≤ ${num(r.targetMs, 0)} ms`,
    met: typeof p.maxStallMs === 'number' && typeof r.targetMs === 'number' ? p.maxStallMs <= r.targetMs : null,
  }));
}

function ehtLibraryRows(r: Loose): SummaryRow[] {
  const first = (r.firstOpen ?? {}) as Loose;
  const colleague = (r.colleague ?? {}) as Loose;
  const targets = (r.targets ?? {}) as Loose;
  const bench = 'EHT library';
  return [
    { bench, measure: `molecules per second per core, server compute pool (${num(r.molecules, 0)} molecules, ${num(r.formulas, 0)} formulas)`, value: num(first.moleculesPerSecondPerCore, 2), target: '—', met: null },
    { bench, measure: `time to first values for a colleague after they were computed once${colleague.openedOnStoredValues === false ? ' (values not stored yet: computed in the page from the stored structures)' : ''}`, value: ms(colleague.firstValuesMs), target: `< ${num(targets.firstValuesMs, 0)} ms`, met: typeof colleague.firstValuesMs === 'number' && typeof targets.firstValuesMs === 'number' ? colleague.firstValuesMs < targets.firstValuesMs : null },
    { bench, measure: "the same values in the colleague's editable grid (the first may be the read-only preview of stored values)", value: ms(colleague.firstEditableValuesMs), target: '—', met: null },
    { bench, measure: 'structures recomputed when the colleague opened it', value: num(colleague.recomputed, 0), target: '0', met: colleague.recomputed === 0 },
    { bench, measure: 'longest main-thread long task while the library computed', value: ms(first.longestLongTaskMs), target: `≤ ${num(targets.stallMs, 0)} ms`, met: typeof first.longestLongTaskMs === 'number' && typeof targets.stallMs === 'number' ? first.longestLongTaskMs <= targets.stallMs : null },
    { bench, measure: 'longest delay of a 50 ms timer on the page meanwhile', value: ms(first.longestTimerDelayMs), target: '—', met: null },
  ];
}

const rowsFor: Record<BenchKey, (r: Loose) => SummaryRow[]> = { functions: functionsRows, huckel: huckelRows, open: openRows, patches: patchRows, io: ioRows, ehtLibrary: ehtLibraryRows, stalls: stallRows };

export function summaryRows(report: BenchReport): SummaryRow[] {
  return report.outcomes.flatMap((o): SummaryRow[] => {
    if (o.status !== 'ok') return [{ bench: o.title, measure: o.status === 'missing' ? 'not run: the benchmark does not exist yet' : 'not run: it failed', value: o.error ?? '', target: '—', met: false }];
    try {
      return rowsFor[o.key]((o.result ?? {}) as Loose);
    } catch (error) {
      return [{ bench: o.title, measure: 'result not understood', value: (error as Error).message, target: '—', met: null }];
    }
  });
}

const cell = (s: string) => s.replace(/\|/g, '\\|').replace(/\n/g, ' ');
const verdict = (met: boolean | null) => (met === null ? '' : met ? 'met' : '**not met**');

/**
 * The outcomes of a partial run (BENCH_ONLY) with the sections it did not repeat taken from the
 * previous report, each keeping when it was measured, in the runner's order.
 */
export function keepUnrepeated(previous: BenchReport, fresh: BenchOutcome[], order: BenchKey[]): BenchOutcome[] {
  const rerun = new Set(fresh.map((o) => o.key));
  const kept = previous.outcomes.filter((o) => !rerun.has(o.key)).map((o) => ({ ...o, measuredAt: o.measuredAt ?? previous.startedAt, loadAverage: o.loadAverage ?? previous.machine.loadAverageAtStart }));
  return [...fresh, ...kept].sort((a, b) => order.indexOf(a.key) - order.indexOf(b.key));
}

export function renderReport(report: BenchReport): string {
  const m = report.machine;
  const rows = summaryRows(report);
  const kept = report.outcomes.filter((o) => o.measuredAt !== undefined && o.measuredAt < report.startedAt);
  const lines = [
    '# Orbitab benchmark report',
    '',
    `Made by \`${report.command}\` from ${report.startedAt} to ${report.finishedAt}. Numbers quoted elsewhere must come from this command; rerun it to refresh them.${kept.length ? ` Kept from an earlier run (not repeated by this one): ${kept.map((o) => `${o.title} (${o.measuredAt})`).join('; ')}.` : ''}`,
    '',
    '## Machine',
    '',
    `- CPU: ${m.cpuModel}, ${m.cpuCount} logical cores`,
    `- Memory: ${m.memoryGb} GB`,
    `- OS: ${m.os}`,
    `- Node: ${m.node}`,
    `- Load average (1 min): ${m.loadAverageAtStart} at the start, ${m.loadAverageAtEnd} at the end${m.loadAverageAtStart > m.cpuCount ? ' — the machine was busy with other work, so timings are slower and noisier than on an idle machine' : ''}`,
    '',
    '## Summary',
    '',
    '| Benchmark | Measure | Result | Target | |',
    '|---|---|---|---|---|',
    ...rows.map((r) => `| ${cell(r.bench)} | ${cell(r.measure)} | ${cell(r.value)} | ${cell(r.target)} | ${verdict(r.met)} |`),
    '',
    '## Each benchmark',
    '',
  ];
  for (const o of report.outcomes) {
    lines.push(`### ${o.title}`, '');
    const when = o.measuredAt ? ` Measured ${o.measuredAt}${o.loadAverage !== undefined ? `, load average ${o.loadAverage}` : ''}${o.measuredAt < report.startedAt ? ' (kept from an earlier run: this run did not repeat it)' : ''}.` : '';
    if (o.status === 'ok') lines.push(`Ran in ${num(o.seconds, 1)} s.${when}`, '', '```json', JSON.stringify(o.result, null, 2), '```', '');
    else lines.push(`${o.status === 'missing' ? 'Not run: the benchmark does not exist yet' : 'Not run: it failed'} — ${o.error ?? 'no message'}`, '');
  }
  return `${lines.join('\n')}\n`;
}
