// HyperFormula 3.5 orders the cells to recompute after every change with Tarjan's algorithm
// (DependencyGraph/TopSort.js), keeping each node's visit state in seven plain arrays indexed by the
// node's id. A fresh TopSort is built for every change, so each run writes a handful of entries at
// ids near a million into empty arrays: V8 turns them into hash tables, and reading a 100,000 × 8
// workbook back into a page's engine allocated about 1.2 GB in them and in the neighbour lists the
// algorithm filters out at each visit (sampling heap profile, bench/openProfile.ts's workbook). Much
// of it lived long enough to be promoted, and the page's major collections grew with it.
//
// This is the same algorithm, visiting nodes and edges in the same order (so cells are computed in
// the same order), with the visit state in typed arrays kept between runs and a run number marking
// what belongs to the current run, so a run allocates only its result lists. The arrays are shared
// by every engine of the process and sized to the highest node id met: 21 bytes an id, beside the
// two pointer arrays HyperFormula itself indexes by id (it never reuses ids, so both grow with the
// cells an engine has replaced over its life, not only with the cells it holds).
import { hyperFormulaInternals } from './engineGuards.js';

interface GraphLike {
  nodesSparseArray: unknown[];
  edgesSparseArray: (number | undefined)[][];
}

const ON_STACK = 1;
const PROCESSED = 2;
const POPPED = 3;
const IN_SCC = 4;
const ON_CYCLE = 8;
/** Given its entrance time (a node reached twice is pushed twice and entered once). */
const ENTERED = 16;

/** Visit state by node id; an entry belongs to the current run when `seen[id] === run`. */
let seen = new Uint32Array(0);
let flags = new Uint8Array(0);
let entrance = new Int32Array(0);
let low = new Int32Array(0);
let parent = new Int32Array(0);
/** Nodes to recompute: `update[id] === run`. */
let update = new Uint32Array(0);
let run = 0;
let busy = false;
const dfs: number[] = [];
const sccStack: number[] = [];
const order: number[] = [];
const next: number[] = [];

function grow(size: number) {
  if (size <= seen.length) return;
  const n = Math.max(size, 2 * seen.length, 1024);
  const widen = <T extends Uint32Array | Uint8Array | Int32Array>(a: T, make: (n: number) => T): T => {
    const b = make(n);
    b.set(a);
    return b;
  };
  seen = widen(seen, (k) => new Uint32Array(k));
  flags = widen(flags, (k) => new Uint8Array(k));
  entrance = widen(entrance, (k) => new Int32Array(k));
  low = widen(low, (k) => new Int32Array(k));
  parent = widen(parent, (k) => new Int32Array(k));
  update = widen(update, (k) => new Uint32Array(k));
}

function nextRun() {
  if (run === 0xffffffff) {
    seen.fill(0);
    update.fill(0);
    run = 0;
  }
  run++;
}

/** The state of `id` in this run: 0 when not reached yet. */
const status = (id: number) => (seen[id] === run ? flags[id] & 3 : 0);
const entered = (id: number) => seen[id] === run && (flags[id] & ENTERED) !== 0;
const markUpdate = (id: number) => {
  if (id >= update.length) grow(id + 1);
  update[id] = run;
};

/**
 * Tarjan's algorithm from each of `starts` (already reversed, as HyperFormula does), then the
 * nodes in reverse finishing order: a node on a cycle goes to `onCycle`; any other is recomputed
 * with `operate` when it or something it depends on changed.
 */
