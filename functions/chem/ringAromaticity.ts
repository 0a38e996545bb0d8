// Hückel's 4n+2 rule ring by ring (E. Hückel, Z. Phys. 70, 204 (1931); antiaromaticity of 4n rings:
// R. Breslow, Acc. Chem. Res. 6, 393 (1973)), so a fused molecule with one cross-conjugated ring
// (anthraquinone, coumarin, caffeine) still shows its intact benzenoid or imidazole ring.
//
// Rings: openchemlib's smallest set of small rings (up to 7 members). A ring system that these do not
// cover (cyclooctatetraene, the annulenes) is judged on its perimeter as one large ring
// (aromaticity.ts, Platt's perimeter model).
// Per ring, in this order:
// 1. a ring with an atom outside the π system (sp3 CH2) is "non-aromatic" (not fully conjugated);
// 2. a ring in a ring system with an odd π count (a radical such as phenalenyl) is "non-aromatic":
//    the 4n+2 and 4n rules are defined for closed shells;
// 3. a ring with an atom double-bonded outside every ring (C=O of quinones and lactams, exocyclic
//    C=C of fulvenes) is "non-aromatic" (cross-conjugated, common practice);
// 4. the ring's π electrons (each ring atom's own: 1 per C, 2 per pyrrole N, ...; Kekulé-independent)
//    decide: 4n+2 "aromatic", 4n "antiaromatic";
// 5. a ring with an odd count is judged with the odd-count rings fused to it, on their common
//    perimeter: azulene's 5- and 7-ring share a 10-electron perimeter (aromatic), pentalene's two
//    5-rings an 8-electron one (antiaromatic). An odd ring fused only to even rings (the five-membered
//    rings of acenaphthylene and fluoranthene) stays "non-aromatic".
// The molecule takes the verdict of its most stabilised ring: "aromatic" if any ring is, else
// "antiaromatic" if any ring is, else "non-aromatic" — biphenylene is aromatic through its benzene
// rings while its four-membered ring is reported antiaromatic by RINGAROMATICITY.
import { edgeKey, ringSystemVerdicts, verdictFor, type AromaticityVerdict } from './aromaticity.js';
import type { PiSystem } from './piSystem.js';

export interface RingVerdict {
  /** 1-based atom numbers, in ring order. */
  atoms: number[];
  /** π electrons counted for the rule (the fused perimeter's when the ring was judged with neighbours); undefined when not fully conjugated. */
  electrons: number | undefined;
  verdict: AromaticityVerdict;
  reason: string;
}

interface Candidate {
  atoms: number[];
  centres: number[];
  electrons: number;
  verdict?: AromaticityVerdict;
  reason?: string;
  counted?: number;
}

function perimeterElectrons(pi: PiSystem, rings: number[][]): number {
  const members = new Set(rings.flat());
  const ringsPerEdge = new Map<string, number>();
  for (const ring of rings)
    ring.forEach((c, i) => {
      const key = edgeKey(c, ring[(i + 1) % ring.length]);
      ringsPerEdge.set(key, (ringsPerEdge.get(key) ?? 0) + 1);
    });
  let total = 0;
  for (const c of members) {
    const incident = [...ringsPerEdge.keys()].filter((k) => k.split('-').map(Number).includes(c));
    const interior = incident.length >= 3 && incident.every((k) => ringsPerEdge.get(k)! >= 2);
    if (!interior) total += pi.centres[c].electrons;
  }
  return total;
}

const sharesBond = (x: number[], y: number[]) => {
  const edges = new Set(x.map((c, i) => edgeKey(c, x[(i + 1) % x.length])));
  return y.some((c, i) => edges.has(edgeKey(c, y[(i + 1) % y.length])));
};

