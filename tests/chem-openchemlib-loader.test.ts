// openchemlib reaches functions/chem/ through one loader: in Node (no document) it is in place as soon
// as the chemistry modules are imported, so the server, the CLI and these tests call SMILES functions
// synchronously; on a page it is loaded only when asked, and a SMILES function called before then
// says so instead of failing obscurely.
import { afterEach, describe, expect, it, vi } from 'vitest';
import { openchemlibLoaded } from '../functions/chem/openchemlib.js';
import { findPiSystem } from '../functions/chem/piSystem.js';

afterEach(() => {
  vi.unstubAllGlobals();
  vi.resetModules();
});

describe('the openchemlib loader', () => {
  it('has the toolkit in place at import where there is no document (Node)', () => {
    expect(openchemlibLoaded()).toBe(true);
    // Ethylene: two π centres with one π electron each (common practice).
    expect(findPiSystem('C=C').electrons).toBe(2);
  });

  it('on a page, loads only when asked; a SMILES function before then says the toolkit is loading', async () => {
    vi.resetModules();
    vi.stubGlobal('document', {});
    const loader = await import('../functions/chem/openchemlib.js');
    const piSystem = await import('../functions/chem/piSystem.js');
    expect(loader.openchemlibLoaded()).toBe(false);
    expect(() => piSystem.findPiSystem('C=C')).toThrow(/structure toolkit is still loading/);
    await loader.loadOpenchemlib();
    expect(loader.openchemlibLoaded()).toBe(true);
    // Benzene: six π centres, six π electrons (common practice).
    const benzene = piSystem.findPiSystem('c1ccccc1');
    expect([benzene.centres.length, benzene.electrons]).toEqual([6, 6]);
  });
});
