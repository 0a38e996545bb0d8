// Patch round-trip under load: `npm run bench:patches`.
//
// The real server runs in its own process on a loopback port with a temporary database. One
// signed-in user owns one workbook; 20 concurrent connections (autocannon) send single-cell patches
// to it for 10 s. Each connection writes its own column, one new row per request, with the revision
// of its last acknowledgement as baseRevision: distinct cells never conflict, so every refusal would
// be a bug, not contention. Afterwards the server is stopped and the database is read back: every
// change the server acknowledged (200) must be there with the input that was sent, each under its
// own revision. Results go to bench/results/patches.json (git-ignored).
import { mkdirSync, writeFileSync } from 'node:fs';
import { cpus, loadavg } from 'node:os';
import { dirname, resolve } from 'node:path';
import { fileURLToPath, pathToFileURL } from 'node:url';
import autocannon from 'autocannon';
import { and, count, eq } from 'drizzle-orm';
import { openDatabase } from '../server/db/index.js';
import { cells, revisions } from '../server/db/schema.js';
import { startAppServer } from './appServer.js';

export interface PatchBenchOptions {
  connections?: number;
  durationSeconds?: number;
}

export interface PatchBenchResult {
  when: string;
  node: string;
  cpu: string;
  cores: number;
  /** 1-minute load average when the run started (the machine may be shared). */
  loadAverageAtStart: number;
  connections: number;
  durationSeconds: number;
  requests: number;
  requestsPerSecond: number;
  latencyMs: { mean: number; p50: number; p95: number; p99: number; max: number };
  statusCounts: Record<string, number>;
  socketErrors: number;
  timeouts: number;
  verification: {
    acknowledgedChanges: number;
    foundInDatabase: number;
    /** Acknowledged changes missing or different in the database (should be empty). */
    missing: { row: number; col: number; expected: string; found: string | null }[];
    /** Each acknowledged patch got its own revision number. */
    distinctRevisions: boolean;
    revisionsInDatabase: number;
  };
  ok: boolean;
}

const SPECIES = ['O2', 'N2', 'NO', 'CO', 'CN-', 'O2^2-', 'F2', 'OH', 'NO+', 'C2'];
const BENCH_PASSWORD = 'bench password, long enough';

function percentile(sortedMs: number[], p: number): number {
  if (sortedMs.length === 0) return 0;
  const i = Math.min(sortedMs.length - 1, Math.ceil((p / 100) * sortedMs.length) - 1);
  return Math.round(sortedMs[Math.max(0, i)] * 100) / 100;
}

async function api(url: string, path: string, init: { method?: string; cookie?: string; body?: unknown } = {}) {
  const res = await fetch(`${url}${path}`, {
    method: init.method ?? 'GET',
    headers: { 'content-type': 'application/json', origin: url, ...(init.cookie ? { cookie: init.cookie } : {}) },
    body: init.body === undefined ? undefined : JSON.stringify(init.body),
  });
  if (!res.ok) throw new Error(`${init.method ?? 'GET'} ${path}: ${res.status} ${await res.text()}`);
  return res;
}

interface Ack {
  row: number;
  col: number;
  input: string;
  revision: number;
}

