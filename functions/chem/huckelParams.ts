// Heteroatom parameters for simple Hückel theory: α_X = α + h_X·β and β_XY = k_XY·β (β < 0).
//
// Two published sets, selectable by name:
// - "streitwieser" (default): A. Streitwieser, Jr., Molecular Orbital Theory for Organic Chemists
//   (Wiley, 1961), Table 5-1 (p. 135), the "recommended" values. Transcribed from memory; they
//   agree with the table as it is commonly reproduced. The set gives k only for bonds to carbon.
//   Streitwieser's table has no sulfur or phosphorus, so for those centres (thione/thiophene S,
//   phosphinine/phosphole P) and their bonds to carbon this set takes Van-Catledge's values below.
//   Both tables put α_C = α and β_CC = β, so the borrowed h and k sit on the same scale.
// - "van-catledge": F. A. Van-Catledge, "A Pariser-Parr-Pople-based set of Hückel molecular orbital
//   parameters", J. Org. Chem. 45, 4801–4802 (1980), Table I: h_X and k_XY for every pair of the
//   listed centre types. Values as commonly reproduced from that table (not checked against the
//   printed page here).
//
// Centre types (the electron count is what the atom gives to the π system):
//   N1 pyridine/imine/nitrile N (1 e)      N2 pyrrole/amine/amide N (2 e)     N+ pyridinium N (1 e)
//   O1 carbonyl O (1 e)                     O2 ether/hydroxyl/furan O (2 e)    O+ pyrylium O (1 e)
//   S1 thione S (1 e)                       S2 thiophene/thioether S (2 e)
//   P1 phosphinine-type P (1 e)             P2 phosphole/phosphine P (2 e)
//   B  trivalent boron, empty p (0 e)       F, Cl, Br halogens (2 e)           C carbon (0, 1 or 2 e)
import { ChemError } from './errors.js';

export type CentreType = 'C' | 'B' | 'N1' | 'N2' | 'N+' | 'O1' | 'O2' | 'O+' | 'S1' | 'S2' | 'P1' | 'P2' | 'F' | 'Cl' | 'Br';

export type ParameterSetName = 'streitwieser' | 'van-catledge';

export const PARAMETER_SET_NAMES: ParameterSetName[] = ['streitwieser', 'van-catledge'];

export const DEFAULT_PARAMETER_SET: ParameterSetName = 'streitwieser';

interface ParameterSet {
  h: Partial<Record<CentreType, number>>;
  /** k keyed by the two centre types joined with '|' in sorted order (see pairKey). */
  k: Record<string, number>;
}

function pairKey(a: CentreType, b: CentreType) {
  return a < b ? `${a}|${b}` : `${b}|${a}`;
}

function table(entries: [CentreType, CentreType, number][]): Record<string, number> {
  return Object.fromEntries(entries.map(([a, b, k]) => [pairKey(a, b), k]));
}

/** Van-Catledge (1980), Table I — as commonly reproduced (no Br, N+ or O+ types in this set). */
const VAN_CATLEDGE: ParameterSet = {
  h: { B: -0.45, C: 0, N1: 0.51, N2: 1.37, O1: 0.97, O2: 2.09, F: 2.71, Cl: 1.48, S1: 0.46, S2: 1.11, P1: 0.19, P2: 0.75 },
  k: table([
    ['B', 'B', 0.87], ['B', 'C', 0.73], ['B', 'Cl', 0.41], ['B', 'F', 0.26], ['B', 'N1', 0.66], ['B', 'N2', 0.53],
    ['B', 'O1', 0.6], ['B', 'O2', 0.35], ['B', 'P1', 0.53], ['B', 'P2', 0.54], ['B', 'S1', 0.51], ['B', 'S2', 0.44],
    ['C', 'C', 1.0], ['C', 'Cl', 0.62], ['C', 'F', 0.52], ['C', 'N1', 1.02], ['C', 'N2', 0.89], ['C', 'O1', 1.06],
    ['C', 'O2', 0.66], ['C', 'P1', 0.77], ['C', 'P2', 0.76], ['C', 'S1', 0.81], ['C', 'S2', 0.69],
    ['Cl', 'Cl', 0.68], ['Cl', 'F', 0.51], ['Cl', 'N1', 0.77], ['Cl', 'N2', 0.8], ['Cl', 'O1', 0.88], ['Cl', 'O2', 0.7],
    ['Cl', 'P1', 0.35], ['Cl', 'P2', 0.55], ['Cl', 'S1', 0.52], ['Cl', 'S2', 0.59],
    ['F', 'F', 1.04], ['F', 'N1', 0.65], ['F', 'N2', 0.77], ['F', 'O1', 0.92], ['F', 'O2', 0.94], ['F', 'P1', 0.21],
    ['F', 'P2', 0.22], ['F', 'S1', 0.28], ['F', 'S2', 0.32],
    ['N1', 'N1', 1.09], ['N1', 'N2', 0.99], ['N1', 'O1', 1.14], ['N1', 'O2', 0.8], ['N1', 'P1', 0.78], ['N1', 'P2', 0.81],
    ['N1', 'S1', 0.83], ['N1', 'S2', 0.78],
    ['N2', 'N2', 0.98], ['N2', 'O1', 1.13], ['N2', 'O2', 0.89], ['N2', 'P1', 0.55], ['N2', 'P2', 0.64], ['N2', 'S1', 0.68],
    ['N2', 'S2', 0.73],
    ['O1', 'O1', 1.26], ['O1', 'O2', 1.02], ['O1', 'P1', 0.75], ['O1', 'P2', 0.82], ['O1', 'S1', 0.84], ['O1', 'S2', 0.85],
    ['O2', 'O2', 0.95], ['O2', 'P1', 0.31], ['O2', 'P2', 0.39], ['O2', 'S1', 0.43], ['O2', 'S2', 0.54],
    ['P1', 'P1', 0.63], ['P1', 'P2', 0.58], ['P1', 'S1', 0.65], ['P1', 'S2', 0.48],
    ['P2', 'P2', 0.63], ['P2', 'S1', 0.65], ['P2', 'S2', 0.6],
    ['S1', 'S1', 0.68], ['S1', 'S2', 0.58], ['S2', 'S2', 0.63],
  ]),
};

