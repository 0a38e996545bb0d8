// PPP-CIS benchmark and error table: `npm run bench:ppp`.
//
// 1. Timing: SCF + CIS of 40-centre systems (the C40 polyene and a 40-centre diphenylpolyene), each
//    run repeated after warm-up with the per-structure cache bypassed; the median is reported, and
//    the 60-centre limit (MAX_PPP_CENTRES) is timed too. The two 40-centre systems are timed again
//    inside headless Chromium (bench/pppBrowser.ts), where a sheet computes them. (Long acenes such as nonacene are refused:
//    their closed-shell PPP ground state is triplet-unstable, as the open-shell character of long
//    acenes would lead one to expect.)
// 2. Truncation: the lowest singlets with the default CIS space (MAX_CIS_CONFIGURATIONS) against the
//    full single-excitation space for the 40-centre chain.
// 3. Error table: computed vs observed band maxima (tests/helpers/pppReference.ts), RMS and worst
//    case per class — the table quoted in docs/spectra.md.
// Results go to bench/results/ppp.json.
import { mkdirSync, writeFileSync } from 'node:fs';
import os from 'node:os';
import { dirname, resolve } from 'node:path';
import { fileURLToPath } from 'node:url';
import { findPiSystem } from '../functions/chem/piSystem.js';
import { MAX_CIS_CONFIGURATIONS, MAX_PPP_CENTRES, pppSpectrum, pppSpectrumOf } from '../functions/chem/ppp.js';
import { REFERENCE_BANDS, rms, toEv } from '../tests/helpers/pppReference.js';
import { median, referenceMatmulMs } from './matmulYardstick.js';
import { browserPppTiming } from './pppBrowser.js';

const here = dirname(fileURLToPath(import.meta.url));

function time(smiles: string, repeats: number, maxConfigurations = MAX_CIS_CONFIGURATIONS) {
  const pi = findPiSystem(smiles);
  pppSpectrum(pi, maxConfigurations); // warm-up (also builds the 2D coordinates path once)
  const runs: number[] = [];
  const cpu: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const c0 = process.cpuUsage();
    const t0 = performance.now();
    pppSpectrum(pi, maxConfigurations);
    runs.push(performance.now() - t0);
    cpu.push(process.cpuUsage(c0).user / 1000);
  }
  return { centres: pi.centres.length, medianMs: median(runs), minMs: Math.min(...runs), medianCpuMs: median(cpu) };
}

const chain40 = 'C=C'.repeat(20);
const diphenyl40 = `c1ccccc1${'C=C'.repeat(14)}c1ccccc1`; // 1,28-diphenyloctacosatetradecaene, 40 centres
const chain60 = 'C=C'.repeat(MAX_PPP_CENTRES / 2);

const loadAverage = os.loadavg()[0];
const matmulMs = referenceMatmulMs();
const timing = {
  chain40: time(chain40, 31),
  diphenylpolyene40: time(diphenyl40, 31),
  chain60: time(chain60, 7),
  chain40FullCis: time(chain40, 3, Infinity),
};

// The same two 40-centre spectra in headless Chromium (the cells of a sheet compute in the browser).
// Where no browser can be started, the Node figures stand: Node and Chromium run the same V8 engine.
const browser = await browserPppTiming({ chain40: { smiles: chain40, repeats: 31 }, diphenylpolyene40: { smiles: diphenyl40, repeats: 31 } }).catch(
  (e: unknown) => ({ unavailable: e instanceof Error ? e.message.split('\n')[0] : String(e) }),
);

const full = pppSpectrum(findPiSystem(chain40), Infinity);
const cut = pppSpectrum(findPiSystem(chain40));
const truncation = [0, 1, 2, 3, 4].map((k) => ({ state: k + 1, fullEv: full.singlets[k].energy, truncatedEv: cut.singlets[k].energy, differenceEv: cut.singlets[k].energy - full.singlets[k].energy }));
const strongFull = full.singlets.reduce((a, b) => (b.f > a.f ? b : a));
const strongCut = cut.singlets.reduce((a, b) => (b.f > a.f ? b : a));

