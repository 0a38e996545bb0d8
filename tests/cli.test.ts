// The headless evaluator: `npm run --silent cli -- eval '=BONDORDER("O2")'`.
import { spawnSync } from 'node:child_process';
import { describe, expect, it } from 'vitest';
import { main } from '../server/cli.js';
import { EXIT_FAILED, EXIT_OK, EXIT_USAGE } from '../server/cli/io.js';

async function run(...argv: string[]) {
  const out: string[] = [];
  const err: string[] = [];
  const code = await main(argv, { stdout: (l) => out.push(l), stderr: (l) => err.push(l) });
  return { code, stdout: out.join('\n'), stderr: err.join('\n') };
}

describe('cli eval', () => {
  it('prints the bond order of dioxygen as 2', async () => {
    expect(await run('eval', '=BONDORDER("O2")')).toEqual({ code: EXIT_OK, stdout: '2', stderr: '' });
  });

  it('prints one JSON line per formula with --json, values and errors alike, and exits 1 on an error', async () => {
    const result = await run('eval', '--json', '=BONDORDER("O2")', '=BONDORDER("Xq2")', '=CHEMCONVERT(1,"hartree","eV")');
    expect(result.code).toBe(EXIT_FAILED);
    expect(result.stdout.split('\n').map((line) => JSON.parse(line))).toEqual([
      { value: 2 },
      { error: '#VALUE!', message: "unknown element 'Xq' in 'Xq2'" },
      { value: expect.closeTo(27.211386245988, 9) }, // the engine rounds what it shows (smartRounding)
    ]);
  });

  it('prints a spilled table as tab-separated rows', async () => {
    const result = await run('eval', '=LCAOLEVELS(-13.6,-13.6,-10,0.25)', 'MAGNETISM("O2")');
    expect(result).toEqual({ code: EXIT_OK, stdout: '-18.88\n-4.8\nparamagnetic', stderr: '' });
  });

  it('keeps spills of several formulas apart', async () => {
    const result = await run('eval', '--json', '=H2PLUSMIN()', '=H2PLUSMIN("distance")');
    const [pair, distance] = result.stdout.split('\n').map((line) => JSON.parse(line));
    expect(pair.value[0][0]).toBeCloseTo(distance.value, 9);
  });

  it('prints an error with its message in plain mode', async () => {
    const result = await run('eval', '=CHEMCONVERT(1,"eV","pm")');
    expect(result.code).toBe(EXIT_FAILED);
    expect(result.stdout).toBe('#VALUE!\tcannot convert eV (an energy) to pm (a length): an energy and a length are different quantities');
  });

  it('answers usage errors with exit 2 and the usage text', async () => {
    expect(await run('eval')).toMatchObject({ code: EXIT_USAGE, stderr: expect.stringContaining('give at least one formula') });
    expect(await run('eval', '--yaml', '=1')).toMatchObject({ code: EXIT_USAGE, stderr: expect.stringContaining("unknown option '--yaml'") });
    expect(await run('frobnicate')).toMatchObject({ code: EXIT_USAGE, stderr: expect.stringContaining("unknown command 'frobnicate'") });
  });

  it('lists its commands under help', async () => {
    const help = await run('help');
    expect(help.code).toBe(EXIT_OK);
    expect(help.stdout).toMatch(/eval\s+evaluate formulas/);
    expect((await run('help', 'eval')).stdout).toContain('--json');
  });

  it('runs as a program through tsx, printing {"value":2} and exiting 0', () => {
    const child = spawnSync('npx', ['tsx', 'server/cli.ts', 'eval', '--json', '=BONDORDER("O2")'], { encoding: 'utf8', timeout: 60_000 });
    expect(child.stderr).toBe('');
    expect(child.stdout).toBe('{"value":2}\n');
    expect(child.status).toBe(0);
  });
});
