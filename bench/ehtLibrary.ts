// A library of distinct molecules (default 1,000, ≤ 30 heavy atoms; bench/ehtMolecules.ts) with four
// extended-Hückel columns, end to end on the real server and headless Chromium:
//   1. the first person opens it with nothing computed: the server's compute pool computes every
//      structure once while the page shows progress; measured: molecules per second per core, and the
//      page's longest main-thread stall (PerformanceObserver long tasks, and the longest delay of a 50 ms timer) until every value is shown;
//   2. a colleague opens it afterwards (once the server has stored the revision's values) in a fresh
//      browser (no cache): time to the first values, and to all of them, with nothing recomputed;
//   3. for comparison, one core computing structures in this process (geometry, solve, summary).
// Run: `npm run build`, then `npm run bench:eht-library` (EHT_LIBRARY_MOLECULES=200 for a shorter run).
// Writes bench/results/eht-library.json.
import fs from 'node:fs';
import path from 'node:path';
import { pathToFileURL } from 'node:url';
import '../functions/openchemlibNode.js';
import { computeEhtResult } from '../functions/chem/ehtSummary.js';
import { launchBrowser } from '../tests/helpers/browser.js';
import { startServer } from '../tests/helpers/server.js';
import { ApiClient, createWorkbook, firstFrameProbe, frameNoted, storedValuesReady } from './browser-open.js';
import { benchMolecules } from './ehtMolecules.js';

const COLUMNS = ['EHTHOMO', 'EHTLUMO', 'EHTGAP', 'EHTCHARGE'];
/** The server's compute pool runs this many structure jobs at once (server/structures/structureService.ts). */
const SERVER_CORES = 2;

export interface EhtLibraryResult {
  molecules: number;
  formulas: number;
  firstOpen: { allValuesMs: number; moleculesPerSecondPerCore: number; longestLongTaskMs: number; longestTimerDelayMs: number; longTasksOver250: number };
  colleague: { firstValuesMs: number; firstEditableValuesMs: number; allValuesMs: number; recomputed: number; openedOnStoredValues: boolean; storedValuesWaitMs: number; timeline: Record<string, number> };
  inProcess: { sample: number; moleculesPerSecond: number };
  targets: { firstValuesMs: number; stallMs: number };
  loadAverage: number[];
  measuredAt: string;
}

export function libraryCells(smiles: string[]): [number, number, string][] {
  const cells: [number, number, string][] = [[0, 0, 'SMILES'], ...COLUMNS.map((c, i) => [0, i + 1, c] as [number, number, string])];
  smiles.forEach((s, r) => {
    cells.push([r + 1, 0, s]);
    COLUMNS.forEach((fn, i) => cells.push([r + 1, i + 1, fn === 'EHTCHARGE' ? `=${fn}(A${r + 2},1)` : `=${fn}(A${r + 2})`]));
  });
  return cells;
}

/** Installed before the page's own scripts: long tasks and the longest delay of a 50 ms timer. */
export function stallProbe() {
  const w = window as unknown as { __stall: { longest: number; over250: number; gap: number } };
  w.__stall = { longest: 0, over250: 0, gap: 0 };
  new PerformanceObserver((list) => {
    for (const e of list.getEntries()) {
      w.__stall.longest = Math.max(w.__stall.longest, e.duration);
      if (e.duration > 250) w.__stall.over250++;
    }
  }).observe({ type: 'longtask' });
  // A timer due every 50 ms: how late it fires is how long the main thread was held (headless
  // Chromium paints no frames for a page nobody looks at, so animation frames cannot be the probe).
  let last = performance.now();
  setInterval(() => {
    const now = performance.now();
    w.__stall.gap = Math.max(w.__stall.gap, now - last - 50);
    last = now;
  }, 50);
}