function topSort(graph: GraphLike, starts: number[], operate: (node: unknown) => boolean, onCycle: (node: unknown) => void) {
  const nodes = graph.nodesSparseArray;
  const edges = graph.edgesSparseArray;
  grow(nodes.length);
  nextRun();
  let time = 0;
  // The three stacks keep their storage between runs (setting an array's length to 0 would drop it):
  // only the tops are reset.
  let dfsTop = 0;
  let sccTop = 0;
  let orderTop = 0;
  const reach = (u: number) => {
    seen[u] = run;
    flags[u] = ON_STACK;
  };
  for (const v of starts) {
    if (status(v) !== 0) continue;
    reach(v);
    parent[v] = -1;
    dfs[dfsTop++] = v;
    while (dfsTop > 0) {
      const u = dfs[dfsTop - 1];
      const state = flags[u] & 3;
      if (state === ON_STACK) {
        entrance[u] = low[u] = time++;
        flags[u] |= ENTERED;
        sccStack[sccTop++] = u;
        const out = edges[u];
        for (let i = 0; i < out.length; i++) {
          const t = out[i];
          if (t === undefined || !nodes[t] || entered(t)) continue;
          dfs[dfsTop++] = t;
          parent[t] = u;
          reach(t);
        }
        flags[u] = (flags[u] & ~3) | PROCESSED;
      } else if (state === PROCESSED) {
        let uLow = entrance[u];
        const out = edges[u];
        for (let i = 0; i < out.length; i++) {
          const t = out[i];
          if (t === undefined || !nodes[t] || (seen[t] === run && flags[t] & IN_SCC)) continue;
          uLow = Math.min(uLow, seen[t] === run && parent[t] === u ? low[t] : entrance[t]);
        }
        low[u] = uLow;
        if (uLow === entrance[u]) {
          let from = sccTop - 1;
          while (sccStack[from] !== u) from--;
          const cycle = sccTop - from > 1 ? ON_CYCLE : 0;
          for (let i = sccTop - 1; i >= from; i--) {
            const t = sccStack[i];
            flags[t] |= IN_SCC | cycle;
            order[orderTop++] = t;
          }
          sccTop = from;
        }
        dfsTop--;
        flags[u] = (flags[u] & ~3) | POPPED;
      } else dfsTop--; // a second copy of a node already done
    }
  }
  for (const id of starts) markUpdate(id);
  const sorted: unknown[] = [];
  const cycled: unknown[] = [];
  for (let k = orderTop - 1; k >= 0; k--) {
    const t = order[k];
    const node = nodes[t];
    // The nodes depending on t, taken before t is computed (computing it may change its edges).
    let nextTop = 0;
    let selfLoop = false;
    const out = edges[t];
    for (let i = 0; i < out.length; i++) {
      const s = out[i];
      if (s === undefined || !nodes[s]) continue;
      next[nextTop++] = s;
      if (s === t) selfLoop = true;
    }
    if (flags[t] & ON_CYCLE || selfLoop) {
      cycled.push(node);
      onCycle(node);
      for (let i = 0; i < nextTop; i++) markUpdate(next[i]);
    } else {
      sorted.push(node);
      if (update[t] === run && operate(node)) for (let i = 0; i < nextTop; i++) markUpdate(next[i]);
    }
  }
  return { sorted, cycled };
}

let installed = false;

/** Patches HyperFormula once so every engine orders its recomputations with `topSort` above. */
export function installTopSort(): void {
  if (installed) return;
  const graphProto = hyperFormulaInternals().graphProto as {
    getTopSortedWithSccSubgraphFrom?: (modified: { idInGraph?: number }[], operate: (node: unknown) => boolean, onCycle: (node: unknown) => void) => unknown;
  };
  const original = graphProto.getTopSortedWithSccSubgraphFrom;
  if (typeof original !== 'function') throw new Error('HyperFormula internals changed: graph.getTopSortedWithSccSubgraphFrom is missing (functions/engineTopSort.ts)');
  graphProto.getTopSortedWithSccSubgraphFrom = function (this: GraphLike, modified, operate, onCycle) {
    // A recomputation started from inside another (not seen in HyperFormula 3.5) takes the original path.
    if (busy) return original.call(this, modified, operate, onCycle);
    const ids: number[] = [];
    for (let i = modified.length - 1; i >= 0; i--) {
      const id = modified[i].idInGraph;
      if (id !== undefined) ids.push(id);
    }
    busy = true;
    try {
      return topSort(this, ids, operate, onCycle);
    } finally {
      busy = false;
    }
  };
  installed = true;
}
