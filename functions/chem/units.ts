// Physical constants and unit conversions for the chemistry cell functions.
//
// Every constant is the CODATA 2018 recommended value as published by NIST
// (physics.nist.gov/cuu/Constants, "CODATA Recommended Values of the Fundamental Physical
// Constants: 2018", Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)). Since the 2019 SI
// redefinition h, c, e, N_A and k_B are exact; the hartree energy and the Bohr radius are measured.
// The thermochemical calorie is exactly 4.184 J by definition (NIST SP 811, 2008, B.8).
import { ChemError } from './errors.js';

export const PLANCK_CONSTANT_J_S = 6.62607015e-34; // exact
export const SPEED_OF_LIGHT_M_PER_S = 299_792_458; // exact
export const ELEMENTARY_CHARGE_C = 1.602176634e-19; // exact; also 1 eV in joules
export const AVOGADRO_PER_MOL = 6.02214076e23; // exact
export const BOLTZMANN_J_PER_K = 1.380649e-23; // exact
export const HARTREE_ENERGY_J = 4.3597447222071e-18; // CODATA 2018, u_r 1.9e-12
export const BOHR_RADIUS_M = 5.29177210903e-11; // CODATA 2018, u_r 1.5e-10
export const BOHR_MAGNETON_J_PER_T = 9.2740100783e-24; // CODATA 2018
export const THERMOCHEMICAL_CALORIE_J = 4.184; // exact by definition

export const ELECTRONVOLT_J = ELEMENTARY_CHARGE_C;
/** 27.211386245988 eV (NIST lists the hartree–electron-volt relationship as 27.211 386 245 988(53) eV). */
export const HARTREE_EV = HARTREE_ENERGY_J / ELECTRONVOLT_J;
export const BOHR_RADIUS_ANGSTROM = BOHR_RADIUS_M * 1e10;
export const BOHR_RADIUS_PM = BOHR_RADIUS_M * 1e12;
/** hc in eV·nm: the photon energy–wavelength product, E(eV) = 1239.84198… / λ(nm). */
export const PLANCK_TIMES_C_EV_NM = ((PLANCK_CONSTANT_J_S * SPEED_OF_LIGHT_M_PER_S) / ELECTRONVOLT_J) * 1e9;

export type EnergyUnit = 'hartree' | 'eV' | 'kJ/mol' | 'kcal/mol' | 'cm-1';
export type LengthUnit = 'bohr' | 'angstrom' | 'pm' | 'nm';

/** Joules per unit, per molecule (molar units divided by N_A, wavenumbers times hc). */
const JOULES_PER_ENERGY_UNIT: Record<EnergyUnit, number> = {
  hartree: HARTREE_ENERGY_J,
  eV: ELECTRONVOLT_J,
  'kJ/mol': 1000 / AVOGADRO_PER_MOL,
  'kcal/mol': (1000 * THERMOCHEMICAL_CALORIE_J) / AVOGADRO_PER_MOL,
  'cm-1': PLANCK_CONSTANT_J_S * SPEED_OF_LIGHT_M_PER_S * 100,
};

const METRES_PER_LENGTH_UNIT: Record<LengthUnit, number> = {
  bohr: BOHR_RADIUS_M,
  angstrom: 1e-10,
  pm: 1e-12,
  nm: 1e-9,
};

// Spellings a chemist types, compared after trimming, removing spaces and lower-casing
// (no two of our units differ only by case). "nm" is listed apart: it is a length between
// lengths and a photon wavelength next to an energy unit.
const ENERGY_SPELLINGS: Record<string, EnergyUnit> = {
  hartree: 'hartree', hartrees: 'hartree', eh: 'hartree', ha: 'hartree',
  ev: 'eV', electronvolt: 'eV', electronvolts: 'eV',
  'kj/mol': 'kJ/mol', 'kjmol-1': 'kJ/mol', 'kjmol^-1': 'kJ/mol', 'kjmol⁻¹': 'kJ/mol',
  'kcal/mol': 'kcal/mol', 'kcalmol-1': 'kcal/mol', 'kcalmol^-1': 'kcal/mol', 'kcalmol⁻¹': 'kcal/mol',
  'cm-1': 'cm-1', 'cm^-1': 'cm-1', 'cm⁻¹': 'cm-1', '1/cm': 'cm-1', wavenumber: 'cm-1', wavenumbers: 'cm-1',
};
const LENGTH_SPELLINGS: Record<string, LengthUnit> = {
  bohr: 'bohr', bohrs: 'bohr', a0: 'bohr',
  angstrom: 'angstrom', angstroms: 'angstrom', 'å': 'angstrom', ang: 'angstrom',
  pm: 'pm', picometre: 'pm', picometer: 'pm',
};

