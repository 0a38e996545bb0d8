import { findPiSystem } from '../functions/chem/piSystem.js';
import { modelFromPiSystem, modelFromMatrix } from '../functions/chem/huckel.js';
const n = Number(process.argv[2]);
// polyphenylene chain of n benzene rings
const smiles = Array.from({ length: n }, () => 'c1ccccc1').join('').replace(/c1ccccc1(?=c1)/g, 'c1ccc(cc1)').replace(/\)c1/g, ')-c1');
let t = performance.now();
const pi = findPiSystem(Array.from({ length: n }, (_, i) => (i === 0 ? 'c1ccc(cc1)' : i < n - 1 ? 'c1ccc(cc1)' : 'c1ccccc1')).join(''));
const t1 = performance.now();
const m = process.env.NOSOLVE ? null : modelFromPiSystem(pi as any, 'streitwieser' as any);
const t2 = performance.now();
const N = Number(process.argv[3] ?? 0);
let t3 = 0;
if (N) { const a = Array.from({ length: N }, (_, i) => Array.from({ length: N }, (_, j) => (Math.abs(i - j) === 1 ? 1 : 0))); const s = performance.now(); modelFromMatrix(a); t3 = performance.now() - s; }
console.log(JSON.stringify({ rings: n, centres: (pi as any).centres?.length ?? (pi as any).size, piMs: Math.round(t1 - t), solveMs: Math.round(t2 - t1), matrixN: N, matrixMs: Math.round(t3) }));
