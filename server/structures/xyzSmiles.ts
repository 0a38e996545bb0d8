// SMILES for an XYZ frame, which carries only elements and coordinates: bonds, bond orders and formal
// charges are perceived from the geometry (functions/chem/bondPerception.ts), then openchemlib builds
// the molecule with the frame's own coordinates (so stereo centres and double-bond geometry are read
// from them) and writes its isomeric SMILES.
import { Molecule } from 'openchemlib';
import { perceiveBonds } from '../../functions/chem/bondPerception.js';
import { ChemError } from '../../functions/chem/errors.js';

export type FrameSmiles = { smiles: string } | { problem: string };

/** The frame's SMILES, or why its bonds could not be perceived (never throws for a bad frame). */
export function smilesFromFrame(elements: readonly string[], coordinates: readonly (readonly [number, number, number])[], totalCharge = 0): FrameSmiles {
  let perception;
  try {
    perception = perceiveBonds(elements, coordinates, { totalCharge });
  } catch (e) {
    if (e instanceof ChemError) return { problem: e.message };
    throw e;
  }
  if (perception.uncertain) return { problem: `bonds uncertain: ${perception.uncertain}` };
  const molecule = new Molecule(elements.length, perception.bonds.length);
  perception.atomicNumbers.forEach((z, i) => {
    const atom = molecule.addAtom(z);
    molecule.setAtomX(atom, coordinates[i][0]);
    molecule.setAtomY(atom, coordinates[i][1]);
    molecule.setAtomZ(atom, coordinates[i][2]);
    if (perception.charges[i] !== 0) molecule.setAtomCharge(atom, perception.charges[i]);
  });
  for (const bond of perception.bonds) molecule.setBondOrder(molecule.addBond(bond.atoms[0], bond.atoms[1]), bond.order);
  return { smiles: molecule.toIsomericSmiles() };
}
