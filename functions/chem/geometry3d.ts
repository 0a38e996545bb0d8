// Three-dimensional structures for all-valence-electron methods, from the text in one cell:
// - XYZ text: lines "El x y z" in ångström, optionally headed by the atom count and a comment line
//   (the plain XYZ exchange format); lines may be separated by newlines or by ";" so that a short
//   molecule fits on one line of a formula. The comment line may state the net charge ("charge=-1");
// - a molfile or one SDF record (V2000/V3000) carrying 3D coordinates and every hydrogen;
// - otherwise SMILES: openchemlib adds the hydrogens, builds one conformer with its ConformerGenerator
//   (fixed seed, so the same text always gives the same geometry) and tidies it with its MMFF94s+
//   force field (T. A. Halgren, J. Comput. Chem. 17, 490 (1996); J. Comput. Chem. 20, 720 (1999)).
//   The conformer generator needs openchemlib's static resources, which are loaded by the environment
//   (Node or browser) before use — never from here, so this file stays free of Node-only calls.
import type { Molecule } from 'openchemlib';
import { openchemlib } from './openchemlib.js';
import { ChemError } from './errors.js';
import { chargeFromComment } from './xyzComment.js';

export type GeometrySource = 'xyz' | 'molfile' | 'smiles-conformer';

export interface Geometry3d {
  /** Element symbols, one per atom (hydrogens included). */
  elements: string[];
  /** Cartesian coordinates in ångström. */
  coordinates: [number, number, number][];
  /** Net charge from the structure (formal charges of SMILES/molfile; for XYZ the comment line's, else 0). */
  charge: number;
  /** The net charge an XYZ comment line states ("charge=-1"), when it states one. */
  commentCharge?: number;
  source: GeometrySource;
  /** For SMILES: whether the MMFF94s+ minimisation ran (false when the force field has no types for an atom). */
  forceFieldTidied?: boolean;
}

/** The seed of the conformer generator: one fixed number, so identical SMILES give identical geometry. */
export const CONFORMER_SEED = 20260;

export function geometrySourceOf(text: string): GeometrySource {
  const t = text.trim();
  if (/M {2}END|V[23]000/.test(t)) return 'molfile';
  const firstLine = xyzLines(t)[0].trim();
  // An element symbol followed by a number cannot start SMILES (a SMILES name follows a space but is
  // not numeric), so such a line is read as XYZ and a malformed one gets the XYZ message.
  if (/^\d+$/.test(firstLine) || /^[A-Za-z]{1,2}\s+[-+.\d]/.test(firstLine)) return 'xyz';
  return 'smiles-conformer';
}

/** Reads a structure from cell text; see the header for the three accepted forms. */
export function readGeometry(text: string): Geometry3d {
  const t = text.trim();
  if (t === '') throw new ChemError('empty structure: give SMILES, XYZ text ("O 0 0 0; H 0.96 0 0; …") or a molfile with 3D coordinates');
  const source = geometrySourceOf(t);
  if (source === 'xyz') return readXyz(t);
  if (source === 'molfile') return readMolfile(t);
  return conformerFromSmiles(t);
}

function normaliseSymbol(raw: string): string {
  return raw.charAt(0).toUpperCase() + raw.slice(1).toLowerCase();
}

/**
 * The lines of XYZ text: a cell holds a frame on one line with ";" between its lines, while text
 * with line breaks (pasted from a file) is split at those alone, so a ";" in its comment line stays
 * part of the comment.
 */
function xyzLines(text: string): string[] {
  const lines = text.split(/\r?\n/);
  return lines.length > 1 ? lines : text.split(';');
}

export function readXyz(text: string): Geometry3d {
  let lines = xyzLines(text).map((l) => l.trim());
  let commentCharge: number | undefined;
  if (/^\d+$/.test(lines[0])) {
    const count = Number(lines[0]);
    commentCharge = chargeFromComment(lines[1] ?? '');
    // The comment line may be empty; atoms start on the third line.
    const atomLines = lines.slice(2).filter((l) => l !== '');
    if (atomLines.length !== count) throw new ChemError(`XYZ text announces ${count} atoms but lists ${atomLines.length}`);
    lines = atomLines;
  } else lines = lines.filter((l) => l !== '');
  const elements: string[] = [];
  const coordinates: [number, number, number][] = [];
  lines.forEach((line, i) => {
    const parts = line.split(/[\s,]+/);
    const xyz = parts.slice(1, 4).map(Number);
    if (parts.length < 4 || !/^[A-Za-z]{1,2}$/.test(parts[0]) || xyz.some((v) => !Number.isFinite(v)))
      throw new ChemError(`XYZ line ${i + 1} "${line.slice(0, 40)}" is not "element x y z" (ångström)`);
    elements.push(normaliseSymbol(parts[0]));
    coordinates.push([xyz[0], xyz[1], xyz[2]]);
  });
  return { elements, coordinates, charge: commentCharge ?? 0, source: 'xyz', ...(commentCharge === undefined ? {} : { commentCharge }) };
}

