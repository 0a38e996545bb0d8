// Argument handling shared by the Diatomic family: the spreadsheet edge, where every value a cell
// can hold is turned into a species text or a clear ChemError.
import { knownFailuresSummary } from '../chem/knownFailures.js';
import { analyseDiatomic, parseOrdering, type DiatomicAnalysis } from '../chem/diatomic.js';
import { ORDERINGS, type OrderingChoice } from '../chem/moDiagram.js';
import { ChemError, type ErrorKind, type ParamSpec, type Table } from './types.js';

const EMPTY_SPECIES = 'species is empty: type a diatomic such as O2, NO+ or OH';
const PROPAGATED_KINDS: Record<string, ErrorKind> = { VALUE: 'VALUE', NUM: 'NUM', NA: 'NA', DIV_BY_ZERO: 'DIV_BY_ZERO', REF: 'REF' };

/** The species text from a cell value: text passes; numbers, logicals, empty cells and errors are named. */
export function speciesText(value: unknown): string {
  if (typeof value === 'string') return value;
  if (typeof value === 'number') throw new ChemError(`species must be text such as "O2", not the number ${value}`);
  if (typeof value === 'boolean') throw new ChemError(`species must be text such as "O2", not the logical value ${value ? 'TRUE' : 'FALSE'}`);
  if (value === null || value === undefined || typeof value === 'symbol') throw new ChemError(EMPTY_SPECIES);
  if (typeof value === 'object' && 'type' in value) {
    // An error already in the referenced cell travels on with its own type and message.
    const { type, message } = value as { type: string; message?: string };
    throw new ChemError(`the species cell holds an error (${type}${message ? ': ' + message : ''})`, PROPAGATED_KINDS[type] ?? 'VALUE');
  }
  throw new ChemError('species must be a single cell or text such as "O2"');
}

/** For parameters declared as `range` (so the engine never vectorises a spilling function): one cell only. */
export function speciesFromTable(table: Table): string {
  if (table.length !== 1 || table[0].length !== 1) {
    throw new ChemError(`species must be a single cell, not a ${table.length}×${table[0]?.length ?? 0} range`);
  }
  return speciesText(table[0][0]);
}

/** A text option; an empty argument or empty cell means the default (the first allowed value). */
function choice<T extends string>(value: unknown, what: string, allowed: readonly T[]): T {
  const text = String(value ?? '').trim().toLowerCase();
  if (text === '') return allowed[0];
  const found = allowed.find((a) => a === text);
  if (found) return found;
  throw new ChemError(`unknown ${what} '${String(value)}': use ${allowed.slice(0, -1).join(', ')} or ${allowed[allowed.length - 1]}`);
}

export const TERM_FORMATS = ['unicode', 'ascii'] as const;
export const CORE_STYLES = ['abbreviated', 'full'] as const;
export const ELECTRON_COUNTS = ['valence', 'total'] as const;

export const termFormat = (v: unknown) => choice(v, 'format', TERM_FORMATS);
export const coreStyle = (v: unknown) => choice(v, 'core style', CORE_STYLES);
export const electronCount = (v: unknown) => choice(v, 'count', ELECTRON_COUNTS);

/** "auto", "mixed" or "unmixed"; an empty argument means auto. */
export function orderingOf(value: unknown): OrderingChoice {
  const text = String(value ?? '');
  return text.trim() === '' ? 'auto' : parseOrdering(text);
}

/** The cached MO analysis for a cell's species and ordering arguments. */
export function analysisOf(species: unknown, ordering: unknown = 'auto'): DiatomicAnalysis {
  return analyseDiatomic(speciesText(species), orderingOf(ordering));
}

export const speciesParam: ParamSpec = {
  name: 'species',
  type: 'any',
  description: 'A diatomic molecule or ion, H to Ar, charge −3 to +3, as text: "O2", "O2+", "O2^2-", "O2(2-)", "CN-", "HeH+", "OH".',
};

export const orderingParam: ParamSpec = {
  name: 'ordering',
  type: 'string',
  description:
    'Order of the π(p) and σ(p) levels: "mixed" (π below σ, s–p mixing), "unmixed" (σ below π) or "auto" (mixed up to 10 valence electrons, unmixed from 11). Hydrides and H/He pairs have their own diagrams and ignore it.',
  optional: true,
  default: 'auto',
  choices: [...ORDERINGS],
};

export const MODEL_SOURCE =
  'Qualitative LCAO molecular-orbital diagrams filled by the Aufbau principle, the Pauli principle and Hund\'s rule ' +
  '(Atkins & de Paula, Physical Chemistry, "Molecular structure"). Ordering "auto": s–p mixed order (πu(2p) below σg(2p)) ' +
  'for species with ≤10 valence electrons (Li2…N2-like, CO, CN⁻, NO⁺; N2 photoelectron spectrum, Turner et al., ' +
  'Molecular Photoelectron Spectroscopy, 1970), unmixed from 11 (O2⁺, NO, O2, F2). Diatomic hydrides: H 1s meets the ' +
  'partner\'s σ orbitals, the partner\'s p π pair is non-bonding. Third-row atoms: n = 3 shells over a neon core, and the ' +
  'same ≤10-electron auto rule, which was set from second-row evidence and is not established for them (Si2 and Al2 come out wrong with it; ' +
  'try ordering "unmixed"). ' +
  'Single configuration, no spin–orbit coupling. Model estimates for screening, not measured data and not safety ' +
  'information: for reactive or toxic species (F2, ClO, NO…) defer to safety data sheets, local codes and qualified review.';

export const TERM_SOURCE =
  'Ground term from the open shell by enumerating microstates and applying Hund\'s rules (highest S, then highest Λ); ' +
  'Σ⁺/Σ⁻ from the reflection through a plane containing the axis (Herzberg, Spectra of Diatomic Molecules, 2nd ed., 1950). ' +
  'Agrees with the ground states tabulated by Huber & Herzberg, Constants of Diatomic Molecules (1979), for the common ' +
  'first- and second-row species (H2…F2, O2⁺, N2⁺, CO, CN, NO, OH, the hydrides) but not for all: simple filling gets these wrong — ' +
  knownFailuresSummary() +
  ' (experimental terms recalled from memory; MODELCAVEAT(species) returns the note for one species).';