const rows = REFERENCE_BANDS.map((band) => {
  const computedEv = band.pick(pppSpectrumOf(band.smiles)).energy;
  const observedEv = toEv(band.observedNm);
  return { name: band.name, cls: band.cls, observedNm: band.observedNm, computedNm: 1239.84198 / computedEv, observedEv, computedEv, errorEv: computedEv - observedEv };
});
const classes = [...new Set(rows.map((r) => r.cls))];
const perClass = classes.map((cls) => {
  const errs = rows.filter((r) => r.cls === cls).map((r) => r.errorEv);
  const worst = errs.reduce((a, b) => (Math.abs(b) > Math.abs(a) ? b : a));
  return { cls, n: errs.length, rmsEv: rms(errs), worstEv: worst, meanEv: errs.reduce((a, b) => a + b, 0) / errs.length };
});
const hydrocarbons = rows.filter((r) => ['polyene', 'benzene', 'acene p band', 'acene β band', 'non-alternant'].includes(r.cls)).map((r) => r.errorEv);

const result = { date: new Date().toISOString(), node: process.version, cpus: os.cpus().length, loadAverage, referenceMatmulMs: matmulMs, maxCisConfigurations: MAX_CIS_CONFIGURATIONS, timing, browser, truncation, strongestBand: { fullEv: strongFull.energy, truncatedEv: strongCut.energy }, rows, perClass, hydrocarbonRmsEv: rms(hydrocarbons) };
mkdirSync(resolve(here, 'results'), { recursive: true });
writeFileSync(resolve(here, 'results', 'ppp.json'), JSON.stringify(result, null, 2));

console.log(`machine: ${os.cpus().length} CPUs, 1-min load average ${loadAverage.toFixed(1)}; reference 100×100 matrix product ${matmulMs.toFixed(2)} ms`);
console.log('timing (median of repeats, ms):');
for (const [k, v] of Object.entries(timing))
  console.log(`  ${k.padEnd(18)} ${v.centres} centres  wall median ${v.medianMs.toFixed(1)} ms  min ${v.minMs.toFixed(1)} ms  CPU median ${v.medianCpuMs.toFixed(1)} ms  = ${(v.medianCpuMs / matmulMs).toFixed(0)} matrix products`);
if ('unavailable' in browser) console.log(`  in the browser: not measured (${browser.unavailable}); Node runs the same V8 engine as Chromium, so the Node figures stand for it`);
else {
  console.log(`  in headless Chromium ${browser.chromium} (reference 100×100 matrix product there ${browser.referenceMatmulMs.toFixed(2)} ms):`);
  for (const [k, v] of Object.entries(browser.timing))
    console.log(`  ${k.padEnd(18)} ${v.centres} centres  wall median ${v.medianMs.toFixed(1)} ms  min ${v.minMs.toFixed(1)} ms  = ${(v.medianMs / browser.referenceMatmulMs).toFixed(0)} matrix products`);
}
console.log(`  full/truncated CIS time ratio at 40 centres: ${(timing.chain40FullCis.medianMs / timing.chain40.medianMs).toFixed(1)}`);
console.log(`truncation (${MAX_CIS_CONFIGURATIONS} configurations vs full) for the C40 chain:`);
for (const t of truncation) console.log(`  S${t.state}: full ${t.fullEv.toFixed(4)}  truncated ${t.truncatedEv.toFixed(4)}  Δ ${t.differenceEv.toFixed(4)} eV`);
console.log(`  strongest band: full ${strongFull.energy.toFixed(4)} truncated ${strongCut.energy.toFixed(4)} eV`);
console.log('\n| molecule | class | observed nm | computed nm | observed eV | computed eV | error eV |\n| --- | --- | --- | --- | --- | --- | --- |');
for (const r of rows) console.log(`| ${r.name} | ${r.cls} | ${r.observedNm} | ${r.computedNm.toFixed(0)} | ${r.observedEv.toFixed(2)} | ${r.computedEv.toFixed(2)} | ${r.errorEv >= 0 ? '+' : ''}${r.errorEv.toFixed(2)} |`);
console.log('\n| class | bands | RMS eV | mean eV | worst eV |\n| --- | --- | --- | --- | --- |');
for (const c of perClass) console.log(`| ${c.cls} | ${c.n} | ${c.rmsEv.toFixed(2)} | ${c.meanEv >= 0 ? '+' : ''}${c.meanEv.toFixed(2)} | ${c.worstEv >= 0 ? '+' : ''}${c.worstEv.toFixed(2)} |`);
console.log(`| all hydrocarbons | ${hydrocarbons.length} | ${rms(hydrocarbons).toFixed(2)} | | |`);
