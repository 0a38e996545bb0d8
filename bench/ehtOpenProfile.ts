// Opens the extended-Hückel library held by bench/ehtOpenProfileServer.ts as bench/ehtLibrary.ts does
// (a fresh browser, nothing cached) and shows where the time goes:
//   MODE=colleague (default): the stored library; time to the first values and every request, mark
//     and long task on the way (ms from navigation);
//   MODE=first: a new library of molecules nobody has computed (another seed each run), opened while
//     the server's pool computes them; the page's long tasks over the first WINDOW_MS.
// PROFILE=1 adds Chrome's CPU profile (CDP) and lists, for each long task over DETAIL_MS, the
// functions that took its time. RUNS=n repeats the open.
// Run: `npx tsx bench/ehtOpenProfileServer.ts` (keep it running), then `npx tsx bench/ehtOpenProfile.ts`.
import fs from 'node:fs';
import path from 'node:path';
import { launchBrowser } from '../tests/helpers/browser.js';
import { profileNodes, sampleClock, timeByFunction, topLines, type Node } from './profileTree.js';
import { ApiClient, createWorkbook } from './browser-open.js';
import { libraryCells, stallProbe } from './ehtLibrary.js';
import { benchMolecules } from './ehtMolecules.js';

const dir = process.env.EHT_PROFILE_DIR ?? '/tmp/orbitab-eht-profile';
const live = JSON.parse(fs.readFileSync(path.join(dir, 'live.json'), 'utf8')) as { url: string; cookie: string; id: string };
const mode = process.env.MODE ?? 'colleague';
const runs = Number(process.env.RUNS ?? 1);
const windowMs = Number(process.env.WINDOW_MS ?? 20_000);
const DETAIL_MS = Number(process.env.DETAIL_MS ?? 100);
const profile = process.env.PROFILE === '1';

interface Profile { nodes: Node[]; startTime: number; endTime: number; samples: number[]; timeDeltas: number[] }

async function workbookToOpen(run: number): Promise<string> {
  if (mode !== 'first') return live.id;
  const api = new ApiClient(live.url);
  api.cookie = live.cookie;
  const smiles = benchMolecules(Number(process.env.EHT_LIBRARY_MOLECULES ?? 200), 30, 1_000 + Date.now() % 100_000 + run);
  return createWorkbook(api, `EHT first open ${run}`, libraryCells(smiles));
}

for (let run = 0; run < runs; run++) {
  const id = await workbookToOpen(run);
  const browser = await launchBrowser({ viewport: { width: 1280, height: 800 } });
  try {
    const [name, value] = live.cookie.split('=');
    await browser.context.addCookies([{ name, value, url: live.url }]);
    await browser.context.addInitScript(stallProbe);
    await browser.context.addInitScript(`(function __orbCalibrate() { const t = performance.now(); while (performance.now() - t < 20); window.__orbCal = t + 10; })()`);
    await browser.context.addInitScript(`(() => { window.__orbTasks = []; new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__orbTasks.push([Math.round(e.startTime), Math.round(e.duration)]); }).observe({ type: 'longtask' }); })()`);
    // When the first values are in the page's DOM (the polls below run only when the main thread is free).
    await browser.context.addInitScript(`(() => { const o = new MutationObserver(() => { if (document.querySelectorAll('[data-testid="sheet-grid"] .orb-cell-number').length >= 4) { window.__orbFirstDom = performance.now(); o.disconnect(); } }); document.addEventListener('DOMContentLoaded', () => o.observe(document.body, { childList: true, subtree: true })); })()`);
    const page = browser.page;
    page.setDefaultTimeout(0);
    const cdp = await page.context().newCDPSession(page);
    if (profile) {
      await cdp.send('Profiler.enable');
      await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
      await cdp.send('Profiler.start');
    }
    await page.goto(`${live.url}/workbooks/${id}`);
    const first = await page.waitForFunction(() => (document.querySelectorAll('[data-testid="sheet-grid"] .orb-cell-number').length >= 4 ? performance.now() : false), undefined, { polling: 100 });
    const firstMs = (await first.jsonValue()) as number;
    // The workspace itself (a read-only preview of stored values may come first).
    const editable = await page.waitForFunction(() => (document.querySelectorAll('[data-testid="sheet-grid"]:not([data-preview]) .orb-cell-number').length >= 4 ? performance.now() : false), undefined, { polling: 100 });
    const editableMs = (await editable.jsonValue()) as number;
    if (mode === 'first') await page.waitForTimeout(Math.max(0, windowMs - firstMs));
    else await page.waitForFunction(() => (document.querySelector('[data-testid="computing-state"]') ? false : true), undefined, { polling: 250 });
    const timeline = (await page.evaluate(() =>
      performance
        .getEntries()
        .filter((e) => e.entryType === 'resource' || e.entryType === 'mark' || e.entryType === 'measure')
        .filter((e) => !/\.(woff2?|css)$/.test(e.name))
        .map((e) => [Math.round(e.startTime), Math.round(e.startTime + e.duration), e.name.replace(/^https?:\/\/[^/]+/, '').replace(/\/api\/workbooks\/[^/?]*/, '/api/workbook')]),
    )) as [number, number, string][];
    const tasks = (await page.evaluate('window.__orbTasks')) as [number, number][];
    const firstDom = (await page.evaluate('window.__orbFirstDom')) as number;
    const load = fs.readFileSync('/proc/loadavg', 'utf8').split(' ').slice(0, 3).join(' ');
    console.log(`\n[${mode} ${run}] first values ${Math.round(firstMs)} ms (in the DOM at ${Math.round(firstDom)} ms), editable ${Math.round(editableMs)} ms; longest task ${Math.max(0, ...tasks.map((t) => t[1]))} ms; load ${load}`);
    for (const [s, e, n] of timeline.sort((a, b) => a[0] - b[0])) console.log(`  ${String(s).padStart(6)} → ${String(e).padStart(6)}  ${n}`);
    console.log('  long tasks (start, ms):', JSON.stringify(tasks));
    if (profile) {
      const { profile: p } = (await cdp.send('Profiler.stop')) as { profile: Profile };
      fs.writeFileSync(path.join(dir, `${mode}-${run}.cpuprofile`), JSON.stringify(p));
      const byId = profileNodes(p.nodes);
      const calMs = (await page.evaluate('window.__orbCal')) as number;
      const { times, offsetUs } = sampleClock(p, byId, calMs);
      fs.writeFileSync(path.join(dir, `${mode}-${run}.calibration.json`), JSON.stringify({ calMs }));
      for (const [start, dur] of tasks.filter((x) => x[1] > DETAIL_MS)) {
        const inTask: [number, number][] = [];
        for (let i = 0; i < times.length; i++) {
          const at = times[i] - offsetUs;
          if (at >= start * 1000 && at <= (start + dur) * 1000) inTask.push([p.samples[i], p.timeDeltas[i + 1] ?? 0]);
        }
        const { self, total } = timeByFunction(inTask, byId);
        const fmt = topLines;
        console.log(`\n  task at ${start} ms, ${dur} ms\n    self:\n${fmt(self, 12)}\n    total (inclusive):\n${fmt(total, Number(process.env.TOTAL_LINES ?? 30))}`);
      }
    }
  } finally {
    await browser.close();
  }
}
