import type PgBoss from 'pg-boss';
import type { Database } from '../db';
import { listUnfinishedLogs } from '../repositories/logs.repository';
import { failUnfinishedLog } from '../services/log-parse.service';
import { hasRawFile } from '../services/log-storage.service';
import { PARSE_LOG_QUEUE } from './queues';

/** What the start-up sweep needs. */
export interface ResumeParsesOptions {
  /** The started queue (workers not started yet). */
  boss: PgBoss;
  /** The Drizzle client. */
  db: Database;
  /** The data folder holding the raw files. */
  dataDir: string;
  /** Options of a fresh parse job. */
  sendOptions: PgBoss.SendOptions;
}

/** What the sweep did, for the start-up log line and tests. */
export interface ResumeReport {
  /** Logs whose job was queued again (it was missing, or done with the log unfinished). */
  requeued: number;
  /** Logs whose job was left active by a stopped server and goes back to the queue. */
  orphansRetried: number;
  /** Logs marked failed because their job had used up its attempts. */
  failed: number;
}

/**
 * Runs at start-up, before the worker, so that no parse is lost to a restart: every log still
 * queued or parsing gets a job that will run. Its job (the job id is the log id) is either
 * waiting (left alone), still `active` — an orphan of the previous process, failed into a retry
 * so pg-boss's attempt count stops a file that crashes the server every time — failed for good
 * (the log is marked failed), or missing (queued again). Logs whose raw file is not in this
 * server's data folder are another server's (tests share a database) and are left alone.
 */
export async function resumeUnfinishedParses(options: ResumeParsesOptions): Promise<ResumeReport> {
  const { boss, db, dataDir, sendOptions } = options;
  const report: ResumeReport = { requeued: 0, orphansRetried: 0, failed: 0 };
  for (const log of await listUnfinishedLogs(db)) {
    if (!(await hasRawFile(dataDir, log.rawPath))) continue;
    const target = { shopId: log.shopId, logId: log.id };
    let job = await boss.getJobById(PARSE_LOG_QUEUE, log.id, { includeArchive: true });
    if (job?.state === 'created' || job?.state === 'retry') continue;
    if (job?.state === 'active') {
      await boss.fail(PARSE_LOG_QUEUE, log.id, { message: 'the server stopped during parsing' });
      job = await boss.getJobById(PARSE_LOG_QUEUE, log.id);
      if (job?.state === 'retry') {
        report.orphansRetried++;
        continue;
      }
    }
    if (job?.state === 'failed' || job?.state === 'cancelled') {
      await failUnfinishedLog(
        db,
        target,
        'Parsing was cut short too many times (the server stopped during each attempt)',
      );
      report.failed++;
      continue;
    }
    // No job (never queued, or long archived) or one completed with the log unfinished.
    if (job) await boss.deleteJob(PARSE_LOG_QUEUE, log.id);
    await boss.send(PARSE_LOG_QUEUE, target, { ...sendOptions, id: log.id });
    report.requeued++;
  }
  if (report.requeued + report.orphansRetried + report.failed > 0) {
    console.log(
      `[cellsmith] unfinished log parses: ${report.requeued} queued again, ` +
        `${report.orphansRetried} resumed after a stop, ${report.failed} given up`,
    );
  }
  return report;
}
