// The authorization matrix: every route under /api/workbooks/:id, asked by each kind of caller, with
// the status the API must answer. Non-members get 404 (a workbook's existence is not revealed);
// members and site admins who may see it but not do this get 403 with the reason; signed-out 401.
// Site admins read every workbook (and its audit log) but change nothing unless made members.
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import type { Express } from 'express';
import { listen, openEventStream } from './helpers/eventStream.js';
import { load, makeTeam, sharedWorkbook, type Person, type Team } from './helpers/team.js';
import { WorkbookModel } from '../src/core/workbook/model/workbookModel.js';
import { applyStructural } from '../src/core/workbook/model/structure.js';
import { fillDown, pasteBlock, sortRange } from '../src/core/workbook/model/rangeEdits.js';
import type { CellInput } from '../src/core/workbook/save/pendingStore.js';
import { actorOf, editRuleFor } from '../src/core/team/editability.js';
import { protectionOf } from '../src/core/team/protection.js';

const callers = ['owner', 'editor', 'viewer', 'outsider', 'admin', 'signedOut'] as const;
type Caller = (typeof callers)[number];
type Method = 'get' | 'post' | 'put' | 'patch' | 'delete';

/** The ids a request path may name; `{id}` is the workbook. */
interface Fixture {
  id: string;
  sheet1: string;
  /** Locked by the owner, with a protected range on it. */
  lockedSheet: string;
  rangeId: string;
  invitationId: string;
  viewerId: string;
  editorId: string;
  editor2Id: string;
  revision: number;
  /** An earlier revision to read, view and restore. */
  n: number;
}

type Body = object | 'patch' | 'cursor' | 'stream' | 'import' | undefined;
type Row = [what: string, method: Method, path: string, body: Body, expected: Record<Caller, number>];
const row = (what: string, method: Method, path: string, body: Body, ...codes: number[]): Row => [
  what,
  method,
  path,
  body,
  Object.fromEntries(callers.map((c, i) => [c, codes[i]])) as Record<Caller, number>,
];

