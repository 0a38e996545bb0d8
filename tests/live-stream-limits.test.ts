// Live-update streams end when the session or access that opened them ends (sign-out, a disabled
// account, sessions invalidated as a password change does, a site admin demoted), within a second and
// whichever route made the change; and a reader that stops reading is cut off instead of making the
// server hold every later event for it.
import net from 'node:net';
import v8 from 'node:v8';
import vm from 'node:vm';
import { beforeAll, describe, expect, it } from 'vitest';
import type { WorkbookPayload } from '../shared/workbooks.js';
import { maxUnsentBytes } from '../server/services/liveStream.js';
import type { EventStreamClient } from './helpers/eventStream.js';
import { liveStreamSuite } from './helpers/liveStreamSuite.js';
import { signUpPerson, type Person, type Team } from './helpers/team.js';
import { testOrigin } from './helpers/app.js';

describe('live-update streams and the session behind them', () => {
  const live = liveStreamSuite('Stream ends');
  let t: Team;
  let wb: WorkbookPayload;
  beforeAll(() => ({ t, wb } = live));

  async function stream(person: Person) {
    const s = await live.stream(person);
    await s.next((e) => e.event === 'ready');
    return s;
  }

  /** The stream's 'closed' event and its end, within a second of `at`. */
  async function endsSoon(s: EventStreamClient, reason: string) {
    const closed = await s.next((e) => e.event === 'closed', 1000);
    expect(closed.data.reason).toBe(reason);
    await s.ended;
  }

  /** A later revision does not reach a stream that has ended. */
  async function noMoreChanges(s: EventStreamClient) {
    const saved = await t.owner.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: (await t.owner.agent.get(`/api/workbooks/${wb.id}`)).body.revision, changes: [{ sheetId: wb.sheets[0].id, row: 0, col: 0, input: String(Math.random()) }] });
    expect(saved.status).toBe(200);
    expect(s.events.some((e) => e.event === 'revision' && e.data.revision === saved.body.revision)).toBe(false);
  }

  it('ends a stream within a second of its session signing out', async () => {
    const person = await signUpPerson(t, 'sal@lab.test', 'Sal Signout');
    await t.owner.agent.post(`/api/workbooks/${wb.id}/members`).send({ email: person.user.email, role: 'viewer' }).expect(201);
    const s = await stream(person);
    await person.agent.post('/api/auth/sign-out').expect(204);
    await endsSoon(s, 'signed_out');
    await noMoreChanges(s);
  });

  it('ends a stream within a second of its account being disabled', async () => {
    const s = await stream(t.editor2);
    await t.admin.agent.patch(`/api/admin/users/${t.editor2.user.id}`).send({ disabled: true }).expect(200);
    await endsSoon(s, 'signed_out');
    await noMoreChanges(s);
  });

  it("ends a stream within a second of the user's sessions being invalidated (as a password change does)", async () => {
    const s = await stream(t.viewer);
    await t.ctx.lucia.invalidateUserSessions(t.viewer.user.id);
    await endsSoon(s, 'signed_out');
  });

  it('ends a demoted site admin\'s stream on a workbook they are no member of', async () => {
    const second = await signUpPerson(t, 'dee@lab.test', 'Dee Deputy');
    await t.admin.agent.patch(`/api/admin/users/${second.user.id}`).send({ siteRole: 'admin' }).expect(200);
    const s = await stream(second);
    await t.admin.agent.patch(`/api/admin/users/${second.user.id}`).send({ siteRole: 'member' }).expect(200);
    await endsSoon(s, 'access_removed');
    await noMoreChanges(s);
  });

  it('cuts 50 streams whose readers stopped reading, keeps serving the others, and holds no more than the bound for each', async () => {
    const reader = await stream(t.owner);
    const port = Number(new URL(live.server.url).port);
    // Clients that open the stream and then never read a byte: the kernel's buffers fill, then the server's.
    async function stalledReader() {
      const socket = net.connect({ port, host: '127.0.0.1' });
      // It reads the response's head (so we know it is subscribed), then nothing more.
      const head = new Promise<string>((resolve) => socket.once('data', (chunk: Buffer) => (socket.pause(), resolve(chunk.toString()))));
      const cut = new Promise<void>((resolve) => socket.once('close', () => resolve()));
      socket.on('error', () => undefined);
      await new Promise<void>((resolve) => socket.once('connect', () => resolve()));
      socket.write(`GET /api/workbooks/${wb.id}/events HTTP/1.1\r\nHost: 127.0.0.1\r\nOrigin: ${testOrigin}\r\nCookie: ${t.owner.cookie}\r\nAccept: text/event-stream\r\n\r\n`);
      expect(await head).toMatch(/^HTTP\/1\.1 200/);
      return { socket, cut };
    }
    const stalled = [];
    for (let i = 0; i < 50; i++) stalled.push(await stalledReader());

    // Large patches: 1,500 cells of 1,000 characters each, about 1.5 MB per event.
    const text = 'x'.repeat(1000);
    const listening = () => t.ctx.events.listenerCount(wb.id);
    expect(listening()).toBe(51);
    // Live memory only (garbage collected first; the JS heap and the buffers written to sockets), so
    // what is measured is what the server holds on to.
    v8.setFlagsFromString('--expose-gc');
    const gc = vm.runInNewContext('gc') as () => void;
    const liveHeap = () => (gc(), process.memoryUsage().heapUsed + process.memoryUsage().external);
    const heapBefore = liveHeap();
    let heapPeak = heapBefore;
    let sent = 0;
    let base = (await t.owner.agent.get(`/api/workbooks/${wb.id}`)).body.revision;
    for (let round = 0; round < 40 && listening() > 1; round++) {
      const changes = Array.from({ length: 1500 }, (_, i) => ({ sheetId: wb.sheets[0].id, row: 100 + i, col: round % 5, input: `${round}${text}` }));
      const saved = await t.owner.agent.post(`/api/workbooks/${wb.id}/patches`).send({ baseRevision: base, changes });
      expect(saved.status).toBe(200);
      base = saved.body.revision;
      sent += 1500 * 1000;
      await reader.next((e) => e.event === 'revision' && e.data.revision === saved.body.revision, 5000);
      heapPeak = Math.max(heapPeak, liveHeap());
    }
    // The server let go of every stalled stream; once the clients read again they find them ended.
    expect(listening()).toBe(1);
    for (const s of stalled) s.socket.resume();
    await Promise.all(stalled.map((s) => s.cut));
    // Cut once its unsent bytes passed the bound plus what the kernel's buffers hold, not after everything.
    expect(sent).toBeLessThan(40 * 1500 * 1000);
    expect(maxUnsentBytes).toBeLessThan(sent);
    // Memory stays bounded: holding every event for all 50 would grow by 50 × 1.5 MB each round; the
    // server held at most its bound per stream, and the cells.
    console.log(`[live-stream-limits] memory held at the peak: ${((heapPeak - heapBefore) / 1e6).toFixed(0)} MB`);
    expect(heapPeak - heapBefore).toBeLessThan(2 * 50 * maxUnsentBytes + 64 * 1024 * 1024);
    // The reading client still gets each revision.
    expect(reader.events.filter((e) => e.event === 'revision').length).toBeGreaterThan(0);
  }, 120_000);
});
