// Page-side half of the browser PPP timing (bench/pppBrowser.ts bundles it): the same SCF + CIS call
// the cell functions make, timed with the page's clock.
import { findPiSystem } from '../../functions/chem/piSystem.js';
import { pppSpectrum } from '../../functions/chem/ppp.js';
import { referenceMatmulMs } from '../matmulYardstick.js';

function time(smiles: string, repeats: number) {
  const pi = findPiSystem(smiles);
  pppSpectrum(pi); // warm-up
  const runs: number[] = [];
  for (let i = 0; i < repeats; i++) {
    const t0 = performance.now();
    pppSpectrum(pi);
    runs.push(performance.now() - t0);
  }
  return { centres: pi.centres.length, runs };
}

Object.assign(globalThis, { pppTiming: time, pppReferenceMatmulMs: referenceMatmulMs });
