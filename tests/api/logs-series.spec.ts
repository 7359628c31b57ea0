import { randomUUID } from 'node:crypto';
import type { LogResource, LogSeries } from '../../shared/contracts/logs';
import { csvText, DEMO_HATCH, ecuVeTable, simulateSamples } from '../../shared/sim';
import { insertLog } from '../../server/repositories/logs.repository';
import { signedIn, ApiClient } from './support/api-client';
import { createTable, createVehicle } from './support/test-data';
import { postLog, waitForLog } from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

const vehicleFacts = {
  engine: {
    displacementL: DEMO_HATCH.engine.displacementL,
    cylinders: DEMO_HATCH.engine.cylinders,
    fuel: 'gasoline' as const,
    injectorCcMin: DEMO_HATCH.engine.injectorCcMin,
  },
  gearing: {
    tireDiameterMm: DEMO_HATCH.gearing.tireDiameterMm,
    gearRatios: [...DEMO_HATCH.gearing.gearRatios],
    finalDrive: DEMO_HATCH.gearing.finalDrive,
  },
};

/** A simulated 3-minute road drive (20 Hz: 3600 samples) in the snake style. */
function roadCsv(seed: number, dropColumns: readonly string[] = []): string {
  const text = csvText(
    simulateSamples({ vehicle: DEMO_HATCH, kind: 'road', seed, durationS: 180, startEctC: 80 }),
    'snake',
    { stoichAfr: DEMO_HATCH.engine.stoichAfr },
  );
  if (dropColumns.length === 0) return text;
  const lines = text.trimEnd().split('\n');
  const header = (lines[0] as string).split(',');
  const keep = header.map((name) => !dropColumns.includes(name));
  return (
    lines
      .map((line) =>
        line
          .split(',')
          .filter((_, i) => keep[i])
          .join(','),
      )
      .join('\n') + '\n'
  );
}

/** The highest non-null value of a list. */
function highest(values: (number | null)[]): number {
  return Math.max(...values.filter((v): v is number => v !== null));
}

