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

/** Letters, digits and punctuation on one line: line breaks and other control characters would end up in mail headers and logs. */
// eslint-disable-next-line no-control-regex -- control characters are exactly what this refuses
export const noControlCharacters = (s: string) => !/[\u0000-\u001f\u007f]/.test(s);

export const personNameSchema = z
  .string({ error: required('text') })
  .trim()
  .min(1, 'required')
  .max(100, 'at most 100 characters')
  .refine(noControlCharacters, 'may not contain line breaks or other control characters');

export const signUpSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: required('text') })
    .min(passwordMinLength, `at least ${passwordMinLength} characters`)
    .max(passwordMaxLength, `at most ${passwordMaxLength} characters`)
    .refine((p) => p.trim() !== '', 'may not be only spaces'),
  name: personNameSchema,
  /** The invitation link the person followed, when they sign up from one: it proves the mailbox. */
  invitationToken: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'not an invitation token').optional(),
}).superRefine((v, ctx) => {
  const problem = passwordProblem(v.password, v.email);
  if (problem) ctx.addIssue({ code: 'custom', path: ['password'], message: problem });
});
export type SignUpInput = z.infer<typeof signUpSchema>;

/**
 * Why a new password is refused, or null. Length is what makes a password hard to guess (NIST SP
 * 800-63B §5.1.1.2 asks for at least 8 characters and no composition rules); all-blank and the
 * account's own address are the first things anyone would try.
 */
export function passwordProblem(password: string, email?: string): string | null {
  if (password.length < passwordMinLength) return `at least ${passwordMinLength} characters`;
  if (password.length > passwordMaxLength) return `at most ${passwordMaxLength} characters`;
  if (password.trim() === '') return 'may not be only spaces';
  if (email && password.trim().toLowerCase() === email.trim().toLowerCase()) return 'may not be your e-mail address';
  return null;
}

const tokenSchema = (what: string) => z.string({ error: required('text') }).regex(/^[A-Za-z0-9_-]{43}$/, `not a ${what} token; open the link from the e-mail again`);

/** POST /api/auth/verify. */
export const verifyEmailSchema = z.object({ token: tokenSchema('verification') });
/** POST /api/auth/password-reset: the same answer whether or not the address has an account. */
export const passwordResetRequestSchema = z.object({ email: emailSchema });
/** POST /api/auth/password-reset/:token (the new password is checked against the account's address on the server). */
export const passwordResetSchema = z.object({ password: z.string({ error: required('text') }) });
export const resetTokenSchema = tokenSchema('password reset');
/** POST /api/auth/password while signed in. */
export const changePasswordSchema = z.object({
  current: z.string({ error: required('text') }).min(1, 'required').max(passwordMaxLength, `at most ${passwordMaxLength} characters`),
  next: z.string({ error: required('text') }),
});

/** Sign-in checks only that a password was given: its rules belong to sign-up. */
export const signInSchema = z.object({
  email: emailSchema,
  password: z
    .string({ error: required('text') })
    .min(1, 'required')
    .max(passwordMaxLength, `at most ${passwordMaxLength} characters`),
});
export type SignInInput = z.infer<typeof signInSchema>;

/** The answer to a reset request, whatever the address: it must not tell who has an account. */
export interface PasswordResetRequested {
  message: string;
}

/** The signed-in user as GET /api/auth/me, sign-up and sign-in return it: `{ user: PublicUser }`. */
export interface PublicUser {
  id: string;
  email: string;
  name: string;
  siteRole: SiteRole;
  /** Whether the address was proved by a mailed link; until then no sharing and no site-admin rights. */
  emailVerified: boolean;
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
  scope: 'account' | 'address' | 'user';
}
