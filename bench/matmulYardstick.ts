// A machine-speed yardstick that runs the same in Node and in the browser: one dense 100×100 matrix
// product (10⁶ multiply-adds), median of 25 runs after 5 warm-ups. bench/ppp.ts states its timings in
// these units too, so figures taken on a loaded machine can be compared.

export function median(xs: number[]): number {
  const s = [...xs].sort((a, b) => a - b);
  return s[Math.floor(s.length / 2)];
}

export function referenceMatmulMs(): number {
  const n = 100;
  const a = Float64Array.from({ length: n * n }, (_, i) => Math.sin(i));
  const b = Float64Array.from({ length: n * n }, (_, i) => Math.cos(i));
  const c = new Float64Array(n * n);
  const runs: number[] = [];
  for (let r = 0; r < 30; r++) {
    const t0 = performance.now();
    for (let i = 0; i < n; i++)
      for (let k = 0; k < n; k++) {
        const aik = a[i * n + k];
        for (let j = 0; j < n; j++) c[i * n + j] += aik * b[k * n + j];
      }
    runs.push(performance.now() - t0);
  }
  return median(runs.slice(5));
}
