import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { SiteRole } from '../../shared/auth.js';
import type { Db } from '../db/index.js';
import { sessions, users } from '../db/schema.js';

export function createLucia(db: Db) {
  const adapter = new DrizzleSQLiteAdapter(db, sessions, users);
  return new Lucia(adapter, {
    // Sessions last 14 days; lucia extends one (session.fresh) once half of that has passed, and
    // loadSession then sends the cookie again with the new expiry.
    sessionExpiresIn: new TimeSpan(14, 'd'),
    sessionCookie: {
      name: 'orbitab_session',
      // `secure` is decided per request in setSessionCookie (true when served over https).
      attributes: { sameSite: 'lax', secure: false },
    },
    // The adapter selects the Drizzle columns, so attributes arrive with the schema's property names.
    getUserAttributes: (a) => ({ email: a.email, name: a.name, siteRole: a.siteRole, disabled: Boolean(a.disabled), emailVerified: a.emailVerifiedAt !== null && a.emailVerifiedAt !== undefined }),
  });
}

export type OrbitabLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: OrbitabLucia;
    DatabaseUserAttributes: { email: string; name: string; siteRole: SiteRole; disabled: boolean; emailVerifiedAt: number | null };
  }
}
