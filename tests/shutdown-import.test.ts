// Once the server is stopping (SIGTERM), an import being stored answers 503 at its next step and
// keeps nothing; a new upload is refused the same way.
import { describe, expect, it } from 'vitest';
import { beginShutdown } from '../server/services/shutdown.js';
import { makeTestApp } from './helpers/app.js';

describe('imports while the server stops', () => {
  it('answers an import in flight with 503 shutting_down and stores nothing of it', async () => {
    const t = makeTestApp();
    const lead = await t.signUp('lead@lab.test', 'Lab Lead');
    const csv = Array.from({ length: 20_000 }, (_, r) => `${r},${r * 3},line ${r}`).join('\n');
    const before = t.db.$client.prepare('select (select count(*) from workbooks) as w, (select count(*) from cells) as c').get();
    // The stop arrives while the upload is on its way or being read (either way it is refused, whole).
    const answer = lead.agent.post('/api/imports').attach('file', Buffer.from(csv), 'lines.csv').then((r) => r);
    setImmediate(beginShutdown);
    const res = await answer;
    expect([res.status, res.body.error.code]).toEqual([503, 'shutting_down']);
    expect(res.headers['retry-after']).toBe('30');
    expect(t.db.$client.prepare('select (select count(*) from workbooks) as w, (select count(*) from cells) as c').get()).toEqual(before);

    const later = await lead.agent.post('/api/imports').attach('file', Buffer.from('a,b\n1,2\n'), 'small.csv');
    expect([later.status, later.body.error.code]).toEqual([503, 'shutting_down']);
  });
});
