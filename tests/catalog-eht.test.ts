// The extended-Hückel family through a real HyperFormula engine: spill shape and the scalar route,
// a structure in a cell reference, one geometry and one solve per structure across a row of
// functions, the charge argument, the size limit's message, and bad input as cell errors.
import '../functions/openchemlibNode.js';
import { DetailedCellError } from 'hyperformula';
import { beforeEach, describe, expect, it } from 'vitest';
import { EHT_MAX_BASIS } from '../functions/chem/eht.js';
import { clearLocalResults, localComputations } from '../functions/structureResults.js';
import { createEngine, type SheetInput } from '../functions/engine.js';

function evaluate(rows: SheetInput) {
  const engine = createEngine({ S: rows });
  const values = engine.getSheetValues(engine.getSheetId('S')!);
  engine.destroy();
  return values;
}
const one = (formula: string, rows: SheetInput = []) => evaluate([...rows, [formula]])[rows.length][0];

// Hydrogen fluoride at r = 0.917 Å (measured; recalled from memory): 5 basis functions, 8 electrons.
const HF = 'H 0 0 0; F 0 0 0.917';

beforeEach(() => clearLocalResults());

describe('EHTLEVELS', () => {
  it('spills one row per basis function, energy and occupancy, lowest first, leaving the cell below free', () => {
    const values = evaluate([[`=EHTLEVELS("${HF}")`], [], [], [], [], ['below']]);
    const energies = values.slice(0, 5).map((r) => r[0] as number);
    const occupancy = values.slice(0, 5).map((r) => r[1]);
    expect([...energies].sort((a, b) => a - b)).toEqual(energies);
    expect(occupancy).toEqual([2, 2, 2, 2, 0]);
    // The two π lone pairs of HF are F 2p alone: they sit exactly at H_pp(F) = −18.1 eV (ehtParams.ts).
    expect(energies[2]).toBeCloseTo(-18.1, 9);
    expect(energies[3]).toBeCloseTo(-18.1, 9);
    expect(values[5][0]).toBe('below');
  });

  it('gives level k as one number (the scalar route), equal to the spilled row', () => {
    const spilled = evaluate([[`=EHTLEVELS("${HF}")`]]);
    expect(one(`=EHTLEVELS("${HF}",5)`)).toBeCloseTo(spilled[4][0] as number, 12);
    const error = one(`=EHTLEVELS("${HF}",6)`) as DetailedCellError;
    expect(error).toBeInstanceOf(DetailedCellError);
    expect(error.message).toMatch(/level 6 is out of range: this system has 5 levels/);
  });

  it('still spills when k is left out before a charge: EHTLEVELS(s,,charge)', () => {
    // HF+ (7 electrons): the π pair shares three electrons, 1.5 each.
    const values = evaluate([[`=EHTLEVELS("${HF}",,1)`]]);
    expect(values.slice(0, 5).map((r) => r[1])).toEqual([2, 2, 1.5, 1.5, 0]);
  });

  it('reads a structure from a cell reference into a fixed 50×2 area', () => {
    const values = evaluate([[HF], ['=EHTLEVELS(A1)']]);
    expect(values[1][1]).toBe(2);
    expect(values[5][1]).toBe(0);
    expect(values[6]?.[0] ?? null).toBeNull();
  });

  it('asks for k when a molecule has more levels than a spill may hold', () => {
    // Benzene: 6 C × 4 + 6 H = 30 levels spill; hexane: 6 × 4 + 14 = 38; decane: 40 + 22 = 62 > 50.
    const error = one('=EHTLEVELS(A1)', [['CCCCCCCCCC']]) as DetailedCellError;
    expect(error).toBeInstanceOf(DetailedCellError);
    expect(error.message).toMatch(/EHTLEVELS would spill 62 values.*EHTLEVELS\(structure, k\)/);
  });
});

