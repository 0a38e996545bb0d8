import { createApp } from './app.js';
import { loadConfig } from './config.js';
import { openDatabase } from './db/index.js';

const config = { ...loadConfig(), production: true };
const db = openDatabase(config.databasePath);
const { app } = createApp({ db, config });
const server = app.listen(config.port, () => {
  console.log(`Orbitab is serving on http://localhost:${config.port}`);
});

function shutdown(signal: string) {
  console.log(`${signal}: closing`);
  server.close(() => {
    db.$client.close();
    process.exit(0);
  });
  setTimeout(() => process.exit(1), 10_000).unref();
}
process.on('SIGTERM', () => shutdown('SIGTERM'));
process.on('SIGINT', () => shutdown('SIGINT'));