//                                                                                                       owner editor viewer outsider admin signedOut
const table: Row[] = [
  row('open', 'get', '/api/workbooks/{id}', undefined,                                                     200, 200, 200, 404, 200, 401),
  row('rename', 'patch', '/api/workbooks/{id}', { title: 'Renamed' },                                      200, 403, 403, 404, 403, 401),
  row('delete', 'delete', '/api/workbooks/{id}', undefined,                                                204, 403, 403, 404, 403, 401),
  row('add a sheet', 'post', '/api/workbooks/{id}/sheets', {},                                             201, 201, 403, 404, 403, 401),
  row('rename a sheet', 'patch', '/api/workbooks/{id}/sheets/{sheet1}', { name: 'Ions' },                  200, 200, 403, 404, 403, 401),
  row('delete a sheet', 'delete', '/api/workbooks/{id}/sheets/{sheet1}', undefined,                        200, 200, 403, 404, 403, 401),
  row('edit cells', 'post', '/api/workbooks/{id}/patches', 'patch',                                        200, 200, 403, 404, 403, 401),
  row('list revisions', 'get', '/api/workbooks/{id}/revisions', undefined,                                 200, 200, 200, 404, 200, 401),
  row('read a revision', 'get', '/api/workbooks/{id}/revisions/{n}', undefined,                              200, 200, 200, 404, 200, 401),
  row('view as of a revision', 'get', '/api/workbooks/{id}/revisions/{n}/snapshot', undefined,               200, 200, 200, 404, 200, 401),
  row('restore a revision', 'post', '/api/workbooks/{id}/revisions/{n}/restore', undefined,                  200, 200, 403, 404, 403, 401),
  row('computed values', 'get', '/api/workbooks/{id}/values', undefined,                                   200, 200, 200, 404, 200, 401),
  row('first rows', 'get', '/api/workbooks/{id}/first-rows', undefined,                                      200, 200, 200, 404, 200, 401),
  row('structure results', 'post', '/api/workbooks/{id}/structures', { inputs: [{ structure: 'O 0 0 0; H 0.96 0 0; H -0.24 0.93 0' }] }, 200, 200, 200, 404, 200, 401),
  row('export', 'get', '/api/workbooks/{id}/export?format=xlsx', undefined,                                200, 200, 200, 404, 200, 401),
  row('import into it', 'post', '/api/imports', 'import',                                                  201, 201, 403, 404, 403, 401),
  row('list members', 'get', '/api/workbooks/{id}/members', undefined,                                     200, 200, 200, 404, 200, 401),
  row('add a member', 'post', '/api/workbooks/{id}/members', { email: 'olga@elsewhere.test', role: 'viewer' }, 201, 403, 403, 404, 403, 401),
  row('change a role', 'patch', '/api/workbooks/{id}/members/{viewerId}', { role: 'editor' },              200, 403, 403, 404, 403, 401),
  row('transfer ownership', 'patch', '/api/workbooks/{id}/members/{editor2Id}', { role: 'owner' },         200, 403, 403, 404, 403, 401),
  row('remove a member', 'delete', '/api/workbooks/{id}/members/{editor2Id}', undefined,                   204, 403, 403, 404, 403, 401),
  row('list invitations', 'get', '/api/workbooks/{id}/invitations', undefined,                             200, 403, 403, 404, 403, 401),
  row('invite by e-mail', 'post', '/api/workbooks/{id}/invitations', { email: 'new@lab.test', role: 'editor' }, 201, 403, 403, 404, 403, 401),
  row('revoke an invitation', 'delete', '/api/workbooks/{id}/invitations/{invitationId}', undefined,       204, 403, 403, 404, 403, 401),
  row('list sheet roles', 'get', '/api/workbooks/{id}/sheets/{sheet1}/roles', undefined,                  200, 200, 200, 404, 200, 401),
  row('set a sheet role', 'put', '/api/workbooks/{id}/sheets/{sheet1}/roles', { email: 'vic@lab.test', role: 'editor' }, 200, 403, 403, 404, 403, 401),
  row('lock a sheet', 'put', '/api/workbooks/{id}/sheets/{sheet1}/lock', { reason: 'final' },              200, 403, 403, 404, 403, 401),
  row('unlock a sheet', 'delete', '/api/workbooks/{id}/sheets/{lockedSheet}/lock', undefined,              204, 403, 403, 404, 403, 401),
  row('protect a range', 'post', '/api/workbooks/{id}/sheets/{sheet1}/protected-ranges', { range: 'B2' },  201, 403, 403, 404, 403, 401),
  row('unprotect a range', 'delete', '/api/workbooks/{id}/sheets/{lockedSheet}/protected-ranges/{rangeId}', undefined, 204, 403, 403, 404, 403, 401),
  row('live events', 'get', '/api/workbooks/{id}/events', 'stream',                                        200, 200, 200, 404, 200, 401),
  row('move my cursor', 'post', '/api/workbooks/{id}/presence', 'cursor',                                  204, 204, 204, 404, 204, 401),
  row('audit log', 'get', '/api/workbooks/{id}/audit', undefined,                                          200, 403, 403, 404, 200, 401),
];

/** Express route patterns of everything mounted under /api/workbooks/:id, read from the app itself. */
function workbookRoutes(app: Express): string[] {
  const found: string[] = [];
  const walk = (stack: any[], prefix: string) => {
    for (const layer of stack) {
      const here = typeof layer.rawPath === 'string' && layer.rawPath !== '/' ? prefix + layer.rawPath : prefix;
      if (layer.route) {
        for (const m of Object.keys(layer.route.methods)) if (m !== '_all') found.push(`${m.toUpperCase()} ${prefix}${layer.route.path}`);
      } else if (layer.handle?.stack) {
        walk(layer.handle.stack, here);
      }
    }
  };
  walk((app as any).router.stack, '');
  return [...new Set(found.filter((r) => r.includes('/api/workbooks/:id')))].sort();
}

