import type { z } from 'zod';
import { analysisResourceSchema } from '../../shared/contracts/analyses';
import { sessionResponseSchema } from '../../shared/contracts/auth';
import {
  logSchema,
  logSeriesSchema,
  mappingPresetSchema,
  uploadLogResponseSchema,
} from '../../shared/contracts/logs';
import {
  revisionComparisonSchema,
  revisionSchema,
  revisionSummarySchema,
  veTableSchema,
} from '../../shared/contracts/tables';
import { vehicleSchema } from '../../shared/contracts/vehicles';
import { signedIn, type ApiClient } from './support/api-client';
import { createTable, createVehicle } from './support/test-data';
import { postLog, simulatedCsv, waitForLog } from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

/**
 * Every resource the client reads is a zod contract in shared/contracts, used by server and
 * client alike. Here real answers of the server are parsed by them, strictly at the top level: a
 * field the server adds or drops without the contract fails here, not in a browser.
 */
function strictly<S extends z.ZodObject>(schema: S, body: unknown): z.infer<S> {
  return schema.strict().parse(body) as z.infer<S>;
}

describe('the shared contracts against real answers', () => {
  let t: TestApp;
  let shop: TestShop;
  let tuner: ApiClient;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'contracts');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
  });
  afterAll(() => t.close());

  it('When the tuner walks a vehicle, its table, a log and an analysis, then every answer parses', async () => {
    strictly(sessionResponseSchema, (await tuner.get('/api/auth/me')).body);

    const vehicle = await createVehicle(tuner);
    strictly(vehicleSchema, (await tuner.get(`/api/vehicles/${vehicle.id}`)).body);

    const table = await createTable(tuner, vehicle.id, {
      rpmAxis: [1000, 2000, 4000, 7000],
      mapAxisKpa: [30, 60, 100, 200],
      values: [
        [40, 45, 50, 48],
        [55, 62, 70, 68],
        [70, 80, 88, 85],
        [75, 85, 92, 88],
      ],
    });
    strictly(veTableSchema, (await tuner.get(`/api/tables/${table.id}`)).body);
    const listed = (await tuner.get(`/api/tables/${table.id}/revisions`)).body;
    expect(listed.total).toBe(1);
    for (const item of listed.items) strictly(revisionSummarySchema, item);
    strictly(revisionSchema, (await tuner.get(`/api/revisions/${table.headRevisionId}`)).body);

    const mapping = {
      channels: {
        time: { column: 'time_s' },
        rpm: { column: 'engine_rpm' },
        map: { column: 'map_kpa' },
        lambda: { column: 'lambda_measured' },
        lambdaTarget: { column: 'lambda_target' },
      },
    };
    const upload = await postLog(tuner, vehicle.id, simulatedCsv('snake', 91, 60), { mapping });
    expect(upload.status).toBe(202);
    const accepted = strictly(uploadLogResponseSchema, upload.body);
    await waitForLog(tuner, accepted.id, ['ready', 'failed'], 60_000);
    const log = strictly(logSchema, (await tuner.get(`/api/logs/${accepted.id}`)).body);
    expect(log.status).toBe('ready');
    strictly(logSeriesSchema, (await tuner.get(`/api/logs/${log.id}/series?points=200`)).body);
    const presets = (await tuner.get('/api/mapping-presets')).body;
    expect(presets.items.length).toBeGreaterThan(0);
    for (const preset of presets.items) strictly(mappingPresetSchema, preset);

    const created = await tuner.post(`/api/tables/${table.id}/analyses`, {
      baseRevisionId: table.headRevisionId,
      logIds: [log.id],
    });
    expect(created.status).toBe(201);
    const analysis = strictly(analysisResourceSchema, created.body);
    strictly(analysisResourceSchema, (await tuner.get(`/api/analyses/${analysis.id}`)).body);

    const applied = await tuner.post(`/api/analyses/${analysis.id}/apply`, {});
    expect(applied.status).toBe(201);
    const revision = strictly(revisionSchema, applied.body);
    const compared = await tuner.get(
      `/api/revisions/compare?a=${table.headRevisionId}&b=${revision.id}`,
    );
    strictly(revisionComparisonSchema, compared.body);
  });
});
