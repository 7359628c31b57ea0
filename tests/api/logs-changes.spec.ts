import { existsSync } from 'node:fs';
import { join } from 'node:path';
import { eq } from 'drizzle-orm';
import { auditEvents, logChannels, logs } from '../../db/schema';
import { logSchema } from '../../shared/contracts/logs';
import { signedIn, type ApiClient } from './support/api-client';
import {
  insertTestRevision,
  insertTestVehicle,
  postLog,
  simulatedCsv,
  waitForLog,
} from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

describe('a log after its upload', () => {
  let t: TestApp;
  let shop: TestShop;
  let other: TestShop;
  let tuner: ApiClient;
  let vehicleId: string;
  let revisionId: string;

  async function readyLog(seed: number): Promise<string> {
    const res = await postLog(tuner, vehicleId, simulatedCsv('snake', seed));
    expect(res.status).toBe(202);
    const log = await waitForLog(tuner, res.body.id as string);
    expect(log.status).toBe('ready');
    return log.id;
  }

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'log-changes');
    other = await createTestShop(t.db, 'log-changes-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    vehicleId = await insertTestVehicle(t.db, shop.id);
    revisionId = await insertTestRevision(
      t.db,
      shop.id,
      vehicleId,
      shop.userIds[shop.emails.tuner] as string,
    );
  });
  afterAll(() => t.close());

  describe('PATCH /api/logs/:id', () => {
    it('When the tuner sets the kind and the ECU revision, then the log says so and the change is audited', async () => {
      const logId = await readyLog(71);
      const res = await tuner.patch(`/api/logs/${logId}`, {
        kind: 'dyno',
        ecuRevisionId: revisionId,
      });
      expect(res.status).toBe(200);
      const log = logSchema.parse(res.body);
      expect(log).toMatchObject({ kind: 'dyno', ecuRevisionId: revisionId });
      const cleared = await tuner.patch(`/api/logs/${logId}`, { ecuRevisionId: null });
      expect(cleared.body.ecuRevisionId).toBeNull();
      const audited = await t.db.select().from(auditEvents).where(eq(auditEvents.targetId, logId));
      expect(audited.filter((e) => e.action === 'log.changed')).toHaveLength(2);
    });

    it('When the revision is of another vehicle, unknown, or the body empty, then 400 or 404 names it', async () => {
      const logId = await readyLog(72);
      const otherVehicle = await insertTestVehicle(t.db, shop.id, 'Another car');
      const foreign = await insertTestRevision(
        t.db,
        shop.id,
        otherVehicle,
        shop.userIds[shop.emails.tuner] as string,
      );
      const wrong = await tuner.patch(`/api/logs/${logId}`, { ecuRevisionId: foreign });
      expect(wrong.status).toBe(400);
      expect(wrong.body.error.details.issues[0].path).toBe('body.ecuRevisionId');
      const unknown = await tuner.patch(`/api/logs/${logId}`, {
        ecuRevisionId: '00000000-0000-4000-8000-000000000000',
      });
      expect(unknown.status).toBe(404);
      expect((await tuner.patch(`/api/logs/${logId}`, {})).status).toBe(400);
      expect((await tuner.patch(`/api/logs/${logId}`, { kind: 'track' })).status).toBe(400);
    });

    it('When a reviewer changes a log, then 403; another shop, then 404', async () => {
      const logId = await readyLog(73);
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      expect((await reviewer.patch(`/api/logs/${logId}`, { kind: 'dyno' })).status).toBe(403);
      const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
      expect((await stranger.patch(`/api/logs/${logId}`, { kind: 'dyno' })).status).toBe(404);
    });
  });

  describe('DELETE /api/logs/:id', () => {
    it('When the tuner deletes a log, then its row, channels and file go, analyses keep their figures, and the file can come again', async () => {
      const logId = await readyLog(74);
      const [row] = await t.db.select().from(logs).where(eq(logs.id, logId));
      const rawFile = join(t.config.dataDir, row?.rawPath as string);
      expect(existsSync(rawFile)).toBe(true);
      const tableId = (await tuner.get(`/api/vehicles/${vehicleId}/tables`)).body.items[0].id;
      const analysis = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId: revisionId,
        logIds: [logId],
      });
      expect(analysis.status).toBe(201);

      const res = await tuner.delete(`/api/logs/${logId}`);
      expect(res.status).toBe(204);
      expect((await tuner.get(`/api/logs/${logId}`)).status).toBe(404);
      expect(await t.db.select().from(logChannels).where(eq(logChannels.logId, logId))).toEqual([]);
      expect(existsSync(rawFile)).toBe(false);
      // The analysis keeps its figures; reading its samples again says which log is gone.
      const kept = await tuner.get(`/api/analyses/${analysis.body.id}`);
      expect(kept.status).toBe(200);
      expect(kept.body.cells).toEqual(analysis.body.cells);
      const samples = await tuner.get(`/api/analyses/${analysis.body.id}/samples`);
      expect(samples.status).toBe(409);
      expect(samples.body.error.details.logId).toBe(logId);
      // The same file is no longer a duplicate.
      expect((await postLog(tuner, vehicleId, simulatedCsv('snake', 74))).status).toBe(202);
    });

    it('When an operator deletes, then 403; another shop, then 404', async () => {
      const logId = await readyLog(75);
      const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      expect((await operator.delete(`/api/logs/${logId}`)).status).toBe(403);
      const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
      expect((await stranger.delete(`/api/logs/${logId}`)).status).toBe(404);
      expect((await tuner.get(`/api/logs/${logId}`)).status).toBe(200);
    });
  });
});
