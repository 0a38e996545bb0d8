// Holds a server with the 100,000 × 8 chemistry workbook (stored values ready) for profiling opens
// (bench/openProfile.ts). The database is kept at $OPEN_PROFILE_DIR so a restarted server finds it.
import fs from 'node:fs';
import path from 'node:path';
import { startServer } from '../tests/helpers/server.js';
import { ApiClient, createWorkbook, storedValuesReady } from './browser-open.js';

const dir = process.env.OPEN_PROFILE_DIR ?? '/tmp/orbitab-open-profile';
fs.mkdirSync(dir, { recursive: true });
const statePath = path.join(dir, 'state.json');
const server = await startServer({ env: { DATABASE_PATH: path.join(dir, 'orbitab.sqlite') }, timeoutMs: 120_000 });
const api = new ApiClient(server.url);
const SPECIES = ['O2', 'N2', 'F2', 'CO', 'NO', 'NO+', 'CN-', 'C2', 'B2', 'O2-', 'O2+', 'N2+', 'OH', 'HF', 'CH', 'NH', 'Li2', 'H2', 'He2+', 'CO+'];
const FORMULAS = ['BONDORDER', 'UNPAIRED', 'MAGNETISM', 'SPINMOMENT', 'GROUNDTERM', 'DEGENERACY', 'HOMO'];
let state: { id: string; email: string } | null = fs.existsSync(statePath) ? JSON.parse(fs.readFileSync(statePath, 'utf8')) : null;
if (!state) {
  await api.call('POST', '/auth/sign-up', { name: 'Profile Analyst', email: 'profile@lab.example', password: 'profile-password-1' });
  const cells: [number, number, string][] = [];
  for (let r = 0; r < 100_000; r++) {
    cells.push([r, 0, SPECIES[r % SPECIES.length]]);
    FORMULAS.forEach((f, i) => cells.push([r, i + 1, `=${f}(A${r + 1})`]));
  }
  const id = await createWorkbook(api, 'Open profile: 100,000 rows', cells);
  state = { id, email: 'profile@lab.example' };
} else {
  await api.call('POST', '/auth/sign-in', { email: state.email, password: 'profile-password-1' });
}
console.log('stored after', await storedValuesReady(api, state.id, 600_000), 'ms');
fs.writeFileSync(statePath, JSON.stringify(state));
fs.writeFileSync(path.join(dir, 'live.json'), JSON.stringify({ url: server.url, cookie: api.cookie, id: state.id }));
console.log('ready', server.url);
process.on('SIGTERM', () => void server.stop().then(() => process.exit(0)));
setInterval(() => undefined, 1 << 30);
