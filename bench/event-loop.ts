// The longest stall of the server's event loop while it imports, opens (GET of the workbook), exports
// and computes the values of a 100,000-cell workbook (the screening list of ioWorkload.ts as a CSV): the server runs in this
// process on a file database, perf_hooks' monitorEventLoopDelay watches its loop, and each phase is
// one HTTP request. Target: no stall longer than 250 ms in any phase (a user's other requests wait
// at most that long). `npx tsx bench/event-loop.ts` runs it alone.
import fs from 'node:fs';
import http from 'node:http';
import type { AddressInfo } from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { monitorEventLoopDelay } from 'node:perf_hooks';
import { pathToFileURL } from 'node:url';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';
import { closeParsePool, warmParsePool } from '../server/xlsx/parseInWorker.js';
import { screeningCells } from './ioWorkload.js';

export interface StallPhase {
  phase: 'import' | 'open' | 'export' | 'values';
  status: number;
  elapsedMs: number;
  /** The longest single stall of the event loop during the phase. */
  maxStallMs: number;
  p99StallMs: number;
}

export interface EventLoopBenchResult {
  cells: number;
  targetMs: number;
  phases: StallPhase[];
}

function csvOf(rows: number): string {
  const cells = screeningCells(rows);
  const lines: string[][] = [];
  for (const [r, c, input] of cells) (lines[r] ??= [])[c] = /[",\n]/.test(input) ? `"${input.replace(/"/g, '""')}"` : input;
  return lines.map((l) => l.join(',')).join('\n');
}

export async function runEventLoopBench(options: { rows?: number } = {}): Promise<EventLoopBenchResult> {
  const rows = options.rows ?? 10_000;
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-stall-'));
  const db = openDatabase(path.join(dir, 'stall.sqlite'));
  const origin = 'http://orbitab.bench';
  const { app, ctx } = createApp({ db, config: { ...loadConfig({ NODE_ENV: 'production' }), seed: false, origin, logLevel: 'warn' } });
  const httpServer = http.createServer(app);
  await new Promise<void>((resolve) => httpServer.listen(0, '127.0.0.1', resolve));
  const server = {
    url: `http://127.0.0.1:${(httpServer.address() as AddressInfo).port}`,
    close: () => new Promise<void>((resolve) => (httpServer.closeAllConnections(), httpServer.close(() => resolve()))),
  };
  warmParsePool();
  try {
    const signUp = await fetch(`${server.url}/api/auth/sign-up`, {
      method: 'POST',
      headers: { Origin: origin, 'Content-Type': 'application/json' },
      body: JSON.stringify({ email: 'bench@lab.test', password: 'a long bench password', name: 'Bench' }),
    });
    const cookie = signUp.headers.getSetCookie().find((c) => c.startsWith('orbitab_session='))!.split(';')[0];
    const csv = csvOf(rows);
    const phases: StallPhase[] = [];
    let workbookId = '';

    const measure = async (phase: StallPhase['phase'], request: () => Promise<Response>) => {
      const h = monitorEventLoopDelay({ resolution: 5 });
      h.enable();
      const started = performance.now();
      const res = await request();
      await res.arrayBuffer().then((b) => (phase === 'import' ? (workbookId = JSON.parse(Buffer.from(b).toString()).workbookId) : undefined));
      const elapsedMs = performance.now() - started;
      h.disable();
      phases.push({ phase, status: res.status, elapsedMs, maxStallMs: h.max / 1e6, p99StallMs: h.percentile(99) / 1e6 });
    };

    await measure('import', () => {
      const form = new FormData();
      form.append('file', new Blob([csv], { type: 'text/csv' }), 'screening.csv');
      return fetch(`${server.url}/api/imports`, { method: 'POST', headers: { Origin: origin, Cookie: cookie }, body: form });
    });
    await measure('open', () => fetch(`${server.url}/api/workbooks/${workbookId}`, { headers: { Cookie: cookie } }));
    await measure('export', () => fetch(`${server.url}/api/workbooks/${workbookId}/export?format=xlsx`, { headers: { Cookie: cookie } }));
    await measure('values', () => fetch(`${server.url}/api/workbooks/${workbookId}/values`, { headers: { Cookie: cookie } }));
    return { cells: screeningCells(rows).length, targetMs: 250, phases };
  } finally {
    await server.close();
    await ctx.mail.stop();
    await closeParsePool();
    db.$client.close();
    fs.rmSync(dir, { recursive: true, force: true });
  }
}

if (import.meta.url === pathToFileURL(process.argv[1] ?? '').href) {
  const result = await runEventLoopBench();
  console.log(JSON.stringify(result, null, 2));
}
