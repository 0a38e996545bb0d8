// π→π* spectra by Pariser–Parr–Pople SCF plus configuration interaction of single excitations (CIS).
// SCF in pppScf.ts. With zero differential overlap the MO integrals are
//   (pq|rs) = Σ_μν c_μp c_μq γ_μν c_νr c_νs,
// and the CIS matrices over excitations i→a (i occupied, a virtual) are (Pariser 1956; J. A. Pople,
// Proc. Phys. Soc. A 68, 81 (1955); standard form e.g. Szabo & Ostlund, Modern Quantum Chemistry, §4.3)
//   singlet  A_ia,jb = δ_ij δ_ab (ε_a − ε_i) + 2 (ia|jb) − (ij|ab)
//   triplet  A_ia,jb = δ_ij δ_ab (ε_a − ε_i) − (ij|ab)
// whose diagonals are ΔE + 2K − J and ΔE − J. Transition dipole of a singlet with amplitudes X_ia:
//   μ = √2 Σ_ia X_ia Σ_μ c_μi c_μa r_μ,     oscillator strength f = (2/3) ΔE(Eh) |μ|²(a.u.).
import { symmetricEigen } from './eigenFast.js';
import { ChemError, oneBasedIndex } from './errors.js';
import { piSystemOf } from './huckelCache.js';
import type { PiSystem } from './piSystem.js';
import { TextMemo } from './textMemo.js';
import { pppScf, type PppScf } from './pppScf.js';

/** Largest π system accepted: bench/ppp.ts measures full CIS at this size (see docs/spectra.md). */
export const MAX_PPP_CENTRES = 60;

/**
 * Single excitations kept in the CIS: all of them up to this count (every system of up to 20 centres),
 * else the ones with the smallest orbital-energy gaps ε_a − ε_i — the usual limited-CI choice of PPP
 * work (Pariser 1956 kept a handful). For the 40-centre C40 chain the three lowest singlets move up by
 * 0.02–0.03 eV and S4–S5 by 0.09 eV against the full space (bench/ppp.ts prints the comparison).
 */
export const MAX_CIS_CONFIGURATIONS = 100;

/** eV per hartree (CODATA 2018). */
const HARTREE_EV = 27.211386245988;
/** Å per bohr (CODATA 2018). */
const BOHR_ANGSTROM = 0.529177210903;
export const HC_EV_NM = 1239.84198;
/** Oscillator strengths below this are rounding noise of a forbidden band. */
const FORBIDDEN_F = 1e-10;

export interface ExcitedState {
  /** Excitation energy, eV. */
  energy: number;
  wavelength: number;
  /** Oscillator strength. */
  f: number;
  /** Transition dipole (x, y) in e·Å. */
  dipole: [number, number];
  /** The excitation with the largest weight, as MO labels relative to the frontier (e.g. HOMO→LUMO+1), and its weight X². */
  leading: string;
  leadingWeight: number;
  /** Weight X² of HOMO→LUMO in this state. */
  homoLumoWeight: number;
}

export interface PppSpectrum {
  scf: PppScf;
  singlets: ExcitedState[];
  /** Triplet excitation energies, eV, lowest first. */
  triplets: number[];
}

function moLabel(k: number, occupied: number): string {
  if (k < occupied) {
    const below = occupied - 1 - k;
    return below === 0 ? 'HOMO' : `HOMO−${below}`;
  }
  const above = k - occupied;
  return above === 0 ? 'LUMO' : `LUMO+${above}`;
}

/** Gaps equal within this (eV) count as one: alternant pairs i→a′ and i′→a are degenerate up to SCF round-off. */
const GAP_TIE_EV = 1e-6;

/**
 * The `count` excitations with the smallest orbital-energy gaps. Gaps that tie within GAP_TIE_EV keep
 * the order occupied-then-virtual, so which excitation of a degenerate set is listed (and kept) first,
 * and with it the leading-transition label of a 50:50 mixture, does not hang on SCF round-off.
 */
function smallestGaps(pairs: [number, number][], energies: number[], count: number): [number, number][] {
  const byGap = pairs.map((pair) => ({ pair, gap: energies[pair[1]] - energies[pair[0]] })).sort((x, y) => x.gap - y.gap);
  const ordered: [number, number][] = [];
  for (let start = 0; start < byGap.length && ordered.length < count; ) {
    let end = start + 1;
    while (end < byGap.length && byGap[end].gap - byGap[start].gap <= GAP_TIE_EV) end++;
    const tied = byGap.slice(start, end).map((x) => x.pair);
    tied.sort((x, y) => x[0] - y[0] || x[1] - y[1]);
    ordered.push(...tied);
    start = end;
  }
  return ordered.slice(0, count);
}

