import path from 'node:path';
import { z } from 'zod';
import { resolveLogLevel, type LogLevel } from './logging.js';

const envSchema = z.object({
  PORT: z.coerce.number().int().min(0).max(65535).default(3000),
  /** The address to listen on: loopback unless the operator opens it to the network on purpose. */
  HOST: z.string().trim().min(1).default('127.0.0.1'),
  DATABASE_PATH: z.string().min(1).default('data/orbitab.sqlite'),
  SMTP_URL: z.string().url().optional(),
  /** The From of Orbitab's e-mail; a real relay usually accepts only its own domain's addresses. */
  MAIL_FROM: z.string().min(3).optional(),
  ORBITAB_SEED: z.enum(['0', '1']).default('1'),
  ORBITAB_ADMIN_EMAIL: z.string().email().optional(),
  /** The public origin (scheme, host, port) people open; links in e-mail are built from it. */
  ORBITAB_ORIGIN: z.string().url().refine((u) => URL.canParse(u) && /^https?:$/.test(new URL(u).protocol), 'must be an http or https URL').optional(),
  NODE_ENV: z.string().default('development'),
});

export interface AppConfig {
  port: number;
  /** The listening address (HOST, default 127.0.0.1: only this machine can connect). */
  host: string;
  databasePath: string;
  smtpUrl?: string;
  mailFrom?: string;
  seed: boolean;
  adminEmail?: string;
  /**
   * The public origin: ORBITAB_ORIGIN, else http://localhost:PORT. E-mailed links are built from it
   * and state-changing requests must come from it; request headers never decide either.
   */
  origin: string;
  /** Whether ORBITAB_ORIGIN was set; when not, the Origin check also accepts 127.0.0.1 and [::1] for localhost. */
  originConfigured: boolean;
  production: boolean;
  /** Set by `npm run dev`: Vite's dev server shares the port, so the content security policy is left off. */
  viteDevServer?: boolean;
  /** Where the built client lives (served in production). */
  clientDir: string;
  /** From LOG_LEVEL (default 'info'); 'silent' under test. Left out, createApp decides from process.env. */
  logLevel?: LogLevel;
}

export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const issue = parsed.error.issues[0];
    throw new Error(`configuration: ${issue.path.join('.')}: ${issue.message}`);
  }
  const e = parsed.data;
  return {
    port: e.PORT,
    host: e.HOST,
    databasePath: e.DATABASE_PATH,
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    seed: e.ORBITAB_SEED === '1',
    adminEmail: e.ORBITAB_ADMIN_EMAIL?.toLowerCase(),
    origin: e.ORBITAB_ORIGIN ? new URL(e.ORBITAB_ORIGIN).origin : `http://localhost:${e.PORT}`,
    originConfigured: e.ORBITAB_ORIGIN !== undefined,
    production: e.NODE_ENV === 'production',
    // Beside the repository root, not the working directory, so `tsx server/main.ts` works from anywhere.
    clientDir: path.resolve(import.meta.dirname, '../dist'),
    logLevel: resolveLogLevel(env),
  };
}

/** An absolute link into the app for e-mail: always from the configured origin, never from a request. */
export function publicLink(config: Pick<AppConfig, 'origin'>, path: string): string {
  return `${config.origin.replace(/\/+$/, '')}${path}`;
}

/** Whether a listening address reaches only this machine (127.0.0.0/8, ::1, localhost). */
export function isLoopbackHost(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, '').toLowerCase();
  return h === 'localhost' || h === '::1' || /^127\.\d{1,3}\.\d{1,3}\.\d{1,3}$/.test(h) || h === '::ffff:127.0.0.1';
}
