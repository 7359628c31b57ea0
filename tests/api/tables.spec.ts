import { randomUUID } from 'node:crypto';
import type { Revision, RevisionSummary, VeTableResource } from '../../shared/contracts/tables';
import type { Vehicle } from '../../shared/contracts/vehicles';
import { type ApiClient, signedIn } from './support/api-client';
import { createTable, createVehicle, tableBody } from './support/test-data';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

interface Issue {
  path: string;
  message: string;
}

/** The first issue of a 400 answer. */
function firstIssue(res: { body: { error: { details?: { issues?: Issue[] } } } }): Issue {
  const issue = res.body.error.details?.issues?.[0];
  if (!issue) throw new Error('no issue in the answer');
  return issue;
}

describe('tables routes', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let tuner: ApiClient;
  let operator: ApiClient;
  let otherTuner: ApiClient;
  let vehicle: Vehicle;
  let foreignVehicle: Vehicle;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'tables');
    otherShop = await createTestShop(t.db, 'tables-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
    otherTuner = await signedIn(t.app, otherShop.emails.tuner, TEST_PASSWORD);
    vehicle = await createVehicle(tuner);
    foreignVehicle = await createVehicle(otherTuner);
  });
  afterAll(() => t.close());

  describe('POST /api/vehicles/:id/tables', () => {
    it('When a tuner creates a table, then 201 and revision 1 is a draft with its values', async () => {
      const body = tableBody();
      const res = await tuner.post(`/api/vehicles/${vehicle.id}/tables`, body);
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        vehicleId: vehicle.id,
        name: 'Main VE',
        rpmAxis: body.rpmAxis,
        mapAxisKpa: body.mapAxisKpa,
        headRevisionId: expect.any(String),
      });
      const revision = await tuner.get(`/api/revisions/${res.body.headRevisionId}`);
      expect(revision.status).toBe(200);
      expect(revision.body).toMatchObject({
        id: res.body.headRevisionId,
        tableId: res.body.id,
        parentId: null,
        number: 1,
        status: 'draft',
        message: 'Initial table',
        values: body.values,
        authorId: shop.userIds[shop.emails.tuner],
        analysisId: null,
      });
    });

    it.each(['operator', 'reviewer', 'admin'] as const)(
      'When the %s creates a table, then 403',
      async (role) => {
        const client = await signedIn(t.app, shop.emails[role], TEST_PASSWORD);
        const res = await client.post(`/api/vehicles/${vehicle.id}/tables`, tableBody());
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
      },
    );

    it('When the vehicle belongs to another shop, then 404 and no table is made there', async () => {
      const res = await tuner.post(`/api/vehicles/${foreignVehicle.id}/tables`, tableBody());
      expect(res.status).toBe(404);
      const list = await otherTuner.get(`/api/vehicles/${foreignVehicle.id}/tables`);
      expect(list.body).toEqual({ items: [], total: 0 });
    });

    it('When a row is ragged, then 400 naming the row', async () => {
      const res = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({
          values: [
            [40, 45, 50, 48],
            [55, 62, 70],
            [70, 80, 88, 85],
          ],
        }),
      );
      expect(res.status).toBe(400);
      expect(firstIssue(res)).toEqual({
        path: 'body.values',
        message: 'table.values[1] has 3 columns, rpmAxis 4',
      });
    });

    it('When the rows do not follow the MAP axis, then 400', async () => {
      const res = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({ mapAxisKpa: [40, 70, 100, 130] }),
      );
      expect(res.status).toBe(400);
      expect(firstIssue(res)).toEqual({
        path: 'body.values',
        message: 'table.values has 3 rows, mapAxisKpa 4',
      });
    });

    it('When an axis is not strictly ascending, then 400 naming the axis and index', async () => {
      const rpm = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({ rpmAxis: [1000, 2000, 2000, 4000] }),
      );
      expect(rpm.status).toBe(400);
      expect(firstIssue(rpm)).toEqual({
        path: 'body.rpmAxis',
        message: 'rpmAxis must be strictly ascending (at index 2)',
      });
      const map = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({ mapAxisKpa: [100, 70, 40] }),
      );
      expect(firstIssue(map)).toEqual({
        path: 'body.mapAxisKpa',
        message: 'mapAxisKpa must be strictly ascending (at index 1)',
      });
    });

    it('When a cell is out of range or not a number, then 400 at that row and column', async () => {
      const values = tableBody().values.map((row) => [...row]);
      values[2]![3] = 301;
      const high = await tuner.post(`/api/vehicles/${vehicle.id}/tables`, tableBody({ values }));
      expect(firstIssue(high)).toEqual({
        path: 'body.values.2.3',
        message: 'VE must be between 1 and 300 %',
      });
      const text = await tuner.post(`/api/vehicles/${vehicle.id}/tables`, {
        ...tableBody(),
        values: [
          [40, 45, 50, 48],
          [55, '62', 70, 68],
          [70, 80, 88, 85],
        ],
      });
      expect(text.status).toBe(400);
      expect(firstIssue(text).path).toBe('body.values.1.1');
    });

    it('When an axis has one breakpoint or the name is blank, then 400', async () => {
      const one = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({ rpmAxis: [1000], values: [[40], [50], [60]] }),
      );
      expect(firstIssue(one)).toEqual({
        path: 'body.rpmAxis',
        message: 'rpmAxis needs at least 2 breakpoints',
      });
      const blank = await tuner.post(
        `/api/vehicles/${vehicle.id}/tables`,
        tableBody({ name: ' ' }),
      );
      expect(firstIssue(blank)).toEqual({ path: 'body.name', message: 'name is required' });
    });
  });

  describe('GET /api/vehicles/:id/tables', () => {
    it('When an operator lists a vehicle’s tables, then they come oldest first', async () => {
      const own = await createVehicle(tuner);
      const first = await createTable(tuner, own.id, { name: 'Cruise' });
      const second = await createTable(tuner, own.id, { name: 'Boost' });
      const res = await operator.get(`/api/vehicles/${own.id}/tables`);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(2);
      expect((res.body.items as VeTableResource[]).map((x) => x.id)).toEqual([first.id, second.id]);
    });

    it('When the vehicle belongs to another shop, then 404', async () => {
      expect((await tuner.get(`/api/vehicles/${foreignVehicle.id}/tables`)).status).toBe(404);
    });
  });

  describe('GET /api/tables/:id', () => {
    it('When a reviewer reads a table, then it has its axes and head revision', async () => {
      const table = await createTable(tuner, vehicle.id);
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await reviewer.get(`/api/tables/${table.id}`);
      expect(res.status).toBe(200);
      expect(res.body).toEqual(table);
    });

    it('When the table belongs to another shop or does not exist, then 404', async () => {
      const foreign = await createTable(otherTuner, foreignVehicle.id);
      expect((await tuner.get(`/api/tables/${foreign.id}`)).status).toBe(404);
      expect((await tuner.get(`/api/tables/${randomUUID()}`)).status).toBe(404);
      expect((await tuner.get('/api/tables/abc')).status).toBe(400);
    });
  });

  describe('GET /api/tables/:id/revisions', () => {
    it('When a table has three revisions, then they are listed by number, without values', async () => {
      const table = await createTable(tuner, vehicle.id);
      const values = tableBody().values;
      const second = await tuner.post(`/api/tables/${table.id}/revisions`, {
        parentId: table.headRevisionId,
        values,
        message: 'Second',
      });
      await tuner.post(`/api/tables/${table.id}/revisions`, {
        parentId: second.body.id,
        values,
        message: 'Third',
      });
      const res = await operator.get(`/api/tables/${table.id}/revisions`);
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(3);
      const items = res.body.items as (RevisionSummary & Partial<Revision>)[];
      expect(items.map((r) => [r.number, r.message])).toEqual([
        [1, 'Initial table'],
        [2, 'Second'],
        [3, 'Third'],
      ]);
      expect(items.every((r) => r.values === undefined)).toBe(true);
      expect(items[0]?.authorName).toBe(`tuner of ${shop.name.replace('Test shop ', '')}`);
    });

    it('When the table belongs to another shop, then 404', async () => {
      const foreign = await createTable(otherTuner, foreignVehicle.id);
      expect((await tuner.get(`/api/tables/${foreign.id}/revisions`)).status).toBe(404);
    });
  });
});
