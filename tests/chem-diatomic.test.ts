// Reference checks of the diatomic MO model against published values.
//  - Bond orders: Atkins & de Paula, Physical Chemistry, "Molecular structure" (MO bond orders of
//    period-2 diatomics and their ions) (from memory).
//  - Ground terms: Huber & Herzberg, Molecular Spectra and Molecular Structure IV: Constants of
//    Diatomic Molecules (1979), the X state of each molecule (from memory).
//  - B2 and O2 paramagnetic, C2 and N2 diamagnetic: common practice.
import { describe, expect, it } from 'vitest';
import { analyseDiatomic } from '../functions/chem/diatomic.js';
import { resolveDiagramKind } from '../functions/chem/moDiagram.js';
import { parseSpecies } from '../functions/chem/species.js';
import { formatTerm, groundTerm, termDegeneracy, termsOfConfiguration, type OpenShell } from '../functions/chem/terms.js';

// species, bond order (Atkins), unpaired electrons, ground term (Huber & Herzberg 1979; from memory)
const REFERENCE: [string, number, number, string][] = [
  ['H2', 1, 0, '¹Σg⁺'],
  ['H2+', 0.5, 1, '²Σg⁺'],
  ['He2', 0, 0, '¹Σg⁺'],
  ['HeH+', 1, 0, '¹Σ⁺'],
  ['Li2', 1, 0, '¹Σg⁺'],
  ['Be2', 0, 0, '¹Σg⁺'],
  ['B2', 1, 2, '³Σg⁻'],
  ['C2', 2, 0, '¹Σg⁺'],
  ['N2', 3, 0, '¹Σg⁺'],
  ['O2', 2, 2, '³Σg⁻'],
  ['F2', 1, 0, '¹Σg⁺'],
  ['Ne2', 0, 0, '¹Σg⁺'],
  ['O2+', 2.5, 1, '²Πg'],
  ['O2-', 1.5, 1, '²Πg'],
  ['O2^2-', 1, 0, '¹Σg⁺'],
  ['N2+', 2.5, 1, '²Σg⁺'],
  ['CO', 3, 0, '¹Σ⁺'],
  ['CN-', 3, 0, '¹Σ⁺'],
  ['NO', 2.5, 1, '²Π'],
  ['NO+', 3, 0, '¹Σ⁺'],
  ['OH', 1, 1, '²Π'],
  ['HF', 1, 0, '¹Σ⁺'],
];

describe('reference diatomics (bond orders: Atkins; terms: Huber & Herzberg 1979; from memory)', () => {
  it.each(REFERENCE)('%s: bond order %d, %d unpaired, ground term %s', (species, bondOrder, unpaired, term) => {
    const a = analyseDiatomic(species);
    expect(a.bondOrder).toBe(bondOrder);
    expect(a.unpairedElectrons).toBe(unpaired);
    expect(a.termUnicode).toBe(term);
  });

  it('finds B2 and O2 paramagnetic, C2 and N2 diamagnetic (common practice)', () => {
    expect(['B2', 'O2', 'C2', 'N2'].map((s) => analyseDiatomic(s).unpairedElectrons > 0)).toEqual([true, true, false, false]);
  });

  it('gives the electronic degeneracies used in partition functions: O2 3, NO 4, OH 4 (Huber & Herzberg terms; McQuarrie, Statistical Mechanics, g_el; from memory)', () => {
    expect(analyseDiatomic('O2').degeneracy).toBe(3);
    expect(analyseDiatomic('NO').degeneracy).toBe(4);
    expect(analyseDiatomic('OH').degeneracy).toBe(4);
    expect(analyseDiatomic('N2').degeneracy).toBe(1);
  });

  it('gives dioxygen the spin-only moment √8 ≈ 2.83 μB (spin-only formula)', () => {
    expect(analyseDiatomic('O2').spinMomentBohr).toBeCloseTo(Math.sqrt(8), 6);
    expect(analyseDiatomic('N2').spinMomentBohr).toBe(0);
  });
});

describe('further ground terms from Huber & Herzberg (1979) (from memory)', () => {
  it.each([
    ['He2+', '²Σu⁺'],
    ['C2-', '²Σg⁺'],
    ['CN', '²Σ⁺'],
    ['CO+', '²Σ⁺'],
    ['LiH', '¹Σ⁺'],
    ['BeH', '²Σ⁺'],
    ['BH', '¹Σ⁺'],
    ['CH', '²Π'],
    ['NH', '³Σ⁻'],
    ['OH+', '³Σ⁻'],
    ['HCl', '¹Σ⁺'],
    ['SH', '²Π'],
    ['Na2', '¹Σg⁺'],
    ['S2', '³Σg⁻'],
    ['Cl2', '¹Σg⁺'],
    ['SO', '³Σ⁻'],
    ['ClO', '²Π'],
    ['SiO', '¹Σ⁺'],
    ['CS', '¹Σ⁺'],
    ['PN', '¹Σ⁺'],
    ['AlO', '²Σ⁺'],
  ])('%s is %s', (species, term) => {
    expect(analyseDiatomic(species).termUnicode).toBe(term);
  });
});

