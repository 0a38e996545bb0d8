// functions/engineTopSort.ts replaces HyperFormula's recomputation order (Tarjan's algorithm in
// DependencyGraph/TopSort.js) with the same algorithm on typed arrays kept between runs. It must give
// exactly what HyperFormula's own gives: the same cells computed in the same order, the same cycles,
// on any graph, run after run (stale state from an earlier run must never leak into the next).
import { describe, expect, it } from 'vitest';
import { hyperFormulaInternals } from '../functions/engineGuards.js';
import { installTopSort } from '../functions/engineTopSort.js';
import { createEngine } from '../functions/engine.js';
import { seededRandom as rng } from './helpers/seededRandom.js';

type Node = { idInGraph: number };
type Graph = { nodesSparseArray: (Node | undefined)[]; edgesSparseArray: (number | undefined)[][] };
type Sort = (this: Graph, modified: Node[], operate: (n: Node) => boolean, onCycle: (n: Node) => void) => { sorted: Node[]; cycled: Node[] };

const graphProto = hyperFormulaInternals().graphProto as { getTopSortedWithSccSubgraphFrom: Sort };
const original = graphProto.getTopSortedWithSccSubgraphFrom;
installTopSort();
const patched = graphProto.getTopSortedWithSccSubgraphFrom;

/** A graph like HyperFormula's: removed nodes leave holes, edge lists keep deleted slots and may point at removed nodes. */
function randomGraph(random: () => number, size: number, density: number): Graph {
  const nodesSparseArray: (Node | undefined)[] = [];
  const edgesSparseArray: (number | undefined)[][] = [];
  for (let id = 0; id < size; id++) {
    nodesSparseArray[id] = random() < 0.1 ? undefined : { idInGraph: id };
    const out: (number | undefined)[] = [];
    const degree = Math.floor(random() * density * 2);
    for (let k = 0; k < degree; k++) {
      const r = random();
      // Mostly forward edges (a sheet's formulas mostly depend on cells above), some back edges (cycles), self loops and holes.
      const to = r < 0.7 ? id + 1 + Math.floor(random() * 6) : r < 0.85 ? Math.floor(random() * size) : r < 0.9 ? id : -1;
      out.push(to < 0 || to >= size + 3 ? undefined : to);
    }
    edgesSparseArray[id] = out;
  }
  for (let id = size; id < size + 3; id++) edgesSparseArray[id] = [];
  return { nodesSparseArray, edgesSparseArray };
}

function runWith(sort: Sort, graph: Graph, modified: Node[], seed: number) {
  const events: string[] = [];
  const random = rng(seed);
  const result = sort.call(
    graph,
    [...modified],
    (n) => {
      events.push(`compute ${n.idInGraph}`);
      return random() < 0.6;
    },
    (n) => events.push(`cycle ${n.idInGraph}`),
  );
  return { events, sorted: result.sorted.map((n) => n?.idInGraph), cycled: result.cycled.map((n) => n?.idInGraph) };
}

describe("the engine's recomputation order (functions/engineTopSort.ts)", () => {
  it('is installed in place of HyperFormula 3.5 own', () => {
    expect(typeof original).toBe('function');
    expect(patched).not.toBe(original);
  });

  it("gives exactly HyperFormula's order, cycles and computations on 600 random graphs run one after another", () => {
    const random = rng(20261205);
    let withCycles = 0;
    for (let g = 0; g < 600; g++) {
      // Sizes go up and down so later, smaller runs meet state an earlier, larger run left behind.
      const graph = randomGraph(random, 1 + Math.floor(random() * (g % 3 === 0 ? 400 : 40)), 1 + random() * 3);
      const present = graph.nodesSparseArray.filter((n): n is Node => n !== undefined);
      const modified = present.filter(() => random() < 0.3);
      if (random() < 0.2) modified.push({ idInGraph: undefined as unknown as number }); // a node without an id is passed over
      if (modified.length > 1 && random() < 0.3) modified.push(modified[0]); // the same node twice
      const seed = Math.floor(random() * 1e9);
      const expected = runWith(original, graph, modified, seed);
      const actual = runWith(patched, graph, modified, seed);
      expect(actual).toEqual(expected);
      if (expected.cycled.length > 0) withCycles++;
    }
    expect(withCycles).toBeGreaterThan(100);
  });

  it('sorts a whole graph (an engine build) and a chain of 30,000 in the same order', () => {
    const chain: Graph = { nodesSparseArray: [], edgesSparseArray: [] };
    for (let id = 0; id < 30_000; id++) {
      chain.nodesSparseArray[id] = { idInGraph: id };
      chain.edgesSparseArray[id] = id + 1 < 30_000 ? [id + 1] : [];
    }
    const all = chain.nodesSparseArray as Node[];
    expect(runWith(patched, chain, all, 7)).toEqual(runWith(original, chain, all, 7));
  });

  it('computes a workbook with chains, ranges and a cycle as before', () => {
    const engine = createEngine({
      S: [
        [1, '=A1*2', '=SUM(A1:B1)', '=D1+1'],
        [2, '=A2*2', '=SUM(A1:B2)', '=C2+E2', '=D2'],
        ['=D2'],
      ],
    });
    const sheet = engine.getSheetId('S')!;
    const at = (col: number, row: number) => engine.getCellValue({ sheet, col, row });
    expect([at(1, 0), at(2, 0), at(2, 1)]).toEqual([2, 3, 9]);
    // D1 refers to itself, D2 and E2 to each other: both are cycles.
    expect((at(3, 0) as { type?: string }).type).toBe('CYCLE');
    expect((at(3, 1) as { type?: string }).type).toBe('CYCLE');
    engine.setCellContents({ sheet, col: 0, row: 0 }, 10);
    expect([at(1, 0), at(2, 0), at(2, 1)]).toEqual([20, 30, 36]);
    engine.setCellContents({ sheet, col: 4, row: 1 }, 5);
    expect(at(3, 1)).toBe(41); // C2 + E2 once the cycle is broken
    expect(at(0, 2)).toBe(41);
    engine.destroy();
  });
});
