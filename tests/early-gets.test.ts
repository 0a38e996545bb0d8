// The requests the page's first script starts before the app has arrived (src/lib/earlyGets.ts):
// the app's first call for the same path takes the answer instead of asking again, but only a
// success, only once, and only soon after it was asked for.
import { afterEach, beforeEach, describe, expect, it, vi } from 'vitest';

let served: { path: string; status: number; body: string }[];
let answers: Record<string, { status: number; body: unknown }>;

beforeEach(() => {
  vi.resetModules();
  served = [];
  answers = {};
  vi.stubGlobal('fetch', async (url: string) => {
    const path = url.replace(/^(https?:\/\/[^/]+)?\/api/, '');
    const a = answers[path] ?? { status: 404, body: { error: { code: 'not_found', message: 'no such thing' } } };
    const body = JSON.stringify(a.body);
    served.push({ path, status: a.status, body });
    return new Response(body, { status: a.status, headers: { 'content-type': 'application/json', 'content-length': String(body.length) } });
  });
});

afterEach(() => {
  vi.unstubAllGlobals();
  vi.useRealTimers();
});

async function modules() {
  const early = await import('../src/lib/earlyGets.js');
  const api = await import('../src/lib/api.js');
  return { ...early, ...api };
}

describe('early GET requests', () => {
  it('hands a successful early answer to the first call for its path, and asks again after that', async () => {
    const { startEarlyGet, api, apiLarge } = await modules();
    answers['/auth/me'] = { status: 200, body: { user: { id: 'u1' } } };
    answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 3 } };
    startEarlyGet('/auth/me');
    startEarlyGet('/workbooks/w1');
    expect(served.map((s) => s.path)).toEqual(['/auth/me', '/workbooks/w1']);

    expect(await api('/auth/me')).toEqual({ user: { id: 'u1' } });
    expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 3 });
    expect(served).toHaveLength(2); // both taken from the early requests

    answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 4 } };
    expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 4 });
    expect(served).toHaveLength(3); // taken once only: a later call asks the server
  });

  it('forgets early answers once the page changes something, so a confirmed address is not shown as unconfirmed', async () => {
    const { startEarlyGet, api } = await modules();
    answers['/auth/me'] = { status: 200, body: { user: { id: 'u1', emailVerified: false } } };
    answers['/auth/verify'] = { status: 200, body: { user: { id: 'u1', emailVerified: true } } };
    startEarlyGet('/auth/me');
    await api('/auth/verify', { method: 'POST', body: { token: 't' } });
    answers['/auth/me'] = { status: 200, body: { user: { id: 'u1', emailVerified: true } } };
    expect(await api('/auth/me')).toEqual({ user: { id: 'u1', emailVerified: true } });
    expect(served.map((s) => s.path)).toEqual(['/auth/me', '/auth/verify', '/auth/me']);
  });

  it('asks again when the early answer was a refusal (signed out when the page started)', async () => {
    const { startEarlyGet, apiLarge, ApiError } = await modules();
    answers['/workbooks/w1'] = { status: 401, body: { error: { code: 'unauthenticated', message: 'sign in first' } } };
    startEarlyGet('/workbooks/w1');
    answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 1 } };
    expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 1 });
    expect(served.map((s) => s.status)).toEqual([401, 200]);

    // A refusal asked afresh is still reported as before.
    answers['/workbooks/w2'] = { status: 404, body: { error: { code: 'not_found', message: 'This workbook does not exist' } } };
    startEarlyGet('/workbooks/w2');
    await expect(apiLarge('/workbooks/w2')).rejects.toBeInstanceOf(ApiError);
    expect(served.filter((s) => s.path === '/workbooks/w2')).toHaveLength(2);
  });

  it('does not use an early answer that has waited too long', async () => {
    vi.useFakeTimers({ toFake: ['performance'] });
    const { startEarlyGet, api } = await modules();
    answers['/auth/me'] = { status: 200, body: { user: { id: 'u1' } } };
    startEarlyGet('/auth/me');
    answers['/auth/me'] = { status: 200, body: { user: null } };
    vi.advanceTimersByTime(60_000);
    expect(await api('/auth/me')).toEqual({ user: null });
    expect(served).toHaveLength(2);
  });

  it('never hands an early answer to a request that sends something', async () => {
    const { startEarlyGet, api } = await modules();
    answers['/workbooks/w1'] = { status: 200, body: { id: 'w1' } };
    startEarlyGet('/workbooks/w1');
    answers['/workbooks/w1'] = { status: 200, body: { renamed: true } };
    expect(await api('/workbooks/w1', { method: 'PATCH', body: { title: 'x' } })).toEqual({ renamed: true });
    expect(served).toHaveLength(2);
  });

  describe('answers that grow with the workbook, read by the JSON worker from the start', () => {
    /** Stands in for jsonFetch.worker.ts: fetches what it is asked for and answers with the text (a small answer's reply). */
    let asked: { id: number; kind: string; url?: string }[];
    beforeEach(() => {
      asked = [];
      vi.stubGlobal('location', { href: 'http://page.test/workbooks/w1' });
      vi.stubGlobal(
        'Worker',
        class {
          onmessage: ((e: { data: unknown }) => void) | null = null;
          onerror: (() => void) | null = null;
          postMessage(m: { id: number; kind: string; url?: string }) {
            asked.push(m);
            if (m.kind !== 'fetch') return;
            void fetch(m.url!).then(async (res) => {
              const text = await res.text();
              const reply = res.ok ? { id: m.id, kind: 'text', text, receivedAt: 0 } : { id: m.id, kind: 'failed', status: res.status, statusText: '', body: JSON.parse(text) };
              this.onmessage?.({ data: reply });
            });
          }
        },
      );
    });

    it('asks the worker, not the page, and hands its answer to the first apiLarge for the path', async () => {
      const { startEarlyLargeGet, apiLarge } = await modules();
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 3 } };
      startEarlyLargeGet('/workbooks/w1');
      expect(asked).toEqual([{ id: 1, kind: 'fetch', url: 'http://page.test/api/workbooks/w1', largeChars: 4_000_000 }]);
      expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 3 });
      expect(served).toHaveLength(1);
      // Once only: the next call asks again.
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 4 } };
      expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 4 });
      expect(served).toHaveLength(2);
    });

    it('asks again after a refusal, and reports a refusal asked afresh as before', async () => {
      const { startEarlyLargeGet, apiLarge, ApiError } = await modules();
      answers['/workbooks/w1'] = { status: 401, body: { error: { code: 'unauthenticated', message: 'sign in first' } } };
      startEarlyLargeGet('/workbooks/w1');
      await vi.waitFor(() => expect(served).toHaveLength(1));
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 1 } };
      expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', revision: 1 });
      expect(served.map((s) => s.status)).toEqual([401, 200]);
      answers['/workbooks/w2'] = { status: 404, body: { error: { code: 'not_found', message: 'This workbook does not exist' } } };
      startEarlyLargeGet('/workbooks/w2');
      await expect(apiLarge('/workbooks/w2')).rejects.toBeInstanceOf(ApiError);
    });

    it('stops the early read and forgets it once the page changes something', async () => {
      const { startEarlyLargeGet, api, apiLarge } = await modules();
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', title: 'before' } };
      answers['/workbooks/w1/title'] = { status: 200, body: {} };
      startEarlyLargeGet('/workbooks/w1');
      await api('/workbooks/w1/title', { method: 'POST', body: { title: 'after' } });
      expect(asked.filter((m) => m.kind === 'abort')).toEqual([{ id: 1, kind: 'abort' }]);
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', title: 'after' } };
      expect(await apiLarge('/workbooks/w1')).toEqual({ id: 'w1', title: 'after' });
    });

    it('holds a held read’s reply unread until released, then hands it over', async () => {
      const { startEarlyLargeGet, apiLarge, releaseHeldAnswers } = await modules();
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 5 } };
      startEarlyLargeGet('/workbooks/w1', { held: true });
      let got: unknown = null;
      void apiLarge('/workbooks/w1').then((d) => (got = d));
      await vi.waitFor(() => expect(served).toHaveLength(1));
      await new Promise((r) => setTimeout(r, 20));
      expect(got).toBeNull(); // arrived, but not read
      releaseHeldAnswers();
      await vi.waitFor(() => expect(got).toEqual({ id: 'w1', revision: 5 }));
    });

    it('starts no read while reads are deferred, until released or until the longest hold has passed', async () => {
      const { holdAnswers, apiLarge, releaseHeldAnswers } = await modules();
      answers['/workbooks/w1'] = { status: 200, body: { id: 'w1', revision: 6 } };
      holdAnswers({ deferReads: true });
      const first = apiLarge('/workbooks/w1');
      await new Promise((r) => setTimeout(r, 20));
      expect(asked).toEqual([]);
      releaseHeldAnswers();
      expect(await first).toEqual({ id: 'w1', revision: 6 });
      expect(asked.map((m) => m.kind)).toEqual(['fetch']);

      // Nobody releases them: they start after the longest hold (3 s).
      vi.useFakeTimers();
      holdAnswers({ deferReads: true });
      const second = apiLarge('/workbooks/w1');
      await vi.advanceTimersByTimeAsync(2_900);
      expect(asked).toHaveLength(1);
      await vi.advanceTimersByTimeAsync(200);
      vi.useRealTimers();
      expect(await second).toEqual({ id: 'w1', revision: 6 });
      expect(asked).toHaveLength(2);
    });
  });
});
