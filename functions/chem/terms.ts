// Molecular term symbols ²ˢ⁺¹Λ(g/u)(±) of a diatomic configuration, derived by enumerating the
// microstates of its open shells — no table of answers per configuration.
//
// Method (Herzberg, "Molecular Spectra and Molecular Structure I: Spectra of Diatomic Molecules",
// 2nd ed. 1950, ch. VI): filled shells contribute ¹Σ⁺ (¹Σg⁺); each open-shell spin-orbital carries
// λ (0 for σ, ±1 for π, ±2 for δ) and mₛ = ±½. Counting microstates N(M_L, M_S) and peeling off terms
// gives every (Λ, S); a Λ > 0 term occupies only M_L = ±Λ, so n(Λ,S) = N(Λ,S) − N(Λ,S+1).
// Σ⁺ and Σ⁻ are told apart by the reflection σv through a plane containing the axis: it maps
// λ → −λ, so its trace over the (M_L = 0, M_S) microstates counts #Σ⁺ − #Σ⁻ among the terms with
// S ≥ M_S. A microstate contributes to that trace only if it maps onto itself (for every π shell and
// spin, λ = +1 and −1 both filled or both empty), with sign (−1)^(number of such swapped pairs).
// Parity (homonuclear only) is the product of the open-shell electrons' parities.
// The ground term follows Hund's rules as used for molecules (Herzberg 1950): highest S, then highest Λ.

export interface OpenShell {
  /** |λ| of the orbital: 0 for σ, 1 for π, 2 for δ. */
  lambda: number;
  electrons: number;
  /** Inversion parity of the orbital, for homonuclear molecules only. */
  parity?: 'g' | 'u';
}

export interface MolecularTerm {
  /** 2S, so the multiplicity is twoS + 1. */
  twoS: number;
  /** Λ = |M_L|. */
  lambda: number;
  /** Reflection symmetry, given for Σ terms only. */
  reflection?: '+' | '-';
  parity?: 'g' | 'u';
}

interface SpinOrbital {
  shell: number;
  ml: number;
  twoMs: number;
}

function spinOrbitals(shell: OpenShell, index: number): SpinOrbital[] {
  const mls = shell.lambda === 0 ? [0] : [shell.lambda, -shell.lambda];
  return mls.flatMap((ml) => [
    { shell: index, ml, twoMs: 1 },
    { shell: index, ml, twoMs: -1 },
  ]);
}

/** All ways to put k electrons into the given spin-orbitals (Pauli: each at most once). */
function choose<T>(items: T[], k: number): T[][] {
  if (k === 0) return [[]];
  if (items.length < k) return [];
  const [first, ...rest] = items;
  return [...choose(rest, k - 1).map((c) => [first, ...c]), ...choose(rest, k)];
}

/** σv sign of a microstate that maps onto itself, or 0 if σv sends it to a different microstate. */
function reflectionTrace(occupied: SpinOrbital[]): number {
  let swappedPairs = 0;
  for (const o of occupied) {
    if (o.ml <= 0) continue;
    const partner = occupied.some((p) => p.shell === o.shell && p.twoMs === o.twoMs && p.ml === -o.ml);
    if (!partner) return 0;
    swappedPairs++;
  }
  for (const o of occupied) {
    if (o.ml < 0 && !occupied.some((p) => p.shell === o.shell && p.twoMs === o.twoMs && p.ml === -o.ml)) return 0;
  }
  return swappedPairs % 2 === 0 ? 1 : -1;
}

function configurationParity(shells: OpenShell[]): 'g' | 'u' | undefined {
  if (shells.some((s) => s.electrons > 0 && !s.parity)) return undefined;
  const odd = shells.reduce((n, s) => n + (s.parity === 'u' ? s.electrons : 0), 0) % 2 === 1;
  return odd ? 'u' : 'g';
}

/**
 * Every term of a configuration's open shells (filled shells may be included; they add nothing).
 * Pass `homonuclear` so that parity is given (all shells must then carry a parity).
 */