/** The verdict of every ring of the molecule (see the rules at the top of this file). */
export function ringVerdicts(pi: PiSystem): RingVerdict[] {
  const out: RingVerdict[] = [];
  // π electrons of the whole conjugated component a ring belongs to (its exocyclic C=O included).
  const component = new Array<number>(pi.centres.length).fill(-1);
  const componentElectrons: number[] = [];
  for (let start = 0; start < pi.centres.length; start++) {
    if (component[start] >= 0) continue;
    const id = componentElectrons.length;
    let total = 0;
    const stack = [start];
    component[start] = id;
    while (stack.length) {
      const c = stack.pop()!;
      total += pi.centres[c].electrons;
      for (const b of pi.bonds) {
        const other = b.a === c ? b.b : b.b === c ? b.a : -1;
        if (other >= 0 && component[other] < 0) {
          component[other] = id;
          stack.push(other);
        }
      }
    }
    componentElectrons.push(total);
  }
  const exocyclicAt = (c: number) => pi.bonds.some((b) => (b.a === c || b.b === c) && b.order >= 2 && !b.inRing);

  const candidates: Candidate[] = [];
  const entries: (RingVerdict | Candidate)[] = [];
  for (const atoms of pi.smallRings) {
    const centres = atoms.map((a) => pi.centreOfAtom.get(a));
    const missing = atoms.find((_, i) => centres[i] === undefined);
    if (missing !== undefined) {
      entries.push({ atoms, electrons: undefined, verdict: 'non-aromatic', reason: `not fully conjugated: atom ${missing} (${pi.atomElements[missing - 1]}) has no p orbital in the π system` });
      continue;
    }
    const cs = centres as number[];
    const candidate: Candidate = { atoms, centres: cs, electrons: cs.reduce((s, c) => s + pi.centres[c].electrons, 0) };
    const systemElectrons = componentElectrons[component[cs[0]]];
    const exo = cs.find(exocyclicAt);
    if (systemElectrons % 2 === 1) {
      candidate.verdict = 'non-aromatic';
      candidate.reason = `radical: its π system has an odd number (${systemElectrons}) of electrons, so neither 4n+2 nor 4n applies`;
    } else if (exo !== undefined) {
      candidate.verdict = 'non-aromatic';
      candidate.reason = `cross-conjugated: atom ${pi.centres[exo].atom} is double-bonded outside the ring`;
    } else if (candidate.electrons % 2 === 0) {
      candidate.verdict = verdictFor(candidate.electrons);
      candidate.counted = candidate.electrons;
      candidate.reason = `${candidate.electrons} π electrons in the ring`;
    }
    candidates.push(candidate);
    entries.push(candidate);
  }

  // Odd rings: judged with the odd rings fused to them, on the common perimeter.
  const odd = candidates.filter((c) => c.verdict === undefined);
  const seen = new Set<Candidate>();
  for (const start of odd) {
    if (seen.has(start)) continue;
    const group = [start];
    seen.add(start);
    for (let k = 0; k < group.length; k++)
      for (const other of odd) if (!seen.has(other) && sharesBond(group[k].centres, other.centres)) {
        seen.add(other);
        group.push(other);
      }
    const total = group.length > 1 ? perimeterElectrons(pi, group.map((g) => g.centres)) : start.electrons;
    for (const ring of group) {
      ring.counted = total;
      if (group.length > 1 && total % 2 === 0) {
        ring.verdict = verdictFor(total);
        ring.reason = `${ring.electrons} π electrons in the ring (odd); judged with the fused ring${group.length > 2 ? 's' : ''} on a ${total}-electron perimeter`;
      } else {
        ring.verdict = 'non-aromatic';
        ring.reason = `${ring.electrons} π electrons in the ring: an odd count follows neither rule${group.length > 1 ? ` (nor does the ${total}-electron perimeter it shares)` : ''}`;
      }
    }
  }

  for (const e of entries) {
    if ('centres' in e) out.push({ atoms: e.atoms, electrons: e.counted ?? e.electrons, verdict: e.verdict!, reason: e.reason! });
    else out.push(e);
  }

  // Ring systems the small rings do not cover (rings of 8 or more): their perimeter as one ring.
  const covered = new Set<string>();
  for (const c of candidates) c.centres.forEach((x, i) => covered.add(edgeKey(x, c.centres[(i + 1) % c.centres.length])));
  for (const system of ringSystemVerdicts(pi)) {
    const centres = system.atoms.map((a) => pi.centreOfAtom.get(a)!);
    const inside = new Set(centres);
    const uncovered = pi.bonds.some((b) => inside.has(b.a) && inside.has(b.b) && !covered.has(edgeKey(b.a, b.b)));
    if (!uncovered) continue;
    const radical = system.perimeterElectrons % 2 === 1;
    out.push({
      atoms: system.atoms,
      electrons: system.perimeterElectrons,
      verdict: system.verdict,
      reason: system.crossConjugated
        ? 'large ring, cross-conjugated: an atom is double-bonded outside the ring'
        : radical
          ? `large ring with an odd number (${system.perimeterElectrons}) of π electrons`
          : `large ring: ${system.perimeterElectrons} π electrons on its perimeter`,
    });
  }
  return out;
}

/** One word for the molecule: the verdict of its most stabilised ring (see above). */
export function moleculeAromaticity(pi: PiSystem): AromaticityVerdict {
  const verdicts = ringVerdicts(pi).map((r) => r.verdict);
  if (verdicts.includes('aromatic')) return 'aromatic';
  if (verdicts.includes('antiaromatic')) return 'antiaromatic';
  return 'non-aromatic';
}

/** The molecule's verdict (kept under its old name for callers of aromaticity.ts). */
export const aromaticity = moleculeAromaticity;