/** Centre types Streitwieser's table lacks; the default set borrows Van-Catledge's values for them. */
export const BORROWED_CENTRE_TYPES: readonly CentreType[] = ['S1', 'S2', 'P1', 'P2'];

/** Streitwieser (1961), Table 5-1 — from memory, as commonly reproduced; S and P from Van-Catledge (1980). */
const STREITWIESER_TABLE: ParameterSet = {
  h: { C: 0, B: -1.0, N1: 0.5, N2: 1.5, 'N+': 2.0, O1: 1.0, O2: 2.0, 'O+': 2.5, F: 3.0, Cl: 2.0, Br: 1.5 },
  k: table([
    ['C', 'C', 1.0],
    ['C', 'B', 0.7],
    ['C', 'N1', 1.0],
    ['C', 'N2', 0.8],
    ['C', 'N+', 1.0],
    ['C', 'O1', 1.0],
    ['C', 'O2', 0.8],
    ['C', 'O+', 1.0],
    ['C', 'F', 0.7],
    ['C', 'Cl', 0.4],
    ['C', 'Br', 0.3],
  ]),
};

const STREITWIESER: ParameterSet = {
  h: { ...STREITWIESER_TABLE.h, ...Object.fromEntries(BORROWED_CENTRE_TYPES.map((t) => [t, VAN_CATLEDGE.h[t]])) },
  k: { ...STREITWIESER_TABLE.k, ...Object.fromEntries(BORROWED_CENTRE_TYPES.map((t) => [pairKey('C', t), VAN_CATLEDGE.k[pairKey('C', t)]])) },
};

const SETS: Record<ParameterSetName, ParameterSet> = { streitwieser: STREITWIESER, 'van-catledge': VAN_CATLEDGE };

/** Reads the params argument ("" or omitted means the default set), case-insensitively. */
export function parseParameterSet(text: string | undefined): ParameterSetName {
  const name = (text ?? '').trim().toLowerCase();
  if (name === '') return DEFAULT_PARAMETER_SET;
  if ((PARAMETER_SET_NAMES as string[]).includes(name)) return name as ParameterSetName;
  throw new ChemError(`unknown Hückel parameter set '${text}': use "streitwieser" or "van-catledge"`);
}

/** h_X for a centre; `where` names the atom in the error message. */
export function coulombParameter(set: ParameterSetName, type: CentreType, where: string): number {
  const h = SETS[set].h[type];
  if (h === undefined) throw new ChemError(`the ${set} parameter set has no value for ${describeType(type)} (${where})${suggestOther(set, type)}`);
  return h;
}

/** k_XY for a bond between two centres; `where` names the bond in the error message. */
export function resonanceParameter(set: ParameterSetName, a: CentreType, b: CentreType, where: string): number {
  const k = SETS[set].k[pairKey(a, b)];
  if (k === undefined) {
    const hint = set === 'streitwieser' && a !== 'C' && b !== 'C' ? '; it gives k only for bonds to carbon — try "van-catledge"' : '';
    throw new ChemError(`the ${set} parameter set has no k for a ${a}–${b} bond (${where})${hint}`);
  }
  return k;
}

function suggestOther(set: ParameterSetName, type: CentreType): string {
  const other: ParameterSetName = set === 'streitwieser' ? 'van-catledge' : 'streitwieser';
  return SETS[other].h[type] !== undefined ? ` — try "${other}"` : '';
}

const TYPE_NAMES: Record<CentreType, string> = {
  C: 'carbon',
  B: 'boron',
  N1: 'pyridine-type N (1 π electron)',
  N2: 'pyrrole-type N (2 π electrons)',
  'N+': 'pyridinium-type N+',
  O1: 'carbonyl-type O (1 π electron)',
  O2: 'ether-type O (2 π electrons)',
  'O+': 'pyrylium-type O+',
  S1: 'thione-type S (1 π electron)',
  S2: 'thiophene-type S (2 π electrons)',
  P1: 'phosphinine-type P (1 π electron)',
  P2: 'phosphole-type P (2 π electrons)',
  F: 'fluorine',
  Cl: 'chlorine',
  Br: 'bromine',
};

export function describeType(type: CentreType): string {
  return TYPE_NAMES[type];
}