/**
 * The net charge to solve a geometry with: the charge argument when given, else the structure's own.
 * A charge stated on an XYZ comment line is part of the structure as the user wrote it, so an argument
 * that contradicts it is refused rather than one of the two silently winning.
 */
export function netCharge(geometry: Geometry3d, charge?: number): number {
  if (charge === undefined) return geometry.charge;
  const stated = geometry.commentCharge;
  if (stated !== undefined && charge !== stated)
    throw new ChemError(`the charge argument is ${charge} but the XYZ comment line says charge=${stated}; give the charge in one place, or make the two agree`);
  return charge;
}

function fromOclMolecule(molecule: Molecule, source: GeometrySource): Geometry3d {
  const elements: string[] = [];
  const coordinates: [number, number, number][] = [];
  let charge = 0;
  for (let a = 0; a < molecule.getAllAtoms(); a++) {
    elements.push(molecule.getAtomLabel(a));
    coordinates.push([molecule.getAtomX(a), molecule.getAtomY(a), molecule.getAtomZ(a)]);
    charge += molecule.getAtomCharge(a);
  }
  return { elements, coordinates, charge, source };
}

export function readMolfile(text: string): Geometry3d {
  const record = text.split(/^\$\$\$\$/m)[0];
  const header = record.split(/\r?\n/)[1] ?? '';
  if (/^.{20}2D/.test(header)) throw new ChemError('the molfile holds 2D coordinates; all-valence methods need a 3D structure (or give SMILES to build one)');
  let molecule: Molecule;
  try {
    molecule = openchemlib().Molecule.fromMolfile(record);
  } catch (e) {
    throw new ChemError(`cannot read the molfile: ${e instanceof Error ? e.message : String(e)}`);
  }
  if (molecule.getAllAtoms() === 0) throw new ChemError('the molfile holds no atoms');
  molecule.ensureHelperArrays(openchemlib().Molecule.cHelperNeighbours);
  for (let a = 0; a < molecule.getAtoms(); a++)
    if (molecule.getImplicitHydrogens(a) > 0)
      throw new ChemError(`atom ${a + 1} (${molecule.getAtomLabel(a)}) of the molfile has hydrogens without coordinates; write every hydrogen as an atom`);
  return fromOclMolecule(molecule, 'molfile');
}

export function conformerFromSmiles(smiles: string): Geometry3d {
  let molecule: Molecule;
  try {
    molecule = openchemlib().Molecule.fromSmiles(smiles);
  } catch (e) {
    const raw = e instanceof Error ? e.message : String(e);
    throw new ChemError(`cannot read SMILES '${smiles}': ${raw.replace(/^.*?SmilesParser:\s*/, '').replace(/^Class\$\S+:\s*/, '')}`);
  }
  if (molecule.getAllAtoms() === 0) throw new ChemError(`cannot read SMILES '${smiles}': no atoms`);
  let conformer: Molecule | null;
  try {
    conformer = new (openchemlib().ConformerGenerator)(CONFORMER_SEED).getOneConformerAsMolecule(molecule);
  } catch (e) {
    if (/resources must be registered/.test(String(e)))
      throw new ChemError('3D structures from SMILES are not available here (the conformer data is not loaded); give XYZ text or a molfile with 3D coordinates');
    throw e;
  }
  if (!conformer) throw new ChemError(`no 3D conformer could be built for '${smiles}'; give XYZ text or a molfile instead`);
  // Single atoms and ions have nothing for a force field to move.
  let forceFieldTidied = false;
  if (conformer.getAllAtoms() > 1) {
    try {
      new (openchemlib().ForceFieldMMFF94)(conformer, 'MMFF94s+', {}).minimise({ maxIts: 4000 });
      forceFieldTidied = true;
    } catch {
      // MMFF94 has no types for some atoms (e.g. unusual ions); the generator's geometry is kept and
      // the geometry description says so.
    }
  }
  return { ...fromOclMolecule(conformer, 'smiles-conformer'), forceFieldTidied };
}

/**
 * The elements of a structure, hydrogens included, without building a conformer: what a spill size
 * needs before the (possibly deferred) solve. XYZ and molfile text are read as usual; SMILES counts
 * each atom and its implicit hydrogens.
 */
export function structureElements(text: string): string[] {
  const t = text.trim();
  if (geometrySourceOf(t) !== 'smiles-conformer') return readGeometry(t).elements;
  let molecule: Molecule;
  try {
    molecule = openchemlib().Molecule.fromSmiles(t);
  } catch {
    throw new ChemError(`cannot read SMILES '${t}'`);
  }
  molecule.ensureHelperArrays(openchemlib().Molecule.cHelperNeighbours);
  const out: string[] = [];
  for (let a = 0; a < molecule.getAllAtoms(); a++) {
    out.push(molecule.getAtomLabel(a));
    for (let h = 0; h < molecule.getImplicitHydrogens(a); h++) out.push('H');
  }
  return out;
}
