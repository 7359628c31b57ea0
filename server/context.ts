import type { AppConfig } from './config';
import type { Database } from './db';
import type { LogJobs } from './jobs/log-jobs';
import type { Mailer } from './mail/mailer';

/** What routes and services need, built once at boot (or by a test). */
export interface AppContext {
  /** Settings. */
  config: AppConfig;
  /** The Drizzle client. */
  db: Database;
  /** Outgoing mail. */
  mailer: Mailer;
  /** Folder of captured mail when the local mail catcher is in use, else null. */
  capturedMailDir: string | null;
  /** Background jobs: a stored log's parse is queued through this. */
  logJobs: LogJobs;
}
