// Demo workbook 1: an invented gas-sensor materials group screens the diatomic species that may sit on
// a metal-oxide film (the analytes, their charged forms after charge transfer, and interferents) for
// the properties that decide how each is detected: unpaired electrons (EPR), bond order (Raman/IR
// shifts) and the frontier levels. The "Settled" sheet holds what the group has agreed and is locked.
import type { DemoWorkbook } from './types.js';

/** [species as our functions read it, how it sits on the sensor surface (invented scenario notes)] */
const screened: [string, string][] = [
  ['O2', 'physisorbed, close to the free molecule'],
  ['O2-', 'superoxide on an oxygen vacancy'],
  ['O2^2-', 'peroxide bridging two metal sites'],
  ['O2+', 'dioxygenyl cation (reference only)'],
  ['NO', 'target analyte, neutral'],
  ['NO+', 'nitrosonium after charge transfer to the film'],
  ['NO-', 'nitroxyl anion on a reduced site'],
  ['CO', 'target analyte, atop site'],
  ['CO+', 'CO cation (reference only)'],
  ['CN-', 'cyanide, interferent from the test gas line'],
  ['N2', 'carrier gas'],
  ['N2+', 'N2 cation (reference only)'],
];

function screeningRow(species: string, form: string, row: number): string[] {
  const a = `A${row}`;
  return [
    species,
    form,
    `=MOCONFIG(${a})`,
    `=BONDORDER(${a})`,
    `=UNPAIRED(${a})`,
    `=MAGNETISM(${a})`,
    `=SPINMOMENT(${a})`,
    `=HOMO(${a})`,
    `=LUMO(${a})`,
    `=IF(E${row}>0,"EPR-active: look for a signal","EPR-silent")`,
  ];
}

/** [species, the group's decision (invented)] */
const settled: [string, string][] = [
  ['O2', 'reference gas for every run'],
  ['O2-', 'track by EPR on vacancy-rich films'],
  ['O2^2-', 'expected EPR-silent; confirm by Raman'],
  ['NO', 'primary analyte'],
  ['CO', 'primary analyte'],
];

export const gasSensorWorkbook: DemoWorkbook = {
  title: 'Gas-sensor screen: adsorbed diatomics',
  sheets: [
    {
      name: 'Screening',
      rows: [
        ['Species', 'Form on the sensor surface', 'MO configuration', 'Bond order', 'Unpaired e⁻', 'Magnetism', 'Spin-only μ (μB)', 'HOMO', 'LUMO', 'EPR check'],
        ...screened.map(([species, form], i) => screeningRow(species, form, i + 2)),
      ],
      settings: { columnWidths: { 0: 80, 1: 230, 2: 300, 5: 110, 6: 130, 9: 230 }, freezeHeaderRow: true },
      protectedRanges: ['A1:J1'],
    },
    {
      name: 'Settled',
      rows: [
        ['Species', 'Bond order', 'Unpaired e⁻', 'Ground term', 'Decision'],
        ...settled.map(([species, decision], i) => [species, `=BONDORDER(A${i + 2})`, `=UNPAIRED(A${i + 2})`, `=GROUNDTERM(A${i + 2})`, decision]),
      ],
      settings: { columnWidths: { 0: 90, 3: 120, 4: 300 }, freezeHeaderRow: true },
      lockReason: 'Agreed at the sensor-materials review; ask Teodora before changing anything here',
    },
  ],
};
