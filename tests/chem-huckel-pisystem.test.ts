// Finding the π system from SMILES: which atoms join, how many π electrons each gives, which
// parameter type it takes, and Hückel's 4n+2 verdicts. Electron counts follow the usual textbook
// bookkeeping (Streitwieser 1961, ch. 5: pyridine N 1, pyrrole N 2, carbonyl O 1, ether O 2,
// halogens 2; carbocations 0, carbanions 2) — common practice.
import { describe, expect, it } from 'vitest';
import { ringSystemVerdicts } from '../functions/chem/aromaticity.js';
import { aromaticity } from '../functions/chem/ringAromaticity.js';
import { buildHuckelMatrix } from '../functions/chem/huckel.js';
import { findPiSystem } from '../functions/chem/piSystem.js';

const pi = (smiles: string) => findPiSystem(smiles);
/** [atom number, element, electrons, type] for each π centre. */
const centres = (smiles: string) => pi(smiles).centres.map((c) => [c.atom, c.element, c.electrons, c.type]);

describe('π electrons of ions and radicals', () => {
  it.each([
    ['allyl cation', '[CH2+]C=C', 3, 2],
    ['allyl radical', '[CH2]C=C', 3, 3],
    ['allyl anion', '[CH2-]C=C', 3, 4],
    ['cyclopentadienide (aromatic SMILES)', '[cH-]1cccc1', 5, 6],
    ['cyclopentadienide (Kekulé SMILES)', 'C1=CC=C[CH-]1', 5, 6],
    ['cyclopentadienyl cation', '[CH+]1C=CC=C1', 5, 4],
    ['tropylium', '[CH+]1C=CC=CC=C1', 7, 6],
    ['cyclopropenyl cation', '[CH+]1C=C1', 3, 2],
    ['benzyl anion', '[CH2-]c1ccccc1', 7, 8],
  ])('counts the %s (%s): %i centres, %i π electrons', (_name, smiles, n, electrons) => {
    const system = pi(smiles);
    expect(system.centres).toHaveLength(n);
    expect(system.electrons).toBe(electrons);
  });
});

describe('heteroatoms join only through a p orbital on the conjugated system', () => {
  it('gives pyridine N one π electron (pyridine type) and pyrrole N two (pyrrole type)', () => {
    expect(centres('c1ccncc1')[3]).toEqual([4, 'N', 1, 'N1']);
    expect(centres('c1cc[nH]c1')[3]).toEqual([4, 'N', 2, 'N2']);
  });

  it('tells carbonyl O (1 electron) from ether and hydroxyl O (2 electrons)', () => {
    expect(centres('C=CC=O')[3]).toEqual([4, 'O', 1, 'O1']);
    expect(centres('COC=C')).toEqual([[2, 'O', 2, 'O2'], [3, 'C', 1, 'C'], [4, 'C', 1, 'C']]);
    expect(centres('Oc1ccccc1')[0]).toEqual([1, 'O', 2, 'O2']);
    expect(centres('c1ccoc1')[3]).toEqual([4, 'O', 2, 'O2']);
  });

  it('lets a halogen give its lone pair to a ring but not from a saturated carbon', () => {
    expect(centres('Clc1ccccc1')[0]).toEqual([1, 'Cl', 2, 'Cl']);
    expect(pi('ClCc1ccccc1').centreOfAtom.has(1)).toBe(false);
    expect(pi('ClCc1ccccc1').centres).toHaveLength(6);
  });

  it('includes aniline and amide N as lone-pair donors', () => {
    expect(centres('Nc1ccccc1')[0]).toEqual([1, 'N', 2, 'N2']);
    expect(centres('CC(=O)N')).toEqual([[2, 'C', 1, 'C'], [3, 'O', 1, 'O1'], [4, 'N', 2, 'N2']]);
  });

  it('keeps methyl groups, CH2 links and ammonium N out', () => {
    expect(pi('Cc1ccccc1').centreOfAtom.has(1)).toBe(false);
    expect(pi('C1=CC=CC1').centres).toHaveLength(4);
    expect(pi('C[N+](C)(C)c1ccccc1').centres).toHaveLength(6);
  });

  it('gives pyridinium N+ and pyrylium O+ one π electron each with their own parameter types', () => {
    expect(centres('c1cc[nH+]cc1')[3]).toEqual([4, 'N', 1, 'N+']);
    expect(centres('c1cc[o+]cc1')[3]).toEqual([4, 'O', 1, 'O+']);
  });

  it('takes one p orbital per triple-bond atom into conjugation (benzonitrile: 8 centres, 8 electrons)', () => {
    const system = pi('N#Cc1ccccc1');
    expect(system.centres).toHaveLength(8);
    expect(system.electrons).toBe(8);
    expect(system.centres[0].type).toBe('N1');
  });

  it('marks centres no published set covers (phenoxide O⁻) instead of guessing a parameter', () => {
    const system = pi('[O-]c1ccccc1');
    expect(system.centres[0]).toMatchObject({ element: 'O', electrons: 2, type: undefined, label: 'O⁻ with 2 π electrons' });
    expect(() => buildHuckelMatrix(system, 'streitwieser')).toThrow('no Hückel parameters for O⁻ with 2 π electrons (atom 1) in either published set');
  });

  it('gives the default set Van-Catledge\'s sulfur, which Streitwieser\'s table lacks (thiophene)', () => {
    // Van-Catledge, J. Org. Chem. 45, 4801 (1980), Table I as commonly reproduced: h_S = 1.11, k_CS = 0.69 (thiophene-type S).
    const m = buildHuckelMatrix(pi('c1ccsc1'), 'streitwieser');
    expect(m[3][3]).toBe(1.11);
    expect(m[2][3]).toBe(0.69);
    // Carbon is α and β in both tables, so thiophene's matrix is the same in either set.
    expect(m).toEqual(buildHuckelMatrix(pi('c1ccsc1'), 'van-catledge'));
  });

  it('asks for Van-Catledge where Streitwieser has no value (N–N bonds)', () => {
    expect(() => buildHuckelMatrix(pi('c1ccnnc1'), 'streitwieser')).toThrow('no k for a N1–N1 bond (atoms 4–5); it gives k only for bonds to carbon');
    expect(buildHuckelMatrix(pi('c1ccnnc1'), 'van-catledge')[3][4]).toBe(1.09);
  });
});