/** PPP-CIS singlet and triplet states of a closed-shell π system, lowest first. */
export function pppSpectrum(pi: PiSystem, maxConfigurations = MAX_CIS_CONFIGURATIONS): PppSpectrum {
  if (pi.centres.length > MAX_PPP_CENTRES)
    throw new ChemError(`'${pi.smiles}' has ${pi.centres.length} π centres; PPP-CIS here is limited to ${MAX_PPP_CENTRES} centres to keep a sheet responsive`);
  const scf = pppScf(pi);
  const n = pi.centres.length;
  const { vectors: c, energies, occupied, gamma, positions } = scf;
  let pairs: [number, number][] = [];
  for (let i = 0; i < occupied; i++) for (let a = occupied; a < n; a++) pairs.push([i, a]);
  if (pairs.length > maxConfigurations) pairs = smallestGaps(pairs, energies, maxConfigurations);
  const m = pairs.length;

  // Transition densities t_pq(μ) = c_μp c_μq (rows of n) and their γ-transforms, so each integral is
  // one dot product: (ia|jb) = t_ia·γt_jb, (ij|ab) = t_ij·γt_ab. Only the orbitals the kept
  // excitations use enter; row `slot` of each table holds one pair of them.
  const product = (out: Float64Array, slot: number, p: number, q: number) => {
    for (let mu = 0; mu < n; mu++) out[slot * n + mu] = c[p * n + mu] * c[q * n + mu];
  };
  const applyGamma = (t: Float64Array): Float64Array => {
    const rows = t.length / n;
    const out = new Float64Array(t.length);
    for (let r = 0; r < rows; r++)
      for (let mu = 0; mu < n; mu++) {
        let s = 0;
        const g = mu * n;
        for (let nu = 0; nu < n; nu++) s += gamma[g + nu] * t[r * n + nu];
        out[r * n + mu] = s;
      }
    return out;
  };
  const dot = (x: Float64Array, xRow: number, y: Float64Array, yRow: number) => {
    let s = 0;
    for (let mu = 0; mu < n; mu++) s += x[xRow * n + mu] * y[yRow * n + mu];
    return s;
  };
  const occ = [...new Set(pairs.map(([i]) => i))];
  const virt = [...new Set(pairs.map(([, a]) => a))];
  const occSlot = new Map(occ.map((i, k) => [i, k]));
  const virtSlot = new Map(virt.map((a, k) => [a, k]));
  const tia = new Float64Array(m * n);
  pairs.forEach(([i, a], x) => product(tia, x, i, a));
  const gia = applyGamma(tia);
  const occOcc = new Float64Array(occ.length * occ.length * n);
  occ.forEach((i, x) => occ.forEach((j, y) => product(occOcc, x * occ.length + y, i, j)));
  const virtVirt = new Float64Array(virt.length * virt.length * n);
  virt.forEach((a, x) => virt.forEach((b, y) => product(virtVirt, x * virt.length + y, a, b)));
  const gVirtVirt = applyGamma(virtVirt);
  const pairOcc = pairs.map(([i]) => occSlot.get(i)!);
  const pairVirt = pairs.map(([, a]) => virtSlot.get(a)!);

  const singlet = new Float64Array(m * m);
  const triplet = new Float64Array(m * m);
  for (let x = 0; x < m; x++) {
    const [i, a] = pairs[x];
    for (let y = 0; y <= x; y++) {
      const exchange = dot(tia, x, gia, y); // (ia|jb)
      const coulomb = dot(occOcc, pairOcc[x] * occ.length + pairOcc[y], gVirtVirt, pairVirt[x] * virt.length + pairVirt[y]); // (ij|ab)
      const diagonal = x === y ? energies[a] - energies[i] : 0;
      singlet[x * m + y] = singlet[y * m + x] = diagonal + 2 * exchange - coulomb;
      triplet[x * m + y] = triplet[y * m + x] = diagonal - coulomb;
    }
  }

  // Transition dipole of each excitation, Σ_μ t_ia(μ) r_μ; a state's is √2 Σ_ia X_ia times these.
  const configDipole = (axis: 0 | 1) => Float64Array.from({ length: m }, (_, x) => positions.reduce((s, r, mu) => s + tia[x * n + mu] * r[axis], 0));
  const dipoleX = configDipole(0);
  const dipoleY = configDipole(1);
  const homoLumo = pairs.findIndex(([i, a]) => i === occupied - 1 && a === occupied);
  const describe = (values: Float64Array, amplitudes: Float64Array): ExcitedState[] =>
    Array.from(values, (energy, s) => {
      const amp = amplitudes.subarray(s * m, s * m + m);
      let best = 0;
      // Ties (50:50 mixtures) go to the first excitation listed, so the label does not hang on rounding.
      for (let x = 1; x < m; x++) if (amp[x] ** 2 > amp[best] ** 2 + 1e-6) best = x;
      let dx = 0;
      let dy = 0;
      for (let x = 0; x < m; x++) {
        dx += amp[x] * dipoleX[x];
        dy += amp[x] * dipoleY[x];
      }
      dx *= Math.SQRT2;
      dy *= Math.SQRT2;
      const mu2 = (dx * dx + dy * dy) / BOHR_ANGSTROM ** 2;
      // A symmetry-forbidden band comes out as rounding noise (~1e-30): report it as exactly 0.
      const raw = (2 / 3) * (energy / HARTREE_EV) * mu2;
      const f = raw < FORBIDDEN_F ? 0 : raw;
      return {
        energy,
        wavelength: HC_EV_NM / energy,
        f,
        dipole: [dx, dy] as [number, number],
        leading: `${moLabel(pairs[best][0], occupied)}→${moLabel(pairs[best][1], occupied)}`,
        leadingWeight: amp[best] ** 2,
        homoLumoWeight: homoLumo < 0 ? 0 : amp[homoLumo] ** 2,
      };
    });
  const s = symmetricEigen(singlet, m);
  const tripletValues = symmetricEigen(triplet, m, true).values;
  // A triplet at or below zero means the closed-shell SCF is unstable (triplet instability): no spectrum.
  if (!(tripletValues[0] > 0) || !(s.values[0] > 0))
    throw new ChemError(`the closed-shell PPP ground state of '${pi.smiles}' is unstable (an excited state falls below it): the model gives no spectrum here`);
  return { scf, singlets: describe(s.values, s.vectors), triplets: Array.from(tripletValues) };
}

