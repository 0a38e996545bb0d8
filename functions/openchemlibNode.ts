// openchemlib's conformer generator reads static tables that must be registered once per process.
// In Node they are read synchronously from the package; the browser loads them by URL instead. Kept
// out of functions/chem/ (which must run anywhere) and imported by the Node entry points that build
// engines: the server's value computation, the workbook import/export workers and the CLI.
import { Resources } from 'openchemlib';

let registered = false;

export function registerConformerDataNode(): void {
  if (registered) return;
  Resources.registerFromNodejs();
  registered = true;
}

registerConformerDataNode();
