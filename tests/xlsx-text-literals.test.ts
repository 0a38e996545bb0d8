// Text read from a file stays text in Orbitab: a leading apostrophe goes on exactly the texts the
// engine would otherwise read as a number, date, boolean, error or formula.
import { describe, expect, it } from 'vitest';
import { computeWorkbook } from '../server/xlsx/engineValues.js';
import { asTextInput, textsNeedingApostrophe } from '../server/xlsx/textLiterals.js';

const tricky = [
  'O2', 'superoxide', 'x1', 'e5', 'E-5', 'Infinity', 'NaN', 'March', 'Jan 1', 'TRUE ', ' TRUE', 'true', 'False', 'yes',
  '007', '12.50', '.5', '1e3', '-', '+', '-5', '+5', '(5)', '$5', '5$', '€5', '5 €', '5%', '1,5', '1 000',
  '01/03/2024', '1/3/24', '2024-03-01', '12:30', '12:30:15', '#N/A', '#REF!', '#nonsense', '=1+1', "'quoted",
  'Hückel', 'π-system', '', ' ', 'NO, nitric oxide', 'batch 12, sensor 3',
];

describe('text that must stay text', () => {
  it('gets an apostrophe exactly when the engine would read it as something else', () => {
    const need = textsNeedingApostrophe(tricky);
    const inputs = tricky.map((t, i) => asTextInput(t, need[i]));
    const values = computeWorkbook([{ name: 'S', cells: inputs.map((input, row) => [row, 0, input]) }]).sheets[0].cells;
    // Every input row comes back, so the check below runs once per text.
    expect(values.map((c) => c.row).sort((a, b) => a - b)).toEqual(tricky.map((_, i) => i));
    values.forEach((cell) => expect(cell.value ?? '', `row ${cell.row}: ${JSON.stringify(tricky[cell.row])}`).toBe(tricky[cell.row]));
    expect(need[tricky.indexOf('O2')]).toBe(false);
    expect(need[tricky.indexOf('007')]).toBe(true);
    expect(need[tricky.indexOf('#N/A')]).toBe(true);
  });

  it('skips the engine only for texts the engine itself would keep as text', () => {
    expect(textsNeedingApostrophe(tricky)).toEqual(textsNeedingApostrophe(tricky, { probeAll: true }));
  });
});
