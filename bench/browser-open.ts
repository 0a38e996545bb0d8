// Opening a 10,000-row × 10-column workbook in headless Chromium: the time from navigation until the
// first rows show computed values, for a sheet of species and chemistry formulas and for a sheet of
// plain numbers of the same size. The ratio is the cost of the chemistry (target ≤ 1×, issue #16).
//
// Run: `npm run build` (the server serves dist/), then `npm run bench:open`.
// Writes bench/results/open.json. BENCH_OPEN_LARGE=0 leaves out the 100,000-row workbook;
// BENCH_OPEN_SMALL=0 runs only that one (written to bench/results/open-large.json). Each workbook is
// opened once to warm the browser cache, then `runs` times, alternating; the median is reported.
// Workbooks whose values the server has stored show their first rows from GET …/first-rows, drawn by
// the page's first script (src/app/earlyGlance.ts); both moments are measured: the first computed rows
// (the target, noted from inside the page: firstRowsProbe) and the whole workbook editable. The
// engine's own build time comes from the page's performance measure "orbitab:build-engine"
// (src/core/workbook/session/useWorkbookSession.ts).
import fs from 'node:fs';
import path from 'node:path';
import { maxCellsPerPatch } from '../shared/workbooks.js';
import type { Page } from 'playwright-core';
import { launchBrowser } from '../tests/helpers/browser.js';
import { startServer } from '../tests/helpers/server.js';

export interface OpenTiming {
  /** Navigation start → first rows showing computed values, per run (ms). */
  runsMs: number[];
  medianMs: number;
  /** Navigation start → the full engine built and the editable grid shown, median (ms). */
  readyMedianMs: number;
  /** The engine build (buildFromSheets) inside that time, median (ms). */
  engineBuildMedianMs: number;
  /** When the workbook's JSON had arrived (navigation start → response end), median (ms). */
  workbookResponseMedianMs: number;
  /** When the parsed workbook reached the page's code, median (ms). */
  workbookLoadedMedianMs: number;
  /** Building the first-screenful preview (NaN when the sheet was loaded whole), median (ms). */
  previewBuildMedianMs: number;
  /** Navigation start → every formula computed in the page (no computing state left), median (ms). */
  liveMedianMs: number;
  /** The page's longest task (Long Tasks API) from navigation until live, worst of the runs (ms). */
  longestStallMs: number;
  /** Whether the server had stored the revision's values, so the page opened on them. */
  openedOnStoredValues: boolean;
}

/** The 100,000 × 8 workbook: one cold open (creating and storing it takes minutes). */
export interface LargeOpenTiming {
  rows: number;
  cols: number;
  firstRowsMs: number;
  editableMs: number;
  liveMs: number;
  longestStallMs: number;
  /** Every task over 150 ms as [start, duration] (ms from navigation), to place the longest in the open. */
  longTasks: [number, number][];
  openedOnStoredValues: boolean;
  /** When the server had stored its values after the last patch (ms after that patch). */
  storedAfterMs: number;
  stallTargetMs: number;
}

export interface ScrollTiming {
  /** Frames drawn while the chemistry sheet scrolled 400 px per frame from the top to row ~8,000. */
  frames: number;
  medianFrameMs: number;
  p95FrameMs: number;
  longestFrameMs: number;
  /** Computed numbers visible after the scroll (rows keep showing values while they stream in). */
  numbersShownAtEnd: number;
}

export interface OpenBenchResult {
  rows: number;
  cols: number;
  chemistry: OpenTiming;
  numbers: OpenTiming;
  scroll: ScrollTiming;
  /** chemistry.medianMs / numbers.medianMs */
  ratio: number;
  /** chemistry.readyMedianMs / numbers.readyMedianMs: the whole workbook editable. */
  editableRatio: number;
  large: LargeOpenTiming | null;
  target: string;
  formulas: string[];
  measuredAt: string;
  node: string;
  chromium: string;
}

