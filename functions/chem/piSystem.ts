// From a SMILES string to the π system of simple Hückel theory: which atoms carry a p orbital in the
// conjugated framework, how many π electrons each gives, and which centres are bonded.
//
// openchemlib parses the SMILES (and kekulizes aromatic input); the π system is found here from
// bonding, not from the library's aromaticity flag:
// - every atom in a double or triple bond is a π centre (one p orbital: the in-plane π bond of a
//   triple bond is orthogonal to the conjugated system and left out — common practice);
// - an atom without a multiple bond joins when it is bonded to such an atom and has a p orbital to
//   offer: carbocations, carbanions and carbon radicals with three σ bonds, and lone-pair donors
//   (pyrrole/amine N, ether/hydroxyl O, halogens, thioether S, trivalent B with an empty p orbital).
// π electrons per centre follow from counting valence electrons: an atom with σ bonds and formal
// charge q keeps its remaining in-plane orbitals as lone pairs, so
//   planar (sp2-like) centre:  e = V − q + σ − 6     (V valence electrons, σ number of σ bonds)
//   linear (sp) centre:        e = V − q + σ − 5     (one electron sits in the orthogonal π bond)
// which gives 1 for C in C=C, 0 for a carbocation, 2 for a carbanion, 1 for pyridine N, 2 for
// pyrrole N, 1 for carbonyl O, 2 for ether O and 2 for a halogen (common practice, e.g. Streitwieser
// 1961, ch. 5).
import type { Molecule } from 'openchemlib';
import { openchemlib } from './openchemlib.js';
import { ChemError } from './errors.js';
import type { CentreType } from './huckelParams.js';

export interface PiCentre {
  /** 1-based atom number: heavy atoms in the order the SMILES writes them. */
  atom: number;
  element: string;
  formalCharge: number;
  /** π electrons this atom gives to the system. */
  electrons: number;
  /** Parameter type, or undefined when no published parameter covers this centre (e.g. O⁻). */
  type: CentreType | undefined;
  /** Human label for messages, e.g. "O⁻ with 2 π electrons". */
  label: string;
}

export interface PiBond {
  /** Indices into PiSystem.centres. */
  a: number;
  b: number;
  /** Formal bond order in the Kekulé structure openchemlib assigned (1, 2 or 3). */
  order: number;
  /** True when the bond lies in a ring of the molecule (an exocyclic bond has false). */
  inRing: boolean;
}

export interface PiSystem {
  smiles: string;
  centres: PiCentre[];
  bonds: PiBond[];
  electrons: number;
  /** Number of heavy atoms (the range of valid atom numbers). */
  atomCount: number;
  /** Element symbol of each heavy atom (index = atom number − 1). */
  atomElements: string[];
  /** Centre index of each atom number, for atoms in the π system. */
  centreOfAtom: Map<number, number>;
  /** False when the SMILES writes hydrogens as atoms ([H]): the parser then renumbers heavy atoms. */
  numberingFollowsSmiles: boolean;
  /** Small rings (as openchemlib perceives them) made only of π centres, as centre indices. */
  rings: number[][];
  /** Every small ring of the molecule (openchemlib's ring set, up to 7 members), as 1-based atom numbers in ring order. */
  smallRings: number[][];
}

const VALENCE_ELECTRONS: Record<string, number> = { B: 3, C: 4, Si: 4, N: 5, P: 5, O: 6, S: 6, Se: 6, F: 7, Cl: 7, Br: 7, I: 7 };

/** Parses SMILES with openchemlib; a parse failure or an empty string becomes a ChemError. */
export function parseSmiles(smiles: string): Molecule {
  const text = smiles.trim();
  if (text === '') throw new ChemError('empty structure: give a SMILES string or a square range holding the Hückel matrix');
  checkBranches(text);
  let molecule: Molecule;
  try {
    molecule = openchemlib().Molecule.fromSmiles(text, { noCoordinates: true, noStereo: true });
  } catch (e) {
    const raw = e instanceof Error ? e.message : String(e);
    const reason = raw.replace(/^.*?SmilesParser:\s*/, '').replace(/^Class\$\S+:\s*/, '');
    throw new ChemError(`cannot read SMILES '${text}': ${reason}`);
  }
  if (molecule.getAllAtoms() === 0) throw new ChemError(`cannot read SMILES '${text}': no atoms`);
  molecule.ensureHelperArrays(openchemlib().Molecule.cHelperRings);
  checkCharges(molecule, text);
  checkAromaticRadicals(molecule, text);
  return molecule;
}

/** The atom tokens of a SMILES string in order: bracket atoms, Cl, Br and single organic-subset letters. */
function atomTokens(text: string): string[] {
  return text.match(/\[[^\]]*\]|Cl|Br|[BCNOPSFIbcnops]/g) ?? [];
}

