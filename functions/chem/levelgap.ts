// HOMO–LUMO gap of a set of orbital energies filled by the aufbau principle.
//
// Conventions (common practice in LCAO and Hückel work):
// - Levels are filled from the lowest energy up, two electrons per orbital (Pauli), whatever
//   order they are listed in.
// - Orbitals whose energies agree within a tolerance form one degenerate level holding 2g electrons.
//   The tolerance is relative, so the unit does not matter (eV, hartree, |β| or joules ~1e-19):
//   1e-9 of the spread of the levels, but never below 1e-12 of the largest |E| (rounding of the
//   energies themselves); all-equal levels are one degenerate level.
// - The HOMO level is the highest level holding an electron. If it is a degenerate level that is
//   only partly filled, HOMO and LUMO lie in the same level and the gap is 0 (the Hückel reading
//   of open-shell degenerate systems such as cyclobutadiene, 4 π electrons in two nonbonding MOs).
// - A singly occupied non-degenerate orbital counts as the HOMO (SOMO); the LUMO is the next level.
// The gap is E(LUMO) − E(HOMO) in the unit of the energies given.
import { ChemError } from './errors.js';

export interface DegenerateLevel {
  energy: number;
  degeneracy: number;
}

const RELATIVE_TOLERANCE = 1e-9;
const ROUNDING_TOLERANCE = 1e-12;

/** Sorts and groups orbital energies into degenerate levels. */
export function groupLevels(orbitalEnergies: number[]): DegenerateLevel[] {
  const sorted = [...orbitalEnergies].sort((x, y) => x - y);
  const spread = sorted.length > 0 ? sorted[sorted.length - 1] - sorted[0] : 0;
  const largest = Math.max(0, ...sorted.map(Math.abs));
  const tolerance = Math.max(RELATIVE_TOLERANCE * spread, ROUNDING_TOLERANCE * largest);
  const levels: DegenerateLevel[] = [];
  for (const energy of sorted) {
    const last = levels[levels.length - 1];
    if (last && Math.abs(energy - last.energy) <= tolerance) last.degeneracy += 1;
    else levels.push({ energy, degeneracy: 1 });
  }
  return levels;
}

/**
 * Turns cells (a range, an inline array or a spilled result) into orbital energies. Empty cells
 * are skipped so a partly filled column can be passed; any other non-number is an error.
 */
export function orbitalEnergiesFromCells(cells: unknown[][]): number[] {
  const energies: number[] = [];
  cells.forEach((row, r) =>
    row.forEach((cell, c) => {
      if (cell === '' || cell === null || cell === undefined) return;
      if (typeof cell !== 'number' || !Number.isFinite(cell)) {
        const shown = typeof cell === 'string' ? `'${cell}'` : String(cell);
        throw new ChemError(`levels must be numbers (orbital energies); found ${shown} at row ${r + 1}, column ${c + 1} of the list`);
      }
      energies.push(cell);
    }),
  );
  return energies;
}

export interface FrontierLevels {
  homo: number;
  lumo: number;
  gap: number;
}

export function frontierLevels(orbitalEnergies: number[], electrons: number): FrontierLevels {
  if (orbitalEnergies.length === 0) throw new ChemError('no orbital energies given');
  if (!Number.isInteger(electrons)) throw new ChemError(`electrons must be a whole number, got ${electrons}`);
  // Electron counts that do not fit are #VALUE!, as in the diatomic and Hückel families.
  if (electrons < 1) throw new ChemError(`electrons must be at least 1 to have a HOMO, got ${electrons}`);
  const capacity = 2 * orbitalEnergies.length;
  if (electrons > capacity) {
    throw new ChemError(`${electrons} electrons do not fit in ${orbitalEnergies.length} orbitals (room for ${capacity})`);
  }
  if (electrons === capacity) {
    throw new ChemError(`${electrons} electrons fill all ${orbitalEnergies.length} orbitals; there is no LUMO`);
  }
  const levels = groupLevels(orbitalEnergies);
  let remaining = electrons;
  for (let i = 0; i < levels.length; i++) {
    const room = 2 * levels[i].degeneracy;
    if (remaining > room) {
      remaining -= room;
      continue;
    }
    const homo = levels[i].energy;
    const partlyFilledDegenerate = remaining < room && levels[i].degeneracy > 1;
    if (partlyFilledDegenerate) return { homo, lumo: homo, gap: 0 };
    const next = levels[i + 1];
    // Only a singly occupied top orbital can lack a level above (electrons < capacity).
    if (!next) throw new ChemError(`the HOMO is the highest orbital given (singly occupied); there is no LUMO`);
    return { homo, lumo: next.energy, gap: next.energy - homo };
  }
  throw new ChemError('internal: electrons left over after filling'); // unreachable: capacity checked above
}

export function levelGap(orbitalEnergies: number[], electrons: number): number {
  return frontierLevels(orbitalEnergies, electrons).gap;
}