/** Species a screening column might hold (invented list; every one is within the diatomic model). */
const SPECIES = ['O2', 'N2', 'F2', 'CO', 'NO', 'NO+', 'CN-', 'C2', 'B2', 'O2-', 'O2+', 'N2+', 'OH', 'HF', 'CH', 'NH', 'Li2', 'H2', 'He2+', 'CO+'];
const FORMULAS = ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'SPINMOMENT', 'GROUNDTERM', 'DEGENERACY', 'HOMO', 'LUMO', 'ELECTRONS'];

export function chemistryCells(rows: number): [number, number, string][] {
  const cells: [number, number, string][] = [];
  for (let r = 0; r < rows; r++) {
    cells.push([r, 0, SPECIES[r % SPECIES.length]]);
    FORMULAS.forEach((f, i) => cells.push([r, i + 1, `=${f}(A${r + 1})`]));
  }
  return cells;
}

export function numberCells(rows: number, cols: number): [number, number, string][] {
  const cells: [number, number, string][] = [];
  for (let r = 0; r < rows; r++) for (let c = 0; c < cols; c++) cells.push([r, c, String(r * cols + c + 0.5)]);
  return cells;
}

export class ApiClient {
  cookie = '';
  constructor(readonly base: string) {}
  async call<T>(method: string, route: string, body?: unknown): Promise<T> {
    const send = () =>
      fetch(`${this.base}/api${route}`, {
        method,
        headers: { origin: this.base, cookie: this.cookie, ...(body === undefined ? {} : { 'content-type': 'application/json' }) },
        body: body === undefined ? undefined : JSON.stringify(body),
      });
    // A kept-alive connection the server closed while idle (its keep-alive timeout passed during a
    // slow browser warm-up) fails the next request before it is read: sent again once, on a new one.
    const res = await send().catch((e: Error & { cause?: { code?: string } }) => {
      if (e.cause?.code !== 'UND_ERR_SOCKET') throw e;
      return send();
    });
    const setCookie = res.headers.getSetCookie?.() ?? [];
    const session = setCookie.find((c) => c.startsWith('orbitab_session='));
    if (session) this.cookie = session.split(';')[0];
    const text = await res.text();
    if (!res.ok) throw new Error(`${method} ${route}: ${res.status} ${text.slice(0, 300)}`);
    return (text ? JSON.parse(text) : null) as T;
  }
}

export async function createWorkbook(api: ApiClient, title: string, cells: [number, number, string][]): Promise<string> {
  const { workbook } = await api.call<{ workbook: { id: string } }>('POST', '/workbooks', { title });
  let wb = await api.call<{ revision: number; sheets: { id: string }[] }>('GET', `/workbooks/${workbook.id}`);
  const sheetId = wb.sheets[0].id;
  let revision = wb.revision;
  for (let i = 0; i < cells.length; i += maxCellsPerPatch) {
    const changes = cells.slice(i, i + maxCellsPerPatch).map(([row, col, input]) => ({ sheetId, row, col, input }));
    ({ revision } = await api.call<{ revision: number }>('POST', `/workbooks/${workbook.id}/patches`, { baseRevision: revision, changes }));
  }
  wb = await api.call('GET', `/workbooks/${workbook.id}`);
  return workbook.id;
}

/** Waits until the server has stored the workbook's values (it computes them in the background); ms waited, or -1. */
export async function storedValuesReady(api: ApiClient, id: string, timeoutMs = 600_000): Promise<number> {
  const started = performance.now();
  while (performance.now() - started < timeoutMs) {
    const res = await fetch(`${api.base}/api/workbooks/${id}/values?stored=only`, { headers: { cookie: api.cookie } });
    await res.arrayBuffer();
    if (res.status === 200) return Math.round(performance.now() - started);
    await new Promise((r) => setTimeout(r, 250));
  }
  return -1;
}