describe('configurations and labels', () => {
  it('writes N2 with the KK core and s–p mixed order (Herzberg 1950 notation)', () => {
    expect(analyseDiatomic('N2').configAbbreviated).toBe('KK σg(2s)² σu*(2s)² πu(2p)⁴ σg(2p)²');
    expect(analyseDiatomic('N2').configFull).toBe('σg(1s)² σu*(1s)² σg(2s)² σu*(2s)² πu(2p)⁴ σg(2p)²');
  });

  it('writes OH as 1σ² 2σ² 3σ² 1π³ (Huber & Herzberg numbering; from memory)', () => {
    expect(analyseDiatomic('OH').configFull).toBe('1σ² 2σ² 3σ² 1π³');
    expect(analyseDiatomic('OH').configAbbreviated).toBe('K 2σ² 3σ² 1π³');
  });

  it('numbers CO as … 1π⁴ 5σ² with 5σ the HOMO and 2π the LUMO (Huber & Herzberg numbering; common practice)', () => {
    const co = analyseDiatomic('CO');
    expect(co.configFull).toBe('1σ² 2σ² 3σ² 4σ*² 1π⁴ 5σ²');
    expect(co.homo.label).toBe('5σ');
    expect(co.lumo?.label).toBe('2π*');
  });

  it('writes HCl over a neon core on chlorine as K L 4σ² 5σ² 2π⁴ (Mulliken numbering counts the core)', () => {
    expect(analyseDiatomic('HCl').configAbbreviated).toBe('K L 4σ² 5σ² 2π⁴');
  });

  it('uses n = 3 shells over neon cores for Cl2', () => {
    const cl2 = analyseDiatomic('Cl2');
    expect(cl2.configAbbreviated).toBe('KK LL σg(3s)² σu*(3s)² σg(3p)² πu(3p)⁴ πg*(3p)⁴');
    expect(cl2.bondOrder).toBe(1);
  });

  it('makes the half-filled level both HOMO and LUMO of an open shell (O2: πg*)', () => {
    const o2 = analyseDiatomic('O2');
    expect(o2.homo.label).toBe('πg*(2p)');
    expect(o2.lumo?.label).toBe('πg*(2p)');
  });

  it('has no LUMO when every valence level is full (Ne2, He2)', () => {
    expect(analyseDiatomic('Ne2').lumo).toBeNull();
    expect(analyseDiatomic('He2').lumo).toBeNull();
  });

  it('lists the hydride orbitals with the partner π pair non-bonding (Atkins, HF)', () => {
    expect(analyseDiatomic('HF').levels.map((l) => [l.label, l.character, l.occupancy])).toEqual([
      ['2σ', 'nonbonding', 2],
      ['3σ', 'bonding', 2],
      ['1π', 'nonbonding', 4],
      ['4σ*', 'antibonding', 0],
    ]);
    expect(analyseDiatomic('LiH').levels[0]).toMatchObject({ label: '2σ', character: 'bonding', occupancy: 2 });
  });
});

describe('level ordering', () => {
  it('takes the mixed order for 10 or fewer valence electrons and the unmixed one from 11 (auto rule)', () => {
    expect(resolveDiagramKind(parseSpecies('N2'), 'auto')).toBe('sp-mixed');
    expect(resolveDiagramKind(parseSpecies('CO'), 'auto')).toBe('sp-mixed');
    expect(resolveDiagramKind(parseSpecies('N2-'), 'auto')).toBe('sp-unmixed');
    expect(resolveDiagramKind(parseSpecies('O2'), 'auto')).toBe('sp-unmixed');
    expect(resolveDiagramKind(parseSpecies('OH'), 'mixed')).toBe('hydride');
    expect(resolveDiagramKind(parseSpecies('HeH+'), 'unmixed')).toBe('one-s');
  });

  it('makes B2 diamagnetic ¹Σg⁺ without s–p mixing: the classic evidence for mixing (Atkins; common practice)', () => {
    const unmixed = analyseDiatomic('B2', 'unmixed');
    expect(unmixed.unpairedElectrons).toBe(0);
    expect(unmixed.termUnicode).toBe('¹Σg⁺');
  });

  it('puts the N2 HOMO at σg(2p) only with mixing (N2 photoelectron spectrum, 3σg first; Turner et al. 1970; from memory)', () => {
    expect(analyseDiatomic('N2', 'mixed').homo.label).toBe('σg(2p)');
    expect(analyseDiatomic('N2', 'unmixed').homo.label).toBe('πu(2p)');
  });

  it('gives O2 the same term in either order, since both fill πg*', () => {
    expect(analyseDiatomic('O2', 'mixed').termUnicode).toBe('³Σg⁻');
    expect(analyseDiatomic('O2', 'unmixed').termUnicode).toBe('³Σg⁻');
  });
});

