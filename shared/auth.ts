// Accounts and sessions: the request bodies the server validates and the client's forms reuse,
// and the user as the API shows it (never the password hash).
import { z } from 'zod';

export const siteRoles = ['admin', 'member'] as const;
export type SiteRole = (typeof siteRoles)[number];
export const siteRoleSchema = z.enum(siteRoles, { error: 'must be "admin" or "member"' });

/** 10 characters is the floor we ask of a human-chosen password; 200 keeps hashing bounded. */
export const passwordMinLength = 10;
export const passwordMaxLength = 200;

const required = (kind: string) => (issue: { input: unknown }) => (issue.input === undefined ? 'required' : `must be ${kind}`);

/** Trimmed and lower-cased before it is checked, so "Ann@Lab.org " and "ann@lab.org" are one account. */
export const emailSchema = z
  .string({ error: required('text') })
  .trim()
  .toLowerCase()
  .max(254, 'at most 254 characters')
  .pipe(z.email({ error: 'not a valid email address' }));

export const signUpSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: required('text') })
    .min(passwordMinLength, `at least ${passwordMinLength} characters`)
    .max(passwordMaxLength, `at most ${passwordMaxLength} characters`),
  name: z
    .string({ error: required('text') })
    .trim()
    .min(1, 'required')
    .max(100, 'at most 100 characters'),
});
export type SignUpInput = z.infer<typeof signUpSchema>;

/** Sign-in checks only that a password was given: its rules belong to sign-up. */
export const signInSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: required('text') })
    .min(1, 'required')
    .max(passwordMaxLength, `at most ${passwordMaxLength} characters`),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** The signed-in user as GET /api/auth/me, sign-up and sign-in return it: `{ user: PublicUser }`. */
export interface PublicUser {
  id: string;
  email: string;
  name: string;
  siteRole: SiteRole;
}

export interface AuthResponse {
  user: PublicUser;
}

/** Body of a 429 from sign-in (inside the usual `{ error: { code: 'rate_limited', message, details } }`). */
export interface RateLimitDetails {
  retryAfterSeconds: number;
  /** ISO 8601 time after which the next attempt is accepted. */
  retryAt: string;
  /** Which limit was reached. */
  scope: 'account' | 'address';
}