/** Collects the page's long tasks from the start of each navigation (installed before any script runs). */
const longTaskProbe = `(() => {
  window.__orbLongest = 0;
  window.__orbLong = [];
  try {
    new PerformanceObserver((list) => { for (const e of list.getEntries()) { window.__orbLongest = Math.max(window.__orbLongest, e.duration); if (e.duration > 150) window.__orbLong.push([Math.round(e.startTime), Math.round(e.duration)]); } }).observe({ type: 'longtask', buffered: true });
  } catch {}
})()`;

/**
 * An init script that notes, as `window[key]`, the first frame in which `selector` matches at least
 * `min` elements, from inside the page. The page's first script can draw a workbook's first rows
 * before the page's load event, and a waitForFunction started after page.goto (which waits for that
 * event) would see them only then. Read it with `frameNoted`.
 */
export function firstFrameProbe(key: string, selector: string, min: number): string {
  return `(() => {
    window[${JSON.stringify(key)}] = 0;
    const observer = new MutationObserver(() => {
      if (document.querySelectorAll(${JSON.stringify(selector)}).length < ${min}) return;
      observer.disconnect();
      requestAnimationFrame(() => { window[${JSON.stringify(key)}] = performance.now(); });
    });
    observer.observe(document, { subtree: true, childList: true, attributes: true, characterData: true });
  })()`;
}

/** The time a firstFrameProbe noted (ms from navigation start), once it has. */
export async function frameNoted(page: Page, key: string): Promise<number> {
  const handle = await page.waitForFunction((k) => (window as unknown as Record<string, number>)[k] || false, key, { polling: 50 });
  return (await handle.jsonValue()) as number;
}

/** The first frame where the grid shows computed numbers in its first rows (20 or more). */
const firstRowsProbe = firstFrameProbe('__orbFirstRows', '[data-testid="sheet-grid"] .orb-cell-number', 20);

const median = (xs: number[]) => {
  const s = [...xs].sort((a, b) => a - b);
  return s.length % 2 ? s[(s.length - 1) / 2] : (s[s.length / 2 - 1] + s[s.length / 2]) / 2;
};

/** Opens a workbook in the page and measures it (navigation start → first rows, editable, live; the longest task). */
function opener(page: Page, url: string) {
  return async (id: string) => {
    await page.goto('about:blank');
    await page.goto(`${url}/workbooks/${id}`);
    // Navigation start → the first frame where the grid shows computed numbers in its first rows (firstRowsProbe).
    const shownMs = await frameNoted(page, '__orbFirstRows');
    const ready = await page.waitForFunction(
      () => {
        const grid = document.querySelector('[data-testid="sheet-grid"]:not([data-preview])');
        return grid && grid.querySelectorAll('.orb-cell-number').length >= 20 ? performance.now() : false;
      },
      undefined,
      { polling: 'raf' },
    );
    const readyMs = (await ready.jsonValue()) as number;
    const openedOnStoredValues = (await page.locator('[data-testid="computing-state"]').count()) > 0;
    const live = await page.waitForFunction(() => (document.querySelector('[data-testid="computing-state"]') ? false : performance.now()), undefined, { polling: 'raf', timeout: 600_000 });
    const liveMs = (await live.jsonValue()) as number;
    const longestStallMs = (await page.evaluate('window.__orbLongest')) as number;
    const longTasks = (await page.evaluate('window.__orbLong')) as [number, number][];
    const { buildMs, previewMs, loadedMs, responseMs } = await page.evaluate(() => ({
      buildMs: performance.getEntriesByName('orbitab:build-engine').at(-1)?.duration ?? NaN,
      previewMs: performance.getEntriesByName('orbitab:build-preview').at(-1)?.duration ?? NaN,
      loadedMs: performance.getEntriesByName('orbitab:workbook-loaded').at(-1)?.startTime ?? NaN,
      // Loaded in a worker (src/lib/jsonFetch.worker.ts), the answer's arrival is marked in the page; loaded in the page, its resource entry tells.
      responseMs:
        performance.getEntriesByType('mark').filter((e) => /^orbitab:json-received \/workbooks\/[^/?]+$/.test(e.name)).at(-1)?.startTime ??
        (performance.getEntriesByType('resource') as PerformanceResourceTiming[]).filter((e) => /\/api\/workbooks\/[^/]+$/.test(e.name)).at(-1)?.responseEnd ??
        NaN,
    }));
    return { shownMs, readyMs, buildMs, previewMs, loadedMs, responseMs, liveMs, longestStallMs, longTasks, openedOnStoredValues };
  };
}

