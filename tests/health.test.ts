import request from 'supertest';
import { describe, expect, it } from 'vitest';
import { createApp } from '../server/app.js';
import { loadConfig } from '../server/config.js';
import { openDatabase } from '../server/db/index.js';

describe('GET /api/health', () => {
  it('reports the database reachable and every migration applied', async () => {
    const db = openDatabase(':memory:');
    const { app } = createApp({ db, config: { ...loadConfig({}), seed: false } });
    const res = await request(app).get('/api/health');
    expect(res.status).toBe(200);
    expect(res.body.database).toBe('ok');
    expect(res.body.migrations.current).toBe(true);
  });

  it('answers an unknown API path with the JSON error shape', async () => {
    const db = openDatabase(':memory:');
    const { app } = createApp({ db, config: loadConfig({}) });
    const res = await request(app).get('/api/nope');
    expect(res.status).toBe(404);
    expect(res.body.error.code).toBe('not_found');
  });
});
