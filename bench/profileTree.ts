// Where a CPU profile's time went inside one long task: the functions' own time ("self") and time
// including what they called ("total"), for the open profilers (openProfile.ts, ehtOpenProfile.ts).

/** A node of a Chrome DevTools CPU profile; `parent` is filled in by `profileNodes`. */
export interface Node { id: number; callFrame: { functionName: string; url: string; lineNumber: number; columnNumber: number }; parent?: number; children?: number[] }

/** The profile's nodes by id, each knowing its parent. */
export function profileNodes(nodes: Node[]): Map<number, Node> {
  const byId = new Map(nodes.map((n) => [n.id, n]));
  for (const n of nodes) for (const c of n.children ?? []) byId.get(c)!.parent = n.id;
  return byId;
}

/**
 * Each sample's time on the profiler's clock (µs), and the offset from the page's clock: the page runs
 * `__orbCalibrate` at page time `calMs`, and its samples' middle is that moment.
 */
export function sampleClock(p: { startTime: number; samples: number[]; timeDeltas: number[] }, byId: Map<number, Node>, calMs: number) {
  const times: number[] = [];
  let t = p.startTime;
  for (const d of p.timeDeltas) times.push((t += d));
  const cal = times.filter((_, i) => byId.get(p.samples[i])!.callFrame.functionName === '__orbCalibrate');
  return { times, calibrationSamples: cal.length, offsetUs: (cal[0] + cal[cal.length - 1]) / 2 - calMs * 1000 };
}

/** "function file.js:line:column" for a node. */
export const nodeLabel = (n: Node) => `${n.callFrame.functionName || '(anon)'} ${n.callFrame.url.split('/').pop()}:${n.callFrame.lineNumber + 1}:${n.callFrame.columnNumber + 1}`;

/** Self and inclusive time (µs) per function over samples given as [node id, µs]. */
export function timeByFunction(samples: Iterable<readonly [number, number]>, byId: Map<number, Node>) {
  const self = new Map<string, number>();
  const total = new Map<string, number>();
  for (const [nid, dt] of samples) {
    const n = byId.get(nid)!;
    self.set(nodeLabel(n), (self.get(nodeLabel(n)) ?? 0) + dt);
    const seen = new Set<string>();
    for (let a: Node | undefined = n; a; a = a.parent ? byId.get(a.parent) : undefined) {
      const l = nodeLabel(a);
      if (seen.has(l)) continue;
      seen.add(l);
      total.set(l, (total.get(l) ?? 0) + dt);
    }
  }
  return { self, total };
}

/** The `k` largest entries, one indented line each. */
export const topLines = (m: Map<string, number>, k: number) => [...m].sort((a, b) => b[1] - a[1]).slice(0, k).map(([l, us]) => `      ${(us / 1000).toFixed(0).padStart(5)} ms  ${l}`).join('\n');