/** SMILES text outside square brackets (bracket atoms replaced by a placeholder). */
function outsideBrackets(text: string): string {
  return text.replace(/\[[^\]]*\]/g, '*');
}

/**
 * Branch syntax, which openchemlib's parser forgives (it reads 'C(((' as methane): every '(' must be
 * closed, a ')' must close an open branch, and a branch may not be empty (OpenSMILES specification,
 * "Branches").
 */
function checkBranches(text: string) {
  const plain = outsideBrackets(text);
  let depth = 0;
  for (let i = 0; i < plain.length; i++) {
    const ch = plain[i];
    if (ch === '(') {
      if (plain[i + 1] === ')') throw new ChemError(`SMILES syntax error in '${text}': empty branch '()'`);
      if (i === 0) throw new ChemError(`SMILES syntax error in '${text}': a branch '(' needs an atom before it`);
      depth++;
    } else if (ch === ')') {
      if (depth === 0) throw new ChemError(`SMILES syntax error in '${text}': ')' closes no open branch`);
      depth--;
    }
  }
  if (depth > 0) throw new ChemError(`SMILES syntax error in '${text}': ${depth} branch${depth === 1 ? '' : 'es'} opened with '(' never closed`);
}

const SECOND_ROW = new Set(['B', 'C', 'N', 'O', 'F']);

/**
 * Refuses charges no real atom can carry, which would otherwise drop the atom from the π system
 * without a word: a charge that leaves fewer valence electrons than bonds ([CH2+5]), or, for B–F, more
 * than an octet around the atom ([CH2-2] with three bonds).
 */
function checkCharges(molecule: Molecule, text: string) {
  for (let i = 0; i < molecule.getAtoms(); i++) {
    const element = molecule.getAtomLabel(i);
    const valence = VALENCE_ELECTRONS[element];
    const charge = molecule.getAtomCharge(i);
    if (valence === undefined || charge === 0) continue;
    let bondElectrons = molecule.getAllHydrogens(i);
    for (let n = 0; n < molecule.getConnAtoms(i); n++) bondElectrons += molecule.getConnBondOrder(i, n);
    const own = valence - charge;
    const shown = `${charge > 0 ? '+' : '−'}${Math.abs(charge)}`;
    if (own < bondElectrons)
      throw new ChemError(`atom ${i + 1} (${element}) with charge ${shown} in '${text}' keeps ${own} valence electron${own === 1 ? '' : 's'} for ${bondElectrons} bonding electrons: no atom can carry that charge here`);
    if (SECOND_ROW.has(element) && own + bondElectrons > 8)
      throw new ChemError(`atom ${i + 1} (${element}) with charge ${shown} in '${text}' would hold ${own + bondElectrons} electrons, more than an octet: no such ${element} exists`);
  }
}

/**
 * Lowercase (aromatic) SMILES that cannot be kekulized as written make openchemlib put a radical on an
 * atom (c1cccc1 becomes the cyclopentadienyl radical). Say so, rather than quietly compute a radical
 * the user may not have meant.
 */
