import { randomUUID } from 'node:crypto';
import { eq } from 'drizzle-orm';
import { logs } from '../../db/schema';
import {
  analysisResourceSchema,
  type AnalysisSamples,
  type AnalysisSummary,
  type AnalysisResource,
} from '../../shared/contracts/analyses';
import { locate } from '../../shared/core/lookup';
import { csvText, DEMO_HATCH, ecuVeTable, simulateSamples, type CsvStyle } from '../../shared/sim';
import { signedIn, type ApiClient } from './support/api-client';
import { createTable, createVehicle } from './support/test-data';
import { postLog, waitForLog } from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

const vehicleFacts = {
  label: 'Samples test hatch',
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

/** The analysis fields this file reads. */
/** The analysis as the API answers it: parsed by the shared contract, so a drift fails here. */
type AnalysisBody = AnalysisResource;

/** The trusted cell with the most weight among those at least 1 % off commanded lambda. */
function wellCoveredCell(analysis: AnalysisBody) {
  const candidates = analysis.cells
    .flatMap((row, r) => row.map((cell, c) => ({ cell, r, c })))
    .filter(({ cell }) => cell.status === 'trusted' && Math.abs(cell.lambdaErrorPct ?? 0) > 1)
    .sort((a, b) => b.cell.weight - a.cell.weight);
  const best = candidates[0];
  if (!best) throw new Error('wellCoveredCell: no trusted cell at least 1 % off');
  return best;
}

/**
 * The bilinear-weighted mean lambda error of the samples around cell (r, c), and their weight:
 * the way accumulateCells (shared/accumulate) spreads each sample over the four cells around it.
 */
function cellMean(samples: AnalysisSamples, r: number, c: number) {
  const { rpmAxis, mapAxisKpa } = ecuVeTable(DEMO_HATCH);
  let sum = 0;
  let weight = 0;
  samples.rpm.forEach((rpm, s) => {
    const x = locate(rpmAxis, rpm);
    const y = locate(mapAxisKpa, samples.mapKpa[s] as number);
    const wx = x.i === c ? 1 - x.f : x.i + 1 === c ? x.f : 0;
    const wy = y.i === r ? 1 - y.f : y.i + 1 === r ? y.f : 0;
    sum += wx * wy * (samples.lambdaErrorPct[s] as number);
    weight += wx * wy;
  });
  return { mean: sum / weight, weight };
}

describe('analyses: list and samples', () => {
  let t: TestApp;
  let shop: TestShop;
  let other: TestShop;
  let tuner: ApiClient;
  let tableId: string;
  let baseRevisionId: string;
  let vehicleId: string;
  const logIds: string[] = [];
  const ecu = ecuVeTable(DEMO_HATCH);
  let first: AnalysisBody;
  let second: AnalysisBody;

  async function uploadSession(kind: 'road' | 'dyno', style: CsvStyle, seed: number) {
    const text = csvText(
      simulateSamples({
        vehicle: DEMO_HATCH,
        kind,
        seed,
        durationS: kind === 'road' ? 600 : undefined,
        startEctC: 80,
      }),
      style,
      { stoichAfr: DEMO_HATCH.engine.stoichAfr, vehicleLabel: vehicleFacts.label },
    );
    const res = await postLog(tuner, vehicleId, text, { kind, ecuRevisionId: baseRevisionId });
    expect(res.status).toBe(202);
    const log = await waitForLog(tuner, res.body.id as string, ['ready', 'failed'], 60_000);
    expect(log.status).toBe('ready');
    return log.id;
  }

  async function analyse(ids: string[], settings?: object): Promise<AnalysisBody> {
    const res = await tuner.post(`/api/tables/${tableId}/analyses`, {
      baseRevisionId,
      logIds: ids,
      settings,
    });
    expect(res.status).toBe(201);
    return analysisResourceSchema.parse(res.body);
  }

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'analyses-samples');
    other = await createTestShop(t.db, 'analyses-samples-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    const vehicle = await createVehicle(tuner, vehicleFacts);
    vehicleId = vehicle.id;
    const table = await createTable(tuner, vehicle.id, {
      name: 'Main VE',
      rpmAxis: [...ecu.rpmAxis],
      mapAxisKpa: [...ecu.mapAxisKpa],
      values: ecu.values.map((row) => [...row]),
    });
    tableId = table.id;
    baseRevisionId = table.headRevisionId;
    logIds.push(await uploadSession('road', 'snake', 21));
    logIds.push(await uploadSession('dyno', 'bracketed', 22));
    first = await analyse(logIds);
    second = await analyse([logIds[1] as string], { stepFraction: 0.3 });
  }, 180_000);
  afterAll(() => t.close());

  describe('GET /api/tables/:id/analyses', () => {
    it('When any role lists, then the analyses come newest first without their grids', async () => {
      for (const role of ['tuner', 'operator', 'reviewer'] as const) {
        const client =
          role === 'tuner' ? tuner : await signedIn(t.app, shop.emails[role], TEST_PASSWORD);
        const res = await client.get(`/api/tables/${tableId}/analyses`);
        expect(res.status).toBe(200);
        expect(res.body.total).toBe(2);
        const items = res.body.items as AnalysisSummary[];
        expect(items.map((item) => item.id)).toEqual([second.id, first.id]);
        expect(items[1]).toEqual({
          id: first.id,
          tableId,
          baseRevisionId,
          baseRevisionNumber: 1,
          logIds,
          settings: {},
          createdAt: expect.any(String),
          trustedCells: first.filterReport.cellsTrusted,
          leanFlagCount: first.leanFlags.filter((f) => f.severity !== 'watch').length,
          authorName: `tuner of ${shop.name.replace('Test shop ', '')}`,
        });
        expect(items[0]?.settings).toEqual({ stepFraction: 0.3 });
        expect(items[0]?.logIds).toEqual([logIds[1]]);
        expect(items[0]).not.toHaveProperty('cells');
        expect(items[0]).not.toHaveProperty('proposal');
      }
    });

    it('When limit and offset are given, then that page comes and total counts all', async () => {
      const res = await tuner.get(`/api/tables/${tableId}/analyses?limit=1&offset=1`);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(2);
      expect((res.body.items as AnalysisSummary[]).map((item) => item.id)).toEqual([first.id]);
    });

    it.each([
      ['limit=0', 'query.limit'],
      ['limit=101', 'query.limit'],
      ['limit=abc', 'query.limit'],
      ['offset=-1', 'query.offset'],
      ['offset=1.5', 'query.offset'],
    ])('When the query is %s, then 400 names %s', async (query, path) => {
      const res = await tuner.get(`/api/tables/${tableId}/analyses?${query}`);
      expect(res.status).toBe(400);
      expect(res.body.error.details.issues[0].path).toBe(path);
    });

    it('When the id is not a UUID, unknown or of another shop, then 400 or 404', async () => {
      expect((await tuner.get('/api/tables/nope/analyses')).status).toBe(400);
      const unknown = await tuner.get(`/api/tables/${randomUUID()}/analyses`);
      expect(unknown.status).toBe(404);
      const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
      expect((await stranger.get(`/api/tables/${tableId}/analyses`)).status).toBe(404);
    });
  });

  describe('GET /api/analyses/:id/samples', () => {
    it('When every kept sample fits, then they are the ones the analysis spread over its cells', async () => {
      const res = await tuner.get(`/api/analyses/${second.id}/samples?max=20000`);
      expect(res.status).toBe(200);
      const samples = res.body as AnalysisSamples;
      // The same steps give the same count as the accumulation reported when the analysis ran.
      expect(samples.total).toBe(second.filterReport.samplesUsed);
      expect(samples.total).toBeLessThanOrEqual(20000);
      expect(samples.returned).toBe(samples.total);
      for (const column of [
        samples.rpm,
        samples.mapKpa,
        samples.lambdaErrorPct,
        samples.logIndex,
      ]) {
        expect(column).toHaveLength(samples.returned);
      }
      expect(new Set(samples.logIndex)).toEqual(new Set([0]));
      // With every sample back, a well-covered cell's weight and mean error are reproduced.
      const { cell, r, c } = wellCoveredCell(second);
      const { mean, weight } = cellMean(samples, r, c);
      expect(weight).toBeCloseTo(cell.weight, 0);
      expect(Math.sign(mean)).toBe(Math.sign(cell.lambdaErrorPct as number));
      expect(mean).toBeCloseTo(cell.lambdaErrorPct as number, 1);
    });

    it('When the samples are thinned, then a well-covered cell keeps the sign of its lambda error', async () => {
      const res = await tuner.get(`/api/analyses/${first.id}/samples?max=5000`);
      const samples = res.body as AnalysisSamples;
      expect(samples.total).toBe(first.filterReport.samplesUsed);
      expect(samples.total).toBeGreaterThan(5000);
      expect(samples.returned).toBe(5000);
      // Log order is kept: every sample of log 0 comes before those of log 1.
      expect(new Set(samples.logIndex)).toEqual(new Set([0, 1]));
      expect(samples.logIndex.indexOf(1)).toBe(samples.logIndex.lastIndexOf(0) + 1);
      const { cell, r, c } = wellCoveredCell(first);
      const { mean } = cellMean(samples, r, c);
      expect(Math.sign(mean)).toBe(Math.sign(cell.lambdaErrorPct as number));
    });

    it('When max is small, then at most max evenly spread samples return, the same each time', async () => {
      const one = await tuner.get(`/api/analyses/${second.id}/samples?max=100`);
      const again = await tuner.get(`/api/analyses/${second.id}/samples?max=100`);
      expect(one.status).toBe(200);
      const samples = one.body as AnalysisSamples;
      expect(samples.returned).toBe(100);
      expect(samples.rpm).toHaveLength(100);
      expect(samples.total).toBe(second.filterReport.samplesUsed);
      expect(again.body).toEqual(one.body);
      // An even stride through all kept samples: sample i is kept sample ⌊i·total/100⌋.
      const all = (await tuner.get(`/api/analyses/${second.id}/samples?max=20000`))
        .body as AnalysisSamples;
      for (const i of [0, 37, 99]) {
        const at = Math.floor((i * all.total) / 100);
        expect([samples.rpm[i], samples.mapKpa[i], samples.lambdaErrorPct[i]]).toEqual([
          all.rpm[at],
          all.mapKpa[at],
          all.lambdaErrorPct[at],
        ]);
      }
    });

    it('When no max is given, then at most 4000 return, and every role may read them', async () => {
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await reviewer.get(`/api/analyses/${first.id}/samples`);
      expect(res.status).toBe(200);
      expect(res.body.returned).toBe(Math.min(4000, res.body.total as number));
    });

    it.each([['max=99'], ['max=20001'], ['max=lots'], ['max=500.5']])(
      'When the query is %s, then 400 names query.max',
      async (query) => {
        const res = await tuner.get(`/api/analyses/${first.id}/samples?${query}`);
        expect(res.status).toBe(400);
        expect(res.body.error.details.issues[0].path).toBe('query.max');
      },
    );

    it('When the id is not a UUID, unknown or of another shop, then 400 or 404', async () => {
      expect((await tuner.get('/api/analyses/nope/samples')).status).toBe(400);
      const unknown = await tuner.get(`/api/analyses/${randomUUID()}/samples`);
      expect(unknown.status).toBe(404);
      const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
      expect((await stranger.get(`/api/analyses/${first.id}/samples`)).status).toBe(404);
    });

    it('When a log of the analysis is no longer ready, then 409 names it', async () => {
      const logId = logIds[1] as string;
      await t.db.update(logs).set({ status: 'failed' }).where(eq(logs.id, logId));
      try {
        const res = await tuner.get(`/api/analyses/${second.id}/samples`);
        expect(res.status).toBe(409);
        expect(res.body.error.details).toEqual({ logId, status: 'failed' });
      } finally {
        await t.db.update(logs).set({ status: 'ready' }).where(eq(logs.id, logId));
      }
      expect((await tuner.get(`/api/analyses/${second.id}/samples`)).status).toBe(200);
    });

    it('When a log of the analysis is gone, then 409 names it', async () => {
      const logId = await uploadSession('dyno', 'unitsrow', 23);
      const analysis = await analyse([logId]);
      await t.db.delete(logs).where(eq(logs.id, logId));
      const res = await tuner.get(`/api/analyses/${analysis.id}/samples`);
      expect(res.status).toBe(409);
      expect(res.body.error.details).toEqual({ logId });
      expect(res.body.error.message).toMatch(/gone/);
    }, 90_000);
  });
});
