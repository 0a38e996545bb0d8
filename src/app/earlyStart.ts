// What the page asks for before the app's code has arrived. main.tsx is kept small and runs this first,
// so who is signed in, and on a workbook's address the workbook and its stored values, are on their
// way while the app's code downloads and starts (its router, its schemas); the app's first requests
// for them take these answers (src/lib/earlyGets.ts). The workbook screen's code is not asked for
// here: fetched alongside the app's own code it slowed that down more than it gained (measured with
// bench/ehtOpenProfile.ts on the 2-core box).
import { workbookPath } from '@shared/workbookPath.js';
import { startEarlyGet } from '../lib/earlyGets.js';
import { startEarlyLargeGet } from '../lib/api.js';

/** The workbook screen's address (router.tsx: workbooks/:id). */
const workbookRoute = /^\/workbooks\/([^/]+)\/?$/;

export function startEarly(pathname: string): void {
  startEarlyGet('/auth/me');
  const match = workbookRoute.exec(pathname);
  if (!match) return;
  let id: string;
  try {
    id = decodeURIComponent(match[1]);
  } catch {
    return; // not an address the router would match either
  }
  // Read by the JSON worker from the start: fetched by the page, these many megabytes were carried
  // through its thread on their way to the worker (a third of a second at a stretch).
  startEarlyLargeGet(workbookPath(id));
  startEarlyLargeGet(`${workbookPath(id, 'values')}?stored=only`);
}
