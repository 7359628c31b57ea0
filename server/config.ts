import { randomBytes } from 'node:crypto';
import { existsSync, mkdirSync, readFileSync, writeFileSync } from 'node:fs';
import { join, resolve } from 'node:path';
import { z } from 'zod';
import { projectRoot } from './project-root';

const envSchema = z.object({
  NODE_ENV: z.enum(['development', 'production', 'test']).default('development'),
  HOST: z.string().min(1).default('127.0.0.1'),
  PORT: z.coerce.number().int().min(0).max(65535).default(4310),
  PGPORT: z.coerce.number().int().min(1).max(65535).default(54329),
  CELLSMITH_DATA_DIR: z.string().min(1).default('./.data'),
  DATABASE_URL: z.url().optional(),
  SESSION_SECRET: z.string().min(32, 'SESSION_SECRET must have at least 32 characters').optional(),
  SMTP_URL: z.url().optional(),
  MAIL_FROM: z.string().min(3).default('Cellsmith <no-reply@cellsmith.test>'),
  PUBLIC_URL: z.url().optional(),
  COOKIE_SECURE: z
    .enum(['true', 'false'])
    .default('false')
    .transform((value) => value === 'true'),
  LOGIN_MAX_FAILURES: z.coerce.number().int().min(1).default(10),
  LOGIN_WINDOW_MINUTES: z.coerce.number().positive().default(15),
  CLIENT_DIST: z.string().optional(),
  MAX_UPLOAD_MB: z.coerce.number().positive().default(512),
});

/** The server's settings, read once from the environment at boot. */
export interface AppConfig {
  /** Which mode the server runs in. */
  env: 'development' | 'production' | 'test';
  /** Address to listen on. */
  host: string;
  /** Port to listen on; 0 picks a free one. */
  port: number;
  /** Folder for the cluster, uploads and captured mail. */
  dataDir: string;
  /** PostgreSQL connection URL. */
  databaseUrl: string;
  /** Secret that signs session cookies and CSRF tokens. */
  sessionSecret: string;
  /** SMTP server to send mail through; absent: a local mail catcher is started. */
  smtpUrl: string | undefined;
  /** The From header of outgoing mail. */
  mailFrom: string;
  /** The address people reach the app at, used in links sent by e-mail. */
  publicUrl: string;
  /** Whether cookies carry the Secure flag (behind HTTPS). */
  cookieSecure: boolean;
  /** Failed sign-ins allowed per account and address within the window. */
  loginMaxFailures: number;
  /** The sign-in rate-limit window, in milliseconds. */
  loginWindowMs: number;
  /** Folder of the built client (index.html and assets). */
  clientDist: string;
  /** The largest log file an upload may carry, in bytes (larger: 413). */
  maxUploadBytes: number;
}

/** Reads the session secret from the environment, or from (or into) the data folder. */
function resolveSessionSecret(given: string | undefined, dataDir: string): string {
  if (given) return given;
  const file = join(dataDir, 'session-secret');
  if (existsSync(file)) return readFileSync(file, 'utf8').trim();
  mkdirSync(dataDir, { recursive: true });
  const secret = randomBytes(32).toString('hex');
  writeFileSync(file, secret, { mode: 0o600 });
  return secret;
}

/** Parses the environment into the server's settings; throws naming each bad variable. */
export function loadConfig(env: NodeJS.ProcessEnv = process.env): AppConfig {
  const parsed = envSchema.safeParse(env);
  if (!parsed.success) {
    const problems = parsed.error.issues.map(
      (issue) => `${issue.path.join('.')}: ${issue.message}`,
    );
    throw new Error(`Invalid environment:\n  ${problems.join('\n  ')}`);
  }
  const e = parsed.data;
  const dataDir = resolve(projectRoot(), e.CELLSMITH_DATA_DIR);
  return {
    env: e.NODE_ENV,
    host: e.HOST,
    port: e.PORT,
    dataDir,
    databaseUrl: e.DATABASE_URL ?? `postgres://postgres@127.0.0.1:${e.PGPORT}/cellsmith`,
    sessionSecret: resolveSessionSecret(e.SESSION_SECRET, dataDir),
    smtpUrl: e.SMTP_URL,
    mailFrom: e.MAIL_FROM,
    publicUrl: (e.PUBLIC_URL ?? `http://${e.HOST}:${e.PORT}`).replace(/\/$/, ''),
    cookieSecure: e.COOKIE_SECURE,
    loginMaxFailures: e.LOGIN_MAX_FAILURES,
    loginWindowMs: e.LOGIN_WINDOW_MINUTES * 60_000,
    clientDist: resolve(projectRoot(), e.CLIENT_DIST ?? 'dist/cellsmith/browser'),
    maxUploadBytes: Math.floor(e.MAX_UPLOAD_MB * 1024 * 1024),
  };
}
