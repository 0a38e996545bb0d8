// Demo workbook 3: an invented dye-screening group ranks conjugated molecules by their simple-Hückel
// π properties and an estimated absorption maximum, before any are made or measured. Cyclobutadiene
// stays on the list on purpose: its π shell is open and degenerate, and ABSORPTION says why it gives
// no estimate rather than printing a number.
import type { DemoWorkbook } from './types.js';

/** [common name, SMILES, the group's status (invented)] */
const candidates: [string, string, string][] = [
  ['ethylene', 'C=C', 'control'],
  ['1,3-butadiene', 'C=CC=C', 'control'],
  ['1,3,5-hexatriene', 'C=CC=CC=C', 'series'],
  ['1,3,5,7-octatetraene', 'C=CC=CC=CC=C', 'series'],
  ['1,3,5,7,9-decapentaene', 'C=CC=CC=CC=CC=C', 'shortlist'],
  ['benzene', 'c1ccccc1', 'benchmark'],
  ['naphthalene', 'c1ccc2ccccc2c1', 'benchmark'],
  ['anthracene', 'c1ccc2cc3ccccc3cc2c1', 'shortlist'],
  ['azulene', 'c1cc2cccccc2c1', 'shortlist'],
  ['styrene', 'C=Cc1ccccc1', 'series'],
  ['trans-stilbene', 'c1ccc(cc1)/C=C/c1ccccc1', 'shortlist'],
  ['pyridine', 'c1ccncc1', 'heteroatom check'],
  ['acrolein', 'C=CC=O', 'heteroatom check'],
  ['p-benzoquinone', 'O=C1C=CC(=O)C=C1', 'acceptor'],
  ['fulvene', 'C=C1C=CC=C1', 'cross-conjugated'],
  ['cyclobutadiene', 'C1=CC=C1', 'antiaromatic: no estimate'],
];

function candidateRow(name: string, smiles: string, status: string, row: number): string[] {
  const b = `B${row}`;
  return [
    name,
    smiles,
    `=PIGAP(${b})`,
    `=PIENERGY(${b})`,
    `=DELOCALIZATION(${b})`,
    `=AROMATICITY(${b})`,
    `=ABSORPTION(${b},Parameters!$B$1,Parameters!$B$2)`,
    `=IF(ISNUMBER(G${row}),CHEMCONVERT(G${row},"nm","eV"),"no estimate")`,
    status,
  ];
}

const cyclobutadieneRow = candidates.findIndex(([name]) => name === 'cyclobutadiene') + 2;

export const dyeCandidatesWorkbook: DemoWorkbook = {
  title: 'Dye candidates: Hückel π screen',
  sheets: [
    {
      name: 'Candidates',
      rows: [
        ['Molecule', 'SMILES', 'π gap (|β|)', 'π energy (β)', 'Delocalization (β)', 'Aromaticity', 'Estimated λmax (nm)', 'Estimated photon energy (eV)', 'Status'],
        ...candidates.map(([name, smiles, status], i) => candidateRow(name, smiles, status, i + 2)),
      ],
      settings: { columnWidths: { 0: 190, 1: 230, 4: 140, 5: 120, 6: 170, 7: 210, 8: 200 }, freezeHeaderRow: true, precision: 3 },
      deliberateErrors: { [`G${cyclobutadieneRow}`]: 'the HOMO–LUMO gap is 0 (open-shell degenerate π shell)' },
    },
    {
      name: 'Parameters',
      rows: [
        ['Spectroscopic |β| (eV)', '2.2783', 'ABSORPTION defaults: least-squares fit over polyenes and acenes (see the function reference)'],
        ['Offset (eV)', '1.963', 'change both to try the polyene-only fit (2.911 and 2.160)'],
      ],
      settings: { columnWidths: { 0: 190, 2: 520 } },
    },
  ],
};
