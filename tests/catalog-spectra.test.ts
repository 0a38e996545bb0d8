// The π spectra family through a real engine: cell references, the PPPSTATES spill and its scalar
// route, ABSORPTION's model switch keeping old values, and bad input as cell errors with messages.
import { DetailedCellError } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { pppSpectrumOf } from '../functions/chem/ppp.js';
import { createEngine, type SheetInput } from '../functions/engine.js';

function evaluate(rows: SheetInput) {
  const engine = createEngine({ S: rows });
  const values = engine.getSheetValues(engine.getSheetId('S')!);
  engine.destroy();
  return values;
}

describe('π spectra cell functions', () => {
  it('read SMILES from a cell reference and agree with the science layer', () => {
    const [[, lambda, osc, triplet, gap]] = evaluate([['C=CC=CC=C', '=PPPLAMBDA(A1)', '=PPPOSC(A1)', '=PPPTRIPLET(A1)', '=PPPSTGAP(A1)']]);
    const s = pppSpectrumOf('C=CC=CC=C');
    expect(lambda).toBeCloseTo(s.singlets[0].wavelength, 9);
    expect(osc).toBeCloseTo(s.singlets[0].f, 9);
    expect(triplet).toBeCloseTo(s.triplets[0], 9);
    expect(gap).toBeCloseTo(s.singlets[0].energy - s.triplets[0], 9);
  });

  it('PPPSTATES spills one row per state (benzene: 3 × 3 = 9 single excitations) for a reference, and gives one value by state and field', () => {
    const values = evaluate([['c1ccccc1', '=PPPSTATES(A1)'], ...Array.from({ length: 11 }, () => [])]);
    const s = pppSpectrumOf('c1ccccc1');
    expect(s.singlets).toHaveLength(9);
    expect(values[9]?.[1] ?? null).toBeNull();
    for (let k = 0; k < 9; k++) {
      expect(values[k][1]).toBeCloseTo(s.singlets[k].energy, 9);
      expect(values[k][2]).toBeCloseTo(s.singlets[k].wavelength, 9);
    }
    const [[, nm, f, label]] = evaluate([['c1ccccc1', '=PPPSTATES(A1,3,"nm")', '=PPPSTATES(A1,1,"f")', '=PPPSTATES(A1,1,"transition")']]);
    expect(nm).toBeCloseTo(s.singlets[2].wavelength, 9);
    expect(f).toBeCloseTo(0, 9);
    expect(label).toMatch(/^HOMO.*→LUMO.* \(\d+ %\)$/);
  });

  it('ABSORPTION keeps its Hückel value by default and switches to PPP on request', () => {
    const [[old, explicit, ppp]] = evaluate([['=ABSORPTION("C=CC=CC=C")', '=ABSORPTION("C=CC=CC=C",,,,"huckel")', '=ABSORPTION("C=CC=CC=C",,,,"ppp")']]);
    expect(old).toBeCloseTo(310.7, 1); // the documented value existing sheets hold
    expect(explicit).toBe(old);
    expect(ppp).toBeCloseTo(pppSpectrumOf('C=CC=CC=C').singlets[0].wavelength, 9);
  });

  it.each([
    ['=PPPEXCITE("C=C[CH2]")', /radical/],
    ['=PPPEXCITE("C=CC=C",9)', /singlet 9 is out of range/],
    ['=PPPSTRONGEST("C=CC=C",900)', /no PPP singlet/],
    ['=PPPSTATES("C=CC=C",1,"colour")', /field must be/],
    ['=ABSORPTION("C=CC=C",,,,"exact")', /model must be "huckel" or "ppp"/],
    ['=PPPEXCITE(B1)', /structure|SMILES|empty/],
  ])('%s is a cell error naming the problem', (formula, message) => {
    const value = evaluate([[formula]])[0][0];
    expect(value).toBeInstanceOf(DetailedCellError);
    expect((value as DetailedCellError).message).toMatch(message);
  });
});