describe('limits of the model', () => {
  it.each([
    ['NaCl', "'NaCl' pairs sodium (an s-block metal) with chlorine: such largely ionic pairs are outside this covalent MO model"],
    ['LiF', "'LiF' pairs lithium (an s-block metal) with fluorine: such largely ionic pairs are outside this covalent MO model"],
    ['HeO', "'HeO' pairs helium with oxygen: this model bonds helium only to H or He"],
    ['Ne2-', "'Ne2-' has 17 valence electrons; its valence orbitals hold at most 16"],
    ['HF^3-', "'HF^3-' has 11 valence electrons; its valence orbitals hold at most 10"],
    ['He2-', "'He2-' has 5 valence electrons; its valence orbitals hold at most 4"],
  ])('rejects %s with a reason', (species, message) => {
    expect(() => analyseDiatomic(species)).toThrow(message);
  });

  it('returns the same cached analysis for a repeated species and ordering', () => {
    expect(analyseDiatomic('NO', 'auto')).toBe(analyseDiatomic('NO', 'auto'));
    expect(analyseDiatomic('NO', 'mixed')).not.toBe(analyseDiatomic('NO', 'auto'));
  });
});

// Terms of open shells: Herzberg, Spectra of Diatomic Molecules (1950), tables of the terms arising
// from equivalent and non-equivalent σ, π and δ electrons (from memory).
describe('term symbols from microstates', () => {
  const termsOf = (shells: OpenShell[], homonuclear = false) =>
    termsOfConfiguration(shells, homonuclear).map((t) => formatTerm(t)).sort();

  it.each<[string, OpenShell[], string[]]>([
    ['π²', [{ lambda: 1, electrons: 2 }], ['¹Δ', '¹Σ⁺', '³Σ⁻']],
    ['π³', [{ lambda: 1, electrons: 3 }], ['²Π']],
    ['π⁴', [{ lambda: 1, electrons: 4 }], ['¹Σ⁺']],
    ['σ¹', [{ lambda: 0, electrons: 1 }], ['²Σ⁺']],
    ['σ¹π¹', [{ lambda: 0, electrons: 1 }, { lambda: 1, electrons: 1 }], ['¹Π', '³Π']],
    ['π¹π¹', [{ lambda: 1, electrons: 1 }, { lambda: 1, electrons: 1 }], ['¹Δ', '¹Σ⁺', '¹Σ⁻', '³Δ', '³Σ⁺', '³Σ⁻']],
    ['δ²', [{ lambda: 2, electrons: 2 }], ['¹Γ', '¹Σ⁺', '³Σ⁻']],
    ['π²σ¹', [{ lambda: 1, electrons: 2 }, { lambda: 0, electrons: 1 }], ['²Δ', '²Σ⁺', '²Σ⁻', '⁴Σ⁻']],
  ])('%s gives the terms Herzberg lists', (_, shells, expected) => {
    expect(termsOf(shells)).toEqual([...expected].sort());
  });

  it('accounts for every microstate: Σ degeneracies of π² add up to C(4,2) = 6', () => {
    const total = termsOfConfiguration([{ lambda: 1, electrons: 2 }]).reduce((n, t) => n + termDegeneracy(t), 0);
    expect(total).toBe(6);
  });

  it('gives πu³ πg¹ the u terms of the excited O2 configuration (Herzberg 1950)', () => {
    const shells: OpenShell[] = [
      { lambda: 1, electrons: 3, parity: 'u' },
      { lambda: 1, electrons: 1, parity: 'g' },
    ];
    expect(termsOf(shells, true)).toEqual(['¹Δu', '¹Σu⁺', '¹Σu⁻', '³Δu', '³Σu⁺', '³Σu⁻'].sort());
  });

  it('picks ⁴Σg⁻ for πu² σg¹ by Hund\'s rules, the X state of C2+ (Huber & Herzberg 1979; from memory)', () => {
    const term = groundTerm([{ lambda: 1, electrons: 2, parity: 'u' }, { lambda: 0, electrons: 1, parity: 'g' }], true);
    expect(formatTerm(term)).toBe('⁴Σg⁻');
    expect(formatTerm(term, 'ascii')).toBe('4Sigma_g-');
  });

  it('picks ³Δ over ³Σ± for π¹π¹ (Hund: highest S, then highest Λ)', () => {
    expect(formatTerm(groundTerm([{ lambda: 1, electrons: 1 }, { lambda: 1, electrons: 1 }]))).toBe('³Δ');
  });

  it('refuses a shell with more electrons than it holds', () => {
    expect(() => termsOfConfiguration([{ lambda: 1, electrons: 5 }])).toThrow('holds 0 to 4 electrons, not 5');
  });
});