describe('one geometry, one solve and one summary per structure', () => {
  it('builds the SMILES conformer once for a row of functions on the same molecule', () => {
    const row = ['CC=O', '=EHTHOMO(A1)', '=EHTLUMO(A1)', '=EHTGAP(A1)', '=EHTCHARGE(A1,3)', '=EHTBONDPOP(A1,2,3)', '=EHTENERGY(A1)', '=EHTHOMOMAKEUP(A1)', '=EHTGEOMETRY(A1)'];
    const values = evaluate([row, row]);
    expect(localComputations()).toBe(1);
    const [, homo, lumo, gap, chargeO, popCO, , makeup, geometry] = values[0];
    expect(gap as number).toBeCloseTo((lumo as number) - (homo as number), 9);
    // Acetaldehyde: carbonyl O negative, C=O bonding; the HOMO is the oxygen lone pair (n_O).
    expect(chargeO as number).toBeLessThan(-0.3);
    expect(popCO as number).toBeGreaterThan(0.5);
    expect(makeup).toMatch(/^O3 2p/);
    expect(geometry).toMatch(/^SMILES: openchemlib conformer \(seed \d+\) tidied with MMFF94s\+, 7 atoms with hydrogens$/);
    expect(values[1]).toEqual(values[0]);
  });
});

describe('charge', () => {
  it('takes the formal charge from SMILES, and the charge argument for XYZ text', () => {
    // NH4+ as SMILES and as XYZ (N–H 1.03 Å, tetrahedral) with charge 1: 8 electrons, closed shell.
    const s = 1.03 / Math.sqrt(3);
    const xyz = `N 0 0 0; H ${s} ${s} ${s}; H ${-s} ${-s} ${s}; H ${-s} ${s} ${-s}; H ${s} ${-s} ${-s}`;
    const [fromSmiles, neutralXyz, chargedXyz] = evaluate([['=EHTLEVELS("[NH4+]",4)', `=EHTLEVELS("${xyz}",4)`, `=EHTHOMO("${xyz}",1)`]])[0];
    // With charge 1 the t2 set (levels 2–4) is the HOMO; neutral, level 4 is still t2 but a ninth electron sits above.
    expect(chargedXyz as number).toBeCloseTo(neutralXyz as number, 9);
    expect(Math.abs((fromSmiles as number) - (chargedXyz as number))).toBeLessThan(1.5);
    expect(one(`=EHTHOMO("${xyz}")`) as number).toBeGreaterThan(chargedXyz as number);
  });

  // XYZ frames as a user pastes them into a cell: count, comment line, atoms. Hydroxide r(OH) 0.964 Å
  // (NIST CCCBDB; recalled from memory); ammonium N–H 1.03 Å, tetrahedral, as above.
  const s = (1.03 / Math.sqrt(3)).toFixed(4);
  const hydroxide = (comment: string) => ['2', comment, 'O 0 0 0', 'H 0 0 0.964'];
  const ammonium = (comment: string) => ['5', comment, 'N 0 0 0', `H ${s} ${s} ${s}`, `H -${s} -${s} ${s}`, `H -${s} ${s} -${s}`, `H ${s} -${s} -${s}`];
  const readings = (ref: string, q = '') => [`=EHTHOMO(${ref}${q})`, `=EHTLUMO(${ref}${q})`, `=EHTENERGY(${ref}${q})`, `=EHTCHARGE(${ref},1${q})`];

  it('takes the net charge from an XYZ comment line when no charge argument is given', () => {
    for (const [frame, q] of [[hydroxide, -1], [ammonium, 1]] as const) {
      const stated = frame(`charge=${q}`).join('\n');
      const plain = frame('no charge here').join('\n');
      const [[, ...fromComment], [, ...fromArgument], [, ...neutral]] = evaluate([
        [stated, ...readings('A1')],
        [plain, ...readings('A2', `,${q}`)],
        [plain, ...readings('A3')],
      ]);
      fromComment.forEach((v) => expect(typeof v).toBe('number'));
      fromComment.forEach((v, i) => expect(v as number).toBeCloseTo(fromArgument[i] as number, 9));
      // The same frame on one line inside the formula, as ";"-separated text.
      expect(one(`=EHTENERGY("${frame(`charge=${q}`).join('; ')}")`) as number).toBeCloseTo(fromArgument[2] as number, 9);
      // No self-consistency, so the levels do not move with the charge: the species with one electron
      // more has the sum of the other plus that electron's level (an independent check that the comment's
      // charge was used). Hydroxide's extra electron joins the O 2p π pair, which has no partner on H and
      // so sits at H_pp(O) = −14.8 eV (Hoffmann 1963); neutral NH4's ninth goes into the cation's LUMO.
      const [moreElectrons, fewer] = q === -1 ? [fromComment[2], neutral[2]] : [neutral[2], fromComment[2]];
      const extraLevel = q === -1 ? -14.8 : (fromComment[1] as number);
      expect((moreElectrons as number) - (fewer as number)).toBeCloseTo(extraLevel, 6);
    }
  });

  it('refuses a charge argument that the XYZ comment line contradicts, naming both, and accepts one that agrees', () => {
    const stated = hydroxide('hydroxide charge=-1').join('\n');
    const [[, positive, zero, agreeing, omitted]] = evaluate([[stated, '=EHTHOMO(A1,1)', '=EHTENERGY(A1,0)', '=EHTENERGY(A1,-1)', '=EHTENERGY(A1)']]);
    for (const [value, given] of [[positive, '1'], [zero, '0']] as const) {
      expect(value).toBeInstanceOf(DetailedCellError);
      expect((value as DetailedCellError).message).toMatch(new RegExp(`charge argument is ${given} but the XYZ comment line says charge=-1`));
    }
    expect(typeof agreeing).toBe('number');
    expect(agreeing).toBe(omitted);
  });
});