export async function runEhtLibraryBench(options: { molecules?: number; write?: boolean } = {}): Promise<EhtLibraryResult> {
  const count = options.molecules ?? Number(process.env.EHT_LIBRARY_MOLECULES ?? 1_000);
  const smiles = benchMolecules(count);

  // 3 first (the server is not running yet, so this process has a core to itself as far as we can).
  const sample = smiles.slice(0, Math.min(30, count));
  const started = performance.now();
  for (const s of sample) computeEhtResult(s);
  const inProcess = { sample: sample.length, moleculesPerSecond: sample.length / ((performance.now() - started) / 1000) };

  const server = await startServer();
  try {
    const api = new ApiClient(server.url);
    await api.call('POST', '/auth/sign-up', { name: 'Library Analyst', email: 'library@lab.example', password: 'bench-password-1' });
    const id = await createWorkbook(api, 'EHT library benchmark', libraryCells(smiles));
    const [name, value] = api.cookie.split('=');

    /** Opens the workbook in a fresh context; resolves when `n` numbers are shown in the EHT columns of the first screen, and when none is pending. */
    const open = async () => {
      // A browser of its own each time: a fresh profile, so nothing is cached from an earlier visit.
      const browser = await launchBrowser({ viewport: { width: 1280, height: 800 } });
      const context = browser.context;
      await context.addCookies([{ name, value, url: server.url }]);
      await context.addInitScript(stallProbe);
      await context.addInitScript(firstFrameProbe('__orbFirstValues', '[data-testid="sheet-grid"] .orb-cell-number', 4));
      const page = browser.page;
      page.setDefaultTimeout(0);
      await page.goto(`${server.url}/workbooks/${id}`);
      // Noted from inside the page: stored values can be drawn before the load event page.goto waits for.
      const firstValuesMs = await frameNoted(page, '__orbFirstValues');
      // The first values may be the read-only preview of stored values; when the editable grid shows them too.
      const editable = await page.waitForFunction(() => (document.querySelectorAll('[data-testid="sheet-grid"]:not([data-preview]) .orb-cell-number').length >= 4 ? performance.now() : false), undefined, { polling: 50 });
      const firstEditableValuesMs = (await editable.jsonValue()) as number;
      // Every structure in: every formula is computed in the page (no computing state: a large open
      // puts its formulas back in slices), the progress line is gone and no cell on screen is pending.
      // The workspace's grid, not the read-only preview of stored values shown before it.
      const all = await page.waitForFunction(
        () =>
          document.querySelector('[data-testid="sheet-grid"]:not([data-preview])') && !document.querySelector('[data-testid="computing-state"]') && !document.querySelector('[data-testid="structure-progress"]') && !document.querySelector('[data-cell-kind="pending"]')
            ? performance.now()
            : false,
        undefined,
        { polling: 250 },
      );
      const allValuesMs = (await all.jsonValue()) as number;
      const stall = await page.evaluate(() => (window as unknown as { __stall: { longest: number; over250: number; gap: number } }).__stall);
      // Whether the server had the revision's values stored (the page marks it; else it computed them from the stored structures).
      const onStoredValues = await page.evaluate(() => performance.getEntriesByName('orbitab:opened-on-stored-values').length > 0);
      // Where the time to first values went: the page's code, the workbook's requests, the engine build (ms from navigation).
      const timeline = await page.evaluate(() =>
        Object.fromEntries(
          performance
            .getEntries()
            .filter((e) => (e.entryType === 'resource' && /\/assets\/(index|WorkbookPage)-.*\.js$|\/api\/workbooks\//.test(e.name)) || e.name.startsWith('orbitab:'))
            .map((e) => [`${e.name.replace(/^.*\/assets\/([A-Za-z]+)-[^/]*$/, '$1.js').replace(/^.*\/api\/workbooks\/[^/?]*/, 'workbook').replace(/\?.*/, '')} ${Math.round(e.startTime)}`, Math.round(e.startTime + e.duration)]),
        ),
      );
      await browser.close();
      return { firstValuesMs, firstEditableValuesMs, allValuesMs, stall, onStoredValues, timeline };
    };

    // The page asks only for the structures its engine evaluates (all rows), so "all values" is the library.
    const countStored = async () => (await api.call<{ results: unknown[] }>('POST', `/workbooks/${id}/structures`, { inputs: smiles.slice(0, 500).map((structure) => ({ structure })) })).results.filter((r) => r !== null).length;
    const firstRun = await open();
    const storedAfterFirst = await countStored();
    // A colleague comes later: by then the server has stored the revision's values (its keeper runs
    // once the last structure is in); how long that took after the first page had every value is reported.
    const storedValuesWaitMs = await storedValuesReady(api, id, 120_000);
    const colleagueRun = await open();
    const storedAfterColleague = await countStored();

    const result: EhtLibraryResult = {
      molecules: count,
      formulas: count * COLUMNS.length,
      firstOpen: {
        allValuesMs: Math.round(firstRun.allValuesMs),
        moleculesPerSecondPerCore: Math.round((count / (firstRun.allValuesMs / 1000) / SERVER_CORES) * 100) / 100,
        longestLongTaskMs: Math.round(firstRun.stall.longest),
        longestTimerDelayMs: Math.round(firstRun.stall.gap),
        longTasksOver250: firstRun.stall.over250,
      },
      colleague: { firstValuesMs: Math.round(colleagueRun.firstValuesMs), firstEditableValuesMs: Math.round(colleagueRun.firstEditableValuesMs), allValuesMs: Math.round(colleagueRun.allValuesMs), recomputed: storedAfterColleague - storedAfterFirst, openedOnStoredValues: colleagueRun.onStoredValues, storedValuesWaitMs, timeline: colleagueRun.timeline },
      inProcess: { sample: inProcess.sample, moleculesPerSecond: Math.round(inProcess.moleculesPerSecond * 100) / 100 },
      targets: { firstValuesMs: 2_000, stallMs: 250 },
      loadAverage: (await import('node:os')).loadavg().map((x) => Math.round(x * 100) / 100),
      measuredAt: new Date().toISOString(),
    };
    if (options.write !== false) {
      const out = path.join(import.meta.dirname, 'results', 'eht-library.json');
      fs.mkdirSync(path.dirname(out), { recursive: true });
      fs.writeFileSync(out, JSON.stringify(result, null, 2));
    }
    return result;
  } finally {
    await server.stop();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(path.resolve(process.argv[1])).href) {
  runEhtLibraryBench().then(
    (r) => console.log(JSON.stringify(r, null, 2)),
    (e) => {
      console.error(e);
      process.exit(1);
    },
  );
}
