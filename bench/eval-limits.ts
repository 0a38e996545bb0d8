// Figures behind functions/limits.ts: each hostile formula in its own child process (heap capped at
// 2 GB, 60 s timeout), built once by the guarded createEngine and once by a bare HyperFormula with
// only our plugin registered. Usage: npx tsx bench/eval-limits.ts [--guarded-only]
//   one case: npx tsx bench/eval-limits.ts --case guarded|bare <index>. Times include building the
//   process's first engine (~0.3 s of plugin registration and warm-up).
import { execFileSync } from 'node:child_process';
import { fileURLToPath } from 'node:url';
import { HyperFormula } from 'hyperformula';
import { createEngine, engineConfig } from '../functions/engine.js';
import { registerOrbitabPlugin } from '../functions/plugin.js';

const ring500 = Array.from({ length: 500 }, (_, i) => (i < 499 ? 'c1ccc(cc1)' : 'c1ccccc1')).join('');
const cases: [string, unknown[][]][] = [
  ['SEQUENCE(1000000,2000)', [['=SEQUENCE(1000000,2000)']]],
  ['SUM(A2:BXX1000000) beside one number', [['=SUM(A2:BXX1000000)', 1]]],
  ['HUCKEL(B2:BXX1000000)', [['=HUCKEL(B2:BXX1000000)']]],
  ['ten REPT("ab",200000000)', Array.from({ length: 10 }, () => ['=REPT("ab",200000000)'])],
  ['BXX1000000 with SUM(B:B)', [['=BXX1000000', '=SUM(B:B)']]],
  ['OFFSET(A1,999999,1999) with INDEX(A:A,2000000)', [['=OFFSET(A1,999999,1999)', '=INDEX(A:A,2000000)']]],
  ['HUCKEL(A1,,1) of a 500-ring SMILES', [[ring500, '=HUCKEL(A1,,1)']]],
  ['SUM(B1:CW100000)', [['=SUM(B1:CW100000)', 1]]],
  ['SECULAR(B2:BXX2001) over empty cells', [['=SECULAR(B2:BXX2001)']]],
  ['B1:B1000000*2', [['=B1:B1000000*2', 1]]],
  ['=1+1+… of 1,250 operands', [['=1' + '+1'.repeat(1249)]]],
  ['allowed: SUM(A1:A100000) of numbers', Array.from({ length: 100_000 }, (_, i) => [i + 1, i === 0 ? '=SUM(A1:A100000)' : null])],
  ['allowed: SEQUENCE(1000)', [['=SEQUENCE(1000)']]],
  ['allowed: HUCKEL of 200 centres', [['C=C'.repeat(100), '=HUCKEL(A1,,1)']]],
];

function runCase(mode: string, rows: any[][]) {
  const t0 = performance.now();
  let engine: HyperFormula;
  if (mode === 'guarded') engine = createEngine({ S: rows });
  else {
    registerOrbitabPlugin();
    engine = HyperFormula.buildFromSheets({ S: rows }, engineConfig);
  }
  const shown = rows[0].map((_, col) => {
    const v: any = engine.getCellValue({ sheet: 0, row: 0, col });
    return v && typeof v === 'object' ? `${v.value} ${v.message}` : String(v).slice(0, 20);
  });
  const ms = performance.now() - t0;
  console.log(JSON.stringify({ ms: Math.round(ms), heapMB: Math.round(process.memoryUsage().heapUsed / 1e6), shown: shown.join(' | ') }));
}

if (process.argv[2] === '--case') runCase(process.argv[3], cases[Number(process.argv[4])][1] as any[][]);
else {
  const self = fileURLToPath(import.meta.url);
  const modes = process.argv.includes('--guarded-only') ? ['guarded'] : ['guarded', 'bare'];
  console.log('| case | engine | time | heap | first row |\n| --- | --- | --- | --- | --- |');
  for (const [index, [name]] of cases.entries())
    for (const mode of modes) {
      let line: string;
      try {
        const out = execFileSync(process.execPath, ['--max-old-space-size=2048', '--import', 'tsx', self, '--case', mode, String(index)], { timeout: 60_000, encoding: 'utf8', stdio: ['ignore', 'pipe', 'ignore'] });
        const r = JSON.parse(out.trim().split('\n').pop()!);
        line = `${r.ms} ms | ${r.heapMB} MB | ${r.shown.slice(0, 90)}`;
      } catch (e: any) {
        line = `${e.signal === 'SIGTERM' ? 'over 60 s' : 'crashed (out of memory or stack)'} | — | —`;
      }
      console.log(`| ${name} | ${mode} | ${line} |`);
    }
}
