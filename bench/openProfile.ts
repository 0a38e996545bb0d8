// Profiles one open of the workbook held by bench/openProfileServer.ts: Chrome's CPU profiler via
// CDP over the whole open (navigation → every formula computed), then each stretch of the main
// thread busy for more than STALL_MS without a break is listed with the functions that took its time.
// Run: `npx tsx bench/openProfileServer.ts` (keep it running), then `npx tsx bench/openProfile.ts`.
import fs from 'node:fs';
import path from 'node:path';
import { launchBrowser } from '../tests/helpers/browser.js';
import { profileNodes, sampleClock, timeByFunction, topLines, type Node } from './profileTree.js';

const dir = process.env.OPEN_PROFILE_DIR ?? '/tmp/orbitab-open-profile';
const { url, cookie, id } = JSON.parse(fs.readFileSync(path.join(dir, 'live.json'), 'utf8')) as { url: string; cookie: string; id: string };
const STALL_MS = Number(process.env.STALL_MS ?? 100);
const profile = process.env.PROFILE !== '0';

interface Profile { nodes: Node[]; startTime: number; endTime: number; samples: number[]; timeDeltas: number[] }

const browser = await launchBrowser({ viewport: { width: 1280, height: 800 } });
try {
  const [name, value] = cookie.split('=');
  await browser.context.addCookies([{ name, value, url }]);
  const page = browser.page;
  page.setDefaultTimeout(600_000);
  // __orbCalibrate: a 20 ms busy loop whose samples place the page's clock on the profile's clock.
  await page.addInitScript(`(function __orbCalibrate() { const t = performance.now(); while (performance.now() - t < 20); window.__orbCal = t + 10; })()`);
  await page.addInitScript(`(() => { window.__orbTasks = []; try { new PerformanceObserver((l) => { for (const e of l.getEntries()) window.__orbTasks.push([Math.round(e.startTime), Math.round(e.duration)]); }).observe({ type: 'longtask', buffered: true }); } catch {} })()`);
  // Warm the cache with the page's code (as the open bench does), not with the workbook.
  await page.goto(`${url}/`);
  await page.waitForLoadState('networkidle');
  await page.goto('about:blank');
  const cdp = await page.context().newCDPSession(page);
  if (profile) {
    await cdp.send('Profiler.enable');
    await cdp.send('Profiler.setSamplingInterval', { interval: 200 });
    await cdp.send('Profiler.start');
  }
  const t0 = Date.now();
  await page.goto(`${url}/workbooks/${id}`);
  const first = await page.waitForFunction(() => { const g = document.querySelector('[data-testid="sheet-grid"]'); return g && g.querySelectorAll('.orb-cell-number').length >= 20 ? performance.now() : false; }, undefined, { polling: 'raf' });
  const firstMs = (await first.jsonValue()) as number;
  const editable = await page.waitForFunction(() => { const g = document.querySelector('[data-testid="sheet-grid"]:not([data-preview])'); return g && g.querySelectorAll('.orb-cell-number').length >= 20 ? performance.now() : false; }, undefined, { polling: 'raf' });
  const editableMs = (await editable.jsonValue()) as number;
  const live = await page.waitForFunction(() => (document.querySelector('[data-testid="computing-state"]') ? false : performance.now()), undefined, { polling: 'raf', timeout: 600_000 });
  const liveMs = (await live.jsonValue()) as number;
  const tasks = (await page.evaluate('window.__orbTasks')) as [number, number][];
  const heapMb = Math.round(((await page.evaluate('performance.memory ? performance.memory.usedJSHeapSize : 0')) as number) / 1e6);
  const longest = Math.max(0, ...tasks.map((t) => t[1]));
  console.log(`first rows ${Math.round(firstMs)} ms, editable ${Math.round(editableMs)} ms, live ${Math.round(liveMs)} ms, wall ${Date.now() - t0} ms; longest task ${longest} ms; JS heap at live ${heapMb} MB; loadavg ${fs.readFileSync('/proc/loadavg', 'utf8').trim()}`);
  console.log('long tasks (start, duration):', JSON.stringify(tasks.filter((t) => t[1] > STALL_MS)));
  // The page's own marks and measures, to place the long tasks in the open's steps.
  const marks = (await page.evaluate(`performance.getEntries().filter((e) => e.name.startsWith('orbitab:')).map((e) => [e.name, Math.round(e.startTime), Math.round(e.duration)])`)) as [string, number, number][];
  console.log('marks (name, start, duration):', JSON.stringify(marks));
  if (profile) {
    const { profile: p } = (await cdp.send('Profiler.stop')) as { profile: Profile };
    fs.writeFileSync(path.join(dir, 'open.cpuprofile'), JSON.stringify(p));
    const byId = profileNodes(p.nodes);
    const calMs = (await page.evaluate('window.__orbCal')) as number;
    const { times, offsetUs, calibrationSamples } = sampleClock(p, byId, calMs);
    const long = tasks.filter((x) => x[1] > STALL_MS).map(([start, dur]) => {
      const samples: [number, number][] = [];
      for (let i = 0; i < times.length; i++) {
        const at = times[i] - offsetUs;
        if (at >= start * 1000 && at <= (start + dur) * 1000) samples.push([p.samples[i], p.timeDeltas[i + 1] ?? 0]);
      }
      return { start: start * 1000 + offsetUs, end: (start + dur) * 1000 + offsetUs, samples };
    });
    console.log(`calibration samples ${calibrationSamples}; ${long.length} long tasks > ${STALL_MS} ms`);
    const DETAIL_MS = Number(process.env.DETAIL_MS ?? 300);
    const all = { start: 0, end: 0, samples: long.flatMap((x) => x.samples) };
    for (const s of [...long.filter((x) => x.end - x.start > DETAIL_MS * 1000), all]) {
      const { self, total } = timeByFunction(s.samples, byId);
      const fmt = topLines;
      console.log(`\n  ${s === all ? `all long tasks together (${long.length})` : `task at ${((s.start - offsetUs) / 1000).toFixed(0)} ms, ${((s.end - s.start) / 1000).toFixed(0)} ms`}\n    self:\n${fmt(self, 10)}\n    total (inclusive):\n${fmt(total, Number(process.env.TOTAL_LINES ?? 30))}`);
    }
  }
} finally {
  await browser.close();
}
