// Hückel's 4n+2 rule on the closed conjugated ring systems of a π system (E. Hückel, Z. Phys. 70,
// 204 (1931); antiaromaticity of 4n rings: R. Breslow, Acc. Chem. Res. 6, 393 (1973)).
//
// A ring system is a block (biconnected component) of the π-centre graph: one ring, or rings fused
// through shared bonds. Its π electrons are counted on its perimeter — atoms inside a peri-fused
// system (the two central carbons of pyrene) are left out, following Platt's perimeter model
// (J. R. Platt, J. Chem. Phys. 17, 484 (1949), from memory): naphthalene 10, pyrene 14, coronene 18.
// Verdicts:
// - 4n+2 perimeter electrons → "aromatic"; 4n (n ≥ 1) → "antiaromatic"; an odd count (a radical)
//   follows neither rule → "non-aromatic";
// - a cross-conjugated ring, where a ring atom is double-bonded outside the ring system (quinones,
//   fulvenes, tropone), is "non-aromatic": the 4n+2 count is defined here only for rings whose every
//   π bond lies in the ring (common practice; tropone-type cases are borderline in the literature);
// These whole-system verdicts are kept for the perimeter of large rings; the molecule's verdict
// (AROMATICITY) is now given ring by ring in ringAromaticity.ts.
// Planarity is assumed, as in all simple Hückel theory: cyclooctatetraene counts 8 and is reported
// antiaromatic although the real molecule avoids this by puckering into a tub.
import type { PiSystem } from './piSystem.js';

export type AromaticityVerdict = 'aromatic' | 'antiaromatic' | 'non-aromatic';

export interface RingSystemVerdict {
  /** Atom numbers of the ring system. */
  atoms: number[];
  perimeterElectrons: number;
  crossConjugated: boolean;
  verdict: AromaticityVerdict;
}

/** Biconnected components (Tarjan, edge-stack form) with at least three vertices: the ring systems. */
export function ringBlocks(n: number, edges: [number, number][]): Set<number>[] {
  const adjacency: number[][] = Array.from({ length: n }, () => []);
  for (const [a, b] of edges) {
    adjacency[a].push(b);
    adjacency[b].push(a);
  }
  const discovery = new Array<number>(n).fill(-1);
  const low = new Array<number>(n).fill(0);
  const stack: [number, number][] = [];
  const blocks: Set<number>[] = [];
  let time = 0;
  const visit = (u: number, parent: number) => {
    discovery[u] = low[u] = time++;
    for (const v of adjacency[u]) {
      if (discovery[v] === -1) {
        stack.push([u, v]);
        visit(v, u);
        low[u] = Math.min(low[u], low[v]);
        if (low[v] >= discovery[u]) {
          const block = new Set<number>();
          let edge: [number, number] | undefined;
          do {
            edge = stack.pop()!;
            block.add(edge[0]);
            block.add(edge[1]);
          } while (edge[0] !== u || edge[1] !== v);
          if (block.size >= 3) blocks.push(block);
        }
      } else if (v !== parent && discovery[v] < discovery[u]) {
        stack.push([u, v]);
        low[u] = Math.min(low[u], discovery[v]);
      }
    }
  };
  for (let u = 0; u < n; u++) if (discovery[u] === -1) visit(u, -1);
  return blocks;
}

export const edgeKey = (a: number, b: number) => (a < b ? `${a}-${b}` : `${b}-${a}`);

export function verdictFor(electrons: number): AromaticityVerdict {
  if (electrons > 0 && electrons % 4 === 2) return 'aromatic';
  if (electrons > 0 && electrons % 4 === 0) return 'antiaromatic';
  return 'non-aromatic';
}

/** Judges each closed conjugated ring system of the π system. */
export function ringSystemVerdicts(pi: PiSystem): RingSystemVerdict[] {
  const edges = pi.bonds.map((b) => [b.a, b.b] as [number, number]);
  const verdicts: RingSystemVerdict[] = [];
  for (const block of ringBlocks(pi.centres.length, edges)) {
    const crossConjugated = pi.bonds.some((b) => b.order >= 2 && block.has(b.a) !== block.has(b.b));
    // How many small rings of this block share each bond; an atom whose every bond in the block is
    // shared by two rings lies inside the perimeter.
    const ringsPerEdge = new Map<string, number>();
    for (const ring of pi.rings) {
      if (!ring.every((c) => block.has(c))) continue;
      ring.forEach((c, i) => {
        const key = edgeKey(c, ring[(i + 1) % ring.length]);
        ringsPerEdge.set(key, (ringsPerEdge.get(key) ?? 0) + 1);
      });
    }
    const blockEdges = pi.bonds.filter((b) => block.has(b.a) && block.has(b.b));
    let perimeterElectrons = 0;
    for (const c of block) {
      const incident = blockEdges.filter((b) => b.a === c || b.b === c);
      const interior = incident.length >= 3 && incident.every((b) => (ringsPerEdge.get(edgeKey(b.a, b.b)) ?? 0) >= 2);
      if (!interior) perimeterElectrons += pi.centres[c].electrons;
    }
    verdicts.push({
      atoms: [...block].map((c) => pi.centres[c].atom).sort((x, y) => x - y),
      perimeterElectrons,
      crossConjugated,
      verdict: crossConjugated ? 'non-aromatic' : verdictFor(perimeterElectrons),
    });
  }
  return verdicts;
}


