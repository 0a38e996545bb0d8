// A fresh Orbitab app on its own in-memory database for each call, and supertest agents that behave
// like the browser app: they keep cookies and send the app's Origin on every request.
import { desc, eq } from 'drizzle-orm';
import request, { type Agent as TestAgent } from 'supertest';
import { afterAll } from 'vitest';
import { mailMessages } from '../../server/db/schema.js';
import type { AttemptLimit, LimitName } from '../../server/auth/rateLimit.js';
import { createApp } from '../../server/app.js';
import { loadConfig, type AppConfig } from '../../server/config.js';
import { openDatabase } from '../../server/db/index.js';
import type { PublicUser } from '../../shared/auth.js';

/** The public origin the test apps believe they serve (ORBITAB_ORIGIN); agents send it as Origin. */
export const testOrigin = 'http://orbitab.test';
export const testPassword = 'correct horse battery staple';

export interface TestAppOptions {
  /** ORBITAB_ADMIN_EMAIL. */
  adminEmail?: string;
  /** Any other configuration to override. */
  config?: Partial<AppConfig>;
  /** Attempt limits to override. */
  limits?: Partial<Record<LimitName, AttemptLimit>>;
}

const mailers: { stop(): Promise<void> }[] = [];
// Sign-up mails a verification link, which starts each app's fake SMTP server; close them all.
afterAll(async () => {
  await Promise.all(mailers.splice(0).map((m) => m.stop()));
});

/** The path of the newest link of a kind ('verify-email', 'reset-password', 'invitations') mailed to `email`, read from the dev inbox table. */
export function mailedLink(db: TestApp['db'], email: string, kind: 'verify-email' | 'reset-password' | 'invitations'): string | undefined {
  const rows = db.select().from(mailMessages).where(eq(mailMessages.to, email.toLowerCase())).orderBy(desc(mailMessages.id)).all();
  for (const row of rows) {
    const m = new RegExp(`(https?://\\S+)/${kind}/([A-Za-z0-9_-]{43})`).exec(row.text);
    if (m) return `${m[1]}/${kind}/${m[2]}`;
  }
  return undefined;
}

/** The token at the end of a mailed link. */
export const linkToken = (link: string) => link.slice(link.lastIndexOf('/') + 1);

export function makeTestApp(options: TestAppOptions = {}) {
  const db = openDatabase(':memory:');
  const config: AppConfig = {
    ...loadConfig({ NODE_ENV: 'test' }),
    seed: false,
    origin: testOrigin,
    originConfigured: true,
    adminEmail: options.adminEmail?.toLowerCase(),
    ...options.config,
  };
  const { app, ctx } = createApp({ db, config, limits: options.limits });
  mailers.push(ctx.mail);

  /** A cookie-keeping client that sends this app's Origin (as the browser would) on every request. */
  const agent = (): TestAgent => request.agent(app).set('Origin', testOrigin);

  /**
   * Opens the verification link mailed to `email` (through the fake SMTP server into the dev inbox),
   * as its owner would; returns the user the API reports afterwards.
   */
  async function verifyEmail(email: string): Promise<PublicUser> {
    const link = mailedLink(db, email, 'verify-email');
    if (!link) throw new Error(`no verification mail for ${email}`);
    const res = await agent().post('/api/auth/verify').send({ token: linkToken(link) });
    if (res.status !== 200) throw new Error(`verification of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return res.body.user as PublicUser;
  }

  /** Creates an account through the API and (unless told not to) verifies its address; returns its signed-in agent and the user. */
  async function signUp(email: string, name = email.split('@')[0], options: { verified?: boolean } = {}): Promise<{ agent: TestAgent; user: PublicUser; password: string }> {
    const client = agent();
    const res = await client.post('/api/auth/sign-up').send({ email, password: testPassword, name });
    if (res.status !== 201) throw new Error(`sign-up of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    const user = options.verified === false ? (res.body.user as PublicUser) : await verifyEmail(email);
    return { agent: client, user, password: testPassword };
  }

  return { app, ctx, db, config, agent, signUp, verifyEmail };
}

export type TestApp = ReturnType<typeof makeTestApp>;

/** The Set-Cookie line for the session cookie, or undefined. */
export function sessionCookieOf(res: { headers: Record<string, unknown> }): string | undefined {
  const lines = (res.headers['set-cookie'] ?? []) as string[];
  return lines.find((l) => l.startsWith('orbitab_session='));
}