export const ENERGY_UNIT_NAMES = ['hartree', 'eV', 'kJ/mol', 'kcal/mol', 'cm-1'] as const;
export const LENGTH_UNIT_NAMES = ['bohr', 'angstrom', 'pm'] as const;

function normaliseSpelling(text: string): string {
  // NFC turns the ANGSTROM SIGN (U+212B) into the letter Å (U+00C5).
  return text.normalize('NFC').trim().replace(/\s+/g, '').toLowerCase();
}

export type ParsedUnit =
  | { kind: 'energy'; unit: EnergyUnit }
  | { kind: 'length'; unit: LengthUnit }
  | { kind: 'wavelength-or-length' };

function describeKnownUnits(): string {
  return `energy units: ${ENERGY_UNIT_NAMES.join(', ')}, nm (photon wavelength); length units: ${LENGTH_UNIT_NAMES.join(', ')}, nm`;
}

/** `known` is the list offered in the error message when the spelling is not recognised. */
export function parseUnit(text: unknown, role = 'unit', known = describeKnownUnits()): ParsedUnit {
  if (typeof text !== 'string') throw new ChemError(`${role} must be text such as "eV" or "angstrom", got ${String(text)}`);
  const key = normaliseSpelling(text);
  if (key === 'nm') return { kind: 'wavelength-or-length' };
  if (key in ENERGY_SPELLINGS) return { kind: 'energy', unit: ENERGY_SPELLINGS[key] };
  if (key in LENGTH_SPELLINGS) return { kind: 'length', unit: LENGTH_SPELLINGS[key] };
  throw new ChemError(`unknown ${role} '${text}'; ${known}`);
}

/** An energy unit for a result or an argument; an empty text means the default. */
export function parseEnergyUnit(text: unknown, fallback: EnergyUnit, role = 'energy unit'): EnergyUnit {
  if (text === undefined || text === '') return fallback;
  const parsed = parseUnit(text, role, `use one of ${ENERGY_UNIT_NAMES.join(', ')}`);
  if (parsed.kind === 'energy') return parsed.unit;
  throw new ChemError(`${role} '${String(text)}' is not an energy unit; use one of ${ENERGY_UNIT_NAMES.join(', ')}`);
}

/** A length unit for a distance argument; an empty text means the default. */
export function parseLengthUnit(text: unknown, fallback: LengthUnit, role = 'distance unit'): LengthUnit {
  if (text === undefined || text === '') return fallback;
  const parsed = parseUnit(text, role, `use one of ${LENGTH_UNIT_NAMES.join(', ')}, nm`);
  if (parsed.kind === 'length') return parsed.unit;
  if (parsed.kind === 'wavelength-or-length') return 'nm';
  throw new ChemError(`${role} '${String(text)}' is not a length unit; use one of ${LENGTH_UNIT_NAMES.join(', ')}, nm`);
}

export function convertEnergy(value: number, from: EnergyUnit, to: EnergyUnit): number {
  if (from === to) return value;
  return (value * JOULES_PER_ENERGY_UNIT[from]) / JOULES_PER_ENERGY_UNIT[to];
}

export function convertLength(value: number, from: LengthUnit, to: LengthUnit): number {
  if (from === to) return value;
  return (value * METRES_PER_LENGTH_UNIT[from]) / METRES_PER_LENGTH_UNIT[to];
}

export const toBohr = (distance: number, unit: LengthUnit) => convertLength(distance, unit, 'bohr');

/** Photon energy of a wavelength, E = hc/λ (Planck–Einstein relation). */
export function wavelengthNmToEnergy(wavelengthNm: number, to: EnergyUnit): number {
  if (!(wavelengthNm > 0)) throw new ChemError(`a wavelength must be positive to have a photon energy: got ${wavelengthNm} nm`, 'NUM');
  return convertEnergy(PLANCK_TIMES_C_EV_NM / wavelengthNm, 'eV', to);
}

