// usage: tsx one.ts '<json sheets>' [dense|sparse|threshold]
import { DenseSparseChooseBasedOnThreshold, AlwaysSparse } from 'hyperformula';
import { createEngine } from '../functions/engine.js';
const sheets = JSON.parse(process.argv[2]);
const pol = process.argv[3];
const opts: any = {};
if (pol === 'sparse') opts.chooseAddressMappingPolicy = new AlwaysSparse();
if (pol === 'threshold') opts.chooseAddressMappingPolicy = new DenseSparseChooseBasedOnThreshold(0.1);
const t0 = performance.now();
const e = createEngine({ S: sheets }, opts);
const t1 = performance.now();
const out: any[] = [];
for (let r = 0; r < Math.min(sheets.length, 3); r++) for (let c = 0; c < sheets[r].length; c++) {
  const v: any = e.getCellValue({ sheet: 0, row: r, col: c });
  out.push(typeof v === 'object' && v ? `${v.value}:${v.message}` : String(v).slice(0, 40));
}
const rss = process.memoryUsage().rss / 1e6;
console.log(JSON.stringify({ buildMs: Math.round(t1 - t0), rssMB: Math.round(rss), heapMB: Math.round(process.memoryUsage().heapUsed/1e6), out }));
