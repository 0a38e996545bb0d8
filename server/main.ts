// `npm start` (after `vite build`): migrate the database, serve the built client and /api on one port,
// and close cleanly on SIGTERM/SIGINT.
import fs from 'node:fs';
import type { AddressInfo } from 'node:net';
import { createApp } from './app.js';
import { isLoopbackHost, loadConfig } from './config.js';
import { openDatabase } from './db/index.js';
import { demoAccountsWithPublicPasswords, seedBanner, seedOnFirstStart } from './seed/index.js';
import { beginShutdown } from './services/shutdown.js';
import { sweepStagedImports } from './xlsx/importStaged.js';
import { warmParsePool } from './xlsx/parseInWorker.js';

const config = { ...loadConfig(), production: true };
const db = openDatabase(config.databasePath); // applies any pending migrations before we listen
const { app, ctx } = createApp({ db, config });
const log = ctx.logger;
// Demo team and workbooks on a database with no accounts yet (ORBITAB_SEED=0 turns it off); the
// banner with the demo passwords is printed this once.
const seedReport = config.seed ? seedBanner(await seedOnFirstStart(ctx)) : null;
if (seedReport) console.log(seedReport);
// Imports a crash or a full disk left half-stored (never visible to anyone) are removed now.
await sweepStagedImports(ctx).catch((err) => log.error({ err }, 'removing unfinished imports failed'));
// One worker per pool started now, so the first /values or upload does not wait for one.
warmParsePool();
// The built-in fake SMTP server (when SMTP_URL is unset) starts now, so /api/health names its port.
ctx.mail.start().catch((err) => log.error({ err }, 'mail transport did not start; invitations cannot be e-mailed until it does'));

if (!fs.existsSync(config.clientDir)) {
  log.warn({ clientDir: config.clientDir }, 'no built client; run `vite build` (npm start does) — serving the API only');
}

// HOST defaults to loopback. Opened to the network while a demo account still has its public
// password, anyone who can reach the port signs in as that account: say so loudly, every start.
if (!isLoopbackHost(config.host)) {
  const open = await demoAccountsWithPublicPasswords(ctx);
  if (open.length > 0) {
    console.error(
      [
        '!!! WARNING: Orbitab listens on ' + config.host + ', reachable from other machines, and these demo accounts',
        '!!! still sign in with the public passwords printed in the README: ' + open.join(', ') + '.',
        '!!! Change or disable them (Account page, or the admin page), or start on a new database with ORBITAB_SEED=0,',
        '!!! or listen on this machine only (unset HOST, or HOST=127.0.0.1).',
      ].join('\n'),
    );
    log.warn({ host: config.host, demoAccounts: open }, 'listening beyond loopback with public demo passwords');
  }
}

const server = app.listen(config.port, config.host);
server.on('listening', () => {
  const { port } = server.address() as AddressInfo;
  // PORT=0 lets the OS choose; the default public origin names the port actually taken.
  if (!config.originConfigured) config.origin = `http://localhost:${port}`;
  log.info({ host: config.host, port, databasePath: config.databasePath }, 'listening');
  // Plain line for the person who ran `npm start` (and for scripts that start us on PORT=0).
  console.log(`Orbitab is serving on http://localhost:${port}` + (isLoopbackHost(config.host) ? ' (this machine only; set HOST=0.0.0.0 to open it to the network)' : ` (listening on ${config.host})`));
});
server.on('error', (err: NodeJS.ErrnoException) => {
  const reason =
    err.code === 'EADDRINUSE' ? `port ${config.port} is already in use; set PORT to another` : err.code === 'EADDRNOTAVAIL' ? `HOST ${config.host} is not an address of this machine` : err.message;
  console.error(`Orbitab could not start: ${reason}`);
  db.$client.close();
  process.exit(1);
});

// Graceful: stop taking connections, let requests in flight finish, then close the database (which
// checkpoints the WAL). Long-lived connections (Server-Sent Events) are cut after a grace period.
const graceMs = 10_000;
let stopping = false;
function shutdown(signal: NodeJS.Signals) {
  if (stopping) return;
  stopping = true;
  beginShutdown(); // an import being stored answers 503 at its next step
  log.info({ signal }, 'shutting down');
  void ctx.mail.stop();
  server.close(() => {
    db.$client.close();
    log.info('closed');
    process.exit(0);
  });
  server.closeIdleConnections();
  setTimeout(() => server.closeAllConnections(), graceMs).unref();
  setTimeout(() => process.exit(1), graceMs + 5_000).unref();
}
process.on('SIGTERM', () => shutdown('SIGTERM'));
process.on('SIGINT', () => shutdown('SIGINT'));
