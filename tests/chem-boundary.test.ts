// The science folder imports nothing of ours outside itself (house rule: imports flow one way).
import { readdirSync, readFileSync } from 'node:fs';
import { join } from 'node:path';
import { describe, expect, it } from 'vitest';

const dir = join(__dirname, '..', 'functions', 'chem');

describe('functions/chem imports', () => {
  it('no file in functions/chem imports from outside functions/chem (except packages)', () => {
    const offenders: string[] = [];
    for (const file of readdirSync(dir).filter((f) => f.endsWith('.ts'))) {
      const text = readFileSync(join(dir, file), 'utf8');
      for (const m of text.matchAll(/from\s+'(\.[^']*)'/g)) if (m[1].startsWith('..')) offenders.push(`${file}: ${m[1]}`);
    }
    expect(offenders).toEqual([]);
  });
});
