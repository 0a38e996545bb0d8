// Starts the real Orbitab server for browser tests: `node --import tsx server/main.ts` as a child
// process, in production mode (serving dist/), on a free port, with its own temporary database.
//
// Why a child process rather than createApp() + listen(0) in the test process: it runs exactly what
// `npm start` runs (main.ts: config from the environment, migrations at start, static client, clean
// shutdown on SIGTERM), nothing of the test process (module state, fake timers, VITEST) leaks into
// the server, and a crash in the server cannot take the test runner down. `node --import tsx` rather
// than `npx tsx`: no npx wrapper process in between, so the pid we signal is the server itself.
//
// Usage:
//   const server = await startServer();               // { url, stop(), output() }
//   await page.goto(server.url);  …  await server.stop();
// The client must be built first (`npm test` builds it; for one file: `npm run build` then
// `npx vitest run tests/browser-auth.test.ts`).
import { spawn, type ChildProcess } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

export const repoRoot = path.resolve(import.meta.dirname, '../..');

export interface StartServerOptions {
  /** Extra environment for the server (e.g. ORBITAB_ADMIN_EMAIL, ORBITAB_SEED: '1', LOG_LEVEL: 'info'). */
  env?: Record<string, string>;
  /** How long to wait for the server to answer /api/health (default 30 s). */
  timeoutMs?: number;
}

export interface TestServer {
  /** http://127.0.0.1:<port>, no trailing slash. */
  url: string;
  port: number;
  /** The temporary SQLite file (deleted by stop()). */
  databasePath: string;
  /** Everything the server printed so far (stdout and stderr), for failure messages. */
  output(): string;
  /** SIGTERM, wait for a clean exit (SIGKILL after 10 s), then delete the temporary directory. */
  stop(): Promise<void>;
}

const running = new Set<ChildProcess>();
// A test run that dies (or forgets stop()) must not leave servers behind.
process.once('exit', () => {
  for (const child of running) child.kill('SIGKILL');
});

/** Throws when dist/ is missing; warns when sources are newer than the build (the test would drive an old client). */
export function checkClientBuild(): void {
  const builtIndex = path.join(repoRoot, 'dist', 'index.html');
  if (!fs.existsSync(builtIndex)) {
    throw new Error('dist/index.html is missing: build the client first (`npm run build`; `npm test` does it for you)');
  }
  const builtAt = fs.statSync(builtIndex).mtimeMs;
  const newer = newestFile(['src', 'shared', 'functions', 'index.html'].map((p) => path.join(repoRoot, p)));
  if (newer && newer.mtimeMs > builtAt) {
    console.warn(`[startServer] ${path.relative(repoRoot, newer.file)} changed after the last client build; run \`npm run build\` to test the current client`);
  }
}

function newestFile(roots: string[]): { file: string; mtimeMs: number } | null {
  let newest: { file: string; mtimeMs: number } | null = null;
  const visit = (p: string) => {
    let stat: fs.Stats;
    try {
      stat = fs.statSync(p);
    } catch {
      return; // deleted while we looked (others edit the tree too)
    }
    if (stat.isDirectory()) {
      for (const name of fs.readdirSync(p)) visit(path.join(p, name));
    } else if (!newest || stat.mtimeMs > newest.mtimeMs) {
      newest = { file: p, mtimeMs: stat.mtimeMs };
    }
  };
  roots.forEach(visit);
  return newest;
}

/** The child's environment: ours, minus anything of the developer's or the test runner's that would change the server. */
function serverEnv(databasePath: string, extra: Record<string, string>): NodeJS.ProcessEnv {
  const env: NodeJS.ProcessEnv = {};
  for (const [key, value] of Object.entries(process.env)) {
    if (/^(ORBITAB_|VITEST|DATABASE_PATH$|PORT$|SMTP_URL$|LOG_LEVEL$|NODE_ENV$)/.test(key)) continue;
    env[key] = value;
  }
  return {
    ...env,
    NODE_ENV: 'production',
    PORT: '0', // the OS picks a free port; main.ts prints it
    DATABASE_PATH: databasePath,
    ORBITAB_SEED: '0',
    LOG_LEVEL: 'warn', // quiet, but server errors still reach output()
    ...extra,
  };
}

export async function startServer(options: StartServerOptions = {}): Promise<TestServer> {
  checkClientBuild();
  const tmpDir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-server-'));
  const databasePath = path.join(tmpDir, 'orbitab.sqlite');
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: repoRoot,
    env: serverEnv(databasePath, options.env ?? {}),
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  running.add(child);

  let output = '';
  const keep = (chunk: Buffer) => {
    output = (output + chunk.toString()).slice(-20_000);
  };
  child.stdout!.on('data', keep);
  child.stderr!.on('data', keep);
  const exited = new Promise<number | null>((resolve) => child.once('exit', (code) => resolve(code)));
  exited.then(() => running.delete(child));

  async function stop() {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const killer = setTimeout(() => child.kill('SIGKILL'), 10_000);
      await exited;
      clearTimeout(killer);
    }
    fs.rmSync(tmpDir, { recursive: true, force: true });
  }

  try {
    const port = await waitForPort(() => output, exited, options.timeoutMs ?? 30_000);
    const url = `http://127.0.0.1:${port}`;
    await waitForHealth(url, exited, options.timeoutMs ?? 30_000);
    return { url, port, databasePath, output: () => output, stop };
  } catch (e) {
    await stop();
    throw new Error(`${(e as Error).message}\n--- server output ---\n${output}`);
  }
}

async function waitForPort(output: () => string, exited: Promise<number | null>, timeoutMs: number): Promise<number> {
  let gone: number | null | undefined;
  void exited.then((code) => (gone = code));
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const match = /serving on https?:\/\/[^:\s]+:(\d+)/.exec(output());
    if (match) return Number(match[1]);
    if (gone !== undefined) throw new Error(`the server exited (code ${gone}) before it was listening`);
    await sleep(50);
  }
  throw new Error(`the server did not report its port within ${timeoutMs} ms`);
}

async function waitForHealth(url: string, exited: Promise<number | null>, timeoutMs: number): Promise<void> {
  let gone = false;
  void exited.then(() => (gone = true));
  const deadline = Date.now() + timeoutMs;
  let last = '';
  while (Date.now() < deadline && !gone) {
    try {
      const res = await fetch(`${url}/api/health`);
      if (res.ok) return;
      last = `${res.status} ${await res.text()}`;
    } catch (e) {
      last = (e as Error).message;
    }
    await sleep(100);
  }
  throw new Error(gone ? 'the server exited before it was healthy' : `GET /api/health did not answer 200 within ${timeoutMs} ms (last: ${last})`);
}

const sleep = (ms: number) => new Promise((r) => setTimeout(r, ms));
