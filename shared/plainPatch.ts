// The usual patch, checked without zod's per-object machinery. Validating 30,000 changes with
// patchSchema took ~100 ms of the request's time on the event loop, most of it zod walking objects;
// these checks are the same rules written as plain code. They only ever accept: anything they do not
// pass (a wrong type, a bad id, a problem input, a repeated cell, an extra limit) goes to patchSchema,
// which refuses it with its usual message. tests/plain-patch.test.ts holds the two to agreeing.
import { cellInputProblem } from './cellInput.js';
import { maxCellsPerPatch, maxColIndex, maxInputLength, maxRowIndex, type PatchInput } from './workbooks.js';

const idPattern = /^[A-Za-z0-9_-]{1,64}$/;

const wholeIn = (x: unknown, lo: number, hi: number): x is number => typeof x === 'number' && Number.isSafeInteger(x) && x >= lo && x <= hi;

/**
 * The patch as patchSchema would give it back (unknown keys dropped), when every part of `body` is
 * plainly valid; null otherwise, and patchSchema decides and words the refusal.
 */
export function plainPatch(body: unknown, limit = maxCellsPerPatch): PatchInput | null {
  if (typeof body !== 'object' || body === null) return null;
  const { baseRevision, changes } = body as Record<string, unknown>;
  if (!wholeIn(baseRevision, 0, Number.MAX_SAFE_INTEGER) || !Array.isArray(changes) || changes.length < 1 || changes.length > limit) return null;
  const out: PatchInput['changes'] = new Array(changes.length);
  const goodIds = new Map<string, Set<number>>();
  for (let i = 0; i < changes.length; i++) {
    const c: unknown = changes[i];
    if (typeof c !== 'object' || c === null) return null;
    const { sheetId, row, col, input } = c as Record<string, unknown>;
    if (typeof sheetId !== 'string' || !wholeIn(row, 0, maxRowIndex) || !wholeIn(col, 0, maxColIndex) || typeof input !== 'string') return null;
    let seen = goodIds.get(sheetId);
    if (!seen) {
      if (!idPattern.test(sheetId)) return null;
      goodIds.set(sheetId, (seen = new Set()));
    }
    const place = row * (maxColIndex + 1) + col;
    if (seen.has(place)) return null; // the same cell twice: patchSchema names both
    seen.add(place);
    if (input.length > maxInputLength || cellInputProblem(input) !== null) return null;
    out[i] = { sheetId, row, col, input };
  }
  return { baseRevision, changes: out };
}
