// Two-centre LCAO family: overlap of 1s orbitals, the H2+ potential curve, the 2×2 secular
// problem and HOMO–LUMO gaps. Atomic units by default (bohr, hartree); unit arguments convert
// at the edge. Science in ../chem/lcao.ts and ../chem/levelgap.ts.
import { frontierLevels, orbitalEnergiesFromCells } from '../chem/levelgap.js';
import { h2PlusEnergyHartree, h2PlusMinimum, overlap1s, solveSecular2x2, type LcaoLevel } from '../chem/lcao.js';
import { convertEnergy, convertLength, ENERGY_UNIT_NAMES, parseEnergyUnit, parseLengthUnit, toBohr } from '../chem/units.js';
import { ChemError, type CatalogEntry, type ParamSpec, type SpillArg } from './types.js';

const LEVELS_SOURCE =
  'Secular determinant det(H − ES) = 0 of the two-orbital LCAO problem (Levine, Quantum Chemistry, LCAO treatment of H2+; Atkins, Physical Chemistry, heteronuclear diatomic MOs).';
const H2PLUS_SOURCE =
  'LCAO treatment of H2+ with closed-form overlap, Coulomb and exchange integrals over hydrogen 1s orbitals (Levine, Quantum Chemistry; Pauling & Wilson, Introduction to Quantum Mechanics, 1935).';

const distanceUnitParam: ParamSpec = {
  name: 'unit',
  type: 'string',
  description: 'Unit of the distance.',
  optional: true,
  default: 'bohr',
  choices: ['bohr', 'angstrom', 'pm', 'nm'],
};
const energyUnitParam: ParamSpec = {
  name: 'energyUnit',
  type: 'string',
  description: 'Unit of the energy returned.',
  optional: true,
  default: 'hartree',
  choices: [...ENERGY_UNIT_NAMES],
};
const secularParams: ParamSpec[] = [
  { name: 'Haa', type: 'number', description: 'Diagonal element ⟨a|H|a⟩ (Coulomb integral α of orbital a).', unit: 'any energy unit' },
  { name: 'Hbb', type: 'number', description: 'Diagonal element ⟨b|H|b⟩.', unit: 'same unit as Haa' },
  { name: 'Hab', type: 'number', description: 'Off-diagonal element ⟨a|H|b⟩ (resonance integral β, usually negative).', unit: 'same unit as Haa' },
  { name: 'S', type: 'number', description: 'Overlap ⟨a|b⟩, strictly between −1 and 1.' },
];
const levelParam: ParamSpec = {
  name: 'level',
  type: 'string',
  description: 'Which level to return as one value; omit to spill both (bonding first).',
  optional: true,
  choices: ['bonding', 'antibonding'],
};

/** Reads the bonding/antibonding choice; `fallback` undefined means the argument picks one value and may not be empty. */
function parseLevel(text: unknown, fallback?: LcaoLevel): LcaoLevel {
  if ((text === undefined || text === '') && fallback) return fallback;
  const key = typeof text === 'string' ? text.trim().toLowerCase() : '';
  if (key === 'bonding' || key === 'antibonding') return key;
  throw new ChemError(`level must be "bonding" or "antibonding", got '${String(text ?? '')}'${fallback ? '' : '; omit the argument to spill both'}`);
}

function parseAtom(text: unknown): 0 | 1 {
  const key = typeof text === 'string' ? text.trim().toLowerCase() : '';
  if (key === 'a') return 0;
  if (key === 'b') return 1;
  throw new ChemError(`atom must be "a" or "b", got '${String(text ?? '')}'`);
}

/** A spilling function with trailing "pick one value" arguments: each one given shrinks the result. */
const spillWhenOmitted =
  (firstPickIndex: number, full: { rows: number; cols: number }, picked: { rows: number; cols: number }[]) =>
  (args: SpillArg[]) => {
    const picks = Math.max(0, args.length - firstPickIndex);
    return picks === 0 ? full : picked[Math.min(picks, picked.length) - 1];
  };

