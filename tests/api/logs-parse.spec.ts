import { eq } from 'drizzle-orm';
import request from 'supertest';
import { logChannels } from '../../db/schema';
import type { LogResource } from '../../shared/contracts/logs';
import { type ApiClient, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { createTable } from './support/test-data';
import { csvText, DEMO_HATCH, simulateSamples } from '../../shared/sim';
import {
  insertTestVehicle,
  postLog,
  simulatedCsv,
  TEST_STOICH_AFR,
  waitForLog,
} from './support/test-logs';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

/** The snake style's mapping, given explicitly so damaged rows never sway a suggestion. */
const SNAKE_MAPPING = {
  channels: {
    time: { column: 'time_s', unit: 's' },
    rpm: { column: 'engine_rpm' },
    map: { column: 'map_kpa', unit: 'kPa' },
    lambda: { column: 'lambda_measured', unit: 'lambda' },
    lambdaTarget: { column: 'lambda_target', unit: 'lambda' },
    iat: { column: 'iat_c', unit: 'C' },
  },
};

/** `text` with the RPM cell of the data rows for which `isBad(index)` holds replaced by junk. */
function damageRpm(text: string, isBad: (dataIndex: number) => boolean): string {
  const lines = text.split('\n');
  return lines
    .map((line, i) => {
      if (i === 0 || line === '' || !isBad(i - 1)) return line;
      const cells = line.split(',');
      cells[1] = 'n/a';
      return cells.join(',');
    })
    .join('\n');
}

/** `text` with the cells of data rows set: each change is [data row index, cell index, text]. */
function setCells(text: string, changes: readonly [number, number, string][]): string {
  const lines = text.split('\n');
  for (const [dataIndex, cell, value] of changes) {
    const cells = (lines[dataIndex + 1] as string).split(',');
    cells[cell] = value;
    lines[dataIndex + 1] = cells.join(',');
  }
  return lines.join('\n');
}

describe('log parsing and reads', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let tuner: ApiClient;
  let reviewer: ApiClient;
  let vehicleId: string;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'logs-parse');
    otherShop = await createTestShop(t.db, 'logs-parse-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
    vehicleId = await insertTestVehicle(t.db, shop.id);
  });
  afterAll(() => t.close());

  describe('background parse', () => {
    it('When a few rows are bad, then they are dropped and reported with row and column', async () => {
      const bad = new Set([100, 250, 251]);
      const text = damageRpm(simulatedCsv('snake', 50), (i) => bad.has(i));
      const res = await postLog(tuner, vehicleId, text, { mapping: SNAKE_MAPPING });
      expect(res.status).toBe(202);
      const log = await waitForLog(tuner, res.body.id);
      expect(log.status).toBe('ready');
      const rows = text.split('\n').filter((l) => l !== '').length - 1;
      expect(log.sampleCount).toBe(rows - 3);
      expect(log.parseReport?.stats).toMatchObject({
        rowsRead: rows,
        rowsKept: rows - 3,
        rowsDroppedUnreadable: 3,
        problemCount: 3,
        isMostlyBad: false,
      });
      // Lines count from 0 with the header on line 0: data row i is line i + 1.
      expect(log.parseReport?.problems).toEqual(
        [101, 251, 252].map((row) => ({
          row,
          column: 'engine_rpm',
          channel: 'rpm',
          message: 'not a number: "n/a"',
        })),
      );
    });

    it('When rows hold implausible values, then the log is ready without them and they are listed', async () => {
      // RPM 99 999 999 on data row 40, MAP 1e30 kPa on data row 90 (columns 1 and 2 of snake).
      const text = setCells(simulatedCsv('snake', 57), [
        [40, 1, '99999999'],
        [90, 2, '1e30'],
      ]);
      const res = await postLog(tuner, vehicleId, text, { mapping: SNAKE_MAPPING });
      expect(res.status).toBe(202);
      const log = await waitForLog(tuner, res.body.id);
      expect(log.status).toBe('ready');
      const rows = text.split('\n').filter((l) => l !== '').length - 1;
      expect(log.sampleCount).toBe(rows - 2);
      expect(log.parseReport?.stats).toMatchObject({
        rowsRead: rows,
        rowsKept: rows - 2,
        rowsDroppedUnreadable: 0,
        rowsDroppedImplausible: 2,
        problemCount: 2,
        isMostlyBad: false,
      });
      // Lines count from 0 with the header on line 0: data row i is line i + 1.
      expect(log.parseReport?.problems).toEqual([
        {
          row: 41,
          column: 'engine_rpm',
          channel: 'rpm',
          message: 'rpm 99999999 is outside the plausible range 0 to 25000 rpm',
        },
        {
          row: 91,
          column: 'map_kpa',
          channel: 'map',
          message: 'map 1e+30 is outside the plausible range 0 to 1000 kPa',
        },
      ]);
      // What the charts and the analysis read stays physical.
      expect(log.channelSummary?.rpm?.max).toBeLessThan(10_000);
      expect(log.channelSummary?.map?.max).toBeLessThan(300);
    });

    it('When most rows are bad, then the log fails with the code, counts and first row/column', async () => {
      const text = damageRpm(simulatedCsv('snake', 51), (i) => i >= 30 && i % 5 !== 0);
      const res = await postLog(tuner, vehicleId, text, { mapping: SNAKE_MAPPING });
      expect(res.status).toBe(202);
      const log = await waitForLog(tuner, res.body.id);
      expect(log.status).toBe('failed');
      // The first damaged row is data row 31 (30 is spared as a multiple of 5): line 32.
      expect(log.error).toMatchObject({
        code: 'mostly_bad',
        details: { row: 32, column: 'engine_rpm' },
      });
      expect(log.sampleCount).toBeNull();
      expect(log.parseReport?.problems).toHaveLength(50);
      expect(log.parseReport?.stats?.problemCount).toBeGreaterThan(50);
      const stored = await t.db.select().from(logChannels).where(eq(logChannels.logId, log.id));
      expect(stored).toEqual([]);
    });

    it('When no row at all can be read, then the log fails with no_usable_rows and a location', async () => {
      const text = damageRpm(simulatedCsv('snake', 52, 10), () => true);
      const res = await postLog(tuner, vehicleId, text, { mapping: SNAKE_MAPPING });
      expect(res.status).toBe(202);
      const log = await waitForLog(tuner, res.body.id);
      expect(log).toMatchObject({
        status: 'failed',
        error: { code: 'no_usable_rows', details: { row: 1, column: 'engine_rpm' } },
      });
    });

    it('When gauge boost comes without a barometer column, then 422 missing baro', async () => {
      const text = [
        'time_s,engine_rpm,boost_psi,lambda_measured,lambda_target',
        ...Array.from({ length: 30 }, (_, i) => `${i * 0.05},${3000 + i},5.0,0.85,0.82`),
      ].join('\n');
      const res = await postLog(tuner, vehicleId, text);
      expect(res.status).toBe(422);
      expect(res.body.error.details.missing).toEqual(['baro']);
    });
  });

  describe('GET /api/logs/:id', () => {
    it('When a reviewer reads a log of their shop, then the log with its mapping and figures', async () => {
      const res = await postLog(tuner, vehicleId, simulatedCsv('unitsrow', 53));
      await waitForLog(tuner, res.body.id);
      const read = await reviewer.get(`/api/logs/${res.body.id}`);
      expect(read.status).toBe(200);
      const log = read.body as LogResource;
      expect(Object.keys(log).sort()).toEqual(
        [
          'beyondTables',
          'channelSummary',
          'createdAt',
          'durationS',
          'ecuRevisionId',
          'error',
          'fileName',
          'id',
          'kind',
          'mapping',
          'parseReport',
          'progress',
          'sampleCount',
          'sizeBytes',
          'status',
          'updatedAt',
          'vehicleId',
        ].sort(),
      );
      expect(log.mapping).toMatchObject({ headerRow: 0, unitsRow: 1, delimiter: '\t' });
      expect(log.channelSummary?.lambdaTarget?.min).toBeGreaterThan(0.6);
    });

    it('When the log belongs to another shop, then 404; a malformed id 400; signed out 401', async () => {
      const res = await postLog(tuner, vehicleId, simulatedCsv('snake', 54));
      const other = await signedIn(t.app, otherShop.emails.tuner, TEST_PASSWORD);
      const foreign = await other.get(`/api/logs/${res.body.id}`);
      expect(foreign.status).toBe(404);
      expect(foreign.body.error.code).toBe('not_found');
      expect((await tuner.get('/api/logs/123')).status).toBe(400);
      expect((await request(t.app).get(`/api/logs/${res.body.id}`)).status).toBe(401);
    });
  });

  describe('GET /api/vehicles/:id/logs', () => {
    it('When an operator lists a vehicle’s logs, then newest first with a total', async () => {
      const car = await insertTestVehicle(t.db, shop.id, 'Listed car');
      const first = await postLog(tuner, car, simulatedCsv('snake', 55));
      const second = await postLog(tuner, car, simulatedCsv('snake', 56));
      const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      const res = await operator.get(`/api/vehicles/${car}/logs`);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(2);
      expect(res.body.items.map((l: LogResource) => l.id)).toEqual([second.body.id, first.body.id]);
    });

    it('When the vehicle belongs to another shop, then 404', async () => {
      const otherVehicle = await insertTestVehicle(t.db, otherShop.id);
      expect((await tuner.get(`/api/vehicles/${otherVehicle}/logs`)).status).toBe(404);
    });
  });

  describe('logs beyond a table', () => {
    it('When a boost log meets a table that ends at 105 kPa, then the log says how much lies above it', async () => {
      const table = await createTable(tuner, vehicleId, {
        name: 'Ends at atmosphere',
        rpmAxis: [1000, 2000, 4000, 8000],
        mapAxisKpa: [30, 60, 90, 105],
        values: [
          [40, 45, 50, 48],
          [60, 70, 75, 72],
          [80, 90, 95, 92],
          [85, 95, 98, 95],
        ],
      });
      // Two minutes on the road: about a tenth of it in boost, 2400 samples.
      const drive = csvText(
        simulateSamples({ vehicle: DEMO_HATCH, kind: 'road', seed: 58, durationS: 120 }),
        'snake',
        { stoichAfr: TEST_STOICH_AFR },
      );
      const res = await postLog(tuner, vehicleId, drive);
      expect(res.status).toBe(202);
      await waitForLog(tuner, res.body.id as string, ['ready', 'failed'], 60_000);
      const log = (await tuner.get(`/api/logs/${res.body.id}`)).body as LogResource;
      expect(log.status).toBe('ready');
      const beyond = log.beyondTables?.find((b) => b.tableId === table.id);
      expect(beyond).toBeDefined();
      const { logMapMaxKpa, shareAboveMap, shareAboveRpm } = beyond as NonNullable<typeof beyond>;
      expect(logMapMaxKpa).toBeGreaterThan(105);
      expect(shareAboveRpm).toBe(0);
      // Recount from the samples themselves (a 2400-sample log comes back sample by sample).
      const series = (await tuner.get(`/api/logs/${res.body.id}/series?points=5000`)).body;
      expect(series.isExact).toBe(true);
      const samples = series.channels.mapKpa.mean as number[];
      const above = samples.filter((v) => v > 105).length / samples.length;
      expect(shareAboveMap).toBeGreaterThan(0.05);
      expect(Math.abs((shareAboveMap as number) - above)).toBeLessThan(0.002);
    });
  });
});