export async function runPatchBench(options: PatchBenchOptions = {}): Promise<PatchBenchResult> {
  const connections = options.connections ?? 20;
  const durationSeconds = options.durationSeconds ?? 10;
  const loadAverageAtStart = Math.round(loadavg()[0] * 100) / 100;
  const server = await startAppServer();
  try {
    const signUp = await api(server.url, '/api/auth/sign-up', { method: 'POST', body: { email: 'bench@orbitab.test', password: BENCH_PASSWORD, name: 'Bench' } });
    const cookie = signUp.headers.getSetCookie().find((c) => c.startsWith('orbitab_session='))?.split(';')[0];
    if (!cookie) throw new Error('sign-up gave no session cookie');
    const created = (await (await api(server.url, '/api/workbooks', { method: 'POST', cookie, body: { title: 'Patch bench' } })).json()) as { workbook: { id: string } };
    const workbookId = created.workbook.id;
    const loaded = (await (await api(server.url, `/api/workbooks/${workbookId}`, { cookie })).json()) as { sheets: { id: string }[] };
    const sheetId = loaded.sheets[0].id;

    const latencies: number[] = [];
    const acks: Ack[] = [];
    const statusCounts: Record<string, number> = {};
    let lastBody = '';
    let nextColumn = 0;

    const run = autocannon({
      url: `${server.url}/api/workbooks/${workbookId}/patches`,
      connections,
      duration: durationSeconds,
      timeout: 10,
      method: 'POST',
      headers: { 'content-type': 'application/json', cookie, origin: server.url },
      // onResponse gets the whole body; it runs just before the client's 'response' event.
      requests: [{ onResponse: (_status: number, body: string) => (lastBody = body) }],
      setupClient(client) {
        const col = nextColumn++;
        let row = 0;
        let baseRevision = 0;
        let sent = { row: 0, input: '' };
        const sendNext = () => {
          const species = SPECIES[row % SPECIES.length];
          sent = { row, input: row % 2 === 0 ? species : `=BONDORDER("${species}")` };
          client.setBody(JSON.stringify({ baseRevision, changes: [{ sheetId, row, col, input: sent.input }] }));
          row++;
        };
        sendNext();
        client.on('response', (status: number, _bytes: number, ms: number) => {
          latencies.push(ms);
          statusCounts[status] = (statusCounts[status] ?? 0) + 1;
          if (status === 200) {
            const { revision } = JSON.parse(lastBody) as { revision: number };
            acks.push({ row: sent.row, col, input: sent.input, revision });
            baseRevision = Math.max(baseRevision, revision);
          }
          sendNext();
        });
      },
    });
    const result = await run;
    await server.stop();

    const db = openDatabase(server.databasePath);
    const missing: PatchBenchResult['verification']['missing'] = [];
    for (const a of acks) {
      const stored = db
        .select({ input: cells.input })
        .from(cells)
        .where(and(eq(cells.sheetId, sheetId), eq(cells.row, a.row), eq(cells.col, a.col)))
        .get();
      if (stored?.input !== a.input) missing.push({ row: a.row, col: a.col, expected: a.input, found: stored?.input ?? null });
    }
    const revisionsInDatabase = db.select({ n: count() }).from(revisions).where(eq(revisions.workbookId, workbookId)).get()!.n;
    db.$client.close();

    const sorted = [...latencies].sort((x, y) => x - y);
    const distinctRevisions = new Set(acks.map((a) => a.revision)).size === acks.length;
    return {
      when: new Date().toISOString(),
      node: process.version,
      cpu: cpus()[0]?.model ?? 'unknown',
      cores: cpus().length,
      loadAverageAtStart,
      connections,
      durationSeconds,
      requests: latencies.length,
      requestsPerSecond: Math.round((latencies.length / (result.duration || durationSeconds)) * 10) / 10,
      latencyMs: {
        mean: Math.round((sorted.reduce((s, x) => s + x, 0) / Math.max(1, sorted.length)) * 100) / 100,
        p50: percentile(sorted, 50),
        p95: percentile(sorted, 95),
        p99: percentile(sorted, 99),
        max: percentile(sorted, 100),
      },
      statusCounts,
      socketErrors: result.errors,
      timeouts: result.timeouts,
      verification: { acknowledgedChanges: acks.length, foundInDatabase: acks.length - missing.length, missing: missing.slice(0, 20), distinctRevisions, revisionsInDatabase },
      ok: acks.length > 0 && missing.length === 0 && distinctRevisions && revisionsInDatabase >= acks.length,
    };
  } finally {
    await server.stop();
    server.cleanup();
  }
}

export const RESULTS_PATH = resolve(dirname(fileURLToPath(import.meta.url)), 'results', 'patches.json');

export function formatReport(r: PatchBenchResult): string {
  const v = r.verification;
  return [
    `patch bench: ${r.connections} connections × ${r.durationSeconds} s, single-cell patches to one workbook (${r.node}, ${r.cores} × ${r.cpu}, load ${r.loadAverageAtStart} at start)`,
    `  requests            ${r.requests} (${r.requestsPerSecond} req/s)`,
    `  latency ms          mean ${r.latencyMs.mean}, p50 ${r.latencyMs.p50}, p95 ${r.latencyMs.p95}, p99 ${r.latencyMs.p99}, max ${r.latencyMs.max}`,
    `  statuses            ${JSON.stringify(r.statusCounts)}; socket errors ${r.socketErrors}, timeouts ${r.timeouts}`,
    `  acknowledged        ${v.acknowledgedChanges}, found in the database ${v.foundInDatabase}, distinct revisions ${v.distinctRevisions}, revisions stored ${v.revisionsInDatabase}`,
    `  verdict             ${r.ok ? 'every acknowledged change is in the database' : 'FAILED: see verification'}`,
  ].join('\n');
}

if (process.argv[1] && import.meta.url === pathToFileURL(resolve(process.argv[1])).href) {
  const result = await runPatchBench({
    connections: Number(process.env.BENCH_CONNECTIONS ?? 20),
    durationSeconds: Number(process.env.BENCH_SECONDS ?? 10),
  });
  mkdirSync(dirname(RESULTS_PATH), { recursive: true });
  writeFileSync(RESULTS_PATH, `${JSON.stringify(result, null, 2)}\n`);
  console.log(formatReport(result));
  console.log(`  written to ${RESULTS_PATH}`);
  if (!result.ok) process.exitCode = 1;
}