/** Wavelength of a photon of this energy, λ = hc/E. */
export function energyToWavelengthNm(energy: number, from: EnergyUnit): number {
  if (!(energy > 0)) throw new ChemError(`only a positive energy has a photon wavelength: got ${energy} ${from}`, 'NUM');
  return PLANCK_TIMES_C_EV_NM / convertEnergy(energy, from, 'eV');
}

function unitLabel(p: ParsedUnit, text: string): string {
  return p.kind === 'wavelength-or-length' ? 'nm' : p.kind === 'energy' ? `${text} (an energy)` : `${text} (a length)`;
}

/**
 * Converts between energy units, between length units, and between an energy and a photon
 * wavelength in nm. "nm" is a length when the other unit is a length and a wavelength when it
 * is an energy, so CHEMCONVERT(500,"nm","eV") and CHEMCONVERT(0.1,"nm","angstrom") both work.
 */
export function chemConvert(value: number, fromText: string, toText: string): number {
  if (typeof value !== 'number' || !Number.isFinite(value)) throw new ChemError(`value to convert must be a number, got ${String(value)}`);
  const from = parseUnit(fromText, 'unit to convert from');
  const to = parseUnit(toText, 'unit to convert to');
  if (from.kind === 'wavelength-or-length') {
    if (to.kind === 'energy') return wavelengthNmToEnergy(value, to.unit);
    return to.kind === 'length' ? convertLength(value, 'nm', to.unit) : value; // nm to nm
  }
  if (to.kind === 'wavelength-or-length') {
    return from.kind === 'energy' ? energyToWavelengthNm(value, from.unit) : convertLength(value, from.unit, 'nm');
  }
  if (from.kind === 'energy' && to.kind === 'energy') return convertEnergy(value, from.unit, to.unit);
  if (from.kind === 'length' && to.kind === 'length') return convertLength(value, from.unit, to.unit);
  throw new ChemError(`cannot convert ${unitLabel(from, fromText)} to ${unitLabel(to, toText)}: an energy and a length are different quantities`);
}

// ---- Pauling's bond-number/length relation -------------------------------------------------
//
// Pauling, "Atomic radii and interatomic distances in metals", J. Am. Chem. Soc. 69, 542 (1947):
// R(1) − R(n) = 0.300 Å·log10 n for a radius, so D(n) = D(1) − 0.600 Å·log10 n for a distance
// between two atoms joined by a bond of bond number n. (Agmon, Chem. Phys. Lett. 45, 343 (1977)
// quotes the 1947 relation in natural-log form with a = 0.26 Å; 0.26·ln 10 = 0.599 Å.)
// Pauling later fitted 0.71 Å to carbon–carbon single, double and triple bonds (1.54, 1.33 and
// 1.20 Å) in The Nature of the Chemical Bond, 3rd ed. (1960) (from memory). We default to the
// 1947 coefficient, the relation the function is named for, and offer the 1960 one for multiple
// bonds of first-row atoms, where it reproduces observed lengths better.
export const PAULING_COEFFICIENT_ANGSTROM = { '1947': 0.6, '1960': 0.71 } as const;
export type PaulingForm = keyof typeof PAULING_COEFFICIENT_ANGSTROM;

export function parsePaulingForm(text: unknown): PaulingForm {
  if (text === undefined || text === '') return '1947';
  const key = String(text).trim();
  if (key === '1947' || key === '1960') return key;
  throw new ChemError(`unknown form '${String(text)}' of Pauling's relation; use "1947" (0.600 Å) or "1960" (0.71 Å)`);
}

/** D(n) = D(1) − c·log10 n, with c converted into the unit of D(1). */
export function paulingBondLength(singleBondLength: number, bondOrder: number, unit: LengthUnit, form: PaulingForm): number {
  if (!(singleBondLength > 0)) throw new ChemError(`single-bond length must be positive, got ${singleBondLength}`, 'NUM');
  if (!(bondOrder > 0)) throw new ChemError(`bond order must be positive for Pauling's relation (log10 of ${bondOrder} is undefined; a bond order of 0 means no bond)`, 'NUM');
  const coefficient = convertLength(PAULING_COEFFICIENT_ANGSTROM[form], 'angstrom', unit);
  const length = singleBondLength - coefficient * Math.log10(bondOrder);
  if (!(length > 0)) throw new ChemError(`Pauling's relation gives no positive length for bond order ${bondOrder} from a single bond of ${singleBondLength} ${unit}`, 'NUM');
  return length;
}
