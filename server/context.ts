import type { AppConfig } from './config.js';
import type { Db } from './db/index.js';
import type { OrbitabLucia } from './auth/lucia.js';

/** What every route module gets: built once per app, so tests can mount many apps side by side. */
export interface AppContext {
  db: Db;
  config: AppConfig;
  lucia: OrbitabLucia;
}
