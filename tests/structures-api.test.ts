// POST /api/workbooks/:id/structures: extended-Hückel results computed once per structure in the
// compute pool, stored, and read by every member; /values and exports use the same stored results.
import { afterAll, beforeAll, describe, expect, it, vi } from 'vitest';
import { computeEhtResult } from '../functions/chem/ehtSummary.js';
import { structureResults } from '../server/db/schema.js';
import { onStructuresSettled, structureComputations } from '../server/structures/structureService.js';
import type { KeeperRun } from '../server/values/keeper.js';
import { stopKeeperThread } from '../server/values/keeperThread.js';
import { storedValues } from '../server/values/store.js';
import { decodeValues } from '../server/values/storedFormat.js';
import { isPendingMessage } from '../functions/structureResults.js';
import { closeParsePool } from '../server/xlsx/parseInWorker.js';
import { makeTeam, sharedWorkbook, type Person, type Team } from './helpers/team.js';

afterAll(async () => {
  await closeParsePool();
  await stopKeeperThread();
});

// Small molecules as XYZ text (no conformer needed) and SMILES (a generated conformer).
const WATER = 'O 0 0 0; H 0.7574 0 0.5864; H -0.7574 0 0.5864';
const library = [WATER, 'C=C', 'N', 'C#N', 'OC=O'];

async function ask(person: Person, id: string, inputs: { structure: string; charge?: number }[]) {
  const res = await person.agent.post(`/api/workbooks/${id}/structures`).send({ inputs });
  expect(res.status, JSON.stringify(res.body)).toBe(200);
  return res.body as { results: unknown[]; underWay: number };
}

/** Asks until every result is stored (the browser's polling, waited on as a condition). */
async function askUntilStored(person: Person, id: string, inputs: { structure: string; charge?: number }[]) {
  let answer = await ask(person, id, inputs);
  await vi.waitFor(
    async () => {
      answer = await ask(person, id, inputs);
      expect(answer.results.every((r) => r !== null)).toBe(true);
    },
    { timeout: 240_000, interval: 100 },
  );
  return answer;
}

// Conformers take seconds on a busy two-core machine: these tests wait on conditions, with room.
describe('structure results shared by a workbook’s members', { timeout: 300_000 }, () => {
  let t: Team;
  let id: string;
  beforeAll(async () => {
    t = await makeTeam();
    id = (await sharedWorkbook(t)).id;
  });

  it('computes each structure once in the background and answers the colleague from the store', async () => {
    const inputs = library.map((structure) => ({ structure }));
    const before = structureComputations();
    const first = await ask(t.owner, id, inputs);
    expect(first.results.some((r) => r === null)).toBe(true); // computed in the background, not in the request
    // Asked again at once (a second member opening the workbook): nothing is queued twice.
    await ask(t.editor, id, inputs);
    const done = await askUntilStored(t.owner, id, inputs);
    expect(structureComputations() - before).toBe(library.length);
    // The same numbers the synchronous path (the CLI's) computes.
    expect(done.results[0]).toEqual(computeEhtResult(WATER));

    const colleague = await ask(t.viewer, id, inputs);
    expect(colleague.results).toEqual(done.results);
    expect(structureComputations() - before).toBe(library.length);
  });

  it('keys a result by the structure text as typed, its margins and line ends aside, and the charge', async () => {
    const before = structureComputations();
    const same = await ask(t.editor, id, [{ structure: `  ${WATER.replace(/; /g, ';\r\n')}\n` }]);
    // Different text for the same atoms is a different key: only trimming and line ends are normalised.
    expect(same.results[0] === null || typeof same.results[0] === 'object').toBe(true);
    const cation = await askUntilStored(t.editor, id, [{ structure: 'N', charge: 1 }]);
    expect((cation.results[0] as { charge: number }).charge).toBe(1);
    expect(structureComputations() - before).toBeGreaterThanOrEqual(1);
  });

  it('stores a structure’s failure as its message, computed once', async () => {
    const answer = await askUntilStored(t.owner, id, [{ structure: 'C1CC' }]);
    expect(answer.results[0]).toEqual({ error: { kind: 'VALUE', message: expect.stringMatching(/cannot read SMILES 'C1CC'/) } });
  });

  it('serves /values and exports from the stored results and stores what they compute', async () => {
    await askUntilStored(t.owner, id, [{ structure: 'C=C' }]);
    const sheetId = (await t.owner.agent.get(`/api/workbooks/${id}`)).body.sheets[0].id;
    const base = (await t.owner.agent.get(`/api/workbooks/${id}`)).body.revision;
    const patch = await t.owner.agent.post(`/api/workbooks/${id}/patches`).send({
      baseRevision: base,
      changes: [
        { sheetId, row: 0, col: 0, input: 'C=C' },
        { sheetId, row: 0, col: 1, input: '=EHTHOMO(A1)' },
        { sheetId, row: 1, col: 0, input: 'CC' },
        { sheetId, row: 1, col: 1, input: '=EHTHOMO(A2)' },
      ],
    });
    expect(patch.status, JSON.stringify(patch.body)).toBe(200);
    // The values keeper queues ethane (new) with the structure service; /values asked meanwhile computes
    // it in its own job. Whichever stores it first, it is stored once and computed at most once more.
    const rowsBefore = t.ctx.db.select().from(structureResults).all().length;
    const computedBefore = structureComputations();
    const values = await t.owner.agent.get(`/api/workbooks/${id}/values`);
    expect(values.status).toBe(200);
    const stored = (await ask(t.owner, id, [{ structure: 'C=C' }, { structure: 'CC' }])).results as { frontier: { homoEv: number } }[];
    const cell = (r: number) => values.body.sheets[0].values.find(([row, col]: number[]) => row === r && col === 1)[2];
    expect(cell(0)).toBeCloseTo(stored[0].frontier.homoEv, 9); // /values gives 11 decimals
    // Ethane was new: the values job computed it in its worker and it is now stored for everyone.
    expect(cell(1)).toBeCloseTo(stored[1].frontier.homoEv, 9);
    expect(t.ctx.db.select().from(structureResults).all().length).toBe(rowsBefore + 1);
    await t.ctx.values.idle();
    // The queue skips what a values job stored while it waited; at most the one the keeper queued ran.
    expect(structureComputations() - computedBefore).toBeLessThanOrEqual(1);
  });

  it('refuses a malformed request with the field named', async () => {
    const res = await t.owner.agent.post(`/api/workbooks/${id}/structures`).send({ inputs: [{ structure: '' }] });
    expect(res.status).toBe(400);
    expect(res.body.error.message).toMatch(/inputs.*give a structure/);
    const many = await t.owner.agent.post(`/api/workbooks/${id}/structures`).send({ inputs: Array.from({ length: 501 }, () => ({ structure: 'C' })) });
    expect(many.status).toBe(400);
    expect(many.body.error.message).toMatch(/at most 500 structures/);
  });
});

