// The one error path: services throw HttpError or SpreadsheetError, and the app's error handler
// (server/errors.ts) is the only place either becomes { error: { code, message } } with its status.
// Each case below is thrown bare from a route and must come out as documented in DEVELOPERS.md.
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { errorHandler, HttpError } from '../server/errors.js';
import { SpreadsheetError } from '../server/xlsx/limits.js';
import { makeTestApp } from './helpers/app.js';

const logged: unknown[] = [];

function appThrowing(error: unknown) {
  const app = express();
  // What the request logger (pino-http) provides; a 500 must be logged, not only answered.
  app.use((req, _res, next) => {
    (req as any).log = { error: (fields: { err: unknown }) => logged.push(fields.err) };
    next();
  });
  app.get('/sync', () => {
    throw error;
  });
  app.get('/async', async () => {
    await Promise.resolve();
    throw error;
  });
  app.use(errorHandler);
  return app;
}

async function answerTo(error: unknown) {
  const app = appThrowing(error);
  const [sync, async] = [await request(app).get('/sync'), await request(app).get('/async')];
  // A synchronous throw and a rejected promise take the same path.
  expect(async.status).toBe(sync.status);
  expect(async.body).toEqual(sync.body);
  return sync;
}

describe('a thrown domain error becomes its documented answer, once', () => {
  it('an uploaded file the reader refuses keeps its code status and names the file', async () => {
    const res = await answerTo(new SpreadsheetError('too_many_cells', 'the workbook holds 600,000 cells, more than the 500,000 allowed'));
    expect(res.status).toBe(413);
    expect(res.body).toEqual({ error: { code: 'too_many_cells', message: 'file: the workbook holds 600,000 cells, more than the 500,000 allowed' } });
    const damaged = await answerTo(new SpreadsheetError('damaged_file', 'the zip directory is cut short').about('file'));
    expect(damaged.status).toBe(400);
    expect(damaged.body.error.code).toBe('damaged_file');
  });

  it('work on a stored workbook that hits a limit is the server’s: 503 with the hint, never a 4xx or 500', async () => {
    const res = await answerTo(new SpreadsheetError('too_complex', 'the export came to more than 256 MB').about('export', '; try values only'));
    expect(res.status).toBe(503);
    expect(res.body).toEqual({ error: { code: 'export_failed', message: 'export: the export came to more than 256 MB; try values only' } });
    const values = await answerTo(new SpreadsheetError('parse_timeout', 'computing the values took longer than 60 s').about('values'));
    expect(values.status).toBe(503);
    expect(values.body.error).toEqual({ code: 'values_failed', message: 'values: computing the values took longer than 60 s' });
  });

  it('a full queue says when to come back', async () => {
    const busy = await answerTo(new SpreadsheetError('busy', 'every worker is busy').about('values'));
    expect(busy.status).toBe(503);
    expect(busy.headers['retry-after']).toBe('30');
    expect(busy.body.error.code).toBe('busy');
    const jobs = await answerTo(new SpreadsheetError('too_many_jobs', 'you already have 3 jobs under way').about('export'));
    expect(jobs.status).toBe(429);
    expect(jobs.headers['retry-after']).toBe('5');
    expect(jobs.body.error).toEqual({ code: 'too_many_jobs', message: 'export: you already have 3 jobs under way' });
  });

  it('an HttpError from a service keeps its status, code and details', async () => {
    const res = await answerTo(new HttpError(409, 'conflict', 'cells changed since revision 4', { cells: ['A1'] }));
    expect(res.status).toBe(409);
    expect(res.body).toEqual({ error: { code: 'conflict', message: 'cells changed since revision 4', details: { cells: ['A1'] } } });
  });

  it('only a bug is a 500, and it does not leak its message', async () => {
    const bug = new TypeError('cannot read properties of undefined (secret detail)');
    const res = await answerTo(bug);
    expect(res.status).toBe(500);
    expect(logged.filter((e) => e === bug)).toHaveLength(2);
    expect(res.body).toEqual({ error: { code: 'internal', message: 'internal error; it has been logged' } });
  });

  it('through the real app: a refused upload, and access refusals from the middleware', async () => {
    const t = makeTestApp();
    const owner = await t.signUp('error-path-owner@example.test');
    const upload = await owner.agent.post('/api/imports').attach('file', Buffer.from('just text'), 'list.xlsx');
    expect(upload.status).toBe(400);
    expect(upload.body.error.code).toBe('not_a_spreadsheet');
    expect(upload.body.error.message).toMatch(/^file: /);

    const created = await owner.agent.post('/api/workbooks').send({ title: 'Errors' });
    const id = created.body.workbook.id as string;
    const anonymous = await request(t.app).get(`/api/workbooks/${id}`);
    expect(anonymous.status).toBe(401);
    expect(anonymous.body.error.code).toBe('unauthorized');
    const stranger = await t.signUp('error-path-stranger@example.test');
    const hidden = await stranger.agent.get(`/api/workbooks/${id}`);
    expect(hidden.status).toBe(404);
    expect(hidden.body).toEqual({ error: { code: 'not_found', message: 'workbook not found' } });
    const badId = await owner.agent.get('/api/workbooks/bad.id');
    expect(badId.status).toBe(400);
    expect(badId.body.error.code).toBe('invalid_input');
  });
});