describe('GET /api/logs/:id/series', () => {
  let t: TestApp;
  let shop: TestShop;
  let other: TestShop;
  let tuner: ApiClient;
  let tableId: string;
  let headRevisionId: string;
  let withRevision: LogResource;
  let withoutRevision: LogResource;
  let noTable: LogResource;
  let noThrottle: LogResource;

  async function upload(vehicleId: string, text: string, ecuRevisionId?: string) {
    const res = await postLog(tuner, vehicleId, text, { kind: 'road', ecuRevisionId });
    expect(res.status).toBe(202);
    const log = await waitForLog(tuner, res.body.id as string, ['ready', 'failed'], 60_000);
    expect(log.status).toBe('ready');
    return log;
  }

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'logs-series');
    other = await createTestShop(t.db, 'logs-series-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    const ecu = ecuVeTable(DEMO_HATCH);
    const vehicle = await createVehicle(tuner, { label: 'Series hatch', ...vehicleFacts });
    const table = await createTable(tuner, vehicle.id, {
      rpmAxis: [...ecu.rpmAxis],
      mapAxisKpa: [...ecu.mapAxisKpa],
      values: ecu.values.map((row) => [...row]),
    });
    tableId = table.id;
    headRevisionId = table.headRevisionId;
    const bare = await createVehicle(tuner, { label: 'Series car without table', ...vehicleFacts });
    withRevision = await upload(vehicle.id, roadCsv(61), headRevisionId);
    withoutRevision = await upload(vehicle.id, roadCsv(62));
    noThrottle = await upload(vehicle.id, roadCsv(63, ['throttle_pct']));
    noTable = await upload(bare.id, roadCsv(64));
  }, 180_000);
  afterAll(() => t.close());

  it('When a tuner asks with no query, then 1500 buckets of the whole log with envelopes and the filter', async () => {
    const res = await tuner.get(`/api/logs/${withRevision.id}/series`);
    expect(res.status).toBe(200);
    const series = res.body as LogSeries;
    expect(series.timeS).toHaveLength(1500);
    expect(series.isExact).toBe(false);
    expect(series.sampleCount).toBe(withRevision.sampleCount);
    const summary = withRevision.channelSummary ?? {};
    expect(series.rangeS[1] - series.rangeS[0]).toBeCloseTo(withRevision.durationS as number, 6);
    // The envelope keeps the extremes however far the log is zoomed out.
    expect(highest(series.channels.rpm.max)).toBeCloseTo(summary.rpm?.max as number, 1);
    expect(highest(series.channels.mapKpa.max)).toBeCloseTo(summary.map?.max as number, 2);
    expect(series.channels.throttlePct?.mean).toHaveLength(1500);
    for (const [k, mean] of series.channels.lambda.mean.entries()) {
      if (mean === null) continue;
      expect(series.channels.lambda.min[k] as number).toBeLessThanOrEqual(mean);
      expect(series.channels.lambda.max[k] as number).toBeGreaterThanOrEqual(mean);
    }
    expect(series.kept?.every((k) => k === null || (k >= 0 && k <= 1))).toBe(true);
    expect(series.revisionId).toBe(headRevisionId);
    expect(series.funnel?.map((line) => line.rule)).toEqual([
      'warmUp',
      'fuelCut',
      'tipIn',
      'rpmRate',
      'mapRate',
      'lambdaRange',
    ]);
  });

  it.each([
    ['its ECU revision', () => withRevision],
    ['no ECU revision (the first table’s head)', () => withoutRevision],
  ])(
    'When the log has %s, then funnel, delay and kept samples equal an analysis with no settings',
    async (_name, log) => {
      const analysis = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId: headRevisionId,
        logIds: [log().id],
      });
      expect(analysis.status).toBe(201);
      const report = analysis.body.filterReport.logs[0];
      // 3600 samples fit in 5000 buckets: one sample each, kept 0 or 1.
      const res = await tuner.get(`/api/logs/${log().id}/series?points=5000`);
      const series = res.body as LogSeries;
      expect(series.isExact).toBe(true);
      expect(series.funnel).toEqual(report.funnel);
      expect(series.delayUsed).toEqual(report.delayUsed);
      expect(series.revisionId).toBe(headRevisionId);
      const keptSamples = (series.kept ?? []).reduce<number>((n, k) => n + (k ?? 0), 0);
      expect(keptSamples).toBe(report.kept);
    },
  );

  it('When a window is asked for, then it is re-bucketed from the samples inside it', async () => {
    const full = (await tuner.get(`/api/logs/${withRevision.id}/series?points=5000`))
      .body as LogSeries;
    const fromS = full.rangeS[0] + 40;
    const toS = full.rangeS[0] + 70;
    const res = await tuner.get(
      `/api/logs/${withRevision.id}/series?points=100&fromS=${fromS}&toS=${toS}`,
    );
    expect(res.status).toBe(200);
    const zoomed = res.body as LogSeries;
    expect(zoomed.rangeS).toEqual([fromS, toS]);
    expect(zoomed.timeS).toHaveLength(100);
    // The same buckets worked out from the exact samples: width (toS − fromS) / 100.
    const widthS = (toS - fromS) / 100;
    const maxRpm: number[] = Array.from({ length: 100 }, () => -Infinity);
    let inside = 0;
    full.timeS.forEach((time, i) => {
      if (time < fromS || time > toS) return;
      inside++;
      const k = Math.min(99, Math.floor((time - fromS) / widthS));
      maxRpm[k] = Math.max(maxRpm[k] as number, full.channels.rpm.max[i] as number);
    });
    expect(zoomed.sampleCount).toBe(inside);
    expect(zoomed.channels.rpm.max).toEqual(maxRpm.map((v) => (v === -Infinity ? null : v)));
    expect(zoomed.timeS[0]).toBeCloseTo(fromS + widthS / 2, 4);
  });

  it('When the vehicle has no table, then the channels come without kept, funnel or delay', async () => {
    const res = await tuner.get(`/api/logs/${noTable.id}/series?points=200`);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ kept: null, funnel: null, delayUsed: null, revisionId: null });
    expect((res.body as LogSeries).channels.rpm.mean).toHaveLength(200);
  });

  it('When the log has no throttle channel, then throttlePct is null and the tip-in rule skipped', async () => {
    const series = (await tuner.get(`/api/logs/${noThrottle.id}/series`)).body as LogSeries;
    expect(series.channels.throttlePct).toBeNull();
    expect(series.funnel?.find((line) => line.rule === 'tipIn')?.status).toBe('skipped');
  });

  it('When an operator or a reviewer asks, then 200; when nobody is signed in, then 401', async () => {
    for (const email of [shop.emails.operator, shop.emails.reviewer]) {
      const client = await signedIn(t.app, email, TEST_PASSWORD);
      expect((await client.get(`/api/logs/${withRevision.id}/series`)).status).toBe(200);
    }
    const anonymous = await new ApiClient(t.app).prime();
    expect((await anonymous.get(`/api/logs/${withRevision.id}/series`)).status).toBe(401);
  });

  it.each([
    ['points=50', 'query.points', 'at least 100'],
    ['points=6000', 'query.points', 'at most 5000'],
    ['points=many', 'query.points', 'whole number'],
    ['fromS=soon', 'query.fromS', 'number of seconds'],
    ['fromS=20&toS=10', 'query.toS', 'later than fromS'],
    ['fromS=100000', 'query.fromS', 'outside the log'],
    ['toS=-5', 'query.toS', 'outside the log'],
  ])('When the query is %s, then 400 naming %s', async (query, path, message) => {
    const res = await tuner.get(`/api/logs/${withRevision.id}/series?${query}`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    expect(res.body.error.details.issues[0].path).toBe(path);
    expect(res.body.error.details.issues[0].message).toContain(message);
  });

  it('When the id is not a UUID, then 400 params.id', async () => {
    const res = await tuner.get('/api/logs/not-a-log/series');
    expect(res.status).toBe(400);
    expect(res.body.error.details.issues[0].path).toBe('params.id');
  });

  it('When the log is another shop’s or does not exist, then 404', async () => {
    const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
    expect((await stranger.get(`/api/logs/${withRevision.id}/series`)).status).toBe(404);
    expect((await tuner.get(`/api/logs/${randomUUID()}/series`)).status).toBe(404);
  });

  it('When the log is not parsed yet, then 409 with its status', async () => {
    const queued = await insertLog(t.db, shop.id, {
      id: randomUUID(),
      vehicleId: withRevision.vehicleId,
      fileName: 'waiting.csv',
      sizeBytes: 10,
      sha256: randomUUID().replace(/-/g, ''),
      kind: 'road',
      ecuRevisionId: null,
      mapping: { channels: {} },
      parseReport: { mappingSource: 'suggested' },
      rawPath: 'nowhere.csv.gz',
      uploadedBy: shop.userIds[shop.emails.tuner] as string,
    });
    const res = await tuner.get(`/api/logs/${queued?.id}/series`);
    expect(res.status).toBe(409);
    expect(res.body.error.details).toMatchObject({ status: 'queued' });
  });
});
