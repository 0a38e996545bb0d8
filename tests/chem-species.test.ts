// Species notation: what a chemist may type, what it means, and what every rejection says.
// Electron counts use atomic numbers from the IUPAC Periodic Table (2022).
import { beforeEach, describe, expect, it } from 'vitest';
import { ChemError } from '../functions/catalog/types.js';
import { ELEMENTS, elementBySymbol } from '../functions/chem/elements.js';
import { clearSpeciesCache, parseSpecies, speciesParseCount } from '../functions/chem/species.js';

describe('elements H to Ar', () => {
  it('covers the eighteen elements of periods 1–3 with their atomic numbers (IUPAC 2022)', () => {
    expect(ELEMENTS.map((e) => e.symbol).join(' ')).toBe('H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar');
    expect(elementBySymbol('Cl')).toMatchObject({ atomicNumber: 17, period: 3, name: 'chlorine' });
  });

  it('counts valence electrons outside the [He] or [Ne] core (NIST ASD ground configurations)', () => {
    const valence = Object.fromEntries(ELEMENTS.map((e) => [e.symbol, e.valenceElectrons]));
    expect(valence).toMatchObject({ H: 1, He: 2, Li: 1, C: 4, O: 6, F: 7, Ne: 8, Na: 1, Si: 4, S: 6, Cl: 7, Ar: 8 });
  });
});

describe('parseSpecies: accepted notations', () => {
  it.each([
    ['O2', 'O2', 0],
    ['O2+', 'O2+', 1],
    ['O2-', 'O2-', -1],
    ['O2^2-', 'O2^2-', -2],
    ['O2(2-)', 'O2^2-', -2],
    ['O2^-2', 'O2^2-', -2],
    ['O2--', 'O2^2-', -2],
    ['O2 2-', 'O2^2-', -2],
    ['O₂²⁻', 'O2^2-', -2],
    ['O2\u2212', 'O2-', -1],
    ['C2^2-', 'C2^2-', -2],
    ['CN-', 'CN-', -1],
    ['NO+', 'NO+', 1],
    ['CO', 'CO', 0],
    ['HeH+', 'HeH+', 1],
    ['H2+', 'H2+', 1],
    ['OH', 'OH', 0],
    ['N2', 'N2', 0],
    ['HF', 'HF', 0],
    ['Cl2', 'Cl2', 0],
    ['N2^3-', 'N2^3-', -3],
    ['  NO(+)  ', 'NO+', 1],
  ])('reads %s as %s with charge %i', (text, formula, charge) => {
    const s = parseSpecies(text);
    expect(s.formula).toBe(formula);
    expect(s.charge).toBe(charge);
    expect(s.text).toBe(text);
  });

  it('tells homonuclear from heteronuclear species', () => {
    expect(parseSpecies('O2').homonuclear).toBe(true);
    expect(parseSpecies('OO').homonuclear).toBe(true);
    expect(parseSpecies('CO').homonuclear).toBe(false);
    expect(parseSpecies('CO').atoms.map((a) => a.symbol)).toEqual(['C', 'O']);
  });

  it('counts electrons after the charge: peroxide has 14 valence and 18 in all', () => {
    expect(parseSpecies('O2^2-')).toMatchObject({ valenceElectrons: 14, totalElectrons: 18 });
    expect(parseSpecies('HeH+')).toMatchObject({ valenceElectrons: 2, totalElectrons: 2 });
    expect(parseSpecies('NO+')).toMatchObject({ valenceElectrons: 10, totalElectrons: 14 });
    expect(parseSpecies('Cl2')).toMatchObject({ valenceElectrons: 14, totalElectrons: 34 });
  });
});

describe('parseSpecies: rejections name the problem', () => {
  it.each([
    ['Xq2', "unknown element 'Xq' in 'Xq2'"],
    ['H2O', "only diatomic species are supported: 'H2O' has 3 atoms"],
    ['O', "only diatomic species are supported: 'O' has 1 atom"],
    ['CN2-', "only diatomic species are supported: 'CN2-' has 3 atoms (for a charge of 2- write CN^2-)"],
    ['Fe2', "element 'Fe' in 'Fe2' is outside the supported range H to Ar"],
    ['O2^5+', "charge +5 in 'O2^5+' is outside the supported range -3 to +3"],
    ['O2^4-', "charge -4 in 'O2^4-' is outside the supported range -3 to +3"],
    ['H2^5+', "charge +5 leaves no electrons in 'H2^5+'"],
    ['H2^2+', "charge +2 leaves no electrons in 'H2^2+'"],
    ['Li2^2+', "charge +2 leaves no valence electrons in 'Li2^2+'"],
    ['', 'species is empty: type a diatomic such as O2, NO+ or OH'],
    ['   ', 'species is empty: type a diatomic such as O2, NO+ or OH'],
    ['5', "'5' is a number, not a species: type a diatomic such as O2, NO+ or OH"],
    ['co', "'co' is not a species: element symbols start with a capital letter (e.g. CO, NO, Cl2)"],
    ['O2#', "'O2#' is not a species: unexpected '#'"],
    ['O22-', "'O22-' is ambiguous: write a multiple charge with ^ or brackets, e.g. O2^2- or O2(2-)"],
    ['O2^x', "cannot read the charge '^x' in 'O2^x': write it as O2+, O2-, O2^2- or O2(2-)"],
    ['O0', "'O0' has a zero atom count after 'O'"],
  ])('rejects %j', (text, message) => {
    expect(() => parseSpecies(text)).toThrow(ChemError);
    expect(() => parseSpecies(text)).toThrow(message);
  });
});

describe('parse cache', () => {
  beforeEach(() => clearSpeciesCache());

  it('parses 100,000 evaluations of three repeated species only three times', () => {
    const column = ['O2', 'NO+', 'CN-'];
    let bonds = 0;
    for (let i = 0; i < 100_000; i++) bonds += parseSpecies(column[i % 3]).atoms.length;
    expect(bonds).toBe(200_000);
    expect(speciesParseCount()).toBe(3);
  });

  it('caches rejections too, so a column of the same typo is parsed once', () => {
    for (let i = 0; i < 1_000; i++) expect(() => parseSpecies('Xq2')).toThrow("unknown element 'Xq'");
    expect(speciesParseCount()).toBe(1);
  });

  it('returns the very same parsed object for the same text', () => {
    expect(parseSpecies('O2^2-')).toBe(parseSpecies('O2^2-'));
  });
});
