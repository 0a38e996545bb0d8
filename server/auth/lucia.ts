import { DrizzleSQLiteAdapter } from '@lucia-auth/adapter-drizzle';
import { Lucia, TimeSpan } from 'lucia';
import type { Db } from '../db/index.js';
import { sessions, users } from '../db/schema.js';

export function createLucia(db: Db) {
  const adapter = new DrizzleSQLiteAdapter(db, sessions, users);
  return new Lucia(adapter, {
    // Sessions last 14 days and lucia extends them (session.fresh) once half of that has passed.
    sessionExpiresIn: new TimeSpan(14, 'd'),
    sessionCookie: {
      name: 'orbitab_session',
      // `secure` is set per request in the middleware (true when served over https).
      attributes: { sameSite: 'lax', secure: false },
    },
    getUserAttributes: (a) => ({ email: a.email, name: a.name, siteRole: a.site_role ?? a.siteRole, disabled: Boolean(a.disabled) }),
  });
}

export type OrbitabLucia = ReturnType<typeof createLucia>;

declare module 'lucia' {
  interface Register {
    Lucia: OrbitabLucia;
    DatabaseUserAttributes: { email: string; name: string; siteRole: 'admin' | 'member'; site_role?: 'admin' | 'member'; disabled: boolean | number };
  }
}
