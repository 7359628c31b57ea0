import { eq, sql } from 'drizzle-orm';
import request from 'supertest';
import { users } from '../../db/schema';
import { DEFAULT_DISPLAY_PREFERENCES } from '../../shared/contracts/preferences';
import { ApiClient, signedIn } from './support/api-client';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

interface Issue {
  path: string;
  message: string;
}

/** The issues of a 400 answer. */
function issuesOf(res: { body: { error: { details?: { issues?: Issue[] } } } }): Issue[] {
  return res.body.error.details?.issues ?? [];
}

describe('preferences routes', () => {
  let t: TestApp;
  let shop: TestShop;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'preferences');
  });
  afterAll(() => t.close());

  describe('GET /api/me/preferences', () => {
    it('When a new member asks, then the defaults are answered (metric, lambda, system)', async () => {
      const client = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await client.get('/api/me/preferences');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ units: 'metric', mixture: 'lambda', theme: 'system' });
      expect(res.body).toEqual(DEFAULT_DISPLAY_PREFERENCES);
    });

    it('When nobody is signed in, then 401', async () => {
      const res = await request(t.app).get('/api/me/preferences');
      expect(res.status).toBe(401);
      expect(res.body.error.code).toBe('not_signed_in');
    });

    it('When the stored value is outdated, then each bad field falls back to its default', async () => {
      const userId = shop.userIds[shop.emails.admin] ?? '';
      await t.db
        .update(users)
        .set({ preferences: sql`'{"units":"furlongs","theme":"dark","extra":1}'::jsonb` })
        .where(eq(users.id, userId));
      const client = await signedIn(t.app, shop.emails.admin, TEST_PASSWORD);
      const res = await client.get('/api/me/preferences');
      expect(res.status).toBe(200);
      expect(res.body).toEqual({ units: 'metric', mixture: 'lambda', theme: 'dark' });
    });
  });

  describe('PATCH /api/me/preferences', () => {
    it('When a subset is sent, then only those fields change and all are answered', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const first = await client.patch('/api/me/preferences', { units: 'imperial' });
      expect(first.status).toBe(200);
      expect(first.body).toEqual({ units: 'imperial', mixture: 'lambda', theme: 'system' });

      const second = await client.patch('/api/me/preferences', { mixture: 'afr', theme: 'dark' });
      expect(second.body).toEqual({ units: 'imperial', mixture: 'afr', theme: 'dark' });
      expect((await client.get('/api/me/preferences')).body).toEqual(second.body);
    });

    it('When the member signs in again elsewhere, then the stored choice is still there', async () => {
      const client = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      await client.patch('/api/me/preferences', { theme: 'light' });
      const elsewhere = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      const res = await elsewhere.get('/api/me/preferences');
      expect(res.body).toMatchObject({ theme: 'light' });
    });

    it('When one member changes theirs, then another member of the shop keeps their own', async () => {
      const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      await operator.patch('/api/me/preferences', { units: 'imperial' });
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      expect((await reviewer.get('/api/me/preferences')).body.units).toBe('metric');
    });

    it('When two changes to different fields arrive together, then both are kept', async () => {
      const client = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      await client.patch('/api/me/preferences', { units: 'metric', mixture: 'lambda' });
      await Promise.all([
        client.patch('/api/me/preferences', { units: 'imperial' }),
        client.patch('/api/me/preferences', { mixture: 'afr' }),
      ]);
      const res = await client.get('/api/me/preferences');
      expect(res.body).toMatchObject({ units: 'imperial', mixture: 'afr' });
      await client.patch('/api/me/preferences', { units: 'metric', mixture: 'lambda' });
    });

    it.each([
      [{ units: 'furlongs' }, 'body.units', 'units must be one of metric, imperial'],
      [{ mixture: 'phi' }, 'body.mixture', 'mixture must be one of lambda, afr'],
      [{ theme: 'purple' }, 'body.theme', 'theme must be one of system, light, dark'],
      [{ units: null }, 'body.units', 'units must be one of metric, imperial'],
    ])('When %j is sent, then 400 names %s', async (body, path, message) => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const before = (await client.get('/api/me/preferences')).body;
      const res = await client.patch('/api/me/preferences', body);
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      expect(res.body.error.message).toBe(`Invalid ${path}: ${message}`);
      expect(issuesOf(res)).toEqual([{ path, message }]);
      expect((await client.get('/api/me/preferences')).body).toEqual(before);
    });

    it('When an unknown field is sent, then 400 names it and nothing changes', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const before = (await client.get('/api/me/preferences')).body;
      const res = await client.patch('/api/me/preferences', { units: 'metric', colour: 'red' });
      expect(res.status).toBe(400);
      expect(issuesOf(res)[0]?.path).toBe('body');
      expect(issuesOf(res)[0]?.message).toMatch(/colour/);
      expect((await client.get('/api/me/preferences')).body).toEqual(before);
    });

    it('When the body is empty, then 400 asks for at least one field', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const res = await client.patch('/api/me/preferences', {});
      expect(res.status).toBe(400);
      expect(issuesOf(res)).toEqual([
        { path: 'body', message: 'give at least one of units, mixture, theme' },
      ]);
    });

    it('When the X-XSRF-TOKEN header is missing, then 403 csrf and nothing changes', async () => {
      const client = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const before = (await client.get('/api/me/preferences')).body;
      const res = await client.agent.patch('/api/me/preferences').send({ theme: 'dark' });
      expect(res.status).toBe(403);
      expect(res.body.error.code).toBe('csrf');
      expect((await client.get('/api/me/preferences')).body).toEqual(before);
    });

    it('When nobody is signed in, then 401', async () => {
      const client = await new ApiClient(t.app).prime();
      const res = await client.patch('/api/me/preferences', { theme: 'dark' });
      expect(res.status).toBe(401);
    });

    it('When PUT is tried, then it is not a route (PATCH is the one way to change)', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const res = await client.agent
        .put('/api/me/preferences')
        .set('X-XSRF-TOKEN', client.xsrf)
        .send({ units: 'metric', mixture: 'lambda', theme: 'system' });
      expect(res.status).toBe(404);
    });
  });

  describe('GET /api/auth/me', () => {
    it('When preferences are stored, then the session answer keeps its fixed shape', async () => {
      const client = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
      const res = await client.get('/api/auth/me');
      expect(Object.keys(res.body.user).sort()).toEqual(
        ['email', 'id', 'name', 'roles', 'shopId', 'shopName'].sort(),
      );
    });
  });
});
