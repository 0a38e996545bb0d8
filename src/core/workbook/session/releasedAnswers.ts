// Letting go of the two large answers a workbook opens from once the model holds what they said. The
// query cache keeps the workbook's answer for as long as the page shows it (its revision, title and
// protection are read from there), but its list of cells, and the stored values, are copies of what
// the model already has: on a 100,000-row workbook they were some 150 MB that the garbage collector
// walked over again and again while the formulas were put back. Their long lists are emptied in
// place, so nothing that watches the cache re-renders; an answer emptied so can never be opened
// again (the session asks for it afresh instead, see useWorkbookSession.ts).
import type { ValuesPayload, WorkbookPayload } from '@shared/workbooks.js';

const released = new WeakSet<object>();

/** Empties every sheet's list of cells; the rest of the answer (revision, sheets' names and settings, protection) stays. */
export function releaseCells(payload: WorkbookPayload) {
  released.add(payload);
  for (const sheet of payload.sheets) sheet.cells = [];
}

/** Empties every sheet's list of stored values. */
export function releaseValues(stored: ValuesPayload) {
  released.add(stored);
  for (const sheet of stored.sheets) sheet.values = [];
}

/** Whether this answer's lists were let go (opening from it would show an empty workbook). */
export function wasReleased(answer: object | null | undefined): boolean {
  return !!answer && released.has(answer);
}
