// A fresh Orbitab app on its own in-memory database for each call, and supertest agents that behave
// like the browser app: they keep cookies and send the app's Origin on every request.
import request, { type Agent as TestAgent } from 'supertest';
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
}

export function makeTestApp(options: TestAppOptions = {}) {
  const db = openDatabase(':memory:');
  const config: AppConfig = {
    ...loadConfig({ NODE_ENV: 'test' }),
    seed: false,
    origin: testOrigin,
    adminEmail: options.adminEmail?.toLowerCase(),
    ...options.config,
  };
  const { app, ctx } = createApp({ db, config });

  /** A cookie-keeping client that sends this app's Origin (as the browser would) on every request. */
  const agent = (): TestAgent => request.agent(app).set('Origin', testOrigin);

  /** Creates an account through the API; returns its signed-in agent and the user the API reported. */
  async function signUp(email: string, name = email.split('@')[0]): Promise<{ agent: TestAgent; user: PublicUser; password: string }> {
    const client = agent();
    const res = await client.post('/api/auth/sign-up').send({ email, password: testPassword, name });
    if (res.status !== 201) throw new Error(`sign-up of ${email} failed: ${res.status} ${JSON.stringify(res.body)}`);
    return { agent: client, user: res.body.user as PublicUser, password: testPassword };
  }

  return { app, ctx, db, config, agent, signUp };
}

export type TestApp = ReturnType<typeof makeTestApp>;

/** The Set-Cookie line for the session cookie, or undefined. */
export function sessionCookieOf(res: { headers: Record<string, unknown> }): string | undefined {
  const lines = (res.headers['set-cookie'] ?? []) as string[];
  return lines.find((l) => l.startsWith('orbitab_session='));
}
