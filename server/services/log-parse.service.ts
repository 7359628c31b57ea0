import {
  MAX_REPORTED_PROBLEMS,
  type LogError,
  type ParseReport,
} from '../../shared/contracts/logs';
import {
  createCsvImporter,
  isImportError,
  summarizeChannels,
  type CsvImportResult,
} from '../../shared/import';
import type { Database } from '../db';
import {
  findLogToParse,
  replaceLogChannels,
  updateLogState,
  type LogToParse,
  type StoredChannel,
} from '../repositories/logs.repository';
import { CHANNEL_ENCODING, encodeChannel } from './channel-codec';
import { openRawText } from './log-storage.service';

/** Which log to parse: the job's data. */
export interface ParseTarget {
  /** The shop the log belongs to. */
  readonly shopId: string;
  /** The log. */
  readonly logId: string;
}

/** Options of {@link parseStoredLog}. */
export interface ParseStoredLogOptions {
  /** Compressed bytes read from disk at a time. */
  readonly pieceBytes: number;
  /** Aborts the parse at the next piece (the server is stopping); nothing is stored then. */
  readonly signal: AbortSignal;
  /** Whether no retry follows: an unexpected error then marks the log failed. */
  readonly isFinalAttempt: boolean;
  /** Called after each piece with the share read; a test can hold the parse mid-way here. */
  readonly onPiece?: (logId: string, fraction: number, signal: AbortSignal) => Promise<void> | void;
}

/** What became of a parse job. */
export type ParseOutcome = 'ready' | 'failed' | 'skipped';

/** Thrown when a parse stops because the server is stopping; the job is retried later. */
export class ParseAbortedError extends Error {
  constructor() {
    super('parsing stopped: the server is stopping');
    this.name = 'ParseAbortedError';
  }
}

/** Progress is written to the database at most once per this share of the file. */
const PROGRESS_STEP = 0.05;

/** Above this share of dropped rows a file is refused as mostly bad (the importer's default). */
const MOSTLY_BAD_FRACTION = 0.5;

/** Streams a log's raw file through the shared importer, writing progress every few %. */
async function importRawFile(
  db: Database,
  dataDir: string,
  target: ParseTarget,
  log: LogToParse,
  options: ParseStoredLogOptions,
): Promise<CsvImportResult> {
  const { shopId, logId } = target;
  const importer = createCsvImporter(log.mapping, {
    stoichAfr: log.stoichAfr,
    maxProblems: MAX_REPORTED_PROBLEMS,
    mostlyBadFraction: MOSTLY_BAD_FRACTION,
  });
  const reader = await openRawText(dataDir, log.rawPath, options.pieceBytes);
  let written = 0;
  try {
    for await (const piece of reader.pieces) {
      importer.push(piece);
      const fraction = reader.fraction();
      await options.onPiece?.(logId, fraction, options.signal);
      if (options.signal.aborted) throw new ParseAbortedError();
      if (fraction - written >= PROGRESS_STEP) {
        written = fraction;
        // Capped below 1: the log is not ready until its channels are stored.
        const progress = Math.min(0.99, fraction);
        await updateLogState(db, shopId, logId, ['parsing'], { progress });
      }
    }
  } finally {
    reader.close();
  }
  return importer.finish();
}

async function markFailed(
  db: Database,
  target: ParseTarget,
  error: LogError,
  parseReport?: ParseReport,
): Promise<void> {
  await updateLogState(db, target.shopId, target.logId, ['queued', 'parsing'], {
    status: 'failed',
    error,
    ...(parseReport && { parseReport }),
  });
}

/** Marks an unfinished log failed (its parse job gave up); for the start-up sweep. */
export function failUnfinishedLog(db: Database, target: ParseTarget, message: string) {
  return markFailed(db, target, { code: 'internal', message });
}

/**
 * Parses a stored log in the background: streams the compressed raw file through the shared
 * importer with the vehicle's stoichiometric AFR, then writes every channel (Float64,
 * little-endian, deflated) and marks the log ready in one transaction, old channel rows removed
 * first — so a parse cut short leaves no half-stored log. A file that cannot be used, or whose
 * rows are mostly bad, marks the log failed with the code, message and row/column; a few bad rows
 * (unreadable, implausible or with time going back) are dropped and counted in the parse report.
 * Runs again safely on a log already done (skipped).
 */
export async function parseStoredLog(
  deps: { db: Database; dataDir: string },
  target: ParseTarget,
  options: ParseStoredLogOptions,
): Promise<ParseOutcome> {
  const { db, dataDir } = deps;
  const { shopId, logId } = target;
  const log = await findLogToParse(db, shopId, logId);
  if (!log || log.status === 'ready' || log.status === 'failed') return 'skipped';
  await updateLogState(db, shopId, logId, ['queued', 'parsing'], {
    status: 'parsing',
    progress: 0,
    error: null,
  });

  let result: CsvImportResult;
  try {
    result = await importRawFile(db, dataDir, target, log, options);
  } catch (err) {
    if (isImportError(err)) {
      const details = { ...err.details } as Record<string, unknown>;
      await markFailed(db, target, { code: err.code, message: err.message, details });
      return 'failed';
    }
    if (!(err instanceof ParseAbortedError) && options.isFinalAttempt) {
      await markFailed(db, target, {
        code: 'internal',
        message: 'The log could not be parsed because of a fault on our side; it has been logged',
      });
    }
    throw err;
  }

  const parseReport: ParseReport = {
    mappingSource: log.parseReport.mappingSource,
    stats: result.stats,
    problems: result.problems.slice(0, MAX_REPORTED_PROBLEMS).map((p) => ({ ...p })),
  };
  if (result.stats.isMostlyBad) {
    const first = result.problems[0];
    const { rowsRead, rowsKept } = result.stats;
    await markFailed(
      db,
      target,
      {
        code: 'mostly_bad',
        message:
          `Most rows could not be used: ${rowsRead - rowsKept} of ${rowsRead} dropped as ` +
          'unreadable, implausible or out of time order',
        details: { rowsRead, rowsKept, row: first?.row, column: first?.column },
      },
      parseReport,
    );
    return 'failed';
  }

  const { log: samples } = result;
  const entries = Object.entries(samples.channels) as [string, Float64Array][];
  const channels: StoredChannel[] = await Promise.all(
    entries.map(async ([channel, values]) => ({
      channel,
      encoding: CHANNEL_ENCODING,
      sampleCount: values.length,
      data: await encodeChannel(values),
    })),
  );
  const time = samples.channels.time;
  const durationS = time && time.length > 0 ? (time[time.length - 1] as number) - time[0] : 0;
  const isStored = await db.transaction(async (tx) => {
    const isParsing = await updateLogState(tx, shopId, logId, ['parsing'], {
      status: 'ready',
      progress: 1,
      sampleCount: samples.length,
      durationS,
      channelSummary: summarizeChannels(samples, ['rpm', 'map']),
      parseReport,
    });
    // Another run finished or failed this log meanwhile: keep what it stored.
    if (isParsing) await replaceLogChannels(tx, shopId, logId, channels);
    return isParsing;
  });
  return isStored ? 'ready' : 'skipped';
}
