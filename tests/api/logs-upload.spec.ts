import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { logs, mappingPresets } from '../../db/schema';
import { loadLogChannels } from '../../server/services/logs.service';
import type { UploadLogResponse } from '../../shared/contracts/logs';
import { parseCsvText } from '../../shared/import';
import { CSV_STYLES } from '../../shared/sim';
import { ApiClient, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import {
  insertTestRevision,
  insertTestVehicle,
  postLog,
  simulatedCsv,
  TEST_STOICH_AFR,
  waitForLog,
} from './support/test-logs';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

describe('POST /api/vehicles/:id/logs', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let tuner: ApiClient;
  let vehicleId: string;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'logs-upload');
    otherShop = await createTestShop(t.db, 'logs-upload-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    vehicleId = await insertTestVehicle(t.db, shop.id);
  });
  afterAll(() => t.close());

  it.each(CSV_STYLES.map((style, i) => [style, 10 + i] as const))(
    'When a tuner uploads a %s-style CSV, then 202, it parses to ready and its channels equal the importer’s',
    async (style, seed) => {
      const text = simulatedCsv(style, seed);
      const res = await postLog(tuner, vehicleId, text, {}, `${style}.csv`);
      expect(res.status).toBe(202);
      const body = res.body as UploadLogResponse;
      expect(body).toMatchObject({ status: 'queued', mappingSource: 'suggested' });

      const log = await waitForLog(tuner, body.id);
      const expected = parseCsvText(text, undefined, { stoichAfr: TEST_STOICH_AFR });
      expect(log).toMatchObject({
        id: body.id,
        vehicleId,
        status: 'ready',
        progress: 1,
        kind: 'dyno',
        fileName: `${style}.csv`,
        sizeBytes: Buffer.byteLength(text),
        sampleCount: expected.log.length,
        error: null,
        mapping: expected.mapping,
      });
      const time = expected.log.channels.time as Float64Array;
      expect(log.durationS).toBeCloseTo((time[time.length - 1] as number) - (time[0] as number), 9);
      expect(log.parseReport?.stats?.rowsKept).toBe(expected.log.length);
      expect(log.channelSummary?.rpm?.max).toBe(Math.max(...(expected.log.channels.rpm ?? [])));

      const stored = await loadLogChannels(t.db, shop.id, body.id);
      expect(stored.length).toBe(expected.log.length);
      expect(Object.keys(stored.channels).sort()).toEqual(
        Object.keys(expected.log.channels).sort(),
      );
      for (const [channel, values] of Object.entries(expected.log.channels)) {
        expect(stored.channels[channel as keyof typeof stored.channels]).toEqual(values);
      }
    },
  );

  it('When an operator uploads with kind road and the vehicle’s revision, then both are kept', async () => {
    const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
    const revisionId = await insertTestRevision(
      t.db,
      shop.id,
      vehicleId,
      shop.userIds[shop.emails.tuner] as string,
    );
    const res = await postLog(operator, vehicleId, simulatedCsv('snake', 21), {
      kind: 'road',
      ecuRevisionId: revisionId,
    });
    expect(res.status).toBe(202);
    const log = await waitForLog(operator, res.body.id);
    expect(log).toMatchObject({ kind: 'road', ecuRevisionId: revisionId, status: 'ready' });
  });

  it('When kind is left out, then the log is a road log', async () => {
    const res = await tuner.agent
      .post(`/api/vehicles/${vehicleId}/logs`)
      .set('X-XSRF-TOKEN', tuner.xsrf)
      .attach('file', Buffer.from(simulatedCsv('snake', 22)), 'no-kind.csv');
    expect(res.status).toBe(202);
    expect((await tuner.get(`/api/logs/${res.body.id}`)).body.kind).toBe('road');
  });

  it('When the same file is uploaded again for the vehicle, then 409 with details.logId', async () => {
    const text = simulatedCsv('snake', 30);
    const first = await postLog(tuner, vehicleId, text);
    expect(first.status).toBe(202);
    const again = await postLog(tuner, vehicleId, text, {}, 'renamed.csv');
    expect(again.status).toBe(409);
    expect(again.body.error).toMatchObject({ code: 'conflict', details: { logId: first.body.id } });
    // Another vehicle may have the same file.
    const otherVehicle = await insertTestVehicle(t.db, shop.id, 'Second car');
    expect((await postLog(tuner, otherVehicle, text)).status).toBe(202);
  });

  it('When the file is empty, then 400 and nothing is stored', async () => {
    const before = await t.db.select().from(logs).where(eq(logs.vehicleId, vehicleId));
    const res = await postLog(tuner, vehicleId, Buffer.alloc(0), {}, 'empty.csv');
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe('invalid_input');
    const after = await t.db.select().from(logs).where(eq(logs.vehicleId, vehicleId));
    expect(after.length).toBe(before.length);
    expect(readdirSync(join(t.config.dataDir, 'uploads', 'tmp'))).toEqual([]);
  });

  it('When the file has no header or no data rows, then 400 with the reason', async () => {
    const junk = await postLog(tuner, vehicleId, 'just some words\nand more words\n');
    expect(junk.status).toBe(400);
    expect(junk.body.error.details.reason).toBe('no_header');
    const headerOnly = await postLog(tuner, vehicleId, 'time_s,engine_rpm,map_kpa\n');
    expect(headerOnly.status).toBe(400);
    expect(headerOnly.body.error.details).toMatchObject({ reason: 'no_data', row: 0 });
  });

  it('When required channels cannot be mapped, then 422 listing what is missing', async () => {
    const text = 'time_s,engine_rpm,iat_c\n0.00,900,20\n0.05,905,20\n0.10,910,20\n';
    const res = await postLog(tuner, vehicleId, text);
    expect(res.status).toBe(422);
    expect(res.body.error.code).toBe('unusable_file');
    expect(res.body.error.details.missing).toEqual(['map', 'lambda', 'lambdaTarget']);
  });

  it('When a mapping leaves a required channel out, then 422 at once, not a failed parse', async () => {
    const mapping = {
      channels: { time: { column: 'time_s' }, rpm: { column: 'engine_rpm' } },
    };
    const res = await postLog(tuner, vehicleId, simulatedCsv('snake', 31), { mapping });
    expect(res.status).toBe(422);
    expect(res.body.error.details.missing).toEqual(['map', 'lambda', 'lambdaTarget']);
  });

  it('When a mapping names a column the file lacks, then 422 naming the column and header row', async () => {
    const mapping = {
      channels: {
        time: { column: 'time_s' },
        rpm: { column: 'Engine RPM' },
        map: { column: 'map_kpa' },
        lambda: { column: 'lambda_measured' },
        lambdaTarget: { column: 'lambda_target' },
      },
    };
    const res = await postLog(tuner, vehicleId, simulatedCsv('snake', 32), { mapping });
    expect(res.status).toBe(422);
    expect(res.body.error.details).toMatchObject({
      reason: 'unknown_column',
      missing: ['Engine RPM'],
      row: 0,
    });
  });

  it('When the mapping is not JSON, has a unit its channel refuses or an unknown field, then 400', async () => {
    const text = simulatedCsv('snake', 33);
    const notJson = await postLog(tuner, vehicleId, text, { mapping: '{channels:' });
    expect(notJson.status).toBe(400);
    expect(notJson.body.error.details.issues[0].path).toBe('body.mapping');
    const badUnit = await postLog(tuner, vehicleId, text, {
      mapping: { channels: { rpm: { column: 'engine_rpm', unit: 'psi' } } },
    });
    expect(badUnit.status).toBe(400);
    expect(badUnit.body.error.details.issues[0].path).toBe('body.mapping.channels.rpm.unit');
    const extra = await postLog(tuner, vehicleId, text, { mapping: { channels: {}, sheet: 2 } });
    expect(extra.status).toBe(400);
    expect((await postLog(tuner, vehicleId, text, { kind: 'track' })).status).toBe(400);
  });

  it('When a given mapping is used, then it is saved as the preset and reused for the next file with that header', async () => {
    // Names the suggestion would never read as these channels: only the preset can map them.
    const header = 'secs;motor;manifold;wb;wb_goal;air_temp';
    const row = (i: number): string =>
      `${(i * 0.05).toFixed(2)};${2000 + i};${(60 + i / 10).toFixed(1)};0.98;1.00;25`;
    const file = (rows: number, offset: number): string =>
      [header, ...Array.from({ length: rows }, (_, i) => row(i + offset))].join('\n') + '\n';
    const mapping = {
      delimiter: ';',
      channels: {
        time: { column: 'secs', unit: 's' },
        rpm: { column: 'motor' },
        map: { column: 'manifold', unit: 'kPa' },
        lambda: { column: 'wb', unit: 'lambda' },
        lambdaTarget: { column: 'wb_goal', unit: 'lambda' },
      },
    };
    expect((await postLog(tuner, vehicleId, file(40, 0))).status).toBe(422);

    const first = await postLog(tuner, vehicleId, file(40, 0), { mapping }, 'first.csv');
    expect(first.status).toBe(202);
    expect(first.body.mappingSource).toBe('given');
    const presets = await t.db
      .select()
      .from(mappingPresets)
      .where(eq(mappingPresets.shopId, shop.id));
    expect(presets).toHaveLength(1);
    expect(presets[0]?.mapping).toEqual(mapping);

    const second = await postLog(tuner, vehicleId, file(60, 100), {}, 'second.csv');
    expect(second.status).toBe(202);
    expect(second.body.mappingSource).toBe('preset');
    const log = await waitForLog(tuner, second.body.id);
    expect(log).toMatchObject({ status: 'ready', sampleCount: 60 });
    expect(log.mapping.channels.rpm).toEqual({ column: 'motor' });
    expect(log.parseReport?.mappingSource).toBe('preset');

    // Presets are per shop: the other shop's upload of the same header is not helped.
    const other = await signedIn(t.app, otherShop.emails.tuner, TEST_PASSWORD);
    const otherVehicle = await insertTestVehicle(t.db, otherShop.id);
    expect((await postLog(other, otherVehicle, file(40, 0))).status).toBe(422);
  });

  describe('refusals', () => {
    it('When a reviewer uploads, then 403', async () => {
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await postLog(reviewer, vehicleId, simulatedCsv('snake', 40));
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('forbidden');
    });

    it('When the vehicle belongs to another shop or does not exist, then 404', async () => {
      const otherVehicle = await insertTestVehicle(t.db, otherShop.id);
      const res = await postLog(tuner, otherVehicle, simulatedCsv('snake', 41));
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      const missing = await postLog(
        tuner,
        '00000000-0000-4000-8000-000000000000',
        simulatedCsv('snake', 41),
      );
      expect(missing.status).toBe(404);
      expect((await postLog(tuner, 'not-a-uuid', 'x')).status).toBe(400);
    });

    it('When ecuRevisionId is another vehicle’s or another shop’s revision, then 400 / 404', async () => {
      const secondVehicle = await insertTestVehicle(t.db, shop.id, 'Third car');
      const tunerId = shop.userIds[shop.emails.tuner] as string;
      const foreignTable = await insertTestRevision(t.db, shop.id, secondVehicle, tunerId);
      const text = simulatedCsv('snake', 42);
      const wrongCar = await postLog(tuner, vehicleId, text, { ecuRevisionId: foreignTable });
      expect(wrongCar.status).toBe(400);
      expect(wrongCar.body.error.details.issues[0].path).toBe('body.ecuRevisionId');
      const otherVehicle = await insertTestVehicle(t.db, otherShop.id);
      const otherAuthor = otherShop.userIds[otherShop.emails.tuner] as string;
      const otherRevision = await insertTestRevision(t.db, otherShop.id, otherVehicle, otherAuthor);
      const res = await postLog(tuner, vehicleId, text, { ecuRevisionId: otherRevision });
      expect(res.status).toBe(404);
    });

    it('When the XSRF header is missing from the multipart request, then 403 csrf', async () => {
      const res = await tuner.agent
        .post(`/api/vehicles/${vehicleId}/logs`)
        .field('kind', 'dyno')
        .attach('file', Buffer.from(simulatedCsv('snake', 43)), 'no-xsrf.csv');
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf');
    });

    it('When there is no file part, then 400 naming it', async () => {
      const res = await tuner.agent
        .post(`/api/vehicles/${vehicleId}/logs`)
        .set('X-XSRF-TOKEN', tuner.xsrf)
        .field('kind', 'dyno');
      expect(res.status).toBe(400);
      expect(res.body.error.details.issues[0].path).toBe('file');
    });

    it('When nobody is signed in, then 401', async () => {
      const anonymous = await new ApiClient(t.app).prime();
      expect((await postLog(anonymous, vehicleId, simulatedCsv('snake', 44))).status).toBe(401);
    });
  });
});
