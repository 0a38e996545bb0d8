// SMILES input to the extended-Hückel functions needs openchemlib's conformer data, which each
// environment registers for itself. This file imports nothing that registers it except the server's
// own evaluation path (server/cli/evaluate.ts), so it fails if a Node entry point forgets to.
import { describe, expect, it } from 'vitest';
import { evaluateStandalone } from '../server/cli/evaluate.js';

describe('SMILES structures on the server', () => {
  it('build a conformer through the server evaluation path', () => {
    const [geometry, homo] = evaluateStandalone(['=EHTGEOMETRY("O")', '=EHTHOMO("O")']);
    expect(geometry).toEqual({ formula: '=EHTGEOMETRY("O")', value: 'SMILES: openchemlib conformer (seed 20260) tidied with MMFF94s+, 3 atoms with hydrogens' });
    // Water's HOMO is the out-of-plane O 2p, at H_pp(O) = −14.8 eV whatever the conformer's angle.
    expect((homo as { value: number }).value).toBeCloseTo(-14.8, 6);
  });
});
