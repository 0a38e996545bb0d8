// Demo workbook 2: an invented combustion-diagnostics group lists the diatomic radicals it sees in
// flame emission, with the ground term and its degeneracy g_el (the ground-level term of the
// electronic partition function, spin–orbit splitting ignored) and a Boltzmann factor for one
// emission band of each. The band positions are invented round figures for the demo, placed near
// the familiar flame bands (from memory); they are not reference data.
import type { DemoWorkbook } from './types.js';

/** [species, band position in cm⁻¹ (demo figure), the group's note (invented)] */
const radicals: [string, number, string][] = [
  ['OH', 32400, 'reaction-zone marker'],
  ['CH', 23200, 'heat-release marker'],
  ['NH', 29800, 'fuel-nitrogen chemistry'],
  ['CN', 25800, 'fuel-nitrogen chemistry'],
  ['C2', 19400, 'rich flames only'],
  ['NO', 44200, 'post-flame gases'],
  ['O2', 49000, 'oxidiser, absorption only'],
  ['N2+', 25600, 'plasma-assisted runs only'],
  ['CO+', 22000, 'plasma-assisted runs only'],
];

function radicalRow(species: string, bandCm: number, note: string, row: number): string[] {
  const a = `A${row}`;
  return [
    species,
    `=GROUNDTERM(${a})`,
    `=DEGENERACY(${a})`,
    `=UNPAIRED(${a})`,
    `=D${row}+1`, // 2S + 1 with S = n/2
    String(bandCm),
    `=CHEMCONVERT(F${row},"cm-1","nm")`,
    `=CHEMCONVERT(F${row},"cm-1","eV")`,
    `=EXP(-H${row}/(Conditions!$B$2*Conditions!$B$1))`,
    note,
  ];
}

export const flameRadicalsWorkbook: DemoWorkbook = {
  title: 'Flame radicals: ground terms for partition functions',
  sheets: [
    {
      name: 'Radicals',
      rows: [
        ['Species', 'Ground term', 'g_el (ground term)', 'Unpaired e⁻', 'Spin multiplicity', 'Band position (cm⁻¹, demo figure)', 'Band wavelength (nm)', 'Band energy (eV)', 'exp(−E/kT) at flame T', 'Note'],
        ...radicals.map(([species, band, note], i) => radicalRow(species, band, note, i + 2)),
      ],
      settings: { columnWidths: { 1: 110, 2: 140, 4: 130, 5: 230, 6: 170, 7: 140, 8: 170, 9: 220 }, freezeHeaderRow: true },
    },
    {
      name: 'Conditions',
      rows: [
        ['Flame temperature (K)', '2200', 'invented operating point'],
        // CODATA 2018: k = 1.380649e-23 J/K exactly, e = 1.602176634e-19 C exactly, so k/e is exact.
        ['Boltzmann constant (eV/K)', '8.617333262E-05', 'CODATA 2018 (k/e, exact in the 2019 SI)'],
      ],
      settings: { columnWidths: { 0: 220, 1: 140, 2: 300 } },
    },
  ],
};
