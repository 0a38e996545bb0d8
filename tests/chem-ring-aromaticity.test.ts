// Aromaticity ring by ring (functions/chem/ringAromaticity.ts) against textbook verdicts. Sources:
// J. Clayden, N. Greeves & S. Warren, Organic Chemistry, 2nd ed. (OUP 2012), chapters on aromaticity and
// aromatic heterocycles; V. I. Minkin, M. N. Glukhovtsev & B. Ya. Simkin, Aromaticity and
// Antiaromaticity (Wiley 1994) for biphenylene, pentalene, phenalenyl and azulene — verdicts recalled
// from memory.
import { describe, expect, it } from 'vitest';
import { findPiSystem } from '../functions/chem/piSystem.js';
import { aromaticity, ringVerdicts } from '../functions/chem/ringAromaticity.js';

const pi = (s: string) => findPiSystem(s);
/** Verdicts of the rings, sorted, for a compact comparison. */
const rings = (s: string) => ringVerdicts(pi(s)).map((r) => `${r.atoms.length}:${r.verdict}`).sort();

describe('fused molecules with one cross-conjugated ring keep their intact aromatic rings', () => {
  it.each([
    ['anthraquinone', 'O=C1c2ccccc2C(=O)c2ccccc12', ['6:aromatic', '6:aromatic', '6:non-aromatic']],
    ['fluorenone', 'O=C1c2ccccc2-c2ccccc12', ['5:non-aromatic', '6:aromatic', '6:aromatic']],
    ['xanthone', 'O=c1c2ccccc2oc2ccccc12', ['6:aromatic', '6:aromatic', '6:non-aromatic']],
    ['acridone', 'O=c1c2ccccc2[nH]c2ccccc12', ['6:aromatic', '6:aromatic', '6:non-aromatic']],
    ['coumarin', 'O=c1ccc2ccccc2o1', ['6:aromatic', '6:non-aromatic']],
    ['1,4-naphthoquinone', 'O=C1C=CC(=O)c2ccccc12', ['6:aromatic', '6:non-aromatic']],
    ['phthalimide', 'O=C1NC(=O)c2ccccc12', ['5:non-aromatic', '6:aromatic']],
    ['quinolin-2-one', 'O=c1ccc2ccccc2[nH]1', ['6:aromatic', '6:non-aromatic']],
    ['caffeine (imidazole ring aromatic)', 'Cn1cnc2c1c(=O)n(C)c(=O)n2C', ['5:aromatic', '6:non-aromatic']],
  ])('%s: aromatic, rings %j', (_name, smiles, expected) => {
    expect(aromaticity(pi(smiles))).toBe('aromatic');
    expect(rings(smiles)).toEqual(expected);
  });
});

describe('odd rings fused to benzenoid rings, radicals and biphenylene', () => {
  it('acenaphthylene and fluoranthene: aromatic through their six-membered rings, the five-membered ring non-aromatic', () => {
    expect(aromaticity(pi('C1=Cc2cccc3cccc1c23'))).toBe('aromatic');
    expect(rings('C1=Cc2cccc3cccc1c23')).toEqual(['5:non-aromatic', '6:aromatic', '6:aromatic']);
    expect(aromaticity(pi('c1ccc2c(c1)-c1cccc3cccc-2c13'))).toBe('aromatic');
    expect(rings('c1ccc2c(c1)-c1cccc3cccc-2c13')).toEqual(['5:non-aromatic', '6:aromatic', '6:aromatic', '6:aromatic']);
  });
  it('the phenalenyl radical follows the odd-count rule: non-aromatic, not antiaromatic', () => {
    const phenalenyl = '[CH]1C=Cc2cccc3cccc1c23';
    expect(pi(phenalenyl).electrons).toBe(13);
    expect(aromaticity(pi(phenalenyl))).toBe('non-aromatic');
  });
  it('biphenylene: aromatic benzene rings, the four-membered ring antiaromatic, the molecule aromatic', () => {
    expect(rings('c1ccc2c(c1)-c1ccccc1-2')).toEqual(['4:antiaromatic', '6:aromatic', '6:aromatic']);
    expect(aromaticity(pi('c1ccc2c(c1)-c1ccccc1-2'))).toBe('aromatic');
  });
  it('azulene: both odd rings judged on their common 10-electron perimeter', () => {
    const verdicts = ringVerdicts(pi('c1ccc2cccc2cc1'));
    expect(verdicts.map((r) => [r.atoms.length, r.electrons, r.verdict]).sort()).toEqual([
      [5, 10, 'aromatic'],
      [7, 10, 'aromatic'],
    ]);
  });
  it('pentalene: two five-membered rings on an 8-electron perimeter, antiaromatic', () => {
    expect(rings('C1=CC2=CC=CC2=C1')).toEqual(['5:antiaromatic', '5:antiaromatic']);
  });
});

describe('textbook single-ring and simple fused verdicts', () => {
  it.each([
    ['benzene', 'c1ccccc1', 'aromatic'],
    ['naphthalene', 'c1ccc2ccccc2c1', 'aromatic'],
    ['pyridine', 'c1ccncc1', 'aromatic'],
    ['pyrrole', 'c1cc[nH]c1', 'aromatic'],
    ['furan', 'c1ccoc1', 'aromatic'],
    ['thiophene', 'c1ccsc1', 'aromatic'],
    ['imidazole', 'c1cnc[nH]1', 'aromatic'],
    ['indole', 'c1ccc2[nH]ccc2c1', 'aromatic'],
    ['tropylium', '[CH+]1C=CC=CC=C1', 'aromatic'],
    ['cyclopentadienyl anion', 'C1=CC=C[CH-]1', 'aromatic'],
    ['cyclopropenyl cation', '[CH+]1C=C1', 'aromatic'],
    ['cyclobutadiene', 'C1=CC=C1', 'antiaromatic'],
    ['planar cyclooctatetraene (assumed planar; the real tub is non-aromatic)', 'C1=CC=CC=CC=C1', 'antiaromatic'],
    ['cyclopentadienyl cation', '[CH+]1C=CC=C1', 'antiaromatic'],
    ['cyclopentadiene', 'C1=CC=CC1', 'non-aromatic'],
    ['p-benzoquinone', 'O=C1C=CC(=O)C=C1', 'non-aromatic'],
    ['fulvene', 'C=C1C=CC=C1', 'non-aromatic'],
    ['the cyclopentadienyl radical', 'C1=CC=C[CH]1', 'non-aromatic'],
  ])('%s is %s', (_name, smiles, expected) => expect(aromaticity(pi(smiles))).toBe(expected));

  it('explains each verdict and names the atom that breaks a ring', () => {
    const [ring] = ringVerdicts(pi('C1=CC=CC1'));
    expect(ring.reason).toMatch(/atom 5 \(C\) has no p orbital/);
    const quinone = ringVerdicts(pi('O=C1C=CC(=O)C=C1'));
    expect(quinone[0].reason).toMatch(/cross-conjugated: atom \d+ is double-bonded outside the ring/);
  });
});