export const lcaoFunctions: CatalogEntry[] = [
  {
    name: 'OVERLAP1S',
    family: 'LCAO',
    summary: 'Overlap integral S of two 1s Slater orbitals with the same exponent a distance R apart.',
    params: [
      { name: 'distance', type: 'number', description: 'Internuclear distance R, zero or positive.', unit: 'bohr (or unit)' },
      { name: 'zeta', type: 'number', description: 'Orbital exponent ζ of both 1s orbitals (1 for hydrogen).', optional: true, default: 1 },
      distanceUnitParam,
    ],
    returns: { description: 'Overlap S = e^(−ρ)(1 + ρ + ρ²/3), ρ = ζR/a0.', unit: 'dimensionless', kind: 'number' },
    examples: [
      { formula: '=OVERLAP1S(2)', expected: 0.5864528940253216, note: 'e^(−2)(1 + 2 + 4/3); Levine tabulates S ≈ 0.586 at R = 2 bohr (from memory)' },
      { formula: '=OVERLAP1S(0)', expected: 1, note: 'a normalised orbital overlaps itself fully' },
      { formula: '=OVERLAP1S(74,1,"pm")', expected: 0.753385, tolerance: 1e-6, note: 'at the H2 bond length, 74 pm = 1.398 bohr' },
      { formula: '=OVERLAP1S(2,1.24)', expected: 0.463111, tolerance: 1e-6, note: 'contracted exponent ζ = 1.24, so ρ = 2.48' },
    ],
    source: 'Mulliken, Rieke, Orloff & Orloff, J. Chem. Phys. 17, 1248 (1949), overlap integrals of Slater orbitals; Levine, Quantum Chemistry, LCAO H2+.',
    implementation: (distance: number, zeta: number, unit: string) => overlap1s(toBohr(distance, parseLengthUnit(unit, 'bohr')), zeta),
  },
  {
    name: 'H2PLUS',
    family: 'LCAO',
    summary: 'LCAO total energy of the molecule ion H2+ at one distance, nuclear repulsion included; a column of distances traces the potential curve.',
    params: [
      { name: 'distance', type: 'number', description: 'Internuclear distance R, positive.', unit: 'bohr (or unit)' },
      { name: 'level', type: 'string', description: 'The bonding (σg) or antibonding (σu*) combination.', optional: true, default: 'bonding', choices: ['bonding', 'antibonding'] },
      distanceUnitParam,
      energyUnitParam,
    ],
    returns: { description: 'E = E_1s + 1/R − (J ± K)/(1 ± S); tends to −0.5 hartree (H atom + proton) at large R.', unit: 'hartree (or energyUnit)', kind: 'number' },
    examples: [
      { formula: '=H2PLUS(2)', expected: -0.553771, tolerance: 1e-6, note: 'at the exact equilibrium distance of H2+, 2.00 bohr' },
      { formula: '=H2PLUS(2,"antibonding")', expected: -0.160854, tolerance: 1e-6 },
      { formula: '=H2PLUS(40)', expected: -0.5, tolerance: 1e-12, note: 'separated H atom and proton' },
      { formula: '=H2PLUS(1.32,"bonding","angstrom","eV")', expected: -15.3698, tolerance: 1e-4, note: 'near the LCAO minimum, in electronvolts' },
    ],
    source: H2PLUS_SOURCE,
    implementation: (distance: number, level: string, unit: string, energyUnit: string) => {
      const distanceBohr = toBohr(distance, parseLengthUnit(unit, 'bohr'));
      const energy = h2PlusEnergyHartree(distanceBohr, parseLevel(level, 'bonding'));
      return convertEnergy(energy, 'hartree', parseEnergyUnit(energyUnit, 'hartree'));
    },
  },
  {
    name: 'H2PLUSMIN',
    family: 'LCAO',
    summary: 'Minimum of the LCAO potential curve of H2+, found numerically: equilibrium distance, energy or dissociation energy.',
    params: [
      {
        name: 'quantity',
        type: 'string',
        description: 'One value to return: "distance" (R_e), "energy" (E at R_e) or "dissociation" (D_e = −0.5 hartree − E). Omit to spill R_e (bohr) and E (hartree) side by side.',
        optional: true,
        choices: ['distance', 'energy', 'dissociation'],
      },
      { name: 'unit', type: 'string', description: 'Unit of the value returned: a length unit for "distance", an energy unit otherwise.', optional: true },
    ],
    returns: { description: 'With no arguments a 1×2 row [R_e in bohr, E in hartree]; with a quantity, that one value.', unit: 'bohr / hartree (or unit)', kind: 'array' },
    examples: [
      { formula: '=H2PLUSMIN()', expected: [[2.4928, -0.564831]], tolerance: 1e-4, note: 'Levine: R_e ≈ 2.49 bohr (from memory)' },
      { formula: '=H2PLUSMIN("distance","angstrom")', expected: 1.3191, tolerance: 1e-3, note: 'Levine: 1.32 Å (from memory)' },
      { formula: '=H2PLUSMIN("dissociation","eV")', expected: 1.764, tolerance: 1e-3, note: 'Levine: D_e = 1.76 eV for the LCAO function, 2.79 eV exact (from memory)' },
    ],
    source: `${H2PLUS_SOURCE} Minimum by golden-section search (Kiefer, Proc. Am. Math. Soc. 4, 502 (1953)).`,
    spill: spillWhenOmitted(0, { rows: 1, cols: 2 }, [{ rows: 1, cols: 1 }]),
    implementation: (quantity: string | undefined, unit: string | undefined) => {
      const minimum = h2PlusMinimum();
      if (quantity === undefined) {
        if (unit !== undefined) throw new ChemError('name the quantity ("distance", "energy" or "dissociation") to choose a unit');
        return [[minimum.distanceBohr, minimum.energyHartree]];
      }
      switch (quantity.trim().toLowerCase()) {
        case 'distance':
          return convertLength(minimum.distanceBohr, 'bohr', parseLengthUnit(unit, 'bohr', 'unit'));
        case 'energy':
          return convertEnergy(minimum.energyHartree, 'hartree', parseEnergyUnit(unit, 'hartree', 'unit'));
        case 'dissociation':
          return convertEnergy(minimum.dissociationHartree, 'hartree', parseEnergyUnit(unit, 'hartree', 'unit'));
        default:
          throw new ChemError(`quantity must be "distance", "energy" or "dissociation", got '${quantity}'; omit it to spill distance and energy`);
      }
    },
  },
  {
    name: 'LCAOLEVELS',
    family: 'LCAO',
    summary: 'Bonding and antibonding orbital energies of a two-orbital LCAO problem, roots of det(H − ES) = 0.',
    params: [...secularParams, levelParam],
    returns: {
      description: 'A 2×1 column [bonding; antibonding] (lower root first), or one value when level is given. For Haa = Hbb: (Haa ± Hab)/(1 ± S).',
      unit: 'same unit as Haa',
      kind: 'array',
    },
    examples: [
      { formula: '=LCAOLEVELS(-13.6,-13.6,-10,0.25)', expected: [[-18.88], [-4.8]], tolerance: 1e-9, note: '(α ± β)/(1 ± S) for a homonuclear pair' },
      { formula: '=LCAOLEVELS(-1,-1,-0.5,0,"antibonding")', expected: -0.5, note: 'zero-overlap (Hückel) limit: α − β' },
      { formula: '=LCAOLEVELS(-2,-1,-0.3,0.1,"bonding")', expected: -2.0097123659, tolerance: 1e-9, note: 'heteronuclear pair: the bonding level lies below the lower atomic level' },
    ],
    source: LEVELS_SOURCE,
    spill: spillWhenOmitted(4, { rows: 2, cols: 1 }, [{ rows: 1, cols: 1 }]),
    implementation: (Haa: number, Hbb: number, Hab: number, S: number, level?: string) => {
      const { energies } = solveSecular2x2(Haa, Hbb, Hab, S);
      if (level === undefined) return [[energies[0]], [energies[1]]];
      return energies[parseLevel(level) === 'bonding' ? 0 : 1];
    },
  },
  {
    name: 'LCAOCOEFFS',
    family: 'LCAO',
    summary: 'Normalised LCAO coefficients (c_a, c_b) of the bonding and antibonding orbitals of a two-orbital problem.',
    params: [
      ...secularParams,
      { ...levelParam, description: 'Which orbital; omit to spill a 2×2 table (rows bonding, antibonding; columns c_a, c_b).' },
      { name: 'atom', type: 'string', description: 'Which coefficient of the chosen orbital as one value; omit for the row [c_a, c_b].', optional: true, choices: ['a', 'b'] },
    ],
    returns: {
      description: 'Coefficients with c_a² + c_b² + 2S·c_a·c_b = 1 and c_a ≥ 0: a 2×2 table, a 1×2 row, or one value.',
      unit: 'dimensionless',
      kind: 'array',
    },
    examples: [
      { formula: '=LCAOCOEFFS(-1,-1,-0.5,0.25)', expected: [[0.632455532, 0.632455532], [0.816496581, -0.816496581]], tolerance: 1e-9, note: '1/√(2(1 ± S)) for a homonuclear pair' },
      { formula: '=LCAOCOEFFS(-1,-1,-0.5,0.25,"antibonding")', expected: [[0.816496581, -0.816496581]], tolerance: 1e-9 },
      { formula: '=LCAOCOEFFS(-2,-1,-0.3,0.1,"bonding","a")', expected: 0.985695783, tolerance: 1e-9, note: 'the bonding orbital lies mostly on the lower-energy atom' },
    ],
    source: LEVELS_SOURCE,
    spill: spillWhenOmitted(4, { rows: 2, cols: 2 }, [{ rows: 1, cols: 2 }, { rows: 1, cols: 1 }]),
    implementation: (Haa: number, Hbb: number, Hab: number, S: number, level?: string, atom?: string) => {
      const { coefficients } = solveSecular2x2(Haa, Hbb, Hab, S);
      if (level === undefined) {
        if (atom !== undefined) throw new ChemError('name the level ("bonding" or "antibonding") to pick one coefficient');
        return coefficients.map((row) => [...row]);
      }
      const row = coefficients[parseLevel(level) === 'bonding' ? 0 : 1];
      return atom === undefined ? [[...row]] : row[parseAtom(atom)];
    },
  },
  {
    name: 'LEVELGAP',
    family: 'LCAO',
    summary: 'HOMO–LUMO gap of a list of orbital energies filled from the bottom, two electrons per orbital; degenerate levels are grouped.',
    params: [
      { name: 'levels', type: 'range', description: 'Orbital energies in any order: a range, an inline array or a spilled result such as LCAOLEVELS(...). Empty cells are skipped.', unit: 'any energy unit' },
      { name: 'electrons', type: 'number', description: 'Number of electrons to place, a whole number from 1 to 2 × (number of orbitals) − 1.' },
    ],
    returns: {
      description: 'E(LUMO) − E(HOMO). A partly filled degenerate HOMO level gives 0; a singly occupied non-degenerate HOMO (SOMO) is followed by the next level.',
      unit: 'same unit as levels',
      kind: 'number',
    },
    examples: [
      { formula: '=LEVELGAP(LCAOLEVELS(-13.6,-13.6,-10,0.25),2)', expected: 14.08, tolerance: 1e-9, note: 'two electrons in the bonding level' },
      { formula: '=LEVELGAP({-2;-1;-1;0},6)', expected: 1, note: 'six electrons fill the lowest level and a degenerate pair' },
      { formula: '=LEVELGAP({-1;1},1)', expected: 2, note: 'one electron: the singly occupied lower orbital is the HOMO (SOMO)' },
      { formula: '=LEVELGAP({2;0;0;-2},4)', expected: 0, note: 'cyclobutadiene-like Hückel levels (units of |β|): two electrons in a degenerate pair, gap 0' },
      { formula: '=LEVELGAP({-2.1799e-18;-5.4497e-19;-2.4221e-19},1)', expected: 1.63493e-18, tolerance: 1e-23, note: 'hydrogen n = 1, 2, 3 in joules: E2 − E1' },
    ],
    source:
      'Aufbau filling with the Pauli principle, two electrons per orbital (common practice); HOMO/LUMO frontier orbitals after Fukui, Yonezawa & Shingu, J. Chem. Phys. 20, 722 (1952). Levels within 1e-9 of the spread of the list (at least 1e-12 of the largest |E|) count as degenerate, so any unit works, joules included. An electron count the levels cannot hold is #VALUE!, as in the other families.',
    implementation: (levels: unknown[][], electrons: number) => frontierLevels(orbitalEnergiesFromCells(levels), electrons).gap,
  },
];
