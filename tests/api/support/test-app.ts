import { randomBytes } from 'node:crypto';
import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import type { Express } from 'express';
import { createApp } from '../../../server/app';
import { loadConfig, type AppConfig } from '../../../server/config';
import { openDatabase, type Database } from '../../../server/db';
import {
  startLogJobs,
  type LogJobRunner,
  type LogJobsOptions,
} from '../../../server/jobs/log-jobs';
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
  /** The PostgreSQL schema of this app's job queue. */
  jobsSchema: string;
  /** The running job queue (log parses). */
  jobs: LogJobRunner;
  /** Closes everything. */
  close(): Promise<void>;
}

/** Options of {@link startTestApp} beyond the environment. */
export interface TestAppOptions {
  /**
   * A data folder and job schema to use (and leave in place at close), to start a second app on
   * the same stored state — a restart. By default each app has its own, removed at close.
   */
  shared?: { dataDir: string; jobsSchema: string };
  /** Job queue settings (piece size, a hook to hold a parse). */
  jobs?: Partial<Omit<LogJobsOptions, 'db' | 'config' | 'schema'>>;
}

/** A fresh pg-boss schema name, so parallel test files never take each other's jobs. */
export function newJobsSchema(): string {
  return `pgboss_test_${randomBytes(5).toString('hex')}`;
}

/** Builds a test app; `env` overrides settings (e.g. the sign-in rate limit). */
export async function startTestApp(
  env: Record<string, string> = {},
  options: TestAppOptions = {},
): Promise<TestApp> {
  const databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl)
    throw new Error('DATABASE_URL is not set: run the API tests through `npm test`');
  const dir = options.shared?.dataDir ?? mkdtempSync(join(tmpdir(), 'cellsmith-api-'));
  const jobsSchema = options.shared?.jobsSchema ?? newJobsSchema();
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
  // Quick polling and no retry delay keep background parses fast in tests.
  const jobs = await startLogJobs({
    db,
    config,
    schema: jobsSchema,
    pollingIntervalSeconds: 0.5,
    retryDelaySeconds: 0,
    ...options.jobs,
  });
  const built = createApp(
    { config, db, mailer, capturedMailDir: mailDir, logJobs: jobs },
    { pool, serveClient: false },
  );
  return {
    app: built.app,
    db,
    config,
    mailDir,
    jobsSchema,
    jobs,
    async close() {
      await jobs.stop();
      built.close();
      mailer.close();
      await catcher.close();
      if (!options.shared) await pool.query(`DROP SCHEMA IF EXISTS "${jobsSchema}" CASCADE`);
      await pool.end();
      if (!options.shared) rmSync(dir, { recursive: true, force: true });
    },
  };
}