/** 100,000 rows × 8 columns of species and chemistry formulas: created, stored by the server, opened once. */
async function measureLargeOpen(api: ApiClient, openOnce: ReturnType<typeof opener>): Promise<LargeOpenTiming | null> {
  const largeCols = 8;
  const largeRows = 100_000;
  const largeId = await createWorkbook(api, 'Open benchmark: 100,000 rows', chemistryCells(largeRows).filter(([, c]) => c < largeCols));
  // The server keeps values of workbooks up to 1,000,000 cells (ORBITAB_STORED_VALUES_MAX_CELLS); past
  // that the page opens by computing, and this says so (openedOnStoredValues false).
  const storedAfterMs = await storedValuesReady(api, largeId, 120_000);
  const run = await openOnce(largeId).catch((e: Error) => {
    console.warn(`the 100,000-row workbook did not open within the time allowed: ${e.message.split('\n')[0]}`);
    return null;
  });
  if (!run) return null;
  return {
    rows: largeRows,
    cols: largeCols,
    firstRowsMs: Math.round(run.shownMs),
    editableMs: Math.round(run.readyMs),
    liveMs: Math.round(run.liveMs),
    longestStallMs: Math.round(run.longestStallMs),
    longTasks: run.longTasks,
    openedOnStoredValues: run.openedOnStoredValues,
    storedAfterMs,
    stallTargetMs: 250,
  };
}

/**
 * The 100,000-row open alone (BENCH_OPEN_SMALL=0): a fresh server and browser, one cold open,
 * written to bench/results/open-large.json (open.json keeps the whole bench's shape).
 */
export async function runLargeOpenBench(): Promise<LargeOpenTiming | null> {
  const server = await startServer();
  const browser = await launchBrowser({ viewport: { width: 1280, height: 800 } });
  try {
    const api = new ApiClient(server.url);
    await api.call('POST', '/auth/sign-up', { name: 'Bench Analyst', email: 'bench@lab.example', password: 'bench-password-1' });
    const [name, value] = api.cookie.split('=');
    await browser.context.addCookies([{ name, value, url: server.url }]);
    browser.page.setDefaultTimeout(120_000);
    await browser.page.addInitScript(longTaskProbe);
    await browser.page.addInitScript(firstRowsProbe);
    // Warm the browser cache with the page's code, as the whole bench's first opens do.
    await browser.page.goto(server.url);
    await browser.page.waitForLoadState('networkidle');
    const large = await measureLargeOpen(api, opener(browser.page, server.url));
    const out = path.resolve(import.meta.dirname, 'results/open-large.json');
    fs.mkdirSync(path.dirname(out), { recursive: true });
    fs.writeFileSync(out, JSON.stringify({ large, loadAverage: fs.readFileSync('/proc/loadavg', 'utf8').trim(), measuredAt: new Date().toISOString() }, null, 2) + '\n');
    return large;
  } finally {
    await browser.close();
    await server.stop();
  }
}