describe('authorization matrix', () => {
  let t: Team;
  let server: Awaited<ReturnType<typeof listen>>;
  beforeAll(async () => {
    // Every row builds fresh workbooks with invitations; the per-inviter limit is tested elsewhere.
    t = await makeTeam({ limits: { invitationsPerInviter: { max: 10_000, windowMs: 60 * 60_000 } } });
    server = await listen(t.app);
  });
  afterAll(async () => {
    await server.close();
    await t.ctx.mail.stop();
  });

  /** A workbook shared with the team, with a second sheet that is locked and holds a protected range. */
  async function fixture(): Promise<Fixture> {
    const wb = await sharedWorkbook(t, 'Matrix');
    const a = t.owner.agent;
    const lockedSheet = (await a.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Settled' }).expect(201)).body.sheet.id;
    await a.put(`/api/workbooks/${wb.id}/sheets/${lockedSheet}/lock`).send({ reason: 'settled' }).expect(200);
    const rangeId = (await a.post(`/api/workbooks/${wb.id}/sheets/${lockedSheet}/protected-ranges`).send({ range: 'Z100' }).expect(201)).body.protectedRange.id;
    const edit = await a.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: 1, changes: [{ sheetId: wb.sheets[0].id, row: 0, col: 0, input: 'O2' }] }).expect(200);
    const invitationId = (await a.post(`/api/workbooks/${wb.id}/invitations`).send({ email: 'pending@lab.test', role: 'viewer' }).expect(201)).body.invitation.id;
    return { id: wb.id, sheet1: wb.sheets[0].id, lockedSheet, rangeId, invitationId, viewerId: t.viewer.user.id, editorId: t.editor.user.id, editor2Id: t.editor2.user.id, revision: edit.body.revision, n: 1 };
  }

  /** Bodies that depend on the fixture are named; 'stream' opens the path as an event stream. */
  function bodyFor(body: Body, f: Fixture): object | undefined {
    if (body === 'patch') return { baseRevision: f.revision, changes: [{ sheetId: f.sheet1, row: 1, col: 1, input: 'N2' }] };
    if (body === 'cursor') return { sheetId: f.sheet1, row: 0, col: 0 };
    return body === 'stream' || body === 'import' ? undefined : body;
  }

  async function ask(caller: Caller, method: Method, path: string, body: Body, f?: Fixture): Promise<number> {
    const person: Person | null = caller === 'signedOut' ? null : t[caller];
    if (body === 'stream') {
      const s = await openEventStream(server.url + path, person ? { Cookie: person.cookie } : {});
      s.close();
      return s.status;
    }
    const agent = person ? person.agent : t.agent();
    if (body === 'import') {
      // A CSV upload into this workbook (multipart, as the browser sends it).
      return (await agent.post(path).field('workbookId', f!.id).attach('file', Buffer.from('species,unpaired\nO2,2\n'), 'radicals.csv')).status;
    }
    return (await agent[method](path).send(f ? bodyFor(body, f) : (body as object | undefined))).status;
  }

  it('covers every route the app serves under /api/workbooks/:id', () => {
    // Parameter names differ ({sheet1} here, :sheetId there); compare the shapes.
    const covered = new Set(table.map(([, m, p]) => `${m.toUpperCase()} ${p.split('?')[0].replace(/\{\w+\}/g, ':_')}`));
    const routes = workbookRoutes(t.app);
    expect(routes).toContain('GET /api/workbooks/:id/events'); // the walk reaches nested routers
    expect(routes.filter((r) => !covered.has(r.replace(/:\w+/g, ':_')))).toEqual([]);
  });

  it.each(table)('%s: %s %s', async (_what, method, path, body, expected) => {
    const actual = {} as Record<Caller, number>;
    // Reads and refusals share one workbook (a refusal must change nothing anyway); each change
    // expected to succeed gets a fresh one, so one caller's success cannot alter the next answer.
    const shared = await fixture();
    for (const caller of callers) {
      const f = method !== 'get' && expected[caller] < 300 ? await fixture() : shared;
      const url = path.replace(/\{(\w+)\}/g, (_m, key: keyof Fixture) => String(f[key]));
      actual[caller] = await ask(caller, method, url, body, f);
    }
    expect(actual).toEqual(expected);
  });

  it('answers the routes outside one workbook as expected for each caller', async () => {
    const list = {} as Record<Caller, number[]>;
    for (const caller of callers) {
      list[caller] = await Promise.all(['/api/workbooks', '/api/admin/mail', '/api/admin/workbooks'].map((p) => ask(caller, 'get', p, undefined)));
    }
    //                         my list, dev inbox, every workbook
    expect(list).toEqual({ owner: [200, 403, 403], editor: [200, 403, 403], viewer: [200, 403, 403], outsider: [200, 403, 403], admin: [200, 200, 200], signedOut: [401, 401, 401] });
  });

  it('lists every workbook on the site to a site admin, who belongs to none of them', async () => {
    const f = await fixture();
    const all = (await t.admin.agent.get('/api/admin/workbooks').expect(200)).body.workbooks as { id: string; role: string; memberCount: number; owner: { name: string } }[];
    expect(all.find((w) => w.id === f.id)).toMatchObject({ role: 'site-admin', memberCount: 4, owner: { name: 'Ann Analyst' } });
    expect((await t.admin.agent.get('/api/workbooks')).body.workbooks).toEqual([]);
  });
});

