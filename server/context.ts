import type { AppConfig } from './config.js';
import type { Db } from './db/index.js';
import type { OrbitabLucia } from './auth/lucia.js';
import type { AccountLimits } from './auth/rateLimit.js';
import type { Logger } from 'pino';
import type { EventHub } from './services/events.js';
import type { Mailer } from './mail/mailer.js';
import type { ValuesKeeper } from './values/keeper.js';

/** What every route module gets: built once per app, so tests can mount many apps side by side. */
export interface AppContext {
  db: Db;
  config: AppConfig;
  lucia: OrbitabLucia;
  /** Attempt counters for sign-in, sign-up, resets, verification mail and invitations (in memory, per app). */
  limits: AccountLimits;
  logger: Logger;
  /** Workbook events (revisions, renames, deletions), published after each commit. */
  events: EventHub;
  /** Outgoing e-mail (SMTP_URL, or the built-in fake SMTP server); stop() it when the app stops. */
  mail: Mailer;
  /** Computes each revision's values in the background and stores them (server/values/). */
  values: ValuesKeeper;
}
