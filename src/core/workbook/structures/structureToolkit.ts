// openchemlib, which the engine's SMILES functions use synchronously, is loaded apart from the page's
// start-up script (functions/chem/openchemlib.ts says why). A workbook's engine is built only once it
// is in; a failed load (offline, say) is an error the workbook page shows.
import { useEffect, useState } from 'react';
import { loadOpenchemlib, openchemlibLoaded } from '@functions/chem/openchemlib.js';

export type ToolkitState = 'loading' | 'ready' | Error;

export function useStructureToolkit(): ToolkitState {
  const [state, setState] = useState<ToolkitState>(() => (openchemlibLoaded() ? 'ready' : 'loading'));
  useEffect(() => {
    if (state !== 'loading') return;
    let live = true;
    loadOpenchemlib().then(
      () => live && setState('ready'),
      (e: unknown) => live && setState(new Error(`The structure toolkit could not be loaded: ${e instanceof Error ? e.message : String(e)}`)),
    );
    return () => {
      live = false;
    };
  }, [state]);
  return state;
}
