// What the page asks for before the app's code has arrived. main.tsx is kept small and runs this first,
// so who is signed in, and on a workbook's address its first rows (and, unless those come with stored
// values, the workbook and its stored values) are on their way while the app's code downloads and
// starts (its router, its schemas); the app's first requests for them take these answers
// (src/lib/earlyGets.ts). The workbook screen's code is not asked for here: fetched alongside the
// app's own code it slowed that down more than it gained (measured with bench/ehtOpenProfile.ts on
// the 2-core box).
import { workbookPath } from '@shared/workbookPath.js';
import type { FirstRowsPayload } from '@shared/workbooks.js';
import { peekEarlyGet, startEarlyGet } from '../lib/earlyGets.js';
import { holdAnswers, startEarlyLargeGet } from '../lib/api.js';
import { showEarlyGlance } from './earlyGlance.js';

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
  // A few kilobytes the page paints first (the first rows and their stored values), asked first.
  const firstRows = workbookPath(id, 'first-rows');
  startEarlyGet(firstRows);
  // The answers that grow with the workbook are read by the JSON worker (fetched by the page, their
  // many megabytes were carried through its thread on their way to the worker). With stored values
  // for the first rows, they are asked for only once those rows are painted (api.ts holdAnswers):
  // the server building them and the worker reading them slowed the page's code on its way, by a
  // quarter of a second on a 10,000 × 10 workbook, and drew out the first rows' paint into a task of
  // 250-300 ms on a 100,000 × 8 one (bench/browser-open.ts); neither was editable any sooner for
  // them. Without, they are asked for at once, their replies held unread until it is clear no first
  // rows will be painted.
  const startLarge = () => {
    startEarlyLargeGet(workbookPath(id), { held: true });
    startEarlyLargeGet(`${workbookPath(id, 'values')}?stored=only`, { held: true });
  };
  // With them, the first rows are drawn at once (earlyGlance.ts).
  void peekEarlyGet(firstRows)
    .then((r) => (r ? (r.json() as Promise<FirstRowsPayload>) : null))
    .then(
      (first) => {
        if (!first?.values) return startLarge();
        holdAnswers({ deferReads: true });
        showEarlyGlance(first);
      },
      () => startLarge(),
    );
}