describe('no reach from one workbook into another', () => {
  // Ann owns both workbooks, so every refusal below comes from the ids not belonging together,
  // not from a missing right.
  let t: Team;
  beforeAll(async () => {
    t = await makeTeam();
  });
  afterAll(() => t.ctx.mail.stop());

  it('finds no sheet, cell, revision, member, invitation, lock or range of workbook A through workbook B', async () => {
    const a = await sharedWorkbook(t, 'A');
    const b = (await t.owner.agent.post('/api/workbooks').send({ title: 'B' }).expect(201)).body.workbook.id as string;
    const bSheet = (await t.owner.agent.get(`/api/workbooks/${b}`)).body.sheets[0].id as string;
    const ann = t.owner.agent;
    const aSheet = a.sheets[0].id;
    for (const input of ['N2', 'O2', 'F2']) {
      const rev = (await ann.get(`/api/workbooks/${a.id}`)).body.revision;
      await ann.post(`/api/workbooks/${a.id}/patches`).send({ baseRevision: rev, changes: [{ sheetId: aSheet, row: 0, col: 0, input }] }).expect(200);
    }
    await ann.put(`/api/workbooks/${a.id}/sheets/${aSheet}/lock`).send({ reason: 'A is settled', editors: [t.editor.user.id] }).expect(200);
    const rangeId = (await ann.post(`/api/workbooks/${a.id}/sheets/${aSheet}/protected-ranges`).send({ range: 'A1:B2' }).expect(201)).body.protectedRange.id;
    const invitationId = (await ann.post(`/api/workbooks/${a.id}/invitations`).send({ email: 'later@lab.test', role: 'viewer' }).expect(201)).body.invitation.id;
    const aBefore = (await ann.get(`/api/workbooks/${a.id}`)).body;

    const attempts: [Method, string, object?][] = [
      ['patch', `/api/workbooks/${b}/sheets/${aSheet}`, { name: 'Taken' }],
      ['delete', `/api/workbooks/${b}/sheets/${aSheet}`],
      ['post', `/api/workbooks/${b}/patches`, { baseRevision: 0, changes: [{ sheetId: aSheet, row: 0, col: 0, input: 'Cl2' }] }],
      ['get', `/api/workbooks/${b}/revisions/3`],
      ['get', `/api/workbooks/${b}/revisions/3/snapshot`],
      ['post', `/api/workbooks/${b}/revisions/2/restore`],
      ['patch', `/api/workbooks/${b}/members/${t.viewer.user.id}`, { role: 'editor' }],
      ['delete', `/api/workbooks/${b}/members/${t.viewer.user.id}`],
      ['delete', `/api/workbooks/${b}/invitations/${invitationId}`],
      ['put', `/api/workbooks/${b}/sheets/${aSheet}/lock`, { reason: 'hijack' }],
      ['delete', `/api/workbooks/${b}/sheets/${aSheet}/lock`],
      ['post', `/api/workbooks/${b}/sheets/${aSheet}/protected-ranges`, { range: 'C3' }],
      ['delete', `/api/workbooks/${b}/sheets/${aSheet}/protected-ranges/${rangeId}`],
      ['delete', `/api/workbooks/${b}/sheets/${bSheet}/protected-ranges/${rangeId}`],
      ['post', `/api/workbooks/${b}/presence`, { sheetId: aSheet, row: 0, col: 0 }],
    ];
    for (const [method, path, body] of attempts) {
      const res = await ann[method](path).send(body);
      expect(res.status, `${method.toUpperCase()} ${path}`).toBe(404);
    }

    const aAfter = (await ann.get(`/api/workbooks/${a.id}`)).body;
    expect(aAfter).toEqual(aBefore);
    const pending = (await ann.get(`/api/workbooks/${a.id}/invitations`)).body.invitations.map((i: { id: string }) => i.id);
    expect(pending).toContain(invitationId);
    const bAfter = (await ann.get(`/api/workbooks/${b}`)).body;
    expect(bAfter).toMatchObject({ revision: 0, locks: [], protectedRanges: [], sheets: [{ id: bSheet, name: 'Screen1', cells: [] }] });
  });
});

