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

interface Node { id: number; callFrame: { functionName: string; url: string; lineNumber: number; columnNumber: number }; parent?: number; children?: number[] }
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
      const byId = new Map(p.nodes.map((n) => [n.id, n]));
      for (const n of p.nodes) for (const c of n.children ?? []) byId.get(c)!.parent = n.id;
      const label = (n: Node) => `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber + 1}:${n.callFrame.columnNumber + 1}`;
      const times: number[] = [];
      let t = p.startTime;
      for (const d of p.timeDeltas) times.push((t += d));
      const cal = times.filter((_, i) => byId.get(p.samples[i])!.callFrame.functionName === '__orbCalibrate');
      const calMs = (await page.evaluate('window.__orbCal')) as number;
      const offsetUs = (cal[0] + cal[cal.length - 1]) / 2 - calMs * 1000;
      fs.writeFileSync(path.join(dir, `${mode}-${run}.calibration.json`), JSON.stringify({ calMs }));
      for (const [start, dur] of tasks.filter((x) => x[1] > DETAIL_MS)) {
        const self = new Map<string, number>();
        const total = new Map<string, number>();
        for (let i = 0; i < times.length; i++) {
          const at = times[i] - offsetUs;
          if (at < start * 1000 || at > (start + dur) * 1000) continue;
          const dt = p.timeDeltas[i + 1] ?? 0;
          const n = byId.get(p.samples[i])!;
          self.set(label(n), (self.get(label(n)) ?? 0) + dt);
          const seen = new Set<string>();
          for (let a: Node | undefined = n; a; a = a.parent ? byId.get(a.parent) : undefined) {
            const l = label(a);
            if (seen.has(l)) continue;
            seen.add(l);
            total.set(l, (total.get(l) ?? 0) + dt);
          }
        }
        const fmt = (m: Map<string, number>, k: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, k).map(([l, us]) => `      ${(us / 1000).toFixed(0).padStart(5)} ms  ${l}`).join('\n');
        console.log(`\n  task at ${start} ms, ${dur} ms\n    self:\n${fmt(self, 12)}\n    total (inclusive):\n${fmt(total, Number(process.env.TOTAL_LINES ?? 30))}`);
      }
    }
  } finally {
    await browser.close();
  }
}
