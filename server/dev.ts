// `npm run dev`: the API and Vite's dev server (with hot reload) on one port.
import express from 'express';
import { createServer as createViteServer } from 'vite';
import { createApp } from './app.js';
import { loadConfig } from './config.js';
import { openDatabase } from './db/index.js';

const config = { ...loadConfig(), production: false, viteDevServer: true };
const db = openDatabase(config.databasePath);
const { app: api, ctx } = createApp({ db, config });
ctx.mail.start().catch((err) => ctx.logger.error({ err }, 'mail transport did not start'));
const vite = await createViteServer({ server: { middlewareMode: true }, appType: 'spa' });
const app = express();
app.use(api);
app.use(vite.middlewares);
app.listen(config.port, config.host, () => console.log(`Orbitab (dev) on http://localhost:${config.port}`));
