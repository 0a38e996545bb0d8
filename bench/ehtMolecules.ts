// A reproducible library of distinct drug-like molecules for the extended-Hückel benchmarks: two
// substituents on one of several cores, each combination checked by openchemlib (parsed, canonical
// ID code unique, at most `maxHeavyAtoms` heavy atoms), in an order fixed by a seeded shuffle.
// Our own invented list of common fragments; nothing here is measured data.
import { Molecule } from 'openchemlib';

/** Cores with two attachment points X and Y. */
const CORES = [
  'c1cc(X)ccc1Y', 'c1c(X)cccc1Y', 'c1cc(X)ncc1Y', 'c1nc(X)ncc1Y', 'C1CC(X)CCC1Y', 'C1CN(X)CCN1Y',
  'c1cc(X)oc1Y', 'c1cc(X)sc1Y', 'X/C=C/Y', 'XC(=O)NY', 'XCCOY', 'c1ccc2cc(X)ccc2c1Y',
];
const SUBSTITUENTS = [
  'C', 'CC', 'C(C)C', 'O', 'OC', 'N', 'N(C)C', 'F', 'Cl', 'C(F)(F)F', 'C#N', 'C(=O)O', 'C(=O)OC', 'C(=O)N',
  'S(=O)(=O)N', 'CO', 'CCO', 'NC(=O)C', 'c9ccccc9', 'C9CC9', 'OC(F)(F)F', 'C=O', '[N+](=O)[O-]', 'CC(=O)C',
];

function seededShuffle<T>(items: T[], seed: number): T[] {
  const out = [...items];
  let s = seed >>> 0;
  for (let i = out.length - 1; i > 0; i--) {
    s = (Math.imul(s, 1664525) + 1013904223) >>> 0; // Numerical Recipes LCG
    const j = s % (i + 1);
    [out[i], out[j]] = [out[j], out[i]];
  }
  return out;
}

export function benchMolecules(count: number, maxHeavyAtoms = 30, seed = 7): string[] {
  const combos: string[] = [];
  for (const core of CORES) for (const x of SUBSTITUENTS) for (const y of SUBSTITUENTS) combos.push(core.replace('X', x).replace('Y', y));
  const seen = new Set<string>();
  const out: string[] = [];
  for (const smiles of seededShuffle(combos, seed)) {
    const m = Molecule.fromSmiles(smiles);
    if (m.getAtoms() > maxHeavyAtoms) continue;
    const id = m.getIDCode();
    if (seen.has(id)) continue;
    seen.add(id);
    out.push(smiles);
    if (out.length === count) return out;
  }
  throw new Error(`only ${out.length} distinct molecules of at most ${maxHeavyAtoms} heavy atoms; asked for ${count}`);
}
