// Geometry of our MO level diagram for a diatomic species: the two atoms' valence levels at the
// sides, the molecular levels in the middle, electrons per orbital, and which atomic levels feed
// which molecular ones. Energies are qualitative (the order of functions/chem/moDiagram.ts, evenly
// spaced), so the picture says "not to scale". Pure, so the layout is tested without a browser.
import type { DiatomicAnalysis, FilledLevel } from '@functions/chem/diatomic.js';
import type { Element } from '@functions/chem/elements.js';

/** One orbital's electrons: 0, 1 (↑) or 2 (↑↓). */
export type OrbitalFilling = 0 | 1 | 2;

export interface DrawnLevel {
  label: string;
  character: 'bonding' | 'antibonding' | 'nonbonding' | 'atomic';
  /** Height in slots above the lowest level (qualitative energy). */
  slot: number;
  /** One entry per degenerate orbital, filled by Hund's rule. */
  orbitals: OrbitalFilling[];
}

export interface AtomSide {
  symbol: string;
  levels: DrawnLevel[];
}

export interface MoPicture {
  left: AtomSide;
  right: AtomSide;
  molecular: DrawnLevel[];
  /** Which atomic level (by side and index) correlates with which molecular level (by index). */
  links: { side: 'left' | 'right'; atomic: number; molecular: number }[];
  /** Highest slot used, for scaling the drawing. */
  topSlot: number;
}

/**
 * Spreads electrons over degenerate orbitals: one each with parallel spins first, then pairing
 * (Hund's rule of maximum multiplicity; Pauli: at most two per orbital).
 */
export function hundFilling(electrons: number, orbitals: number): OrbitalFilling[] {
  if (electrons < 0 || electrons > 2 * orbitals) throw new RangeError(`${electrons} electrons do not fit in ${orbitals} orbital(s)`);
  return Array.from({ length: orbitals }, (_, i) => (electrons >= orbitals + i + 1 ? 2 : electrons > i ? 1 : 0) as OrbitalFilling);
}

function molecularLevel(l: FilledLevel, slot: number): DrawnLevel {
  return { label: l.label, character: l.character, slot, orbitals: hundFilling(l.occupancy, l.capacity / 2) };
}

/** The neutral atom's valence levels: ns (and np for periods 2–3), filled s first. */
function atomLevels(e: Element, slots: { s: number; p: number | null }): DrawnLevel[] {
  const n = e.period;
  const sElectrons = Math.min(2, e.valenceElectrons);
  const levels: DrawnLevel[] = [{ label: `${n}s`, character: 'atomic', slot: slots.s, orbitals: hundFilling(sElectrons, 1) }];
  if (slots.p !== null) levels.push({ label: `${n}p`, character: 'atomic', slot: slots.p, orbitals: hundFilling(e.valenceElectrons - sElectrons, 3) });
  return levels;
}

/**
 * A rough stand-in for electronegativity to decide which atom's levels sit lower in a
 * heteronuclear species: more valence electrons (further right in the p block) and, between
 * periods, the smaller atom lies lower (the usual periodic trend, common practice).
 */
function pull(e: Element): number {
  return e.valenceElectrons - 0.5 * (e.period - 2);
}

export function layoutMoDiagram(a: DiatomicAnalysis): MoPicture {
  const molecular = a.levels.map((l, i) => molecularLevel(l, i));
  const [first, second] = a.species.atoms;
  const shift = a.species.homonuclear ? 0 : pull(first) === pull(second) ? 0 : 0.35;
  const lowerFirst = pull(first) > pull(second);
  const offset = (e: Element) => (shift === 0 ? 0 : (e === first) === lowerFirst ? -shift : shift);
  const links: MoPicture['links'] = [];
  let left: DrawnLevel[];
  let right: DrawnLevel[];

  if (a.diagram === 'one-s') {
    left = [{ label: '1s', character: 'atomic', slot: 0.5 + offset(first), orbitals: hundFilling(first.valenceElectrons, 1) }];
    right = [{ label: '1s', character: 'atomic', slot: 0.5 + offset(second), orbitals: hundFilling(second.valenceElectrons, 1) }];
    for (const side of ['left', 'right'] as const) links.push({ side, atomic: 0, molecular: 0 }, { side, atomic: 0, molecular: 1 });
  } else if (a.diagram === 'hydride') {
    // Levels 0–3: a σ pair, the partner's π pair (non-bonding), σ*. H 1s meets the σ levels.
    const hydrogenFirst = first.symbol === 'H';
    const partner = hydrogenFirst ? second : first;
    const hSide: DrawnLevel[] = [{ label: '1s', character: 'atomic', slot: 1.6, orbitals: hundFilling(1, 1) }];
    const partnerSide = atomLevels(partner, { s: 0, p: 2 });
    left = hydrogenFirst ? hSide : partnerSide;
    right = hydrogenFirst ? partnerSide : hSide;
    const hName = hydrogenFirst ? 'left' : 'right';
    const pName = hydrogenFirst ? 'right' : 'left';
    const bonding = a.levels.findIndex((l) => l.character === 'bonding');
    links.push({ side: hName, atomic: 0, molecular: bonding }, { side: hName, atomic: 0, molecular: 3 });
    links.push({ side: pName, atomic: 0, molecular: 0 }, { side: pName, atomic: 1, molecular: 2 }, { side: pName, atomic: 1, molecular: 3 });
    if (bonding !== 0) links.push({ side: pName, atomic: 1, molecular: bonding });
  } else {
    // sp diagrams: levels 0–1 come from the two ns orbitals, 2–5 from the np orbitals.
    left = atomLevels(first, { s: 0.5 + offset(first), p: 3.5 + offset(first) });
    right = atomLevels(second, { s: 0.5 + offset(second), p: 3.5 + offset(second) });
    for (const side of ['left', 'right'] as const) {
      links.push({ side, atomic: 0, molecular: 0 }, { side, atomic: 0, molecular: 1 });
      for (let m = 2; m < molecular.length; m++) links.push({ side, atomic: 1, molecular: m });
    }
  }
  const topSlot = Math.max(...molecular.map((l) => l.slot), ...left.map((l) => l.slot), ...right.map((l) => l.slot));
  return { left: { symbol: first.symbol, levels: left }, right: { symbol: second.symbol, levels: right }, molecular, links, topSlot };
}
