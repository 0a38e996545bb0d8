// SMILES for XYZ frames (server/structures/xyzSmiles.ts), checked against an independent program:
// openchemlib builds each molecule from SMILES and gives it 3D coordinates with its own conformer
// generator; only the elements and coordinates (rounded to 4 decimals, as an XYZ file carries them)
// go to the perception, and the SMILES that comes back must name the same compound — same
// openchemlib ID code, which includes stereo — as the SMILES we started from.
import '../functions/openchemlibNode.js';
import { ConformerGenerator, Molecule } from 'openchemlib';
import { describe, expect, it } from 'vitest';
import { chargeFromComment } from '../functions/chem/xyzComment.js';
import { smilesFromFrame } from '../server/structures/xyzSmiles.js';

/** The molecule as an XYZ frame would hold it: elements, coordinates to 0.1 mÅ, and its net charge. */
function frameOf(smiles: string) {
  const conformer = new ConformerGenerator(2026).getOneConformerAsMolecule(Molecule.fromSmiles(smiles));
  if (!conformer) throw new Error(`no conformer for ${smiles}`);
  const elements: string[] = [];
  const coordinates: [number, number, number][] = [];
  let charge = 0;
  for (let a = 0; a < conformer.getAllAtoms(); a++) {
    elements.push(conformer.getAtomLabel(a));
    coordinates.push([conformer.getAtomX(a), conformer.getAtomY(a), conformer.getAtomZ(a)].map((v) => Number(v.toFixed(4))) as [number, number, number]);
    charge += conformer.getAtomCharge(a);
  }
  return { elements, coordinates, charge };
}

const idCode = (smiles: string) => Molecule.fromSmiles(smiles).getIDCode();

const cases: [string, string][] = [
  ['water', 'O'],
  ['ammonia', 'N'],
  ['methane', 'C'],
  ['ethylene', 'C=C'],
  ['acetylene', 'C#C'],
  ['benzene', 'c1ccccc1'],
  ['pyridine', 'c1ccncc1'],
  ['pyrrole', 'c1cc[nH]c1'],
  ['naphthalene', 'c1ccc2ccccc2c1'],
  ['carbon dioxide', 'O=C=O'],
  ['formaldehyde', 'C=O'],
  ['acetic acid', 'CC(=O)O'],
  ['nitrobenzene (charge-separated nitro group)', 'c1ccccc1[N+](=O)[O-]'],
  ['pyridine N-oxide', '[O-][n+]1ccccc1'],
  ['glycine zwitterion', '[NH3+]CC(=O)[O-]'],
  ['carbon monoxide', '[C-]#[O+]'],
  ['dimethyl sulfoxide', 'CS(C)=O'],
  ['dimethyl sulfone', 'CS(=O)(=O)C'],
  ['phosphoric acid', 'OP(=O)(O)O'],
  ['caffeine', 'Cn1cnc2c1c(=O)n(C)c(=O)n2C'],
  ['paracetamol', 'CC(=O)Nc1ccc(O)cc1'],
  ['L-alanine (stereo centre read from the coordinates)', 'C[C@H](N)C(=O)O'],
  ['(E)-but-2-ene (double-bond geometry read from the coordinates)', 'C/C=C/C'],
  ['(S)-propranolol, 19 heavy atoms', 'CC(C)NC[C@H](O)COc1cccc2ccccc12'],
  ['(S)-ibuprofen', 'CC(C)Cc1ccc(cc1)[C@H](C)C(=O)O'],
];

describe('SMILES from an XYZ frame name the compound the coordinates came from', () => {
  it.each(cases)('%s', (_, smiles) => {
    const { elements, coordinates, charge } = frameOf(smiles);
    expect(charge).toBe(0);
    const result = smilesFromFrame(elements, coordinates);
    expect(result).toHaveProperty('smiles');
    expect(idCode((result as { smiles: string }).smiles)).toBe(idCode(smiles));
  });

  it.each([
    ['phenoxide, charge on O', '[O-]c1ccccc1', -1],
    ['ammonium', '[NH4+]', 1],
    ['acetate', 'CC(=O)[O-]', -1],
    ['pyrylium, charge on O', 'c1cc[o+]cc1', 1],
  ] as const)('%s, with its net charge given', (_, smiles, given) => {
    const { elements, coordinates, charge } = frameOf(smiles);
    expect(charge).toBe(given);
    const result = smilesFromFrame(elements, coordinates, given);
    expect(idCode((result as { smiles: string }).smiles)).toBe(idCode(smiles));
    // Without its charge the ion fits no neutral valences: uncertain, not invented.
    expect(smilesFromFrame(elements, coordinates)).toEqual({ problem: expect.stringMatching(/^bonds uncertain: /) });
  });

  it('fits a dication given without its charge to the neutral molecule with the same atoms (a documented limit)', () => {
    // Paraquat (1,1′-dimethyl-4,4′-bipyridinium) and its two-electron-reduced quinoid form share C12H14N2.
    const { elements, coordinates, charge } = frameOf('C[n+]1ccc(cc1)-c1cc[n+](C)cc1');
    expect(charge).toBe(2);
    expect(idCode((smilesFromFrame(elements, coordinates, 2) as { smiles: string }).smiles)).toBe(idCode('C[n+]1ccc(cc1)-c1cc[n+](C)cc1'));
    expect(idCode((smilesFromFrame(elements, coordinates) as { smiles: string }).smiles)).toBe(idCode('CN1C=CC(C=C1)=C1C=CN(C)C=C1'));
  });

  it('reports a radical (pentacene less one H) by its odd electron count, without searching', () => {
    const { elements, coordinates } = frameOf('c1ccc2cc3cc4cc5ccccc5cc4cc3cc2c1');
    const h = elements.indexOf('H');
    const result = smilesFromFrame(elements.filter((_, a) => a !== h), coordinates.filter((_, a) => a !== h));
    expect(result).toEqual({ problem: expect.stringMatching(/^bonds uncertain: an odd number of electrons \(neutral\)/) });
  });

  it('reports a frame it cannot bond instead of throwing', () => {
    expect(smilesFromFrame(['O', 'H'], [[0, 0, 0], [0, 0, 0.2]])).toEqual({ problem: expect.stringMatching(/atoms 1 \(O\) and 2 \(H\) are 0\.200 Å apart/) });
    expect(smilesFromFrame(['U', 'F'], [[0, 0, 0], [0, 0, 2]])).toEqual({ problem: expect.stringMatching(/no covalent radius for "U"/) });
  });
});

describe('a net charge in the comment line', () => {
  it('reads "charge=-1", "Charge: +2" and "charge 1", and nothing from other numbers', () => {
    expect(chargeFromComment('acetate charge=-1')).toBe(-1);
    expect(chargeFromComment('dication, Charge: +2')).toBe(2);
    expect(chargeFromComment('charge 1 multiplicity 1')).toBe(1);
    expect(chargeFromComment('energy -76.4 hartree')).toBeUndefined();
    expect(chargeFromComment('charge 0.5')).toBeUndefined();
  });
});
