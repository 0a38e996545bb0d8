// bench/report.md from the outcomes of `npm run bench`: targets judged from the numbers, missing and
// failed benchmarks named rather than dropped, and the machine stated. Outcomes here are made up.
import { describe, expect, it } from 'vitest';
import { keepUnrepeated, renderReport, summaryRows, type BenchOutcome, type BenchReport } from '../bench/report.js';

const machine = { os: 'Linux 6.1 (x64)', cpuModel: 'Test CPU 3000', cpuCount: 2, memoryGb: 7.8, node: 'v20.20.2', loadAverageAtStart: 0.4, loadAverageAtEnd: 1.1 };
const report = (outcomes: BenchOutcome[], load = 0.4): BenchReport => ({
  startedAt: '2025-01-31T10:00:00.000Z',
  finishedAt: '2025-01-31T10:20:00.000Z',
  command: 'npm run bench',
  machine: { ...machine, loadAverageAtStart: load },
  outcomes,
});
const ok = (key: BenchOutcome['key'], result: unknown): BenchOutcome => ({ key, title: key, status: 'ok', seconds: 12.3, result });

describe('the benchmark report', () => {
  it('meets the functions target at 1.24× and misses it at 1.6× or with error cells', () => {
    const at = (ratio: number, errorCells = 0) => summaryRows(report([ok('functions', { ratio, oursMs: 1240, builtInMs: 1000, formulasPerSheet: 800_000, errorCells })]))[0];
    expect(at(1.24)).toMatchObject({ value: '1.24× (1,240 ms vs 1,000 ms)', target: '≤ 1.5×', met: true });
    expect(at(1.6).met).toBe(false);
    expect(at(1.24, 3).met).toBe(false);
  });

  it('judges the browser-open ratios against 1× (first rows) and 1.5× (editable), the import/export ratios against 1.5×, with peak memory', () => {
    const rows = summaryRows(
      report([
        ok('open', { rows: 10_000, cols: 10, ratio: 1.32, editableRatio: 1.2, chemistry: { medianMs: 5613, readyMedianMs: 6568 }, numbers: { medianMs: 4248, readyMedianMs: 5473 } }),
        ok('io', { cells: 100_000, export: { ratio: 2.21, oursMs: 7037, bareMs: 3178, peakRssMb: 581, bareRssMb: 531 }, import: { ratio: 1.2, oursMs: 3500, bareMs: 2931, peakRssMb: 751, bareRssMb: 776 } }),
      ]),
    );
    expect(rows.find((r) => r.bench === 'Browser open' && r.target === '≤ 1×')).toMatchObject({ value: '1.32× (5,613 ms vs 4,248 ms)', met: false });
    expect(rows.find((r) => r.bench === 'Browser open' && r.target === '≤ 1.5×')).toMatchObject({ value: '1.2× (6,568 ms vs 5,473 ms)', met: true });
    expect(rows.filter((r) => r.bench === 'Import/export' && r.target === '≤ 1.5×').map((r) => r.met)).toEqual([false, true]);
    expect(rows.find((r) => r.measure.startsWith('export peak memory'))?.value).toBe('581 MB / 531 MB');
  });

  it('judges the stored-values export against 1× and the 100,000 × 8 open stall against 250 ms', () => {
    const rows = summaryRows(
      report([
        ok('open', { rows: 10_000, cols: 10, ratio: 0.9, chemistry: { medianMs: 900 }, numbers: { medianMs: 1000 }, large: { rows: 100_000, cols: 8, firstRowsMs: 3000, editableMs: 3100, liveMs: 60_000, longestStallMs: 400, openedOnStoredValues: true, stallTargetMs: 250 } }),
        ok('io', { cells: 100_000, export: { bareMs: 600 }, stored: { exportMs: 540, exportRatio: 0.9, exportTargetRatio: 1, buildMs: 3000, patchMs: 200, patchEngineMs: 2, patchReadMs: 198, patchChangedCells: 4, storedBytes: 450_000, jsonBytes: 1_700_000, warmHeapMb: 230 } }),
      ]),
    );
    expect(rows.find((r) => r.bench === 'Stored values' && r.target === '≤ 1×')).toMatchObject({ value: '0.9× (540 ms vs 600 ms)', met: true });
    expect(rows.find((r) => r.measure.includes('one stored revision'))?.value).toBe('439 KB; 1,660 KB');
    expect(rows.find((r) => r.measure.includes("page's longest stall"))).toMatchObject({ value: '400 ms', met: false });
  });

  it('shows where the import and export time goes beside the ratios', () => {
    const rows = summaryRows(
      report([
        ok('io', {
          cells: 100_000,
          export: { ratio: 2.1, oursMs: 1100, bareMs: 520, engineMs: 700, engineOnlyRatio: 1.35, floorRatio: 1.88, writerOnlyMs: 280, writerOnlyRatio: 0.54, parallelEngine: { wholeMs: 900, halvesAtOnceMs: 700, halfAloneMs: 450, speedup: 1.29 } },
          import: { ratio: 2, oursMs: 1000, bareMs: 500, guardMs: 28, loadMs: 480, cellsMs: 140, packMs: 36, parseMs: 760, storeMs: 200, rawInsertMs: 150, floorRatio: 1.43 },
        }),
      ]),
    );
    const value = (start: string) => rows.find((r) => r.measure.startsWith(start))?.value;
    expect(value("export: the engine's recalculation alone")).toBe('1.35× (700 ms vs 520 ms)');
    expect(value('export: our writer alone')).toBe('0.54× (280 ms vs 520 ms)');
    expect(value('recalculation split over two workers')).toBe('1.29× faster (700 ms vs 900 ms)');
    expect(value('export lower bound')).toBe('1.88×');
    expect(value('import lower bound')).toBe('1.43× (SQLite alone 150 ms)');
    expect(value('import: where the time goes')).toBe('zip guard 28 ms, exceljs load 480 ms, our pass 140 ms, packing 36 ms, reading in all 760 ms; storing 200 ms');
    // Only the two ratios carry a target.
    expect(rows.filter((r) => r.target === '≤ 1.5×')).toHaveLength(2);
  });

  it('names the direct reader’s parts, and a lower bound without exceljs, when it read the file', () => {
    const rows = summaryRows(
      report([ok('io', { cells: 100_000, import: { reader: 'direct', ratio: 0.8, oursMs: 280, bareMs: 350, guardMs: 30, loadMs: 1, cellsMs: 120, packMs: 18, parseMs: 200, storeMs: 60, rawInsertMs: 90, floorRatio: 0.39 } })]),
    );
    const value = (start: string) => rows.find((r) => r.measure.startsWith(start));
    expect(value('import lower bound')).toMatchObject({ measure: 'import lower bound: (zip guard, inflating every part + packing + SQLite alone) / exceljs alone', value: '0.39× (SQLite alone 90 ms)' });
    expect(value('import: where the time goes')?.value).toBe('zip guard, inflating every part 30 ms, workbook parts 1 ms, sheets into cells 120 ms, packing 18 ms, reading in all 200 ms; storing 60 ms');
    expect(rows.find((r) => r.target === '≤ 1.5×' && r.measure.startsWith('import'))).toMatchObject({ value: '0.8× (280 ms vs 350 ms)', met: true });
  });

  it('counts the patch run good only when every acknowledged change was found, each with its own revision', () => {
    const patch = (missing: unknown[], distinctRevisions = true) =>
      summaryRows(report([ok('patches', { connections: 20, durationSeconds: 10, requestsPerSecond: 69.7, latencyMs: { p50: 218, p95: 510, p99: 2610 }, verification: { acknowledgedChanges: 710, foundInDatabase: 710 - missing.length, missing, distinctRevisions } })]));
    const rows = patch([]);
    expect(rows.map((r) => r.value)).toEqual(['69.7 req/s', '510 ms (218 ms, 2,610 ms)', '710 of 710']);
    expect(rows[2].met).toBe(true);
    expect(patch([{ row: 1, col: 1, expected: 'O2', found: null }])[2]).toMatchObject({ value: '709 of 710', met: false });
    expect(patch([], false)[2].met).toBe(false);
  });

  it('reports the Hückel cache saving in time and as a factor', () => {
    const [saving] = summaryRows(report([ok('huckel', { formulas: 40_000, distinctMolecules: 645, cachedMs: 1640, uncachedMs: 19991, cacheSpeedup: 12.19, builtInMs: 1351, errorCells: 0 })]));
    expect(saving).toMatchObject({ value: '12.19× faster (1,640 ms vs 19,991 ms; 18,351 ms saved)', met: true });
  });

  it('names a missing or failed benchmark as not met instead of leaving it out', () => {
    const text = renderReport(
      report([
        { key: 'open', title: 'Opening a large workbook in the browser', status: 'failed', error: 'dist/index.html is missing: build the client first' },
        { key: 'io', title: 'Import and export against exceljs alone', status: 'missing', error: 'bench/io.ts does not exist' },
      ]),
    );
    expect(text).toContain('| Opening a large workbook in the browser | not run: it failed | dist/index.html is missing: build the client first | — | **not met** |');
    expect(text).toContain('Not run: the benchmark does not exist yet — bench/io.ts does not exist');
  });

  it('says "not reported" for a field a benchmark no longer gives, rather than failing', () => {
    const [row] = summaryRows(report([ok('functions', { speedRatio: 1.1 })]));
    expect(row).toMatchObject({ value: 'not reported', met: null });
  });

  it('states the machine, the command and a warning when the machine was busier than its cores', () => {
    const quiet = renderReport(report([]));
    expect(quiet).toContain('- CPU: Test CPU 3000, 2 logical cores');
    expect(quiet).toContain('- Memory: 7.8 GB');
    expect(quiet).toContain('- Node: v20.20.2');
    expect(quiet).toContain('Made by `npm run bench`');
    expect(quiet).not.toContain('machine was busy');
    expect(renderReport(report([], 6.5))).toContain('the machine was busy with other work');
  });

  it('a partial run (BENCH_ONLY) keeps the sections it did not repeat, in order, each saying when it was measured', () => {
    const earlier = { ...report([ok('functions', { ratio: 1.2 }), ok('io', { exportRatio: 2 }), ok('stalls', {})], 0.9), startedAt: '2025-01-30T08:00:00.000Z' };
    const fresh = [{ ...ok('io', { exportRatio: 1.1 }), measuredAt: '2025-01-31T10:00:05.000Z', loadAverage: 1.2 }];
    const merged = keepUnrepeated(earlier, fresh, ['functions', 'huckel', 'open', 'patches', 'io', 'ehtLibrary', 'stalls']);
    expect(merged.map((o) => o.key)).toEqual(['functions', 'io', 'stalls']);
    expect(merged[1].result).toEqual({ exportRatio: 1.1 });
    expect(merged[0]).toMatchObject({ measuredAt: '2025-01-30T08:00:00.000Z', loadAverage: 0.9 });
    const text = renderReport({ ...report(merged), command: 'npm run bench (BENCH_ONLY=io)' });
    expect(text).toContain('Kept from an earlier run (not repeated by this one): functions (2025-01-30T08:00:00.000Z); stalls (2025-01-30T08:00:00.000Z).');
    expect(text).toContain('Measured 2025-01-31T10:00:05.000Z, load average 1.2.');
    expect(text).toContain('Measured 2025-01-30T08:00:00.000Z, load average 0.9 (kept from an earlier run: this run did not repeat it).');
  });
});
