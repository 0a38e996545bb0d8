// Two analysts on one workbook of a real Orbitab server (in memory): Ann works in a browser session
// run in Node (the real grid model, save queue, live feed and ledger), Bob calls the API directly.
// The test decides when the server's live events reach Ann, so late or early arrivals can be staged.
import type { PatchResult, WorkbookEvent, WorkbookPayload } from '../../shared/workbooks.js';
import { WorkbookModel } from '../../src/core/workbook/model/workbookModel.js';
import { PatchQueue, type PatchTransport } from '../../src/core/workbook/save/patchQueue.js';
import { PendingStore } from '../../src/core/workbook/save/pendingStore.js';
import { applyRemoteRevision, fromRevisionDetail, type RemoteRevision } from '../../src/features/live/remoteRevision.js';
import { RevisionFeed } from '../../src/features/live/revisionFeed.js';
import { ApiError } from '../../src/lib/api.js';
import { makeTestApp } from './app.js';
import { memoryStorage } from './workbookSession.js';

export async function twoAnalysts() {
  const t = makeTestApp();
  await t.signUp('admin@lab.test', 'Site Admin');
  const ann = await t.signUp('ann@lab.test', 'Ann Okafor');
  const bob = await t.signUp('bob@lab.test', 'Bob Laszlo');
  const id = (await ann.agent.post('/api/workbooks').send({ title: 'Ion screen' }).expect(201)).body.workbook.id as string;
  await ann.agent.post(`/api/workbooks/${id}/members`).send({ email: 'bob@lab.test', role: 'editor' }).expect(201);
  const load = async () => (await ann.agent.get(`/api/workbooks/${id}`).expect(200)).body as WorkbookPayload;
  const payload = await load();
  const sheetId = payload.sheets[0].id;

  // Live events as the server publishes them, handed to Ann only when the test says so.
  const late: RemoteRevision[] = [];
  t.ctx.events.subscribe(id, (e: WorkbookEvent) => {
    if (e.type === 'revision') late.push({ revision: e.revision, kind: e.kind, authorId: e.authorId ?? '', changes: e.patch.changes, sheetOps: e.patch.sheetOps });
  });

  let beforeNextSend: (() => Promise<void>) | null = null;
  const transport: PatchTransport = {
    async send(patch) {
      const hook = beforeNextSend;
      beforeNextSend = null;
      if (hook) await hook();
      const res = await ann.agent.post(`/api/workbooks/${id}/patches`).send(patch);
      if (res.status !== 200) throw new ApiError(res.status, res.body.error.code, res.body.error.message, res.body.error.details);
      return res.body as PatchResult;
    },
  };
  const model: WorkbookModel = new WorkbookModel(payload, { onLocalChanges: (c) => queue.enqueue(c) });
  const queue: PatchQueue = new PatchQueue({ transport, store: new PendingStore(memoryStorage(), id), baseRevision: payload.revision, debounceMs: 0, firstRetryMs: 50, showRemote: (inputs) => model.applyRemote(inputs) });
  const feed = new RevisionFeed({
    start: payload.revision,
    apply: (rev) => applyRemoteRevision(model, queue, rev),
    fetchRevision: async (n) => fromRevisionDetail((await ann.agent.get(`/api/workbooks/${id}/revisions/${n}`).expect(200)).body),
    onTooFarBehind: (n) => {
      throw new Error(`too far behind at revision ${n}`);
    },
  });
  queue.catchUp = (n) => feed.catchUp(n);

  return {
    sheetId,
    model,
    queue,
    /** Ann types into a cell of the first sheet. */
    annTypes: (row: number, col: number, input: string) => model.edit([{ sheetId, row, col, input }]),
    /** Bob saves a cell on top of the workbook as it is now. */
    bobSets: async (row: number, col: number, input: string) => {
      const { revision } = await load();
      await bob.agent.post(`/api/workbooks/${id}/patches`).send({ baseRevision: revision, changes: [{ sheetId, row, col, input }] }).expect(200);
    },
    /** Runs once, just before Ann's next patch reaches the server. */
    beforeAnnSends: (hook: () => Promise<void>) => (beforeNextSend = hook),
    /** The live events published so far reach Ann. */
    deliverLiveEvents: () => late.splice(0).forEach((r) => feed.receive(r)),
    serverCells: async () => (await load()).sheets[0].cells,
  };
}
