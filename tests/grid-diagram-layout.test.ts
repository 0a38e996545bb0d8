// The side panel's pictures: which cells name a species or a π system, and how electrons are laid
// on the MO diagram and the Hückel ladder.
import { describe, expect, it } from 'vitest';
import { analyseDiatomic } from '../functions/chem/diatomic.js';
import { huckelModelOf } from '../functions/chem/huckelCache.js';
import { cellReferences, stringLiterals, subjectOfCell } from '../src/features/diagram/cellSubject.js';
import { hundFilling, layoutMoDiagram } from '../src/features/diagram/moLayout.js';
import { ladderLevels, levelLabel } from '../src/features/diagram/huckelLayout.js';

const electronsOn = (levels: { orbitals: number[] }[]) => levels.reduce((n, l) => n + l.orbitals.reduce((a, b) => a + b, 0), 0);
const unpaired = (levels: { orbitals: number[] }[]) => levels.reduce((n, l) => n + l.orbitals.filter((o) => o === 1).length, 0);

describe("Hund's rule on degenerate orbitals", () => {
  it('puts one electron in each orbital before pairing', () => {
    expect(hundFilling(2, 2)).toEqual([1, 1]);
    expect(hundFilling(3, 2)).toEqual([2, 1]);
    expect(hundFilling(4, 3)).toEqual([2, 1, 1]); // oxygen 2p⁴: two unpaired (NIST ground level ³P₂)
    expect(hundFilling(0, 1)).toEqual([0]);
  });

  it('refuses more electrons than the orbitals hold', () => {
    expect(() => hundFilling(5, 2)).toThrow(/do not fit/);
  });
});

describe('MO diagram layout', () => {
  it('draws dioxygen with two unpaired electrons in the πg* pair (paramagnetic O2, Atkins & de Paula)', () => {
    const pic = layoutMoDiagram(analyseDiatomic('O2'));
    const pistar = pic.molecular.find((l) => l.label.startsWith('πg*'))!;
    expect(pistar.orbitals).toEqual([1, 1]);
    expect(pistar.character).toBe('antibonding');
    expect(electronsOn(pic.molecular)).toBe(12);
    expect(unpaired(pic.molecular)).toBe(2);
  });

  it('gives each oxygen atom 2s² 2p⁴ on its side, at the same heights for a homonuclear molecule', () => {
    const pic = layoutMoDiagram(analyseDiatomic('O2'));
    expect(pic.left.levels.map((l) => [l.label, l.orbitals])).toEqual([
      ['2s', [2]],
      ['2p', [2, 1, 1]],
    ]);
    expect(pic.right.levels.map((l) => l.slot)).toEqual(pic.left.levels.map((l) => l.slot));
  });

  it('draws the more electronegative atom of carbon monoxide lower', () => {
    const pic = layoutMoDiagram(analyseDiatomic('CO'));
    expect(pic.left.symbol).toBe('C');
    expect(pic.right.levels[1].slot).toBeLessThan(pic.left.levels[1].slot);
    expect(unpaired(pic.molecular)).toBe(0);
  });

  it('links both 1s orbitals to the bonding and antibonding level of dihydrogen', () => {
    const pic = layoutMoDiagram(analyseDiatomic('H2'));
    expect(pic.molecular.map((l) => l.character)).toEqual(['bonding', 'antibonding']);
    expect(pic.links).toHaveLength(4);
    expect(pic.molecular[0].orbitals).toEqual([2]);
  });

  it('shows the partner’s p pair of a hydride as non-bonding (OH radical: one unpaired electron, ²Π, Huber & Herzberg 1979)', () => {
    const pic = layoutMoDiagram(analyseDiatomic('OH'));
    const pi = pic.molecular.find((l) => l.orbitals.length === 2)!;
    expect(pi.character).toBe('nonbonding');
    expect(unpaired(pic.molecular)).toBe(1);
    expect(pic.left.levels.map((l) => l.label)).toEqual(['2s', '2p']);
    expect(pic.right.levels.map((l) => l.label)).toEqual(['1s']);
  });
});

describe('Hückel ladder', () => {
  it('shows benzene as 1 + 2 + 2 + 1 levels at α+2β, α+β, α−β, α−2β with six paired electrons (Streitwieser 1961, ch. 2)', () => {
    const model = huckelModelOf([['c1ccccc1']]);
    const ladder = ladderLevels(model, model.electrons);
    expect(ladder.map((l) => l.orbitals.length)).toEqual([1, 2, 2, 1]);
    expect(ladder.map((l) => levelLabel(l.x))).toEqual(['α + 2β', 'α + β', 'α − β', 'α − 2β']);
    expect(ladder.map((l) => l.orbitals)).toEqual([[2], [2, 2], [0, 0], [0]]);
  });

  it('leaves square cyclobutadiene with one electron in each non-bonding orbital (Hund)', () => {
    const ladder = ladderLevels({ levels: [2, 0, 0, -2] }, 4);
    expect(ladder.map((l) => l.orbitals)).toEqual([[2], [1, 1], [0]]);
    expect(levelLabel(0)).toBe('α');
  });
});

describe('finding what a cell is about', () => {
  const sheet: Record<string, string> = { A2: 'NO+', B7: 'c1ccccc1' };
  const textOf = (a1: string) => sheet[a1] ?? null;

  it('reads a species typed into the cell', () => {
    expect(subjectOfCell({ input: 'O2', display: 'O2', textOf })).toMatchObject({ kind: 'diatomic', text: 'O2' });
  });

  it('reads a species from a formula’s string argument', () => {
    expect(subjectOfCell({ input: '=BONDORDER("N2^2-")', display: '2', textOf })).toMatchObject({ kind: 'diatomic', text: 'N2^2-' });
  });

  it('follows a formula’s reference to the cell holding the species', () => {
    expect(subjectOfCell({ input: '=UNPAIRED(A2)', display: '0', textOf })).toMatchObject({ kind: 'diatomic', text: 'NO+' });
  });

  it('takes a Hückel function’s argument as SMILES even where it could read as a species', () => {
    expect(subjectOfCell({ input: '=PIGAP(B7)', display: '2', textOf })).toMatchObject({ kind: 'huckel', smiles: 'c1ccccc1' });
  });

  it('finds nothing in a number or a sentence', () => {
    expect(subjectOfCell({ input: '42', display: '42', textOf }).kind).toBe('none');
    expect(subjectOfCell({ input: 'batch three', display: 'batch three', textOf }).kind).toBe('none');
  });

  it('picks string literals and references apart without mistaking function names for cells', () => {
    expect(stringLiterals('=CONCATENATE("say ""O2""", "N2")')).toEqual(['say "O2"', 'N2']);
    expect(cellReferences('=LOG10(A1)+$B$2*Sheet2!C3+"D4"')).toEqual(['A1', 'B2']);
  });
});
