// What an empty workbook offers instead of a blank grid: a species column with the usual property
// columns already written as formulas, for each kind of screening Orbitab does. Plain data, so a
// test can evaluate every formula (tests/starter-templates.test.ts).
import type { CellInput } from '../../core/workbook/save/pendingStore.js';

export interface StarterTemplate {
  id: string;
  label: string;
  /** One line under the button. */
  description: string;
  /** Cell inputs row by row; the first row holds the column titles. */
  rows: string[][];
}

function rowsFor(first: string[], titles: string[], formulas: string[], items: string[][]): string[][] {
  return [
    [...first, ...titles],
    ...items.map((item, i) => [...item, ...formulas.map((f) => f.replaceAll('{row}', String(i + 2)))]),
  ];
}

export const starterTemplates: readonly StarterTemplate[] = [
  {
    id: 'diatomic',
    label: 'Diatomic species screen',
    description: 'A species column with MO configuration, bond order, unpaired electrons, magnetism, ground term and frontier levels.',
    rows: rowsFor(
      ['Species'],
      ['MO configuration', 'Bond order', 'Unpaired e⁻', 'Magnetism', 'Ground term', 'HOMO', 'LUMO'],
      ['=MOCONFIG(A{row})', '=BONDORDER(A{row})', '=UNPAIRED(A{row})', '=MAGNETISM(A{row})', '=GROUNDTERM(A{row})', '=HOMO(A{row})', '=LUMO(A{row})'],
      [['O2'], ['O2-'], ['N2'], ['NO'], ['CO'], ['CN-']],
    ),
  },
  {
    id: 'conjugated',
    label: 'Conjugated π screen',
    description: 'Molecules as SMILES with simple-Hückel gap, π energy, aromaticity and an estimated absorption maximum.',
    rows: rowsFor(
      ['Molecule', 'SMILES'],
      ['π gap (|β|)', 'π energy (β)', 'Aromaticity', 'Estimated λmax (nm)'],
      ['=PIGAP(B{row})', '=PIENERGY(B{row})', '=AROMATICITY(B{row})', '=ABSORPTION(B{row})'],
      [
        ['1,3-butadiene', 'C=CC=C'],
        ['1,3,5-hexatriene', 'C=CC=CC=C'],
        ['benzene', 'c1ccccc1'],
        ['naphthalene', 'c1ccc2ccccc2c1'],
        ['pyridine', 'c1ccncc1'],
      ],
    ),
  },
];

/** The template as cell changes on one sheet, from A1. */
export function templateChanges(template: StarterTemplate, sheetId: string): CellInput[] {
  return template.rows.flatMap((cells, row) => cells.map((input, col) => ({ sheetId, row, col, input })));
}
