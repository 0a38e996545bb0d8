// Units family: conversions with CODATA 2018 constants and Pauling's bond-number/length relation.
// Science in ../chem/units.ts.
import { chemConvert, ENERGY_UNIT_NAMES, LENGTH_UNIT_NAMES, parseLengthUnit, parsePaulingForm, paulingBondLength } from '../chem/units.js';
import type { CatalogEntry } from './types.js';

const CODATA_SOURCE =
  'CODATA 2018 recommended values (NIST, physics.nist.gov/cuu/Constants; Tiesinga et al., Rev. Mod. Phys. 93, 025010 (2021)); thermochemical calorie = 4.184 J (NIST SP 811); photon energy E = hc/λ.';

/** The units CHEMCONVERT offers: energies, then nm (a wavelength or a length), then lengths. */
const CONVERTIBLE_UNITS = [...ENERGY_UNIT_NAMES, 'nm', ...LENGTH_UNIT_NAMES];

export const unitFunctions: CatalogEntry[] = [
  {
    name: 'CHEMCONVERT',
    family: 'Units',
    summary: 'Converts an energy, a length, or a photon energy to and from its wavelength in nm.',
    params: [
      { name: 'value', type: 'number', description: 'The quantity to convert. Negative energies are allowed except to or from a wavelength.' },
      {
        name: 'from',
        type: 'string',
        description: 'Unit of value. Energies: hartree (Eh), eV, kJ/mol, kcal/mol (thermochemical), cm-1 (also cm^-1, wavenumber); lengths: bohr, angstrom (Å), pm; nm is a photon wavelength beside an energy unit and a length beside a length unit.',
        choices: CONVERTIBLE_UNITS,
      },
      { name: 'to', type: 'string', description: 'Unit wanted, from the same list; an energy and a length cannot be converted into each other.', choices: CONVERTIBLE_UNITS },
    ],
    returns: { description: 'The value in the unit wanted (energy ↔ wavelength is reciprocal: λ = hc/E).', unit: 'to', kind: 'number' },
    examples: [
      { formula: '=CHEMCONVERT(1,"hartree","eV")', expected: 27.211386245988, tolerance: 1e-9, note: 'NIST CODATA 2018 hartree–electron-volt relationship' },
      { formula: '=CHEMCONVERT(1,"eV","cm-1")', expected: 8065.543937, tolerance: 1e-6, note: 'NIST CODATA 2018 electron volt–inverse metre relationship' },
      { formula: '=CHEMCONVERT(1,"hartree","kJ/mol")', expected: 2625.4996394799, tolerance: 1e-6, note: 'NIST CODATA 2018 molar energy of the hartree' },
      { formula: '=CHEMCONVERT(1,"kcal/mol","kJ/mol")', expected: 4.184, tolerance: 1e-12, note: 'thermochemical calorie' },
      { formula: '=CHEMCONVERT(500,"nm","eV")', expected: 2.479683969, tolerance: 1e-8, note: 'hc = 1239.841984 eV nm' },
      { formula: '=CHEMCONVERT(1,"bohr","angstrom")', expected: 0.529177210903, tolerance: 1e-12, note: 'NIST CODATA 2018 Bohr radius' },
      { formula: '=CHEMCONVERT(154,"pm","angstrom")', expected: 1.54, tolerance: 1e-12 },
    ],
    source: CODATA_SOURCE,
    implementation: (value: number, from: string, to: string) => chemConvert(value, from, to),
  },
  {
    name: 'PAULINGLENGTH',
    family: 'Units',
    summary: "Bond length for a bond order from the single-bond length, by Pauling's relation D(n) = D(1) − c·log10 n.",
    params: [
      { name: 'singleBondLength', type: 'number', description: 'Length D(1) of the single bond between the same two atoms, positive.', unit: 'angstrom (or unit)' },
      { name: 'bondOrder', type: 'number', description: 'Bond order (bond number) n, positive; fractions allowed.' },
      { name: 'unit', type: 'string', description: 'Unit of singleBondLength and of the result.', optional: true, default: 'angstrom', choices: ['angstrom', 'pm', 'bohr', 'nm'] },
      {
        name: 'form',
        type: 'string',
        description: '"1947": c = 0.600 Å (Pauling 1947, derived for fractional bond numbers); "1960": c = 0.71 Å (later fit to C–C, C=C, C≡C).',
        optional: true,
        default: '1947',
        choices: ['1947', '1960'],
      },
    ],
    returns: { description: 'Estimated length D(n), in the unit of singleBondLength.', unit: 'angstrom (or unit)', kind: 'number' },
    examples: [
      { formula: '=PAULINGLENGTH(1.54,2)', expected: 1.3593, tolerance: 1e-4, note: '1.54 − 0.600·log10 2' },
      { formula: '=PAULINGLENGTH(1.54,3,"angstrom","1960")', expected: 1.2013, tolerance: 1e-4, note: 'C≡C observed 1.20 Å (common practice)' },
      { formula: '=PAULINGLENGTH(154,2,"pm","1960")', expected: 132.63, tolerance: 1e-2, note: 'C=C observed 133–134 pm (common practice)' },
      { formula: '=PAULINGLENGTH(1.54,0.5)', expected: 1.7206, tolerance: 1e-4, note: 'a half bond is longer than a single bond' },
    ],
    source:
      'Pauling, J. Am. Chem. Soc. 69, 542 (1947): R(1) − R(n) = 0.300 log n per radius, 0.600 Å per bond; Pauling, The Nature of the Chemical Bond, 3rd ed. (1960): 0.71 Å for multiple bonds (from memory).',
    implementation: (singleBondLength: number, bondOrder: number, unit: string, form: string) =>
      paulingBondLength(singleBondLength, bondOrder, parseLengthUnit(unit, 'angstrom', 'unit'), parsePaulingForm(form)),
  },
];
