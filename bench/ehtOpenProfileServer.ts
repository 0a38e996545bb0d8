// Holds a server with the extended-Hückel library workbook of bench/ehtLibrary.ts, every structure
// computed and the revision's values stored, for profiling opens of it (bench/ehtOpenProfile.ts).
// The database is kept at $EHT_PROFILE_DIR so a restarted server (after a new client build) finds it.
// Run: `npx tsx bench/ehtOpenProfileServer.ts` (EHT_LIBRARY_MOLECULES=200 as for the bench), keep it running.
import fs from 'node:fs';
import path from 'node:path';
import { startServer } from '../tests/helpers/server.js';
import { ApiClient, createWorkbook, storedValuesReady } from './browser-open.js';
import { benchMolecules } from './ehtMolecules.js';
import { libraryCells } from './ehtLibrary.js';

const dir = process.env.EHT_PROFILE_DIR ?? '/tmp/orbitab-eht-profile';
fs.mkdirSync(dir, { recursive: true });
const count = Number(process.env.EHT_LIBRARY_MOLECULES ?? 1_000);
const statePath = path.join(dir, 'state.json');
const server = await startServer({ env: { DATABASE_PATH: path.join(dir, 'orbitab.sqlite') }, timeoutMs: 120_000 });
const api = new ApiClient(server.url);
const password = 'profile-password-1';
let state: { id: string; email: string } | null = fs.existsSync(statePath) ? JSON.parse(fs.readFileSync(statePath, 'utf8')) : null;
const smiles = benchMolecules(count);
if (!state) {
  await api.call('POST', '/auth/sign-up', { name: 'Library Analyst', email: 'library@lab.example', password });
  state = { id: await createWorkbook(api, 'EHT library profile', libraryCells(smiles)), email: 'library@lab.example' };
  fs.writeFileSync(statePath, JSON.stringify(state));
} else {
  await api.call('POST', '/auth/sign-in', { email: state.email, password });
}
// Every structure computed by the server's pool (asked for as the page would), then the values stored.
const started = performance.now();
for (;;) {
  let missing = 0;
  for (let i = 0; i < smiles.length; i += 500) {
    const { results } = await api.call<{ results: unknown[] }>('POST', `/workbooks/${state.id}/structures`, { inputs: smiles.slice(i, i + 500).map((structure) => ({ structure })) });
    missing += results.filter((r) => r === null).length;
  }
  if (missing === 0) break;
  console.log(`${missing} structures still computing (${Math.round((performance.now() - started) / 1000)} s)`);
  await new Promise((r) => setTimeout(r, 5_000));
}
console.log('stored after', await storedValuesReady(api, state.id, 600_000), 'ms');
fs.writeFileSync(path.join(dir, 'live.json'), JSON.stringify({ url: server.url, cookie: api.cookie, id: state.id }));
console.log('ready', server.url);
process.on('SIGTERM', () => void server.stop().then(() => process.exit(0)));
setInterval(() => undefined, 1 << 30);