describe('the values keeper and extended-Hückel cells', { timeout: 300_000 }, () => {
  it('stores no values while cells wait, leaves each structure to the queue once, then stores the final values', async () => {
    const t = await makeTeam();
    const id = (await sharedWorkbook(t)).id;
    const runs: KeeperRun[] = [];
    t.ctx.values.onRun = (run) => runs.push(run);
    const { sheets, revision: base } = (await t.owner.agent.get(`/api/workbooks/${id}`)).body;
    const sheetId = sheets[0].id;
    const molecules = ['CCO', 'CC(=O)C', 'C1CC1'];
    // Values stored at the moment the structure service finished this workbook's structures.
    const atSettle: unknown[] = [];
    const stopListening = onStructuresSettled((_ctx, workbookId) => {
      if (workbookId === id) atSettle.push(storedValues(t.ctx.db, id));
    });
    const before = structureComputations();
    // Two formulas per structure: still one computation each.
    const patch = await t.owner.agent.post(`/api/workbooks/${id}/patches`).send({
      baseRevision: base,
      changes: molecules.flatMap((m, r) => [
        { sheetId, row: r, col: 0, input: m },
        { sheetId, row: r, col: 1, input: `=EHTHOMO(A${r + 1})` },
        { sheetId, row: r, col: 2, input: `=EHTLUMO(A${r + 1})` },
      ]),
    });
    expect(patch.status, JSON.stringify(patch.body)).toBe(200);
    const revision = patch.body.revision as number;
    // Nothing but the keeper asks for these structures (no browser, no /values read).
    await vi.waitFor(() => expect(storedValues(t.ctx.db, id, revision)).not.toBeNull(), { timeout: 240_000, interval: 100 });
    stopListening();
    expect(atSettle.length).toBeGreaterThanOrEqual(1);
    expect(atSettle[0]).toBeNull(); // values with cells still computing were never stored
    expect(structureComputations() - before).toBe(molecules.length);
    expect(t.ctx.db.select().from(structureResults).all().filter((r) => r.workbookId === id)).toHaveLength(molecules.length);
    expect(runs.filter((r) => r.workbookId === id && r.revision === revision)).toHaveLength(1);

    // Independent check: the synchronous path (functions/chem, as the CLI computes) gives the same numbers.
    const payload = decodeValues(storedValues(t.ctx.db, id, revision)!.valuesGzip);
    const cell = (row: number, col: number) => payload.sheets[0].values.find(([r, c]) => r === row && c === col)?.[2];
    for (const v of payload.sheets[0].values) expect(isPendingMessage((v[2] as { message?: string })?.message)).toBe(false);
    molecules.forEach((m, r) => {
      const expected = computeEhtResult(m) as { frontier: { homoEv: number; lumoEv: number } };
      expect(cell(r, 1)).toBeCloseTo(expected.frontier.homoEv, 9);
      expect(cell(r, 2)).toBeCloseTo(expected.frontier.lumoEv, 9);
    });

    // A later edit using a stored structure is applied to the warm engine, stored at once, computes nothing.
    const next = await t.owner.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: revision, changes: [{ sheetId, row: 0, col: 3, input: '=EHTGAP(A1)' }] });
    expect(next.status, JSON.stringify(next.body)).toBe(200);
    await t.ctx.values.idle();
    const later = decodeValues(storedValues(t.ctx.db, id, next.body.revision)!.valuesGzip);
    const gap = later.sheets[0].values.find(([r, c]) => r === 0 && c === 3)?.[2];
    const ethanol = computeEhtResult('CCO') as { frontier: { homoEv: number; lumoEv: number } };
    expect(gap).toBeCloseTo(ethanol.frontier.lumoEv - ethanol.frontier.homoEv, 9);
    expect(runs.at(-1)?.mode).toBe('incremental');
    expect(structureComputations() - before).toBe(molecules.length);
  });
});
