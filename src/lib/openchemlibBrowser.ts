// openchemlib's conformer generator (SMILES → 3D for the extended-Hückel functions) needs its static
// data tables. In the browser they are fetched once, as a build asset, at start-up; until they arrive
// a SMILES structure in an extended-Hückel cell reports that 3D data is not loaded (XYZ and molfile
// input work at once). Node registers them in functions/openchemlibNode.ts instead.
import { Resources } from 'openchemlib';
import resourcesUrl from '../../node_modules/openchemlib/dist/resources.json?url';

export const conformerDataReady: Promise<boolean> = Resources.registerFromUrl(resourcesUrl).then(
  () => true,
  () => false,
);
