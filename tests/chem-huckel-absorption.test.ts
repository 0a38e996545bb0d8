// The absorption estimate: its default constants are the least-squares fit of the published
// polyene and acene band maxima listed (with sources) in functions/chem/absorption.ts, refitted here
// from that data with our own Hückel gaps. The spectra are recalled values (from memory).
import { describe, expect, it } from 'vitest';
import {
  ABSORPTION_REFERENCE_SPECTRA,
  absorptionMaxNm,
  DEFAULT_BETA_EV,
  DEFAULT_OFFSET_EV,
  fitGapRelation,
  HC_EV_NM,
} from '../functions/chem/absorption.js';
import { frontierGap } from '../functions/chem/huckel.js';
import { huckelModelOf } from '../functions/chem/huckelCache.js';

const gapOf = (smiles: string) => {
  const m = huckelModelOf([[smiles]]);
  return frontierGap(m, m.electrons).gap;
};
const points = ABSORPTION_REFERENCE_SPECTRA.map((s) => ({ ...s, gap: gapOf(s.smiles) }));
const polyenes = points.slice(0, 4);
const acenes = points.slice(4);

describe('the fitted defaults of ABSORPTION', () => {
  it('names a source for every reference band', () => {
    for (const s of ABSORPTION_REFERENCE_SPECTRA) expect(s.source.length).toBeGreaterThan(5);
    expect(polyenes.map((p) => p.name)).toEqual(['1,3-butadiene', '1,3,5-hexatriene', '1,3,5,7-octatetraene', '1,3,5,7,9-decapentaene']);
    expect(acenes.map((p) => p.name)).toEqual(['benzene', 'naphthalene', 'anthracene', 'tetracene', 'pentacene']);
  });

  it('are the least-squares line through all nine bands (|β| 2.2783 eV, offset 1.963 eV, RMS 0.68 eV)', () => {
    const fit = fitGapRelation(points);
    expect(fit.betaEv).toBeCloseTo(DEFAULT_BETA_EV, 4);
    expect(fit.offsetEv).toBeCloseTo(DEFAULT_OFFSET_EV, 3);
    expect(fit.rmsEv).toBeCloseTo(0.68, 2);
  });

  it('match the per-class fits the help quotes (polyenes 2.911/2.160, acenes 2.496/1.155, RMS 0.08 eV each)', () => {
    const p = fitGapRelation(polyenes);
    const a = fitGapRelation(acenes);
    expect([p.betaEv, p.offsetEv]).toEqual([expect.closeTo(2.911, 3), expect.closeTo(2.16, 3)]);
    expect([a.betaEv, a.offsetEv]).toEqual([expect.closeTo(2.496, 3), expect.closeTo(1.155, 3)]);
    expect(p.rmsEv).toBeLessThan(0.09);
    expect(a.rmsEv).toBeLessThan(0.09);
  });

  it('miss no reference band by more than 30 % with the one-line defaults (the documented accuracy)', () => {
    for (const p of points) {
      const error = Math.abs(absorptionMaxNm(p.gap) - p.lambdaMaxNm) / p.lambdaMaxNm;
      expect(error, p.name).toBeLessThan(0.3);
    }
  });

  it('reproduce each class within 6 % when its own fit is given', () => {
    for (const [group, fit] of [[polyenes, fitGapRelation(polyenes)], [acenes, fitGapRelation(acenes)]] as const)
      for (const p of group) {
        const error = Math.abs(absorptionMaxNm(p.gap, fit.betaEv, fit.offsetEv) - p.lambdaMaxNm) / p.lambdaMaxNm;
        expect(error, p.name).toBeLessThan(0.06);
      }
  });
});

describe('absorptionMaxNm', () => {
  it('is hc/(|β|·gap + offset) with hc = 1239.84198 eV·nm (CODATA 2018)', () => {
    expect(HC_EV_NM).toBe(1239.84198);
    expect(absorptionMaxNm(1, 3, 1)).toBeCloseTo(1239.84198 / 4, 10);
    expect(absorptionMaxNm(1, -3, 1)).toBeCloseTo(1239.84198 / 4, 10);
  });

  it('moves to longer wavelength as conjugation grows (polyenes and acenes)', () => {
    const series = (xs: string[]) => xs.map((s) => absorptionMaxNm(gapOf(s)));
    const chain = series(['C=CC=C', 'C=CC=CC=C', 'C=CC=CC=CC=C', 'C=CC=CC=CC=CC=C']);
    const acene = series(acenes.map((a) => a.smiles));
    for (const list of [chain, acene]) list.slice(1).forEach((l, i) => expect(l).toBeGreaterThan(list[i]));
  });

  it('refuses a zero gap, a zero β and a non-positive transition energy', () => {
    expect(() => absorptionMaxNm(0)).toThrow('open-shell degenerate');
    expect(() => absorptionMaxNm(1, 0)).toThrow('beta_eV must not be 0');
    expect(() => absorptionMaxNm(1, 2, -3)).toThrow('|β|·gap + offset = -1 eV is not a positive transition energy');
  });
});