/** The n-th singlet (1-based), naming the valid range. */
export function nthSinglet(spectrum: PppSpectrum, k: number): ExcitedState {
  const list = spectrum.singlets;
  return list[oneBasedIndex(k, list.length, { item: 'singlet', items: 'singlet states', holder: `the PPP-CIS of '${spectrum.scf.pi.smiles}'` })];
}

/** The band with the largest oscillator strength at wavelengths above `aboveNm`. */
export function strongestBand(spectrum: PppSpectrum, aboveNm: number): ExcitedState {
  if (!(aboveNm >= 0)) throw new ChemError(`above_nm must be a wavelength ≥ 0 nm, got ${aboveNm}`);
  let best: ExcitedState | undefined;
  for (const s of spectrum.singlets) if (s.wavelength > aboveNm && (!best || s.f > best.f)) best = s;
  if (!best) throw new ChemError(`no PPP singlet of '${spectrum.scf.pi.smiles}' lies above ${aboveNm} nm (the lowest is at ${Number(spectrum.singlets[0].wavelength.toFixed(1))} nm)`);
  return best;
}

/** The singlet carrying most of the HOMO→LUMO excitation: the band simple Hückel estimates aim at. */
export function homoLumoBand(spectrum: PppSpectrum): ExcitedState {
  return spectrum.singlets.reduce((best, s) => (s.homoLumoWeight > best.homoLumoWeight + 1e-9 ? s : best));
}

const spectra = new TextMemo<PppSpectrum>(500);

/** The PPP-CIS spectrum of a SMILES string, cached per structure text (failures too). */
export function pppSpectrumOf(smiles: string): PppSpectrum {
  const key = smiles.trim();
  return spectra.get(key, () => pppSpectrum(piSystemOf(key)));
}

/** How many spectra were computed since the last clear (tests and benchmark). */
export function pppCacheMisses(): number {
  return spectra.misses;
}

export function clearPppCache(): void {
  spectra.clear();
}
