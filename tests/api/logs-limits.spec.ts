import { readdirSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { logs } from '../../db/schema';
import { type ApiClient, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { insertTestVehicle, postLog, simulatedCsv } from './support/test-logs';
import { createTestShop, TEST_PASSWORD } from './support/test-shop';

describe('POST /api/vehicles/:id/logs with a small size limit', () => {
  let t: TestApp;
  let tuner: ApiClient;
  let vehicleId: string;

  beforeAll(async () => {
    // 0.05 MB = 52 428 bytes: a 60 s simulated session (about 90 kB) is too large.
    t = await startTestApp({ MAX_UPLOAD_MB: '0.05' });
    const shop = await createTestShop(t.db, 'logs-limits');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    vehicleId = await insertTestVehicle(t.db, shop.id);
  });
  afterAll(() => t.close());

  it('When the file is over the limit, then 413 too_large, no log and no temporary file', async () => {
    const text = simulatedCsv('snake', 60);
    expect(Buffer.byteLength(text)).toBeGreaterThan(t.config.maxUploadBytes);
    const res = await postLog(tuner, vehicleId, text);
    expect(res.status).toBe(413);
    expect(res.body.error).toMatchObject({
      code: 'too_large',
      details: { maxBytes: t.config.maxUploadBytes },
    });
    expect(await t.db.select().from(logs).where(eq(logs.vehicleId, vehicleId))).toEqual([]);
    expect(readdirSync(join(t.config.dataDir, 'uploads', 'tmp'))).toEqual([]);
  });

  it('When the file is under the limit, then 202 and only the kept file remains', async () => {
    const text = simulatedCsv('snake', 61, 20);
    expect(Buffer.byteLength(text)).toBeLessThan(t.config.maxUploadBytes);
    const res = await postLog(tuner, vehicleId, text);
    expect(res.status).toBe(202);
    expect(readdirSync(join(t.config.dataDir, 'uploads', 'tmp'))).toEqual([]);
    const [row] = await t.db.select().from(logs).where(eq(logs.id, res.body.id));
    expect(row?.rawPath).toMatch(/^uploads\/[0-9a-f-]{36}\/[0-9a-f-]{36}\.csv\.gz$/);
  });
});
