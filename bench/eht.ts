// Benchmark of the extended-Hückel family: `npm run bench:eht` (one core: everything runs in this thread).
//
// 1. Molecules of about 30 heavy atoms given as SMILES, each measured as
//    geometry   openchemlib conformer + MMFF94s+ tidy (the cost of SMILES input),
//    solve      overlap + Hamiltonian + Löwdin solve from that geometry,
//    first      both, i.e. what a structure costs a cell the first time it is seen,
//    again      the same after our memo is emptied (openchemlib still knows its ring conformers),
//    cached     a repeat of the same text through the per-structure memo (ehtModelOf).
// 2. Solve time against size (n-alkane conformers), to place the size limit (EHT_MAX_BASIS).
// Times are CPU time of this single thread (ms), so "per second" means per core; the uncached figure
// is also given in wall time. Results go to bench/results/eht.json.
import { mkdirSync, writeFileSync } from 'node:fs';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import '../functions/openchemlibNode.js';
import { EHT_MAX_ATOMS, EHT_MAX_BASIS, solveEht } from '../functions/chem/eht.js';
import { clearEhtCache, ehtCacheStats, ehtModelOf, geometryOf } from '../functions/chem/ehtCache.js';
import { conformerFromSmiles } from '../functions/chem/geometry3d.js';

// Invented screening set (our own picks), 27–33 heavy atoms each.
const MOLECULES = [
  'CC(C)(C)OC(=O)NC(Cc1ccccc1)C(=O)NC(CC(C)C)C(=O)OCc1ccccc1',
  'COc1ccc(cc1)C=CC(=O)c1ccc(OCC(=O)OCC)cc1OCC(C)C',
  'O=C(Nc1ccc(cc1)S(=O)(=O)NC)c1ccc(cc1)N1CCN(CC1)c1ccccc1',
  'CCCCCCCCCCCCCCCCCCCCCCCCCCCCCC',
  'c1ccc2cc3cc4cc5ccccc5cc4cc3cc2c1C(=O)OCCOC',
  'CN1CCN(CC1)C(=O)c1cc(Cl)c(NC(=O)c2ccc(F)cc2)cc1OCCOC',
  'OCC1OC(OC2C(O)C(O)C(O)OC2CO)C(O)C(O)C1OC(C)=O',
  'CC1=C(C(=O)OCC)C(c2ccccc2[N+](=O)[O-])C(C(=O)OCCOC)=C(C)N1',
];

// CPU time of this thread (user + system, ms): the machine is shared, so wall time overstates the cost
// per core whenever other processes compete; both are recorded.
const cpu = () => {
  const u = process.cpuUsage();
  return (u.user + u.system) / 1000;
};
const now = cpu;
const wall = () => performance.now();

function heavyAtoms(elements: string[]) {
  return elements.filter((e) => e !== 'H').length;
}

export function runEhtBench() {
  // Warm-up: the first conformer pays for class loading and JIT.
  solveEht(conformerFromSmiles('CCO'));

  const rows = MOLECULES.map((smiles) => {
    // First sight of the molecule: conformer + MMFF, then the solve (geometry now memoised).
    clearEhtCache();
    let t = now();
    const w = wall();
    const geometry = geometryOf(smiles);
    const geometryMs = now() - t;
    t = now();
    const model = ehtModelOf(smiles);
    const solveMs = now() - t;
    const uncachedMs = geometryMs + solveMs;
    const uncachedWallMs = wall() - w;
    // The same text again after our memo is emptied: openchemlib keeps its own ring-conformer cache,
    // so this shows what a second sheet with the same molecules costs.
    clearEhtCache();
    t = now();
    ehtModelOf(smiles);
    const rebuiltMs = now() - t;
    const repeats = 2000;
    t = now();
    for (let i = 0; i < repeats; i++) ehtModelOf(smiles);
    const cachedMs = (now() - t) / repeats;
    return { smiles, heavyAtoms: heavyAtoms(geometry.elements), atoms: geometry.elements.length, basis: model.basis.length, geometryMs, solveMs, uncachedMs, uncachedWallMs, rebuiltMs, cachedMs };
  });
  const mean = (xs: number[]) => xs.reduce((a, b) => a + b, 0) / xs.length;
  const summary = {
    meanHeavyAtoms: mean(rows.map((r) => r.heavyAtoms)),
    meanBasis: mean(rows.map((r) => r.basis)),
    uncachedMoleculesPerSecond: 1000 / mean(rows.map((r) => r.uncachedMs)),
    uncachedMoleculesPerSecondWall: 1000 / mean(rows.map((r) => r.uncachedWallMs)),
    rebuiltMoleculesPerSecond: 1000 / mean(rows.map((r) => r.rebuiltMs)),
    geometryOnlyPerSecond: 1000 / mean(rows.map((r) => r.geometryMs)),
    solveOnlyPerSecond: 1000 / mean(rows.map((r) => r.solveMs)),
    cachedLookupsPerSecond: 1000 / mean(rows.map((r) => r.cachedMs)),
  };

  const sizes = [10, 20, 30, 40, 50, 60, 80].map((n) => {
    const geometry = conformerFromSmiles('C'.repeat(n));
    const basis = 4 * n + (2 * n + 2);
    // Timed beyond the cell limits too (lifted for this measurement), to show where the limit sits.
    const t = now();
    solveEht(geometry, 0, { atoms: Infinity, basis: Infinity });
    const solveMs = now() - t;
    const overLimit = geometry.elements.length > EHT_MAX_ATOMS || basis > EHT_MAX_BASIS;
    return { alkane: `C${n}H${2 * n + 2}`, atoms: geometry.elements.length, basis, solveMs, overLimit };
  });

  const result = { date: new Date().toISOString(), node: process.version, limits: { atoms: EHT_MAX_ATOMS, basis: EHT_MAX_BASIS }, summary, molecules: rows, sizes, cacheStats: ehtCacheStats() };
  const out = resolve(dirname(fileURLToPath(import.meta.url)), 'results', 'eht.json');
  mkdirSync(dirname(out), { recursive: true });
  writeFileSync(out, JSON.stringify(result, null, 2) + '\n');
  return result;
}

const result = runEhtBench();
const f = (x: number) => x.toFixed(1);
console.log(`molecules: mean ${f(result.summary.meanHeavyAtoms)} heavy atoms, ${f(result.summary.meanBasis)} basis functions`);
for (const r of result.molecules) console.log(`  ${r.heavyAtoms} heavy / ${r.basis} bf  geometry ${f(r.geometryMs)} ms  solve ${f(r.solveMs)} ms  first ${f(r.uncachedMs)} ms  again ${f(r.rebuiltMs)} ms  cached ${(r.cachedMs * 1000).toFixed(2)} µs`);
console.log(`per core (CPU time): ${f(result.summary.uncachedMoleculesPerSecond)} new molecules/s [wall ${f(result.summary.uncachedMoleculesPerSecondWall)}/s], ${f(result.summary.rebuiltMoleculesPerSecond)}/s seen before (geometry ${f(result.summary.geometryOnlyPerSecond)}/s, solve ${f(result.summary.solveOnlyPerSecond)}/s), ${Math.round(result.summary.cachedLookupsPerSecond)} cached look-ups/s`);
for (const s of result.sizes) console.log(`  ${s.alkane}: ${s.atoms} atoms, ${s.basis} bf, solve ${f(s.solveMs)} ms${s.overLimit ? ' (over the cell limit)' : ''}`);