describe('bad input comes back as a cell error naming the problem', () => {
  const cases: [string, RegExp][] = [
    ['=EHTHOMO("Fe 0 0 0; O 0 0 1.6")', /no extended-Hückel parameters for Fe \(atom 1\)/],
    ['=EHTHOMO("")', /empty structure/],
    ['=EHTCHARGE("O 0 0 0; H 0 0 0.96",3)', /atom 3 is out of range: the structure has 2 atoms/],
    ['=EHTBONDPOP("O 0 0 0; H 0 0 0.96",1,1)', /both atom 1/],
    ['=EHTHOMO("H 0 0 0",1)', /no valence electrons/],
    ['=EHTLUMO("He 0 0 0")', /no extended-Hückel parameters for He/],
    ['=EHTHOMO("C1CC")', /cannot read SMILES 'C1CC'/],
    // 76 chlorine atoms 3 Å apart: 304 basis functions, over the limit before any solve starts.
    [`=EHTHOMO("${Array.from({ length: 76 }, (_, i) => `Cl ${3 * i} 0 0`).join('; ')}")`, new RegExp(`needs 304 basis functions; extended-Hückel cells are limited to ${EHT_MAX_BASIS}`)],
  ];
  for (const [formula, message] of cases)
    it(formula.slice(0, 60), () => {
      const value = one(formula) as DetailedCellError;
      expect(value).toBeInstanceOf(DetailedCellError);
      expect(value.message).toMatch(message);
    });
});

describe('model limits in help and docs', () => {
  it('states in every entry and in docs/eht.md: no self-consistency, exaggerated charges, qualitative energies, and the usual caution', async () => {
    const { catalog } = await import('../functions/catalog/index.js');
    const fs = await import('node:fs');
    const entries = catalog.filter((e) => e.family === 'Extended Hückel' && e.name !== 'EHTGEOMETRY');
    expect(entries.length).toBeGreaterThanOrEqual(8);
    const docs = fs.readFileSync(new URL('../docs/eht.md', import.meta.url), 'utf8').replace(/\s+/g, ' ');
    for (const text of [...entries.map((e) => e.source), docs]) {
      for (const words of ['no self-consistency', 'exaggerated', 'qualitative', 'safety data sheets', 'qualified review']) expect(text).toContain(words);
    }
  });
});