function checkAromaticRadicals(molecule: Molecule, text: string) {
  if (!/[bcnops]/.test(outsideBrackets(text))) return;
  const tokens = atomTokens(text);
  for (let i = 0; i < molecule.getAtoms(); i++) {
    if (molecule.getAtomRadical(i) === 0) continue;
    // A radical the user wrote on purpose (an uppercase bracket atom such as [CH]) is kept.
    if (!/^\[?\d*[a-z]/.test(tokens[i] ?? '')) continue;
    throw new ChemError(
      `'${text}' was read as a radical: its aromatic ring has no Kekulé structure without an unpaired electron on atom ${i + 1} (${molecule.getAtomLabel(i)}). Write the species meant explicitly, e.g. [cH-]1cccc1 for the anion, [cH+]1cccc1 for the cation or C1=CC=C[CH]1 for the radical`,
    );
  }
}

function chargeSuffix(q: number) {
  return q === 0 ? '' : q > 0 ? (q === 1 ? '⁺' : `${q}⁺`) : q === -1 ? '⁻' : `${-q}⁻`;
}

function centreType(element: string, electrons: number, charge: number): CentreType | undefined {
  const key = `${element}:${electrons}:${charge}`;
  const types: Record<string, CentreType> = {
    'B:0:0': 'B',
    'N:1:0': 'N1',
    'N:2:0': 'N2',
    'N:1:1': 'N+',
    'O:1:0': 'O1',
    'O:2:0': 'O2',
    'O:1:1': 'O+',
    'S:1:0': 'S1',
    'S:2:0': 'S2',
    'P:1:0': 'P1',
    'P:2:0': 'P2',
    'F:2:0': 'F',
    'Cl:2:0': 'Cl',
    'Br:2:0': 'Br',
  };
  if (element === 'C') return 'C';
  return types[key];
}

interface Candidate {
  index: number;
  element: string;
  charge: number;
  electrons: number;
  inMultipleBond: boolean;
}

/** Classifies one heavy atom: a π-centre candidate, or undefined when it has no p orbital to give. */
function classifyAtom(molecule: Molecule, index: number): Candidate | undefined {
  const element = molecule.getAtomLabel(index);
  const charge = molecule.getAtomCharge(index);
  const sigma = molecule.getConnAtoms(index) + molecule.getAllHydrogens(index);
  const piBonds = molecule.getAtomPi(index);
  const valence = VALENCE_ELECTRONS[element];
  const where = `atom ${index + 1} (${element})`;
  if (piBonds > 0) {
    if (valence === undefined) throw new ChemError(`${where} is in a multiple bond, but simple Hückel theory here covers only B, C, N, O, F, Si, P, S, Cl, Se, Br and I`);
    let doubleBonds = 0;
    let tripleBonds = 0;
    for (let i = 0; i < molecule.getConnAtoms(index); i++) {
      const order = molecule.getConnBondOrder(index, i);
      if (order === 2) doubleBonds++;
      if (order === 3) tripleBonds++;
    }
    if (doubleBonds >= 2)
      throw new ChemError(`${where} has two cumulated double bonds (allene-type): their π bonds are orthogonal, so it has no single p orbital for simple Hückel theory`);
    const electrons = valence - charge + sigma - (tripleBonds > 0 ? 5 : 6);
    if (electrons < 0)
      throw new ChemError(
        `${where} has only ${sigma} σ bond${sigma === 1 ? '' : 's'} besides its multiple bond (under-coordinated): write its hydrogens (e.g. [CH]) or its charge, or leave the brackets off for the usual valence`,
      );
    if (electrons > 2)
      throw new ChemError(`${where} has ${sigma} σ bonds and a multiple bond (hypervalent); simple Hückel theory needs planar centres with at most three σ bonds`);
    return { index, element, charge, electrons, inMultipleBond: true };
  }
  if (valence === undefined || sigma > 3 || sigma === 0) return undefined;
  const electrons = valence - charge + sigma - 6;
  if (electrons < 0 || electrons > 2) return undefined;
  return { index, element, charge, electrons, inMultipleBond: false };
}

/** Finds the π system of a parsed molecule (see the rules at the top of this file). */
export function findPiSystem(smiles: string, molecule: Molecule = parseSmiles(smiles)): PiSystem {
  const atomCount = molecule.getAtoms();
  const candidates = new Map<number, Candidate>();
  for (let i = 0; i < atomCount; i++) {
    const c = classifyAtom(molecule, i);
    if (c) candidates.set(i, c);
  }
  const bondedToMultiple = (i: number) => {
    for (let n = 0; n < molecule.getConnAtoms(i); n++) if (candidates.get(molecule.getConnAtom(i, n))?.inMultipleBond) return true;
    return false;
  };
  const centres: PiCentre[] = [];
  const centreOfAtom = new Map<number, number>();
  for (const c of candidates.values()) {
    if (!c.inMultipleBond && !bondedToMultiple(c.index)) continue;
    centreOfAtom.set(c.index + 1, centres.length);
    const type = centreType(c.element, c.electrons, c.charge);
    const label = `${c.element}${chargeSuffix(c.charge)} with ${c.electrons} π electron${c.electrons === 1 ? '' : 's'}`;
    centres.push({ atom: c.index + 1, element: c.element, formalCharge: c.charge, electrons: c.electrons, type, label });
  }
  if (centres.length === 0)
    throw new ChemError(`no π system in '${smiles.trim()}': no atom is in a double or triple bond (a saturated molecule has no Hückel π levels)`);

  const bonds: PiBond[] = [];
  for (let b = 0; b < molecule.getBonds(); b++) {
    const ca = centreOfAtom.get(molecule.getBondAtom(0, b) + 1);
    const cb = centreOfAtom.get(molecule.getBondAtom(1, b) + 1);
    if (ca !== undefined && cb !== undefined) bonds.push({ a: ca, b: cb, order: molecule.getBondOrder(b), inRing: molecule.isRingBond(b) });
  }

  const ringSet = molecule.getRingSet();
  const rings: number[][] = [];
  const smallRings: number[][] = [];
  for (let r = 0; r < ringSet.getSize(); r++) {
    smallRings.push(ringSet.getRingAtoms(r).map((a) => a + 1));
    const members = ringSet.getRingAtoms(r).map((a) => centreOfAtom.get(a + 1));
    if (members.every((m) => m !== undefined)) rings.push(members as number[]);
  }

  return {
    smiles: smiles.trim(),
    centres,
    bonds,
    electrons: centres.reduce((sum, c) => sum + c.electrons, 0),
    atomCount,
    atomElements: Array.from({ length: atomCount }, (_, i) => molecule.getAtomLabel(i)),
    centreOfAtom,
    numberingFollowsSmiles: molecule.getAllAtoms() === atomCount,
    rings,
    smallRings,
  };
}
