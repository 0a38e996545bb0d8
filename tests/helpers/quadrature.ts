// Independent numerical integration used by the reference tests to check closed forms.
// Composite Simpson's rule (Abramowitz & Stegun 25.4.6), nothing shared with functions/.

export function simpson(f: (x: number) => number, a: number, b: number, intervals = 2000): number {
  const n = intervals % 2 === 0 ? intervals : intervals + 1;
  const h = (b - a) / n;
  let sum = f(a) + f(b);
  for (let i = 1; i < n; i++) sum += (i % 2 === 1 ? 4 : 2) * f(a + i * h);
  return (sum * h) / 3;
}

/**
 * ∫_1^∞ dξ ∫_-1^1 dη g(ξ, η) over confocal elliptic coordinates, where g decays like e^(−decay·ξ).
 * The ξ range is cut where e^(−decay(ξ−1)) < e^(−60).
 */
export function ellipticIntegral(g: (xi: number, eta: number) => number, decay: number, xiIntervals = 3000, etaIntervals = 400): number {
  const xiMax = 1 + 60 / decay;
  return simpson((xi) => simpson((eta) => g(xi, eta), -1, 1, etaIntervals), 1, xiMax, xiIntervals);
}

export { seededRandom } from './seededRandom.js';
