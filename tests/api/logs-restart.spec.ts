import { mkdtempSync, rmSync } from 'node:fs';
import { tmpdir } from 'node:os';
import { join } from 'node:path';
import { eq, sql, type SQL } from 'drizzle-orm';
import { logChannels } from '../../db/schema';
import { PARSE_LOG_QUEUE } from '../../server/jobs/queues';
import { parseCsvText } from '../../shared/import';
import { signedIn } from './support/api-client';
import { newJobsSchema, startTestApp, type TestApp } from './support/test-app';
import {
  insertTestVehicle,
  postLog,
  simulatedCsv,
  TEST_STOICH_AFR,
  waitForLog,
} from './support/test-logs';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

/** A parse hook that holds every parse once a fifth of the file is read, until the app stops. */
function holdMidway(): {
  onPiece: (id: string, f: number, s: AbortSignal) => Promise<void> | void;
  reached: Promise<void>;
} {
  let signalReached: () => void = () => undefined;
  const reached = new Promise<void>((resolve) => (signalReached = resolve));
  const onPiece = (_logId: string, fraction: number, signal: AbortSignal) => {
    if (fraction < 0.2) return;
    signalReached();
    return new Promise<void>((resolve) => {
      if (signal.aborted) resolve();
      else signal.addEventListener('abort', () => resolve(), { once: true });
    });
  };
  return { onPiece, reached };
}

/** What to do to the stored state between the two server runs. */
type Between = (first: TestApp, logId: string) => Promise<void>;

async function setJob(app: TestApp, logId: string, change: SQL): Promise<void> {
  await app.db.execute(
    sql`UPDATE ${sql.identifier(app.jobsSchema)}.job SET ${change}
        WHERE name = ${PARSE_LOG_QUEUE} AND id = ${logId}`,
  );
}

describe('log parsing across a server restart', () => {
  let shop: TestShop;
  let dataDir: string;
  let jobsSchema: string;
  let second: TestApp | null = null;

  beforeEach(() => {
    dataDir = mkdtempSync(join(tmpdir(), 'cellsmith-restart-'));
    jobsSchema = newJobsSchema();
  });
  afterEach(async () => {
    if (second) {
      await second.jobs.stop();
      await second.db.execute(sql`DROP SCHEMA IF EXISTS ${sql.identifier(jobsSchema)} CASCADE`);
      await second.close();
      second = null;
    }
    rmSync(dataDir, { recursive: true, force: true });
  });

  /** Uploads in a first app that holds the parse mid-way, stops it, then starts a second one. */
  async function restartDuringParse(seed: number, between: Between) {
    const shared = { dataDir, jobsSchema };
    const hold = holdMidway();
    const first = await startTestApp(
      {},
      { shared, jobs: { pieceBytes: 1024, onPiece: hold.onPiece } },
    );
    shop ??= await createTestShop(first.db, 'logs-restart');
    const vehicleId = await insertTestVehicle(first.db, shop.id);
    const text = simulatedCsv('bracketed', seed);
    const tuner = await signedIn(first.app, shop.emails.tuner, TEST_PASSWORD);
    const res = await postLog(tuner, vehicleId, text);
    expect(res.status).toBe(202);
    await hold.reached;
    const midway = await waitForLog(tuner, res.body.id, ['parsing']);
    const stored = await first.db
      .select()
      .from(logChannels)
      .where(eq(logChannels.logId, midway.id));
    expect(stored).toEqual([]);
    await first.jobs.stop();
    await between(first, res.body.id);
    await first.close();

    second = await startTestApp({}, { shared });
    const again = await signedIn(second.app, shop.emails.tuner, TEST_PASSWORD);
    const log = await waitForLog(again, res.body.id);
    return { log, midway, expected: parseCsvText(text, undefined, { stoichAfr: TEST_STOICH_AFR }) };
  }

  it('When the server stops during a parse, then the next start parses the log to ready', async () => {
    const { log, midway, expected } = await restartDuringParse(70, async () => undefined);
    expect(midway.progress).toBeGreaterThan(0);
    expect(midway.progress).toBeLessThan(1);
    expect(log).toMatchObject({ status: 'ready', sampleCount: expected.log.length, error: null });
  });

  it('When the server died during a parse (its job left active), then the next start parses it', async () => {
    const { log, expected } = await restartDuringParse(71, (first, logId) =>
      setJob(first, logId, sql`state = 'active', started_on = now()`),
    );
    expect(log).toMatchObject({ status: 'ready', sampleCount: expected.log.length });
  });

  it('When the parse job was lost, then the next start queues it again', async () => {
    const { log, expected } = await restartDuringParse(72, async (first, logId) => {
      await first.db.execute(
        sql`DELETE FROM ${sql.identifier(first.jobsSchema)}.job WHERE id = ${logId}`,
      );
    });
    expect(log).toMatchObject({ status: 'ready', sampleCount: expected.log.length });
  });

  it('When the parse was cut short on every attempt, then the log fails instead of looping', async () => {
    const { log } = await restartDuringParse(73, (first, logId) =>
      setJob(first, logId, sql`state = 'active', started_on = now(), retry_count = retry_limit`),
    );
    expect(log.status).toBe('failed');
    expect(log.error?.code).toBe('internal');
  });
});
