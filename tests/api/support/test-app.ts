import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { loadConfig, type AppConfig } from '../../../server/config';
import { openDatabase, type Database } from '../../../server/db';
import { startMailCatcher, type MailCatcher } from '../../../server/mail/mail-catcher';
import { createSmtpMailer, type Mailer } from '../../../server/mail/mailer';

/** An app built against the test database (from `npm test`), with its own mail catcher. */
export interface TestApp {
  /** The Express app, for supertest. */
  app: Express;
  /** The Drizzle client, for arranging and checking data. */
  db: Database;
  /** The settings used. */
  config: AppConfig;
  /** Where captured mail lands. */
  mailDir: string;
  /** Closes everything. */
  close(): Promise<void>;
}

/** Builds a test app; `env` overrides settings (e.g. the sign-in rate limit). */
export async function startTestApp(env: Record<string, string> = {}): Promise<TestApp> {
  const databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl)
    throw new Error('DATABASE_URL is not set: run the API tests through `npm test`');
  const dir = mkdtempSync(join(tmpdir(), 'cellsmith-api-'));
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    CELLSMITH_DATA_DIR: dir,
    SESSION_SECRET: 'api-test-secret-api-test-secret-api-test',
    PUBLIC_URL: 'http://app.test',
    ...env,
  });
  const { db, pool } = openDatabase(databaseUrl, 4);
  const mailDir = join(dir, 'mail');
  const catcher: MailCatcher = await startMailCatcher(mailDir);
  const mailer: Mailer = createSmtpMailer(catcher.url, config.mailFrom);
  const built = createApp(
    { config, db, mailer, capturedMailDir: mailDir },
    { pool, serveClient: false },
  );
  return {
    app: built.app,
    db,
    config,
    mailDir,
    async close() {
      built.close();
      mailer.close();
      await catcher.close();
      await pool.end();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