export async function runOpenBench(options: { rows?: number; cols?: number; runs?: number; write?: boolean; large?: boolean } = {}): Promise<OpenBenchResult> {
  const rows = options.rows ?? 10_000;
  const cols = options.cols ?? 10;
  // 21 each: drawn by the page's first script, the first rows come in about 0.4 s, and one open's
  // spread (0.3-0.56 s) is most of that: with nine opens each, one run's two medians came 7 % apart.
  const runs = options.runs ?? Number(process.env.BENCH_OPEN_RUNS ?? 21);
  const server = await startServer();
  const browser = await launchBrowser({ viewport: { width: 1280, height: 800 } });
  try {
    const api = new ApiClient(server.url);
    await api.call('POST', '/auth/sign-up', { name: 'Bench Analyst', email: 'bench@lab.example', password: 'bench-password-1' });
    const chemistryId = await createWorkbook(api, 'Open benchmark: chemistry', chemistryCells(rows).filter(([, c]) => c < cols));
    const numbersId = await createWorkbook(api, 'Open benchmark: numbers', numberCells(rows, cols));
    const storedWait = Math.max(await storedValuesReady(api, chemistryId), await storedValuesReady(api, numbersId));
    if (storedWait < 0) console.warn('the server did not store the values in time; the pages open by computing');
    const [name, value] = api.cookie.split('=');
    await browser.context.addCookies([{ name, value, url: server.url }]);
    const page = browser.page;
    page.setDefaultTimeout(120_000);
    await page.addInitScript(longTaskProbe);
    await page.addInitScript(firstRowsProbe);

    const openOnce = opener(page, server.url);

    type Run = Awaited<ReturnType<ReturnType<typeof opener>>>;
    const summary = (results: Run[]): OpenTiming => ({
      runsMs: results.map((r) => Math.round(r.shownMs)),
      medianMs: Math.round(median(results.map((r) => r.shownMs))),
      readyMedianMs: Math.round(median(results.map((r) => r.readyMs))),
      engineBuildMedianMs: Math.round(median(results.map((r) => r.buildMs))),
      workbookResponseMedianMs: Math.round(median(results.map((r) => r.responseMs))),
      workbookLoadedMedianMs: Math.round(median(results.map((r) => r.loadedMs))),
      previewBuildMedianMs: Math.round(median(results.map((r) => r.previewMs))),
      liveMedianMs: Math.round(median(results.map((r) => r.liveMs))),
      longestStallMs: Math.round(Math.max(...results.map((r) => r.longestStallMs))),
      openedOnStoredValues: results.every((r) => r.openedOnStoredValues),
    });
    // Warm the browser cache, then alternate the two workbooks so a busy machine slows both alike.
    await openOnce(numbersId);
    await openOnce(chemistryId);
    const numberRuns: Run[] = [];
    const chemistryRuns: Run[] = [];
    // In pairs whose order alternates (plain first, then chemistry first), so neither always follows the other.
    for (let i = 0; i < runs; i++) {
      if (i % 2 === 0) {
        numberRuns.push(await openOnce(numbersId));
        chemistryRuns.push(await openOnce(chemistryId));
      } else {
        chemistryRuns.push(await openOnce(chemistryId));
        numberRuns.push(await openOnce(numbersId));
      }
    }
    const numbers = summary(numberRuns);
    const chemistry = summary(chemistryRuns);

    // Scrolling the open chemistry sheet (the grid shows 26 columns, rows virtualised).
    // Sent as text: tsx would wrap named inner functions in a helper the page does not have.
    const scroll = (await page.evaluate(`new Promise((resolve) => {
      const box = document.querySelector('[data-testid="sheet-grid"]:not([data-preview]) .dsg-container');
      const deltas = [];
      let last = performance.now();
      const step = () => {
        const now = performance.now();
        deltas.push(now - last);
        last = now;
        box.scrollTop += 400;
        if (deltas.length < 480) return requestAnimationFrame(step);
        const sorted = deltas.slice(1).sort((a, b) => a - b);
        const at = (q) => Math.round(sorted[Math.min(sorted.length - 1, Math.floor(q * sorted.length))] * 10) / 10;
        requestAnimationFrame(() => resolve({ frames: sorted.length, medianFrameMs: at(0.5), p95FrameMs: at(0.95), longestFrameMs: at(1), numbersShownAtEnd: box.querySelectorAll('.orb-cell-number').length }));
      };
      requestAnimationFrame(step);
    })`)) as ScrollTiming;

    // 100,000 rows × 8 columns of species and chemistry formulas: created, stored by the server, opened once.
    const large = options.large !== false && process.env.BENCH_OPEN_LARGE !== '0' ? await measureLargeOpen(api, openOnce) : null;

    const result: OpenBenchResult = {
      rows,
      cols,
      chemistry,
      numbers,
      scroll,
      ratio: Math.round((chemistry.medianMs / numbers.medianMs) * 100) / 100,
      editableRatio: Math.round((chemistry.readyMedianMs / numbers.readyMedianMs) * 100) / 100,
      large,
      target: '≤ 1× the plain-number workbook',
      formulas: ['A: species', ...FORMULAS.slice(0, cols - 1).map((f, i) => `${String.fromCharCode(66 + i)}: =${f}(A<row>)`)],
      measuredAt: new Date().toISOString(),
      node: process.version,
      chromium: browser.context.browser()?.version() ?? 'unknown',
    };
    if (options.write !== false) {
      const out = path.resolve(import.meta.dirname, 'results/open.json');
      fs.mkdirSync(path.dirname(out), { recursive: true });
      fs.writeFileSync(out, JSON.stringify(result, null, 2) + '\n');
    }
    return result;
  } finally {
    await browser.close();
    await server.stop();
  }
}

