import { randomBytes } from 'node:crypto';
import { existsSync, mkdtempSync, rmSync } from 'node:fs';
import type { Server as HttpServer } from 'node:http';
import { createServer, type Server } from 'node:net';
import type { AddressInfo } from 'node:net';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { createApp } from '../../../server/app';
import { loadConfig } from '../../../server/config';
import { openDatabase } from '../../../server/db';
import { startLogJobs } from '../../../server/jobs/log-jobs';
import { startMailCatcher } from '../../../server/mail/mail-catcher';
import { createSmtpMailer } from '../../../server/mail/mailer';
import { projectRoot } from '../../../server/project-root';

/** The whole product served on a free loopback port: built client, API, mail catcher. */
export interface RunningApp {
  /** Base URL, e.g. http://127.0.0.1:41234. */
  url: string;
  /** Stops everything. */
  close(): Promise<void>;
}

function freePort(): Promise<number> {
  return new Promise((resolvePort, reject) => {
    const probe: Server = createServer();
    probe.once('error', reject);
    probe.listen(0, '127.0.0.1', () => {
      const { port } = probe.address() as AddressInfo;
      probe.close(() => resolvePort(port));
    });
  });
}

/** Starts the app in this process against the `npm test` database and the built client. */
export async function startRunningApp(): Promise<RunningApp> {
  const databaseUrl = process.env['DATABASE_URL'];
  if (!databaseUrl)
    throw new Error('DATABASE_URL is not set: run the browser tests through `npm test`');
  // CLIENT_DIST lets a build in another folder be tested (e.g. while dist/ is being rebuilt).
  const clientDist =
    process.env['CLIENT_DIST'] ?? join(projectRoot(), 'dist', 'cellsmith', 'browser');
  if (!existsSync(join(clientDist, 'index.html'))) {
    throw new Error('the client is not built: `npm test` builds it before the browser tests');
  }
  const dir = mkdtempSync(join(tmpdir(), 'cellsmith-e2e-'));
  const mailDir = join(dir, 'mail');
  const catcher = await startMailCatcher(mailDir);
  const port = await freePort();
  const url = `http://127.0.0.1:${port}`;
  const config = loadConfig({
    NODE_ENV: 'test',
    DATABASE_URL: databaseUrl,
    CELLSMITH_DATA_DIR: dir,
    PUBLIC_URL: url,
    CLIENT_DIST: clientDist,
  });
  const { db, pool } = openDatabase(databaseUrl, 4);
  const mailer = createSmtpMailer(catcher.url, config.mailFrom);
  // Its own job schema: the API tests share the database and must not take these jobs.
  const jobsSchema = `pgboss_e2e_${randomBytes(5).toString('hex')}`;
  const logJobs = await startLogJobs({ db, config, schema: jobsSchema });
  const built = createApp({ config, db, mailer, capturedMailDir: mailDir, logJobs }, { pool });
  const server = await new Promise<HttpServer>((resolveServer, reject) => {
    const s = built.app.listen(port, '127.0.0.1', () => resolveServer(s));
    s.once('error', reject);
  });
  return {
    url,
    async close() {
      await new Promise<void>((r) => {
        server.close(() => r());
        server.closeAllConnections();
      });
      await logJobs.stop();
      built.close();
      mailer.close();
      await catcher.close();
      await pool.query(`DROP SCHEMA IF EXISTS "${jobsSchema}" CASCADE`);
      await pool.end();
      rmSync(dir, { recursive: true, force: true });
    },
  };
}