describe('authorization matrix, sheet by sheet', () => {
  // Two sheet-level actors on a workbook with a sheet "Measurements" and a sheet "Other": Vic, a
  // workbook viewer whom "Measurements" names editor, and Bob, a workbook editor whom it names
  // viewer. Cell edits arrive as the client sends them: the grid's model performs the action (insert
  // a row, sort, fill, paste …) and the patch it hands to the save queue is posted as is.
  let t: Team;
  beforeAll(async () => {
    t = await makeTeam({ limits: { invitationsPerInviter: { max: 10_000, windowMs: 60 * 60_000 } } });
  });
  afterAll(() => t.ctx.mail.stop());

  interface SheetFixture {
    id: string;
    measurements: string;
    other: string;
  }
  const rows3 = [['species', 'unpaired'], ['O2', '2'], ['N2', '0'], ['NO', '1']];

  async function sheetFixture(): Promise<SheetFixture> {
    const wb = await sharedWorkbook(t, 'Sheet roles');
    const a = t.owner.agent;
    const other = wb.sheets[0].id;
    await a.patch(`/api/workbooks/${wb.id}/sheets/${other}`).send({ name: 'Other' }).expect(200);
    const measurements = (await a.post(`/api/workbooks/${wb.id}/sheets`).send({ name: 'Measurements' }).expect(201)).body.sheet.id as string;
    const cells = (sheetId: string) => rows3.flatMap((r, row) => r.map((input, col) => ({ sheetId, row, col, input })));
    const rev = (await load(a, wb.id)).revision;
    await a.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: rev, changes: [...cells(measurements), ...cells(other)] }).expect(200);
    await a.put(`/api/workbooks/${wb.id}/sheets/${measurements}/roles`).send({ email: t.viewer.user.email, role: 'editor' }).expect(200);
    await a.put(`/api/workbooks/${wb.id}/sheets/${measurements}/roles`).send({ email: t.editor.user.email, role: 'viewer' }).expect(200);
    return { id: wb.id, measurements, other };
  }

  /** The patch the client's model would send for `action` on `sheetId` (built with no local refusal). */
  async function clientPatch(f: SheetFixture, sheetId: string, action: (m: WorkbookModel, sheetId: string) => void) {
    const payload = await load(t.owner.agent, f.id);
    const sent: CellInput[] = [];
    const m = new WorkbookModel(payload, { onLocalChanges: (c) => sent.push(...c) });
    action(m, sheetId);
    expect(sent.length, 'the action changed some cells').toBeGreaterThan(0);
    return { baseRevision: payload.revision, changes: sent };
  }

  type Action = { what: string; run: (p: Person, f: SheetFixture, sheetId: string) => Promise<number> };
  const viaClient = (what: string, action: (m: WorkbookModel, sheetId: string) => void): Action => ({
    what,
    run: async (p, f, sheetId) => (await p.agent.post(`/api/workbooks/${f.id}/patches`).send(await clientPatch(f, sheetId, action))).status,
  });
  const actions: Action[] = [
    viaClient('type into a cell', (m, s) => m.edit([{ sheetId: s, row: 1, col: 1, input: '3' }])),
    viaClient('insert a row', (m, s) => applyStructural(m, s, { axis: 'row', action: 'insert', at: 1, count: 1 })),
    viaClient('delete a column', (m, s) => applyStructural(m, s, { axis: 'col', action: 'remove', at: 0, count: 1 })),
    viaClient('sort', (m, s) => sortRange(m, s, { top: 1, bottom: 3, left: 0, right: 1 }, 1, 'ascending')),
    viaClient('fill down', (m, s) => fillDown(m, s, { top: 1, bottom: 3, left: 0, right: 1 })),
    viaClient('paste', (m, s) => pasteBlock(m, s, [4, 5], 0, [['F2', '0'], ['Cl2', '0']])),
    { what: 'rename the sheet', run: async (p, f, s) => (await p.agent.patch(`/api/workbooks/${f.id}/sheets/${s}`).send({ name: 'Renamed' })).status },
    { what: 'move the sheet', run: async (p, f, s) => (await p.agent.patch(`/api/workbooks/${f.id}/sheets/${s}`).send({ position: s === f.other ? 1 : 0 })).status },
    { what: 'freeze its first row', run: async (p, f, s) => (await p.agent.patch(`/api/workbooks/${f.id}/sheets/${s}`).send({ settings: { frozenRows: 1 } })).status },
    { what: 'delete the sheet', run: async (p, f, s) => (await p.agent.delete(`/api/workbooks/${f.id}/sheets/${s}`)).status },
    {
      what: 'restore a revision that changes only this sheet',
      // The owner edits this sheet; restoring to the revision before undoes that edit and nothing else.
      run: async (p, f, s) => {
        const before = (await load(t.owner.agent, f.id)).revision;
        await t.owner.agent.post(`/api/workbooks/${f.id}/patches`).send({ baseRevision: before, changes: [{ sheetId: s, row: 7, col: 0, input: 'Ar' }] }).expect(200);
        return (await p.agent.post(`/api/workbooks/${f.id}/revisions/${before}/restore`)).status;
      },
    },
    {
      what: 'import a file into the workbook (new sheets beside this one)',
      run: async (p, f) => (await p.agent.post('/api/imports').field('workbookId', f.id).attach('file', Buffer.from('species,unpaired\nO2,2\n'), 'radicals.csv')).status,
    },
  ];

  // What each actor may do on "Measurements" and on "Other". Tab operations (rename, move, settings,
  // delete), restores and imports need the workbook editor role as well as the sheet's.
  //                                                    viewer made editor of M     editor made viewer of M
  //                                                    on M   on Other             on M   on Other
  const expected: Record<string, [number, number, number, number]> = {
    'type into a cell':                                  [200, 403, 403, 200],
    'insert a row':                                      [200, 403, 403, 200],
    'delete a column':                                   [200, 403, 403, 200],
    sort:                                                [200, 403, 403, 200],
    'fill down':                                         [200, 403, 403, 200],
    paste:                                               [200, 403, 403, 200],
    'rename the sheet':                                  [403, 403, 403, 200],
    'move the sheet':                                    [403, 403, 403, 200],
    'freeze its first row':                              [403, 403, 403, 200],
    'delete the sheet':                                  [403, 403, 403, 200],
    'restore a revision that changes only this sheet':   [403, 403, 403, 200],
    'import a file into the workbook (new sheets beside this one)': [403, 403, 201, 201],
  };

  it.each(actions.map((a) => [a.what, a] as const))('%s', async (what, action) => {
    const actual: number[] = [];
    for (const person of [t.viewer, t.editor]) {
      for (const which of ['measurements', 'other'] as const) {
        const f = await sheetFixture();
        actual.push(await action.run(person, f, f[which]));
      }
    }
    expect(actual).toEqual(expected[what]);
  });

  it('names the sheet and the reason in every refusal, and the client greys the same cells', async () => {
    const f = await sheetFixture();
    const patch = await clientPatch(f, f.measurements, (m, s) => sortRange(m, s, { top: 1, bottom: 3, left: 0, right: 1 }, 1, 'ascending'));
    const res = await t.editor.agent.post(`/api/workbooks/${f.id}/patches`).send(patch).expect(403);
    expect(res.body.error.message).toMatch(/^Measurements!A2 is on sheet "Measurements": Ann Analyst made you a viewer of sheet "Measurements"; ask them or an owner/);
    const before = (await load(t.owner.agent, f.id)).revision;
    await t.owner.agent.post(`/api/workbooks/${f.id}/patches`).send({ baseRevision: before, changes: [{ sheetId: f.measurements, row: 0, col: 0, input: 'name' }] }).expect(200);
    const restore = await t.editor.agent.post(`/api/workbooks/${f.id}/revisions/${before}/restore`).expect(403);
    expect(restore.body.error.message).toMatch(/^Measurements!A1 is on sheet "Measurements": Ann Analyst made you a viewer/);
    const del = await t.editor.agent.delete(`/api/workbooks/${f.id}/sheets/${f.measurements}`).expect(403);
    expect(del.body.error).toMatchObject({ code: 'view_only', message: 'Ann Analyst made you a viewer of sheet "Measurements"; ask them or an owner' });

    // Bob's own client, built from what the API tells him, refuses the same edits before sending.
    const mine = await load(t.editor.agent, f.id);
    expect(mine.mySheetRoles).toEqual([
      { sheetId: f.other, role: 'editor', source: 'workbook' },
      { sheetId: f.measurements, role: 'viewer', source: 'override' },
    ]);
    const m = new WorkbookModel(mine);
    m.setEditRule(editRuleFor(protectionOf(mine), actorOf(t.editor.user.id, mine.role)));
    expect(m.edit([{ sheetId: f.measurements, row: 1, col: 1, input: '3' }]).applied).toEqual([]);
    expect(m.edit([{ sheetId: f.other, row: 1, col: 1, input: '3' }]).applied).toHaveLength(1);
  });
});
