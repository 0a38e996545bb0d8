// Valence electronic structure of a diatomic species: fill the diagram's levels lowest first
// (Aufbau), two electrons per spatial orbital (Pauli), spreading electrons over a degenerate π pair
// with parallel spins (Hund) — the ground term is then derived from the open shell's microstates.
//
// Model assumptions, stated once: a single configuration; the level order of moDiagram.ts; no
// spin–orbit coupling (so ²Π is one term, degeneracy 4, rather than ²Π½ and ²Π3/2); the spin-only
// magnetic moment. Where two configurations lie close, nature may pick the other one: C2⁺ is X⁴Σg⁻
// (πu² σg¹) and Si2 X³Σg⁻ (σg² πu²) in Huber & Herzberg (1979), while strict Aufbau on the mixed
// order gives ²Πu and ¹Σg⁺. These are model estimates, not measurements.
//
// Results are cached per (ordering, species text): a screening column repeats a few species many
// thousands of times, so a repeat costs two Map lookups.
import { ChemError } from './errors.js';
import { buildDiagram, ORDERINGS, type DiagramKind, type MoLevel, type OrderingChoice } from './moDiagram.js';
import { parseSpecies, type Species } from './species.js';
import { formatTerm, groundTerm, superscriptNumber, termDegeneracy, type MolecularTerm } from './terms.js';
import { TextMemo } from './textMemo.js';

export interface FilledLevel extends MoLevel {
  occupancy: number;
}

export interface DiatomicAnalysis {
  species: Species;
  diagram: DiagramKind;
  /** Valence levels in energy order, with their electrons. */
  levels: FilledLevel[];
  /** (bonding − antibonding valence electrons) / 2; core shells cancel. */
  bondOrder: number;
  /** 2S of the ground term: Hund's rule leaves this many electrons unpaired. */
  unpairedElectrons: number;
  term: MolecularTerm;
  termUnicode: string;
  termAscii: string;
  /** (2S+1)·(2 if Λ > 0 else 1). */
  degeneracy: number;
  /** Spin-only moment √(n(n+2)) in Bohr magnetons. */
  spinMomentBohr: number;
  /** Highest level holding an electron; for an open shell, the partly filled level. */
  homo: FilledLevel;
  /** Lowest level with a vacancy (a partly filled level counts), or null if the valence set is full. */
  lumo: FilledLevel | null;
  configAbbreviated: string;
  configFull: string;
}

export function parseOrdering(value: string): OrderingChoice {
  const ordering = value.trim().toLowerCase();
  if ((ORDERINGS as string[]).includes(ordering)) return ordering as OrderingChoice;
  throw new ChemError(`unknown ordering '${value}': use auto, mixed or unmixed`);
}

function fill(levels: MoLevel[], electrons: number): FilledLevel[] {
  let left = electrons;
  return levels.map((l) => {
    const occupancy = Math.min(left, l.capacity);
    left -= occupancy;
    return { ...l, occupancy };
  });
}

function writeConfiguration(core: string, levels: FilledLevel[]): string {
  const valence = levels.filter((l) => l.occupancy > 0).map((l) => `${l.label}${superscriptNumber(l.occupancy)}`);
  return [core, ...valence].filter(Boolean).join(' ');
}

function analyse(species: Species, ordering: OrderingChoice): DiatomicAnalysis {
  const diagram = buildDiagram(species, ordering);
  const capacity = diagram.levels.reduce((n, l) => n + l.capacity, 0);
  if (species.valenceElectrons > capacity) {
    throw new ChemError(
      `'${species.text}' has ${species.valenceElectrons} valence electrons; its valence orbitals hold at most ${capacity}`,
    );
  }
  const levels = fill(diagram.levels, species.valenceElectrons);
  const electronsOf = (c: MoLevel['character']) => levels.reduce((n, l) => n + (l.character === c ? l.occupancy : 0), 0);
  const bondOrder = (electronsOf('bonding') - electronsOf('antibonding')) / 2;

  const openShells = levels
    .filter((l) => l.occupancy > 0 && l.occupancy < l.capacity)
    .map((l) => (l.parity ? { lambda: l.lambda, electrons: l.occupancy, parity: l.parity } : { lambda: l.lambda, electrons: l.occupancy }));
  const term = groundTerm(openShells, species.homonuclear);
  const unpairedElectrons = term.twoS;

  let homo = levels[0];
  for (const l of levels) if (l.occupancy > 0) homo = l;
  const lumo = levels.find((l) => l.occupancy < l.capacity) ?? null;

  return {
    species,
    diagram: diagram.kind,
    levels,
    bondOrder,
    unpairedElectrons,
    term,
    termUnicode: formatTerm(term, 'unicode'),
    termAscii: formatTerm(term, 'ascii'),
    degeneracy: termDegeneracy(term),
    spinMomentBohr: Math.sqrt(unpairedElectrons * (unpairedElectrons + 2)),
    homo,
    lumo,
    configAbbreviated: writeConfiguration(diagram.coreAbbreviation, levels),
    configFull: writeConfiguration(diagram.coreFull, levels),
  };
}

/** One bounded memo per ordering, keyed by the species text (rejections remembered too: textMemo.ts). */
const CACHE_LIMIT = 20_000;
const caches: Record<OrderingChoice, TextMemo<DiatomicAnalysis>> = {
  auto: new TextMemo(CACHE_LIMIT),
  mixed: new TextMemo(CACHE_LIMIT),
  unmixed: new TextMemo(CACHE_LIMIT),
};

/** The cached analysis of a species text under an ordering. Throws ChemError for bad or unsupported species. */
export function analyseDiatomic(speciesText: string, ordering: OrderingChoice = 'auto'): DiatomicAnalysis {
  return caches[ordering].get(speciesText, () => analyse(parseSpecies(speciesText), ordering));
}

/** How many analyses were actually computed (cache misses) since the last reset: for tests and benchmarks. */
export function diatomicAnalysisCount(): number {
  return Object.values(caches).reduce((sum, c) => sum + c.misses, 0);
}

export function clearDiatomicCache(): void {
  for (const c of Object.values(caches)) c.clear();
}
