// A stick spectrum broadened into a curve, as absorption bands are usually drawn: each band a
// Gaussian in energy whose full width at half maximum the user sets (common practice for comparing
// computed excitations with measured spectra), its area proportional to the oscillator strength.
// Wavelength and energy: E (eV) = hc / λ with hc = 1239.841984 eV·nm (CODATA 2018).
export const HC_EV_NM = 1239.841984;

export interface Band {
  /** Excitation energy, eV. */
  energy: number;
  /** Oscillator strength. */
  f: number;
}

/** Absorbance-like intensity at each wavelength (nm): Σ f · G(E − Eᵢ), G a unit-area Gaussian of that FWHM. */
export function broadenedSpectrum(bands: readonly Band[], fwhmEv: number, wavelengthsNm: readonly number[]): number[] {
  const sigma = fwhmEv / (2 * Math.sqrt(2 * Math.LN2));
  const norm = 1 / (sigma * Math.sqrt(2 * Math.PI));
  return wavelengthsNm.map((nm) => {
    const e = HC_EV_NM / nm;
    let sum = 0;
    for (const b of bands) sum += b.f * norm * Math.exp(-0.5 * ((e - b.energy) / sigma) ** 2);
    return sum;
  });
}
