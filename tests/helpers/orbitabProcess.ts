// The real server as a child process on a database file the test owns, for tests that kill it,
// restart it on the same file or read what it printed (fault tests, first-start seeding). Unlike
// tests/helpers/server.ts it needs no built client and never deletes the database.
import { spawn, type ChildProcess } from 'node:child_process';
import path from 'node:path';

export const repoRoot = path.resolve(import.meta.dirname, '../..');

export interface OrbitabProcess {
  /** http://127.0.0.1:<port> */
  url: string;
  child: ChildProcess;
  /** Everything printed so far, stdout and stderr. */
  output(): string;
  /** Resolves when the process has ended. */
  exited: Promise<{ code: number | null; signal: NodeJS.Signals | null }>;
}

const running = new Set<ChildProcess>();
process.once('exit', () => {
  for (const child of running) child.kill('SIGKILL');
});

/** Starts `node --import tsx server/main.ts` on PORT=0 and waits for its "serving on" line. */
export async function startOrbitab(databasePath: string, env: Record<string, string> = {}, timeoutMs = 30_000): Promise<OrbitabProcess> {
  const inherited = Object.fromEntries(Object.entries(process.env).filter(([k]) => !/^(ORBITAB_|VITEST|DATABASE_PATH$|PORT$|SMTP_URL$|LOG_LEVEL$|NODE_ENV$)/.test(k)));
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: repoRoot,
    env: { ...inherited, NODE_ENV: 'production', PORT: '0', DATABASE_PATH: databasePath, ORBITAB_SEED: '0', LOG_LEVEL: 'warn', ...env },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  running.add(child);
  let output = '';
  child.stdout!.on('data', (c: Buffer) => (output += c.toString()));
  child.stderr!.on('data', (c: Buffer) => (output += c.toString()));
  const exited = new Promise<{ code: number | null; signal: NodeJS.Signals | null }>((resolve) =>
    child.once('exit', (code, signal) => {
      running.delete(child);
      resolve({ code, signal });
    }),
  );
  let gone = false;
  void exited.then(() => (gone = true));
  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    // main.ts prints this plain line once it listens.
    const match = /Orbitab is serving on http:\/\/localhost:(\d+)/.exec(output);
    if (match) return { url: `http://127.0.0.1:${match[1]}`, child, output: () => output, exited };
    if (gone) throw new Error(`the server exited before listening:\n${output}`);
    await new Promise((r) => setTimeout(r, 25));
  }
  child.kill('SIGKILL');
  throw new Error(`the server did not start within ${timeoutMs} ms:\n${output}`);
}

/** A minimal browser-like client: keeps the session cookie and sends the server's Origin. */
export function apiClient(url: string) {
  let cookie = '';
  async function call(method: string, route: string, body?: unknown): Promise<{ status: number; body: any }> {
    const res = await fetch(`${url}${route}`, {
      method,
      headers: { Origin: url, ...(cookie ? { Cookie: cookie } : {}), ...(body !== undefined ? { 'Content-Type': 'application/json' } : {}) },
      body: body !== undefined ? JSON.stringify(body) : undefined,
    });
    const session = res.headers.getSetCookie().find((c) => c.startsWith('orbitab_session='));
    if (session) cookie = session.split(';')[0];
    const text = await res.text();
    return { status: res.status, body: text ? JSON.parse(text) : null };
  }
  return {
    get: (route: string) => call('GET', route),
    post: (route: string, body?: unknown) => call('POST', route, body ?? {}),
    cookie: () => cookie,
  };
}