describe('structures simple Hückel theory cannot take', () => {
  it.each([
    ['an unparseable SMILES', 'C1CC', "cannot read SMILES 'C1CC': dangling ring closure"],
    ['an unknown element', 'Xx', "cannot read SMILES 'Xx'"],
    ['an empty string', '  ', 'empty structure'],
    ['a saturated molecule', 'CCO', "no π system in 'CCO'"],
    ['an allene', 'C=C=C', 'atom 2 (C) has two cumulated double bonds'],
    ['a hypervalent sulfoxide', 'CS(=O)c1ccccc1', 'atom 2 (S) has 3 σ bonds and a multiple bond (hypervalent)'],
  ])('rejects %s with a message saying so', (_what, smiles, message) => {
    expect(() => findPiSystem(smiles)).toThrow(message);
  });

  it('numbers heavy atoms as written, and flags SMILES whose [H] atoms make the parser renumber', () => {
    expect(pi('OC=C').centres.map((c) => c.atom)).toEqual([1, 2, 3]);
    expect(pi('C([H])=CO').numberingFollowsSmiles).toBe(false);
    expect(pi('[CH2]=CO').numberingFollowsSmiles).toBe(true);
  });
});

describe("Hückel's 4n+2 rule on closed conjugated rings", () => {
  it.each([
    ['benzene', 'c1ccccc1'],
    ['pyridine', 'c1ccncc1'],
    ['pyrrole', 'c1cc[nH]c1'],
    ['furan', 'c1ccoc1'],
    ['thiophene', 'c1ccsc1'],
    ['cyclopentadienide', 'C1=CC=C[CH-]1'],
    ['tropylium', '[CH+]1C=CC=CC=C1'],
    ['cyclopropenyl cation', '[CH+]1C=C1'],
    ['naphthalene (10 π)', 'c1ccc2ccccc2c1'],
    ['azulene (10 π)', 'c1ccc2cccc2cc1'],
    ['pyrene (perimeter 14 π)', 'c1cc2ccc3cccc4ccc(c1)c2c34'],
    ['coronene (perimeter 18 π)', 'c1cc2ccc3ccc4ccc5ccc6ccc1c7c2c3c4c5c67'],
    ['biphenyl', 'c1ccc(cc1)-c1ccccc1'],
    ['[18]annulene', 'C1=C' + 'C=C'.repeat(8) + '1'],
  ])('calls %s aromatic', (_name, smiles) => expect(aromaticity(pi(smiles))).toBe('aromatic'));

  it.each([
    ['cyclobutadiene', 'C1=CC=C1'],
    ['the cyclopentadienyl cation', '[CH+]1C=CC=C1'],
    ['pentalene', 'C1=CC2=CC=CC2=C1'],
    ['planar cyclooctatetraene (the real molecule puckers)', 'C1=CC=CC=CC=C1'],
    ['[16]annulene', 'C1=C' + 'C=C'.repeat(7) + '1'],
  ])('calls %s antiaromatic', (_name, smiles) => expect(aromaticity(pi(smiles))).toBe('antiaromatic'));

  it.each([
    ['butadiene (no ring)', 'C=CC=C'],
    ['cyclopentadiene (sp3 CH2 in the ring)', 'C1=CC=CC1'],
    ['p-benzoquinone (cross-conjugated)', 'O=C1C=CC(=O)C=C1'],
    ['fulvene (cross-conjugated)', 'C=C1C=CC=C1'],
    ['the cyclopentadienyl radical (odd count)', 'C1=CC=C[CH]1'],
  ])('calls %s non-aromatic', (_name, smiles) => expect(aromaticity(pi(smiles))).toBe('non-aromatic'));

  it('counts the pyrene perimeter, leaving out the two inner carbons', () => {
    const [system] = ringSystemVerdicts(pi('c1cc2ccc3cccc4ccc(c1)c2c34'));
    expect(system).toMatchObject({ perimeterElectrons: 14, verdict: 'aromatic', crossConjugated: false });
    expect(system.atoms).toHaveLength(16);
  });

  it('judges the rings of styrene and leaves the vinyl group out of the ring system', () => {
    const verdicts = ringSystemVerdicts(pi('C=Cc1ccccc1'));
    expect(verdicts).toHaveLength(1);
    expect(verdicts[0].atoms).toEqual([3, 4, 5, 6, 7, 8]);
  });
});