export function termsOfConfiguration(shells: OpenShell[], homonuclear = shells.length > 0 && shells.every((s) => s.parity)): MolecularTerm[] {
  for (const s of shells) {
    const capacity = s.lambda === 0 ? 2 : 4;
    if (!Number.isInteger(s.electrons) || s.electrons < 0 || s.electrons > capacity) {
      throw new RangeError(`a ${s.lambda === 0 ? 'σ' : 'λ=' + s.lambda} shell holds 0 to ${capacity} electrons, not ${s.electrons}`);
    }
  }
  let microstates: SpinOrbital[][] = [[]];
  shells.forEach((shell, i) => {
    const options = choose(spinOrbitals(shell, i), shell.electrons);
    microstates = microstates.flatMap((m) => options.map((o) => [...m, ...o]));
  });

  const count = new Map<string, number>();
  const trace = new Map<number, number>();
  let maxTwoS = 0;
  let maxLambda = 0;
  for (const m of microstates) {
    const ml = m.reduce((s, o) => s + o.ml, 0);
    const twoMs = m.reduce((s, o) => s + o.twoMs, 0);
    count.set(`${ml},${twoMs}`, (count.get(`${ml},${twoMs}`) ?? 0) + 1);
    if (ml === 0) trace.set(twoMs, (trace.get(twoMs) ?? 0) + reflectionTrace(m));
    maxTwoS = Math.max(maxTwoS, twoMs);
    maxLambda = Math.max(maxLambda, ml);
  }
  const N = (ml: number, twoMs: number) => count.get(`${ml},${twoMs}`) ?? 0;
  const T = (twoMs: number) => trace.get(twoMs) ?? 0;
  const parity = homonuclear ? configurationParity(shells) : undefined;

  const terms: MolecularTerm[] = [];
  for (let twoS = maxTwoS; twoS >= 0; twoS -= 2) {
    for (let lambda = maxLambda; lambda >= 0; lambda--) {
      const n = N(lambda, twoS) - N(lambda, twoS + 2);
      if (n <= 0) continue;
      const base = parity ? { twoS, lambda, parity } : { twoS, lambda };
      if (lambda > 0) {
        for (let i = 0; i < n; i++) terms.push({ ...base });
        continue;
      }
      const plusMinusMinus = T(twoS) - T(twoS + 2);
      const plus = (n + plusMinusMinus) / 2;
      for (let i = 0; i < plus; i++) terms.push({ ...base, reflection: '+' });
      for (let i = 0; i < n - plus; i++) terms.push({ ...base, reflection: '-' });
    }
  }
  return terms;
}

/**
 * The ground term by Hund's rules: highest spin, then highest Λ. A tie between Σ⁺ and Σ⁻ of the same
 * spin is not decided by those rules; it cannot arise from one open σ or π shell (all Orbitab's
 * Aufbau configurations); should it arise, Σ⁻ is reported.
 */
export function groundTerm(shells: OpenShell[], homonuclear?: boolean): MolecularTerm {
  const terms = termsOfConfiguration(shells, homonuclear);
  const best = terms[0];
  const ties = terms.filter((t) => t.twoS === best.twoS && t.lambda === best.lambda);
  return ties.find((t) => t.reflection === '-') ?? best;
}

const LAMBDA_UNICODE = ['Σ', 'Π', 'Δ', 'Φ', 'Γ'];
const LAMBDA_ASCII = ['Sigma', 'Pi', 'Delta', 'Phi', 'Gamma'];
const SUPERSCRIPT_DIGITS = '⁰¹²³⁴⁵⁶⁷⁸⁹';

export function superscriptNumber(n: number): string {
  return String(n).replace(/\d/g, (d) => SUPERSCRIPT_DIGITS[Number(d)]);
}

/**
 * "³Σg⁻", "²Πg", "¹Σ⁺" (Unicode has no subscript g, so g/u follow the letter on the line, as
 * commonly printed), or plain ASCII for export: "3Sigma_g-", "2Pi_g", "1Sigma+".
 */
export function formatTerm(term: MolecularTerm, format: 'unicode' | 'ascii' = 'unicode'): string {
  const multiplicity = term.twoS + 1;
  if (format === 'ascii') {
    const letter = LAMBDA_ASCII[term.lambda] ?? `Lambda${term.lambda}`;
    return `${multiplicity}${letter}${term.parity ? '_' + term.parity : ''}${term.reflection ?? ''}`;
  }
  const letter = LAMBDA_UNICODE[term.lambda] ?? `Λ${term.lambda}`;
  const reflection = term.reflection === '+' ? '⁺' : term.reflection === '-' ? '⁻' : '';
  return `${superscriptNumber(multiplicity)}${letter}${term.parity ?? ''}${reflection}`;
}

/** Electronic degeneracy of a term as used in partition functions: (2S+1)·(2 if Λ > 0 else 1). */
export function termDegeneracy(term: MolecularTerm): number {
  return (term.twoS + 1) * (term.lambda > 0 ? 2 : 1);
}
