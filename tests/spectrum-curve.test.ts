// The broadened curve of the structure panel's spectrum: a Gaussian in energy per band, checked
// against its defining properties (peak at the band, half maximum at ± FWHM/2, area equal to f) and
// the CODATA 2018 value of hc (1239.841984 eV nm).
import { describe, expect, it } from 'vitest';
import { broadenedSpectrum, HC_EV_NM } from '../src/features/diagram/spectrumCurve.js';

const nmOf = (eV: number) => HC_EV_NM / eV;

describe('a broadened band', () => {
  const band = { energy: 4.0, f: 0.5 };
  it('peaks at the band and falls to half its height FWHM/2 away in energy', () => {
    const [peak, half1, half2, far] = broadenedSpectrum([band], 0.4, [nmOf(4.0), nmOf(4.2), nmOf(3.8), nmOf(5.0)]);
    expect(half1 / peak).toBeCloseTo(0.5, 10);
    expect(half2 / peak).toBeCloseTo(0.5, 10);
    expect(far / peak).toBeLessThan(1e-6);
  });

  it('has an area in energy equal to its oscillator strength, whatever the width', () => {
    for (const width of [0.1, 0.3, 0.8]) {
      const energies = Array.from({ length: 4001 }, (_, i) => 2 + i * 0.001);
      const values = broadenedSpectrum([band], width, energies.map(nmOf));
      const area = values.reduce((s, v) => s + v * 0.001, 0);
      expect(area).toBeCloseTo(0.5, 3);
    }
  });

  it('adds overlapping bands and leaves a forbidden one (f = 0) out', () => {
    const at = [nmOf(4.0)];
    const both = broadenedSpectrum([band, { energy: 4.1, f: 0.2 }], 0.3, at)[0];
    const one = broadenedSpectrum([band], 0.3, at)[0];
    const other = broadenedSpectrum([{ energy: 4.1, f: 0.2 }], 0.3, at)[0];
    expect(both).toBeCloseTo(one + other, 12);
    expect(broadenedSpectrum([{ energy: 4.0, f: 0 }], 0.3, at)[0]).toBe(0);
  });
});
