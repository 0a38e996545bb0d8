// Starts the real server (`node --import tsx server/main.ts`, as `npm run serve` does) on a free
// loopback port with a throw-away database, in its own process so the load generator and the
// server do not share an event loop.
import { spawn } from 'node:child_process';
import fs from 'node:fs';
import os from 'node:os';
import path from 'node:path';

const repoRoot = path.resolve(import.meta.dirname, '..');

export interface AppServer {
  url: string;
  databasePath: string;
  /** SIGTERM and wait for a clean exit (the database is closed and its WAL checkpointed). */
  stop(): Promise<void>;
  /** Deletes the temporary directory (after stop). */
  cleanup(): void;
  output(): string;
}

export async function startAppServer(timeoutMs = 30_000): Promise<AppServer> {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-bench-'));
  const databasePath = path.join(dir, 'bench.sqlite');
  const env: NodeJS.ProcessEnv = {};
  for (const [k, v] of Object.entries(process.env)) if (!/^(ORBITAB_|DATABASE_PATH$|PORT$|SMTP_URL$|LOG_LEVEL$|NODE_ENV$)/.test(k)) env[k] = v;
  const child = spawn(process.execPath, ['--import', 'tsx', 'server/main.ts'], {
    cwd: repoRoot,
    env: { ...env, NODE_ENV: 'production', PORT: '0', DATABASE_PATH: databasePath, ORBITAB_SEED: '0', LOG_LEVEL: 'warn' },
    stdio: ['ignore', 'pipe', 'pipe'],
  });
  let output = '';
  const keep = (b: Buffer) => (output = (output + b.toString()).slice(-20_000));
  child.stdout.on('data', keep);
  child.stderr.on('data', keep);
  const exited = new Promise<void>((resolve) => child.once('exit', () => resolve()));
  const stop = async () => {
    if (child.exitCode === null && child.signalCode === null) {
      child.kill('SIGTERM');
      const killer = setTimeout(() => child.kill('SIGKILL'), 15_000);
      await exited;
      clearTimeout(killer);
    }
  };
  const cleanup = () => fs.rmSync(dir, { recursive: true, force: true });

  const deadline = Date.now() + timeoutMs;
  while (Date.now() < deadline) {
    const port = /serving on https?:\/\/[^:\s]+:(\d+)/.exec(output)?.[1];
    if (port) return { url: `http://127.0.0.1:${port}`, databasePath, stop, cleanup, output: () => output };
    if (child.exitCode !== null) break;
    await new Promise((r) => setTimeout(r, 50));
  }
  await stop();
  cleanup();
  throw new Error(`the server did not start within ${timeoutMs} ms:\n${output}`);
}
