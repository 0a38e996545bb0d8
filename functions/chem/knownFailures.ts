// Species whose ground state the single-configuration, Aufbau-filled MO diagrams here get wrong
// against experiment. Experimental terms: K. P. Huber & G. Herzberg, Molecular Spectra and Molecular
// Structure IV. Constants of Diatomic Molecules (Van Nostrand Reinhold, 1979) — RECALLED FROM MEMORY,
// not re-read from the tables. The model's own answers (auto ordering) are checked by
// tests/chem-known-failures.test.ts, so this list cannot drift from what the functions return.
import type { Species } from './species.js';

export interface KnownFailure {
  /** Canonical spelling as written in the list. */
  species: string;
  /** Experimental ground term (Huber & Herzberg 1979, recalled from memory). */
  experimentalTerm: string;
  /** What the model gives and why it differs. */
  note: string;
}

export const KNOWN_GROUND_STATE_FAILURES: KnownFailure[] = [
  {
    species: 'Si2',
    experimentalTerm: 'X ³Σg⁻',
    note: 'the auto (s–p mixed) order gives ¹Σg⁺ with πu(3p)⁴; experiment has σg(3p)² πu(3p)², which the "unmixed" order reproduces',
  },
  {
    species: 'C2+',
    experimentalTerm: 'X ⁴Σg⁻',
    note: 'the model gives ²Πu (πu³); near-degenerate σu*, πu and σg levels make the high-spin ⁴Σg⁻ lowest, beyond simple filling',
  },
  { species: 'BN', experimentalTerm: 'X ³Π', note: 'the model gives ¹Σ⁺ (closed 1π⁴ shell); 1π and 5σ lie close, so the open-shell ³Π is lowest' },
  { species: 'SiC', experimentalTerm: 'X ³Π', note: 'the model gives ¹Σ⁺ (closed π⁴ shell); as for BN, an open π³σ¹ shell is lowest' },
  { species: 'AlN', experimentalTerm: 'X ³Π', note: 'the model gives ¹Σ⁺ (closed π⁴ shell); as for BN, an open π³σ¹ shell is lowest' },
  {
    species: 'P2',
    experimentalTerm: 'X ¹Σg⁺',
    note: 'the term is right, but the model\'s HOMO is σg(3p); the photoelectron spectrum puts πu(3p) highest (the third-row order differs from N2\'s)',
  },
  { species: 'P2+', experimentalTerm: 'X ²Πu', note: 'the model removes the electron from σg(3p) and gives ²Σg⁺; the ion has the hole in πu(3p)' },
  { species: 'Al2', experimentalTerm: 'X ³Πu', note: 'the model gives ³Σg⁻ (πu²); experiment has σg¹πu¹ ³Πu lowest with ³Σg⁻ only slightly above' },
  {
    species: 'Be2',
    experimentalTerm: 'X ¹Σg⁺',
    note: 'the term is right, but the model\'s bond order 0 says unbound; Be2 is weakly bound (well depth about 0.1 eV) by electron correlation',
  },
  { species: 'Mg2', experimentalTerm: 'X ¹Σg⁺', note: 'bond order 0 in the model; Mg2 is a weakly bound van der Waals molecule (well depth about 0.05 eV)' },
];

const key = (symbols: string[], charge: number) => `${[...symbols].sort().join('')}|${charge}`;

const SPECIES_KEYS: Record<string, string> = {
  Si2: key(['Si', 'Si'], 0),
  'C2+': key(['C', 'C'], 1),
  BN: key(['B', 'N'], 0),
  SiC: key(['C', 'Si'], 0),
  AlN: key(['Al', 'N'], 0),
  P2: key(['P', 'P'], 0),
  'P2+': key(['P', 'P'], 1),
  Al2: key(['Al', 'Al'], 0),
  Be2: key(['Be', 'Be'], 0),
  Mg2: key(['Mg', 'Mg'], 0),
};

const byKey = new Map(KNOWN_GROUND_STATE_FAILURES.map((f) => [SPECIES_KEYS[f.species], f]));

/** The known disagreement for a parsed species (order of the atoms and spelling do not matter), if any. */
export function knownFailureFor(species: Species): KnownFailure | undefined {
  return byKey.get(key(species.atoms.map((a) => a.symbol), species.charge));
}

/** One sentence per species, for help texts and docs. */
export function knownFailuresSummary(): string {
  return KNOWN_GROUND_STATE_FAILURES.map((f) => `${f.species} (experiment ${f.experimentalTerm}: ${f.note})`).join('; ');
}
