import { join } from 'node:path';
import type { AddressInfo } from 'node:net';
import { createApp } from './app';
import { loadConfig } from './config';
import { openDatabase } from './db';
import { startLogJobs } from './jobs/log-jobs';
import { startMailCatcher, type MailCatcher } from './mail/mail-catcher';
import { createSmtpMailer } from './mail/mailer';

/** Boots the server: database, mail, the app; shuts all of it down on SIGINT/SIGTERM. */
async function main(): Promise<void> {
  const config = loadConfig();
  const { db, pool } = openDatabase(config.databaseUrl);
  let catcher: MailCatcher | null = null;
  let capturedMailDir: string | null = null;
  let smtpUrl = config.smtpUrl;
  if (!smtpUrl) {
    capturedMailDir = join(config.dataDir, 'mail');
    catcher = await startMailCatcher(capturedMailDir);
    smtpUrl = catcher.url;
    console.log(
      `[cellsmith] mail is captured locally (${catcher.url}), readable by admins on the Team page`,
    );
  }
  const mailer = createSmtpMailer(smtpUrl, config.mailFrom);
  const logJobs = await startLogJobs({ db, config });
  const built = createApp({ config, db, mailer, capturedMailDir, logJobs }, { pool });
  const server = built.app.listen(config.port, config.host);
  await new Promise<void>((resolvePromise, reject) => {
    server.once('listening', resolvePromise);
    server.once('error', reject);
  });
  const { port } = server.address() as AddressInfo;
  console.log(`[cellsmith] server listening on http://${config.host}:${port}`);

  let stopping = false;
  const stop = (signal: string): void => {
    if (stopping) return;
    stopping = true;
    console.log(`[cellsmith] ${signal}: stopping the server…`);
    server.close(() => {
      built.close();
      mailer.close();
      // Jobs stop first: a parse in progress stops at its next piece and resumes at next start.
      void logJobs
        .stop()
        .catch((err: unknown) => console.error('[cellsmith] the job queue did not stop:', err))
        .finally(() => Promise.all([pool.end(), catcher?.close()]).finally(() => process.exit(0)));
    });
    server.closeAllConnections();
    setTimeout(() => process.exit(1), 10_000).unref();
  };
  process.on('SIGINT', () => stop('SIGINT'));
  process.on('SIGTERM', () => stop('SIGTERM'));
}

main().catch((err: unknown) => {
  console.error('[cellsmith] the server could not start:', err);
  process.exit(1);
});
