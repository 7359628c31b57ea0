import PgBoss from 'pg-boss';
import { z } from 'zod';
import type { AppConfig } from '../config';
import type { Database } from '../db';
import {
  ParseAbortedError,
  parseStoredLog,
  type ParseStoredLogOptions,
  type ParseTarget,
} from '../services/log-parse.service';
import { PARSE_LOG_QUEUE } from './queues';
import { resumeUnfinishedParses } from './resume-parse-jobs';

/** What routes and services need of the background jobs: queueing a log's parse. */
export interface LogJobs {
  /** Queues the parse of a stored log (its job id is the log id). */
  enqueueParse(target: ParseTarget): Promise<void>;
}

/** The running job queue: queueing plus stopping. */
export interface LogJobRunner extends LogJobs {
  /** Stops taking jobs; a parse in progress stops at its next piece and is retried later. */
  stop(): Promise<void>;
}

/** Settings of the job queue; all but `db` and `config` have production defaults. */
export interface LogJobsOptions {
  /** The Drizzle client the parse writes through. */
  db: Database;
  /** Data folder (raw files) and database URL (pg-boss keeps its own small pool). */
  config: Pick<AppConfig, 'dataDir' | 'databaseUrl'>;
  /** PostgreSQL schema pg-boss keeps its tables in (default `pgboss`; tests use their own). */
  schema?: string;
  /** How often an idle worker looks for jobs, seconds (default 0.5; a new upload wakes it). */
  pollingIntervalSeconds?: number;
  /** Attempts after the first (default 2). */
  retryLimit?: number;
  /** Seconds before a retry (default 10). */
  retryDelaySeconds?: number;
  /** Compressed bytes read at a time while parsing (default 256 KiB). */
  pieceBytes?: number;
  /** Called after each piece read; a test holds a parse mid-way with it. */
  onPiece?: ParseStoredLogOptions['onPiece'];
}

const parseTargetSchema = z.object({ shopId: z.uuid(), logId: z.uuid() });

/**
 * Starts the background jobs on pg-boss in the app's own database (pg-boss creates its schema):
 * re-queues parses a stopped or crashed server left unfinished, then works the `parse-log`
 * queue one log at a time. A failed attempt is retried (`retryLimit`); the last one marks the log
 * failed. One server per database works the queue: that is what makes a job still `active` at
 * start-up an orphan of the previous process.
 */
export async function startLogJobs(options: LogJobsOptions): Promise<LogJobRunner> {
  const { db, config } = options;
  const retryLimit = options.retryLimit ?? 2;
  // pg-boss's shortest poll: a new log waits at most half a second for its parse to start.
  const pollingIntervalSeconds = options.pollingIntervalSeconds ?? 0.5;
  const sendOptions: PgBoss.SendOptions = {
    retryLimit,
    retryDelay: options.retryDelaySeconds ?? 10,
    // Generous: pg-boss fails a job that runs longer, and a 512 MB file takes a while.
    expireInSeconds: 60 * 60,
  };
  const boss = new PgBoss({
    connectionString: config.databaseUrl,
    schema: options.schema ?? 'pgboss',
    max: 3,
    application_name: 'cellsmith-jobs',
    schedule: false,
    pollingIntervalSeconds,
  });
  boss.on('error', (err) => console.error('[cellsmith] job queue:', err));
  await boss.start();
  await boss.createQueue(PARSE_LOG_QUEUE, { name: PARSE_LOG_QUEUE, ...sendOptions });
  await resumeUnfinishedParses({ boss, db, dataDir: config.dataDir, sendOptions });

  const stopping = new AbortController();
  const workerId = await boss.work<unknown>(
    PARSE_LOG_QUEUE,
    { includeMetadata: true, batchSize: 1, pollingIntervalSeconds },
    async ([job]) => {
      if (!job) return null;
      const target = parseTargetSchema.parse(job.data);
      try {
        const outcome = await parseStoredLog({ db, dataDir: config.dataDir }, target, {
          pieceBytes: options.pieceBytes ?? 256 * 1024,
          signal: stopping.signal,
          isFinalAttempt: job.retryCount >= job.retryLimit,
          onPiece: options.onPiece,
        });
        return { outcome };
      } catch (err) {
        // pg-boss keeps the error with the job and retries it; the log gets no stack trace.
        if (!(err instanceof ParseAbortedError)) {
          console.error(`[cellsmith] parsing log ${target.logId} failed:`, err);
        }
        throw err;
      }
    },
  );

  return {
    async enqueueParse(target) {
      await boss.send(PARSE_LOG_QUEUE, target, { ...sendOptions, id: target.logId });
      // Wakes the idle worker now instead of at its next poll.
      boss.notifyWorker(workerId);
    },
    async stop() {
      stopping.abort();
      await boss.stop({ graceful: true, timeout: 5_000 });
    },
  };
}
