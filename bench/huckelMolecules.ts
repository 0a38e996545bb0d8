// Invented benchmark set: conjugated molecules generated programmatically (polyenes, acenes and
// aza-acenes, annulenes, diphenylpolyenes, substituted benzenes, naphthalenes and biphenyls),
// de-duplicated by openchemlib's canonical ID code and kept when they have 6–40 π centres and a
// closed-shell ground state (4n annulenes are left out: their gap is 0 and ABSORPTION declines them).
import { Molecule } from 'openchemlib';
import { frontierGap } from '../functions/chem/huckel.js';
import { huckelModelOf } from '../functions/chem/huckelCache.js';

const polyene = (n: number) => 'C=C'.repeat(n);

/** Linear acene of n rings, e.g. n = 3: c1ccc2cc3ccccc3cc2c1 (ring-closure digits 1–9, so n ≤ 8). */
function acene(n: number): string {
  if (n === 1) return 'c1ccccc1';
  let s = 'c1ccc2';
  for (let d = 3; d <= n; d++) s += `cc${d}`;
  s += `ccccc${n}`;
  for (let d = n - 1; d >= 2; d--) s += `cc${d}`;
  return s + 'c1';
}

/** Aza-acenes: one CH of the acene replaced by N at each distinct aromatic position of the SMILES text. */
function azaAcenes(n: number): string[] {
  const base = acene(n);
  const out: string[] = [];
  for (let i = 0; i < base.length; i++) if (base[i] === 'c') out.push(base.slice(0, i) + 'n' + base.slice(i + 1));
  return out;
}

const annulene = (size: number) => 'C1=C' + 'C=C'.repeat(size / 2 - 1) + '1';

const SUBSTITUENTS = ['', 'F', 'Cl', 'Br', 'O', 'OC', 'N', 'N(C)C', 'C=O', 'C#N', 'C=C', 'C(=O)C', 'c9ccccc9'];

function substituted(): string[] {
  const out: string[] = [];
  for (const a of SUBSTITUENTS)
    for (const b of SUBSTITUENTS) {
      const pa = a ? `(${a})` : '';
      const pb = b ? `(${b})` : '';
      out.push(`c1${pa}ccc${pb}cc1`, `c1${pa}cccc${pb}c1`, `c1${pa}c${pb}cccc1`);
      out.push(`c1${pa}ccc2cc${pb}ccc2c1`, `c1${pa}ccc(cc1)-c1ccc${pb}cc1`, `c1${pa}cnc${pb}cc1`);
    }
  return out;
}

/** The distinct benchmark molecules, in a fixed order. */
export function benchmarkMolecules(): string[] {
  const candidates = [
    ...Array.from({ length: 18 }, (_, i) => polyene(i + 3)),
    ...Array.from({ length: 8 }, (_, i) => acene(i + 1)),
    ...[2, 3, 4].flatMap(azaAcenes),
    ...Array.from({ length: 18 }, (_, i) => annulene(6 + 2 * i)),
    ...Array.from({ length: 15 }, (_, i) => `c1ccccc1${polyene(i)}c1ccccc1`),
    ...substituted(),
  ];
  const seen = new Set<string>();
  const kept: string[] = [];
  for (const smiles of candidates) {
    let id: string;
    let centres: number;
    let gap: number;
    try {
      id = Molecule.fromSmiles(smiles, { noCoordinates: true, noStereo: true }).getIDCode();
      const model = huckelModelOf([[smiles]]);
      centres = model.levels.length;
      gap = frontierGap(model, model.electrons).gap;
    } catch {
      continue;
    }
    if (seen.has(id) || centres < 6 || centres > 40 || gap <= 0) continue;
    seen.add(id);
    kept.push(smiles);
  }
  return kept;
}