const printLarge = (l: LargeOpenTiming) =>
  console.log(`  ${l.rows.toLocaleString('en')} × ${l.cols} chemistry workbook: first rows ${l.firstRowsMs} ms, editable ${l.editableMs} ms, every formula computed ${l.liveMs} ms, longest stall ${l.longestStallMs} ms (target ≤ ${l.stallTargetMs} ms); on stored values: ${l.openedOnStoredValues} (stored ${l.storedAfterMs} ms after the last patch)`);

if (import.meta.url === `file://${process.argv[1]}` && process.env.BENCH_OPEN_SMALL === '0') {
  const l = await runLargeOpenBench();
  if (l) printLarge(l);
  console.log(`  load average ${fs.readFileSync('/proc/loadavg', 'utf8').trim()} → bench/results/open-large.json`);
} else if (import.meta.url === `file://${process.argv[1]}`) {
  const r = await runOpenBench();
  console.log(`10,000 × ${r.cols} workbook, median of ${r.chemistry.runsMs.length} opens in headless Chromium:`);
  for (const [label, t] of [['plain numbers:     ', r.numbers], ['chemistry formulas:', r.chemistry]] as const) {
    console.log(`  ${label} first computed rows ${t.medianMs} ms; whole workbook editable ${t.readyMedianMs} ms`);
    console.log(`                       (workbook JSON received ${t.workbookResponseMedianMs} ms, parsed ${t.workbookLoadedMedianMs} ms, preview ${t.previewBuildMedianMs} ms, engine build ${t.engineBuildMedianMs} ms)`);
  }
  console.log(`  scrolling the chemistry sheet: median frame ${r.scroll.medianFrameMs} ms, p95 ${r.scroll.p95FrameMs} ms, longest ${r.scroll.longestFrameMs} ms over ${r.scroll.frames} frames`);
  for (const [label, t] of [['plain numbers:     ', r.numbers], ['chemistry formulas:', r.chemistry]] as const) {
    console.log(`  ${label} every formula computed in the page ${t.liveMedianMs} ms; longest stall ${t.longestStallMs} ms; opened on stored values: ${t.openedOnStoredValues}`);
  }
  if (r.large) printLarge(r.large);
  console.log(`  ratio: ${r.ratio}× (target ${r.target}); editable ${r.editableRatio}× → bench/results/open.json`);
}
