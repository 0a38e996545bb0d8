// The listening address: loopback unless HOST opens it, and a loud warning when it is opened while a
// demo account still signs in with the public password printed in the README.
import fs from 'node:fs';
import net from 'node:net';
import os from 'node:os';
import path from 'node:path';
import { afterEach, describe, expect, it } from 'vitest';
import { isLoopbackHost, loadConfig } from '../server/config.js';
import { startOrbitab, type OrbitabProcess } from './helpers/orbitabProcess.js';

/** An IPv4 address of this machine other than loopback (the test machine has one: eth0). */
function outsideAddress(): string | undefined {
  return Object.values(os.networkInterfaces())
    .flat()
    .find((a) => a && a.family === 'IPv4' && !a.internal)?.address;
}

/** Whether a TCP connection to host:port is accepted. */
function accepts(host: string, port: number): Promise<boolean> {
  return new Promise((resolve) => {
    const socket = net.connect({ host, port });
    socket.once('connect', () => {
      socket.destroy();
      resolve(true);
    });
    socket.once('error', () => resolve(false));
  });
}

const running: OrbitabProcess[] = [];
afterEach(async () => {
  for (const p of running.splice(0)) {
    p.child.kill('SIGTERM');
    await p.exited;
  }
});

function tempDatabase() {
  const dir = fs.mkdtempSync(path.join(os.tmpdir(), 'orbitab-host-'));
  return path.join(dir, 'db.sqlite');
}

describe('HOST setting', () => {
  it('defaults to loopback and reads HOST', () => {
    expect(loadConfig({}).host).toBe('127.0.0.1');
    expect(loadConfig({ HOST: '0.0.0.0' }).host).toBe('0.0.0.0');
  });

  it('tells loopback addresses from the rest', () => {
    for (const h of ['127.0.0.1', '127.1.2.3', 'localhost', '::1', '[::1]']) expect(isLoopbackHost(h)).toBe(true);
    for (const h of ['0.0.0.0', '::', '192.0.2.2', '10.0.0.1']) expect(isLoopbackHost(h)).toBe(false);
  });

  it('answers on loopback only by default, while the demo is seeded', async () => {
    const outside = outsideAddress();
    expect(outside, 'this test needs a non-loopback IPv4 interface').toBeDefined();
    const p = await startOrbitab(tempDatabase(), { ORBITAB_SEED: '1' });
    running.push(p);
    const port = Number(new URL(p.url).port);
    expect(await accepts('127.0.0.1', port)).toBe(true);
    expect(await accepts(outside!, port)).toBe(false);
    expect(p.output()).not.toContain('WARNING');
  }, 60_000);

  it('opens to the network with HOST=0.0.0.0 and warns loudly while demo passwords are public', async () => {
    const outside = outsideAddress()!;
    const p = await startOrbitab(tempDatabase(), { ORBITAB_SEED: '1', HOST: '0.0.0.0' });
    running.push(p);
    const port = Number(new URL(p.url).port);
    expect(await accepts(outside, port)).toBe(true);
    expect(p.output()).toMatch(/WARNING: Orbitab listens on 0\.0\.0\.0/);
    expect(p.output()).toContain('teodora.vance@example.com');
  }, 60_000);

  it('stays quiet on the network without demo accounts', async () => {
    const p = await startOrbitab(tempDatabase(), { ORBITAB_SEED: '0', HOST: '0.0.0.0' });
    running.push(p);
    expect(p.output()).not.toContain('WARNING');
  }, 60_000);
});
