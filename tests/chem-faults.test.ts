// Reported faults, each pinned by a test written before its fix: level grouping in joules, one error
// kind for "too many electrons", SMILES that were silently misread, limits at huge distances, and
// empty cells in number arguments.
import { DetailedCellError } from 'hyperformula';
import { describe, expect, it } from 'vitest';
import { levelGap } from '../functions/chem/levelgap.js';
import { h2PlusEnergyHartree, overlap1s } from '../functions/chem/lcao.js';
import { findPiSystem } from '../functions/chem/piSystem.js';
import { createEngine, type SheetInput } from '../functions/engine.js';

function evaluate(rows: SheetInput) {
  const engine = createEngine({ S: rows });
  const values = engine.getSheetValues(engine.getSheetId('S')!);
  engine.destroy();
  return values;
}

describe('LEVELGAP tolerance follows the spread of the levels', () => {
  // Hydrogen-atom levels n = 1, 2, 3 in joules: E_n = −R_∞hc/n², R_∞hc = 2.1798723611e-18 J (CODATA 2018).
  const rydbergJ = 2.1798723611035e-18;
  const levels = [1, 2, 3].map((n) => -rydbergJ / n ** 2);
  it('keeps distinct levels in joules apart (one electron: gap E2 − E1)', () => {
    expect(levelGap(levels, 1) / (levels[1] - levels[0])).toBeCloseTo(1, 12);
  });
  it('still groups levels in joules that agree within rounding', () => {
    const e = 1e-19;
    expect(levelGap([-3 * e, e * (0.1 + 0.2), e * 0.3, 2 * e], 4)).toBe(0);
  });
});

describe('"too many electrons" is #VALUE! in every family', () => {
  it.each([['=LEVELGAP({-1;1},5)'], ['=PIGAP("C=C",,5)'], ['=GROUNDTERM("O2",99)']])('%s', (formula) => {
    const value = evaluate([[formula]])[0][0];
    expect(value).toBeInstanceOf(DetailedCellError);
    expect((value as DetailedCellError).type).toBe('VALUE');
  });
});

describe('SMILES that used to be misread are refused or explained', () => {
  it('refuses impossible charges instead of dropping the atom', () => {
    expect(() => findPiSystem('[CH2+5]C=C')).toThrow(/atom 1 \(C\).*charge \+5/);
    expect(() => findPiSystem('[CH2-2]C=C')).toThrow(/atom 1 \(C\).*charge −2/);
  });
  it('reports an unclosed branch as a SMILES syntax error', () => {
    expect(() => findPiSystem('C(((')).toThrow(/SMILES syntax.*branch/);
  });
  it('calls C=[C] under-coordinated, not hypervalent', () => {
    expect(() => findPiSystem('C=[C]')).toThrow(/under-coordinated/);
    expect(() => findPiSystem('C=[C]')).not.toThrow(/hypervalent/);
  });
  it('says c1cccc1 was read as a radical and how to write the ion', () => {
    expect(() => findPiSystem('c1cccc1')).toThrow(/read as a radical/);
  });
  it('keeps accepting ordinary ions and the explicit radical', () => {
    expect(findPiSystem('[CH2-]C=C').electrons).toBe(4);
    expect(findPiSystem('[CH2+]C=C').electrons).toBe(2);
    expect(findPiSystem('[CH]1C=CC=C1').electrons).toBe(5);
    expect(findPiSystem('c1ccccc1').electrons).toBe(6);
  });
});

describe('limits at very large distance', () => {
  // S → 0 and E(H2+) → E(H 1s) = −0.5 Eh as R → ∞ (Levine, Quantum Chemistry, H2+ LCAO treatment).
  it('OVERLAP1S and H2PLUS return their limits at R = 1e300', () => {
    expect(overlap1s(1e300)).toBe(0);
    expect(h2PlusEnergyHartree(1e300)).toBe(-0.5);
    expect(h2PlusEnergyHartree(1e300, 'antibonding')).toBe(-0.5);
    const [[s], [e]] = evaluate([['=OVERLAP1S(1e300)'], ['=H2PLUS(1e300)']]);
    expect(s).toBe(0);
    expect(e).toBe(-0.5);
  });
});

describe('empty cells in required number arguments', () => {
  it('are refused with a message naming the parameter, not read as 0', () => {
    const [[s], [h]] = evaluate([['=OVERLAP1S(C1)'], ['=H2PLUS(C1)']]);
    expect(s).toBeInstanceOf(DetailedCellError);
    expect((s as DetailedCellError).message).toMatch(/distance.*empty/);
    expect(h).toBeInstanceOf(DetailedCellError);
    expect((h as DetailedCellError).message).toMatch(/distance.*empty/);
  });
  it('an empty cell in an optional number argument takes its default', () => {
    const [[s]] = evaluate([['=OVERLAP1S(2,C1)']]);
    expect(s).toBeCloseTo(overlap1s(2, 1), 12);
  });
});

describe('numbers below the engine rounding floor', () => {
  it('ABSORPTION with an absurd β gives a number (0 at worst), never NaN, as fuzzing found', () => {
    const [[v]] = evaluate([['=ABSORPTION("O=C1C=CC(=O)C=C1",1e+308,2)']]);
    expect(typeof v).toBe('number');
    expect(Number.isNaN(v)).toBe(false);
  });
});
