// The patch route checks the usual patch with plain code (shared/plainPatch.ts) and leaves anything
// else to patchSchema: the two must agree on every body, and give back the same patch.
import { describe, expect, it } from 'vitest';
import { plainPatch } from '../shared/plainPatch.js';
import { maxCellsPerPatch, maxColIndex, maxInputLength, maxRowIndex, patchSchema, patchSchemaUpTo } from '../shared/workbooks.js';
import { cellInput, seededRandom, type Random } from './helpers/fuzzInputs.js';

const sheet = 'sheet_A-1';
const ok = (input = '=BONDORDER("O2")', row = 0, col = 0) => ({ sheetId: sheet, row, col, input });

function agree(body: unknown, limit = maxCellsPerPatch) {
  const schema = limit === maxCellsPerPatch ? patchSchema : patchSchemaUpTo(limit);
  const zod = schema.safeParse(body);
  const plain = plainPatch(body, limit);
  if (zod.success) expect(plain).toStrictEqual(zod.data);
  else expect(plain).toBeNull();
  return zod.success;
}

/** A change with, now and then, one part wrong in a way a broken client might send. */
function change(r: Random, i: number): unknown {
  const c: Record<string, unknown> = { sheetId: r.chance(0.9) ? sheet : 'other_sheet', row: i, col: r.int(0, 20), input: cellInput(r) };
  if (r.chance(0.05)) c.extra = 'dropped';
  if (r.chance(0.03)) c.sheetId = r.pick(['', 'has space', 'x'.repeat(65), 7, null, 'ok/slash']);
  if (r.chance(0.03)) c.row = r.pick([-1, 1.5, maxRowIndex, maxRowIndex + 1, '3', Number.NaN, 2 ** 60, -0]);
  if (r.chance(0.03)) c.col = r.pick([-1, 0.5, maxColIndex, maxColIndex + 1, null]);
  if (r.chance(0.02)) c.input = r.pick([5, null, undefined, ['a'], 'x'.repeat(maxInputLength + 1)]);
  if (r.chance(0.01)) return r.pick([null, 'text', [1, 2], 42]);
  return c;
}

describe('plainPatch and patchSchema', () => {
  it('agree on valid and broken bodies alike (seeded fuzz, seed 2026)', () => {
    const r = seededRandom(2026);
    let accepted = 0;
    let refused = 0;
    for (let n = 0; n < 400; n++) {
      const size = r.int(1, 12);
      const changes = Array.from({ length: size }, (_, i) => change(r, i));
      if (r.chance(0.1)) changes.push({ ...(changes[0] as object) }); // the same cell twice
      const body: Record<string, unknown> = { baseRevision: r.chance(0.95) ? r.int(0, 1000) : r.pick([-1, 1.5, '2', null]), changes };
      if (r.chance(0.05)) body.unknownKey = true;
      if (agree(body)) accepted++;
      else refused++;
    }
    // Both kinds must be well represented, or the comparison shows little.
    expect(accepted).toBeGreaterThan(50);
    expect(refused).toBeGreaterThan(50);
  });

  it('agree on the edges: empty, over the limit, not an object, repeated cells on two sheets', () => {
    for (const body of [null, [], 'x', {}, { baseRevision: 0 }, { baseRevision: 0, changes: [] }, { baseRevision: 0, changes: {} }, { changes: [ok()] }]) agree(body);
    expect(agree({ baseRevision: 0, changes: [ok('a', 0, 0), ok('b', 0, 1), ok('c', 1, 0)] }, 3)).toBe(true);
    expect(agree({ baseRevision: 0, changes: [ok('a', 0, 0), ok('b', 0, 1), ok('c', 1, 0)] }, 2)).toBe(false);
    // Same row and column on two sheets is two cells; same sheet twice is refused.
    expect(agree({ baseRevision: 3, changes: [ok(), { ...ok(), sheetId: 'other' }] })).toBe(true);
    expect(agree({ baseRevision: 3, changes: [ok(), ok('again')] })).toBe(false);
    // Column and row numbers that pack to the same place must not be taken for the same cell.
    expect(agree({ baseRevision: 0, changes: [ok('a', 1, 0), ok('b', 0, maxColIndex)] })).toBe(true);
  });

  it('checks a large patch in one pass, keeping every change in order', () => {
    const changes = Array.from({ length: 20_000 }, (_, i) => ok(`=${i}*2`, Math.floor(i / 10), i % 10));
    const plain = plainPatch({ baseRevision: 9, changes }, 20_000);
    expect(plain?.changes).toHaveLength(20_000);
    expect(plain?.changes[12_345]).toEqual(changes[12_345]);
  });
});
