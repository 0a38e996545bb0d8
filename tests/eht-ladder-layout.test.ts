// The structure panel's extended-Hückel ladder: which levels it shows around the frontier, with each
// level's electrons and largest contributions (the same words EHTHOMOMAKEUP gives for the HOMO).
import { describe, expect, it } from 'vitest';
import '../functions/openchemlibNode.js';
import { computeEhtResult, type EhtSummary } from '../functions/chem/ehtSummary.js';
import { createEngine } from '../functions/engine.js';
import { ehtLadder } from '../src/features/diagram/ehtLayout.js';
import { subjectOfCell } from '../src/features/diagram/cellSubject.js';

// Water at its measured gas-phase geometry (NIST CCCBDB; recalled from memory).
const WATER = 'O 0 0 0; H 0.7574 0 0.5864; H -0.7574 0 0.5864';

describe('the extended-Hückel ladder of the structure panel', () => {
  it('shows all six levels of water, highest first, the HOMO being the O 2p lone pair', () => {
    const ladder = ehtLadder(computeEhtResult(WATER) as EhtSummary);
    // Six basis functions (O 2s, 2p×3; H 1s×2) make six levels; eight valence electrons fill four (common practice: valence electron count).
    expect(ladder.rows.map((r) => r.level)).toEqual([6, 5, 4, 3, 2, 1]);
    expect(ladder.rows.map((r) => r.electrons)).toEqual([0, 0, 2, 2, 2, 2]);
    const homo = ladder.rows.find((r) => r.role === 'HOMO')!;
    expect(homo).toMatchObject({ level: 4, makeup: 'O1 2p 1.00' });
    // Non-bonding, so at O's H_pp (R. Hoffmann, J. Chem. Phys. 39, 1397 (1963), parameter table).
    expect(homo.energyEv).toBeCloseTo(-14.8, 6);
    expect(ladder.rows.find((r) => r.role === 'LUMO')?.level).toBe(5);
    expect([ladder.hiddenBelow, ladder.hiddenAbove]).toEqual([0, 0]);
  });

  it('shows a window around the frontier of benzene and counts what it leaves out', () => {
    const summary = computeEhtResult('c1ccccc1') as EhtSummary;
    const ladder = ehtLadder(summary);
    // 30 basis functions (6 C × 4 + 6 H × 1) and 30 valence electrons: levels 1–15 filled (common practice).
    expect(summary.levels).toHaveLength(30);
    expect(ladder.rows.map((r) => r.level)).toEqual([19, 18, 17, 16, 15, 14, 13, 12, 11, 10]);
    expect([ladder.hiddenBelow, ladder.hiddenAbove]).toEqual([9, 11]);
    const homo = ladder.rows.find((r) => r.role === 'HOMO')!;
    const engine = createEngine({ S: [['=EHTHOMOMAKEUP("c1ccccc1")']] });
    expect(homo.makeup).toBe(engine.getCellValue({ sheet: 0, row: 0, col: 0 }));
  });

  it('finds the structure of a selected EHT formula, through a cell reference', () => {
    const subject = subjectOfCell({ input: '=EHTGAP(A1)', display: '12.3', textOf: (a1) => (a1 === 'A1' ? WATER : null) });
    expect(subject.kind).toBe('eht');
    if (subject.kind === 'eht' && subject.summary !== 'pending') expect(subject.summary.atoms).toBe(3);
  });
});
