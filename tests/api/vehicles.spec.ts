import { randomUUID } from 'node:crypto';
import request from 'supertest';
import type { Vehicle } from '../../shared/contracts/vehicles';
import { STOICH_AFR } from '../../shared/units/fuels';
import { type ApiClient, signedIn } from './support/api-client';
import { createVehicle, vehicleBody } from './support/test-data';
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

describe('vehicles routes', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let tuner: ApiClient;
  let admin: ApiClient;
  let operator: ApiClient;
  let otherTuner: ApiClient;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'vehicles');
    otherShop = await createTestShop(t.db, 'vehicles-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    admin = await signedIn(t.app, shop.emails.admin, TEST_PASSWORD);
    operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
    otherTuner = await signedIn(t.app, otherShop.emails.tuner, TEST_PASSWORD);
  });
  afterAll(() => t.close());

  describe('POST /api/vehicles', () => {
    it('When a tuner gives a gasoline engine without stoichAfr, then 201 with 14.7', async () => {
      const res = await tuner.post('/api/vehicles', vehicleBody());
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({
        label: 'Test hatch 2.0 turbo',
        description: 'Bigger intercooler, 3 in downpipe',
        engine: { displacementL: 2, cylinders: 4, fuel: 'gasoline', stoichAfr: 14.7 },
        gearing: { tireDiameterMm: 634, gearRatios: [3.45, 2.05, 1.38, 1.03, 0.8] },
      });
      expect(res.body.id).toEqual(expect.any(String));
    });

    it('When an admin adds an E85 vehicle, then stoichAfr is the E85 value', async () => {
      const body = vehicleBody({
        engine: { displacementL: 3, cylinders: 6, fuel: 'e85', injectorCcMin: 1000 },
      });
      const res = await admin.post('/api/vehicles', body);
      expect(res.status).toBe(201);
      expect(res.body.engine.stoichAfr).toBeCloseTo(STOICH_AFR.e85, 10);
    });

    it('When the fuel is custom, then stoichAfr is required and kept as given', async () => {
      const engine = { displacementL: 1.6, cylinders: 4, fuel: 'custom' as const };
      const missing = await tuner.post(
        '/api/vehicles',
        vehicleBody({ engine: { ...engine, injectorCcMin: 440 } }),
      );
      expect(missing.status).toBe(400);
      expect(issuesOf(missing)).toContainEqual({
        path: 'body.engine.stoichAfr',
        message: 'stoichAfr is required when fuel is custom',
      });
      const given = await tuner.post(
        '/api/vehicles',
        vehicleBody({ engine: { ...engine, injectorCcMin: 440, stoichAfr: 9.8 } }),
      );
      expect(given.status).toBe(201);
      expect(given.body.engine).toMatchObject({ fuel: 'custom', stoichAfr: 9.8 });
    });

    it('When fields are out of range, then 400 with an issue naming each field', async () => {
      const res = await tuner.post('/api/vehicles', {
        label: '  ',
        engine: { displacementL: 30, cylinders: 2.5, fuel: 'diesel', injectorCcMin: 5 },
        gearing: { tireDiameterMm: 100, gearRatios: [3, 11], finalDrive: 0.5 },
      });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe('invalid_input');
      const byPath = Object.fromEntries(issuesOf(res).map((i) => [i.path, i.message]));
      expect(byPath).toMatchObject({
        'body.label': 'label is required',
        'body.engine.displacementL': 'displacementL must be between 0.05 and 20 L',
        'body.engine.cylinders': 'cylinders must be a whole number',
        'body.engine.fuel': 'fuel must be one of gasoline, e10, e85, ethanol, methanol, custom',
        'body.engine.injectorCcMin': 'injectorCcMin must be between 10 and 10000 cc/min',
        'body.gearing.tireDiameterMm': 'tireDiameterMm must be between 200 and 1500 mm',
        'body.gearing.gearRatios.1': 'gearRatios[] must be between 0.2 and 10',
        'body.gearing.finalDrive': 'finalDrive must be between 1 and 10',
      });
    });

    it('When there are no gears or more than 12, then 400 on gearRatios', async () => {
      const gearing = { tireDiameterMm: 634, finalDrive: 3.9 };
      const none = await tuner.post(
        '/api/vehicles',
        vehicleBody({ gearing: { ...gearing, gearRatios: [] } }),
      );
      expect(issuesOf(none)).toContainEqual({
        path: 'body.gearing.gearRatios',
        message: 'gearRatios needs at least 1 gear',
      });
      const many = await tuner.post(
        '/api/vehicles',
        vehicleBody({ gearing: { ...gearing, gearRatios: Array.from({ length: 13 }, () => 1) } }),
      );
      expect(many.status).toBe(400);
      expect(issuesOf(many)[0]?.message).toBe('gearRatios takes at most 12 gears');
    });

    it('When the body has an unknown field, then 400', async () => {
      const res = await tuner.post('/api/vehicles', { ...vehicleBody(), vin: 'X' });
      expect(res.status).toBe(400);
    });

    it.each(['operator', 'reviewer'] as const)(
      'When the %s adds a vehicle, then 403 and nothing is stored',
      async (role) => {
        const client = await signedIn(t.app, shop.emails[role], TEST_PASSWORD);
        const label = `Refused ${role} ${randomUUID()}`;
        const res = await client.post('/api/vehicles', vehicleBody({ label }));
        expect(res.status).toBe(403);
        expect(res.body.error.code).toBe('forbidden');
        const list = await tuner.get(`/api/vehicles?q=${encodeURIComponent(label)}`);
        expect(list.body.total).toBe(0);
      },
    );

    it('When nobody is signed in, then 401', async () => {
      expect((await request(t.app).get('/api/vehicles')).status).toBe(401);
    });
  });

  describe('GET /api/vehicles', () => {
    let listShop: TestShop;
    let lister: ApiClient;

    beforeAll(async () => {
      // A shop of its own so the counts below never depend on the other tests' vehicles.
      listShop = await createTestShop(t.db, 'vehicles-list');
      lister = await signedIn(t.app, listShop.emails.tuner, TEST_PASSWORD);
      for (const [label, description] of [
        ['delta wagon', 'Dyno car, 100% ethanol'],
        ['Alpha coupe', 'Street car'],
        ['charlie roadster', 'New cams'],
        ['Bravo van', 'Intercooler swap'],
      ]) {
        await createVehicle(lister, { label, description });
      }
    });

    it('When a member lists, then only their shop appears, by label a–z', async () => {
      const reader = await signedIn(t.app, listShop.emails.operator, TEST_PASSWORD);
      const res = await reader.get('/api/vehicles');
      expect(res.status).toBe(200);
      expect(res.body.total).toBe(4);
      expect((res.body.items as Vehicle[]).map((v) => v.label)).toEqual([
        'Alpha coupe',
        'Bravo van',
        'charlie roadster',
        'delta wagon',
      ]);
    });

    it('When q is given, then label and description are searched in any case', async () => {
      const byLabel = await lister.get('/api/vehicles?q=ROADSTER');
      expect((byLabel.body.items as Vehicle[]).map((v) => v.label)).toEqual(['charlie roadster']);
      const byDescription = await lister.get('/api/vehicles?q=intercooler');
      expect((byDescription.body.items as Vehicle[]).map((v) => v.label)).toEqual(['Bravo van']);
      const percent = await lister.get(`/api/vehicles?q=${encodeURIComponent('100%')}`);
      expect(percent.body.total).toBe(1);
      const wildcard = await lister.get(`/api/vehicles?q=${encodeURIComponent('%')}`);
      expect(wildcard.body.total).toBe(1);
    });

    it('When sorted by label descending, then z–a', async () => {
      const res = await lister.get('/api/vehicles?sort=label&order=desc');
      expect((res.body.items as Vehicle[]).map((v) => v.label)).toEqual([
        'delta wagon',
        'charlie roadster',
        'Bravo van',
        'Alpha coupe',
      ]);
    });

    it('When sorted by createdAt, then newest first unless asked ascending', async () => {
      const newest = await lister.get('/api/vehicles?sort=createdAt');
      expect((newest.body.items as Vehicle[])[0]?.label).toBe('Bravo van');
      const oldest = await lister.get('/api/vehicles?sort=createdAt&order=asc');
      expect((oldest.body.items as Vehicle[])[0]?.label).toBe('delta wagon');
    });

    it('When paged, then limit and offset cut the list and total counts all', async () => {
      const res = await lister.get('/api/vehicles?limit=2&offset=1');
      expect(res.body.total).toBe(4);
      expect((res.body.items as Vehicle[]).map((v) => v.label)).toEqual([
        'Bravo van',
        'charlie roadster',
      ]);
    });

    it('When the query is malformed, then 400 naming the parameter', async () => {
      for (const [query, path] of [
        ['limit=0', 'query.limit'],
        ['limit=abc', 'query.limit'],
        ['offset=-1', 'query.offset'],
        ['sort=fuel', 'query.sort'],
        ['order=up', 'query.order'],
      ]) {
        const res = await lister.get(`/api/vehicles?${query}`);
        expect(res.status).toBe(400);
        expect(issuesOf(res)[0]?.path).toBe(path);
      }
    });
  });

  describe('GET /api/vehicles/:id', () => {
    it('When an operator reads a vehicle of the shop, then 200', async () => {
      const vehicle = await createVehicle(tuner);
      const res = await operator.get(`/api/vehicles/${vehicle.id}`);
      expect(res.status).toBe(200);
      expect(res.body).toEqual(vehicle);
    });

    it('When the vehicle belongs to another shop or does not exist, then 404', async () => {
      const foreign = await createVehicle(otherTuner);
      const res = await tuner.get(`/api/vehicles/${foreign.id}`);
      expect(res.status).toBe(404);
      expect(res.body.error.code).toBe('not_found');
      expect((await tuner.get(`/api/vehicles/${randomUUID()}`)).status).toBe(404);
    });

    it('When the id is not a UUID, then 400', async () => {
      const res = await tuner.get('/api/vehicles/not-an-id');
      expect(res.status).toBe(400);
      expect(issuesOf(res)[0]).toEqual({
        path: 'params.id',
        message: 'vehicle id must be a UUID',
      });
    });
  });

  describe('PATCH /api/vehicles/:id', () => {
    it('When a tuner changes one engine field, then the rest is kept', async () => {
      const vehicle = await createVehicle(tuner);
      const res = await tuner.patch(`/api/vehicles/${vehicle.id}`, {
        label: 'Renamed hatch',
        engine: { injectorCcMin: 1000 },
        gearing: { finalDrive: 4.1 },
      });
      expect(res.status).toBe(200);
      expect(res.body).toEqual({
        ...vehicle,
        label: 'Renamed hatch',
        engine: { ...vehicle.engine, injectorCcMin: 1000 },
        gearing: { ...vehicle.gearing, finalDrive: 4.1 },
        updatedAt: expect.any(String),
      });
      expect(Date.parse(res.body.updatedAt)).toBeGreaterThanOrEqual(Date.parse(vehicle.updatedAt));
      expect((await tuner.get(`/api/vehicles/${vehicle.id}`)).body.label).toBe('Renamed hatch');
    });

    it('When the fuel changes without stoichAfr, then the new fuel’s value is used', async () => {
      const vehicle = await createVehicle(tuner);
      const res = await admin.patch(`/api/vehicles/${vehicle.id}`, { engine: { fuel: 'e85' } });
      expect(res.status).toBe(200);
      expect(res.body.engine.stoichAfr).toBeCloseTo(STOICH_AFR.e85, 10);
    });

    it('When the fuel changes to custom without stoichAfr, then 400 and nothing changes', async () => {
      const vehicle = await createVehicle(tuner);
      const res = await tuner.patch(`/api/vehicles/${vehicle.id}`, { engine: { fuel: 'custom' } });
      expect(res.status).toBe(400);
      expect(issuesOf(res)).toEqual([
        { path: 'body.engine.stoichAfr', message: 'stoichAfr is required when fuel is custom' },
      ]);
      expect((await tuner.get(`/api/vehicles/${vehicle.id}`)).body.engine.fuel).toBe('gasoline');
      const ok = await tuner.patch(`/api/vehicles/${vehicle.id}`, {
        engine: { fuel: 'custom', stoichAfr: 12.5 },
      });
      expect(ok.body.engine).toMatchObject({ fuel: 'custom', stoichAfr: 12.5 });
    });

    it('When the body is empty or a value is out of range, then 400', async () => {
      const vehicle = await createVehicle(tuner);
      expect((await tuner.patch(`/api/vehicles/${vehicle.id}`, {})).status).toBe(400);
      const res = await tuner.patch(`/api/vehicles/${vehicle.id}`, { engine: { cylinders: 17 } });
      expect(res.status).toBe(400);
      expect(issuesOf(res)[0]).toEqual({
        path: 'body.engine.cylinders',
        message: 'cylinders must be between 1 and 16',
      });
    });

    it('When an operator changes a vehicle, then 403', async () => {
      const vehicle = await createVehicle(tuner);
      const res = await operator.patch(`/api/vehicles/${vehicle.id}`, { label: 'No' });
      expect(res.status).toBe(403);
    });

    it('When the vehicle belongs to another shop, then 404 and it is untouched', async () => {
      const foreign = await createVehicle(otherTuner);
      const res = await tuner.patch(`/api/vehicles/${foreign.id}`, { label: 'Taken over' });
      expect(res.status).toBe(404);
      expect((await otherTuner.get(`/api/vehicles/${foreign.id}`)).body.label).toBe(foreign.label);
    });
  });
});
