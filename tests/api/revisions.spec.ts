import { randomUUID } from 'node:crypto';
import type { Revision, VeTableResource } from '../../shared/contracts/tables';
import type { Vehicle } from '../../shared/contracts/vehicles';
import { type ApiClient, signedIn } from './support/api-client';
import { createTable, createVehicle, createVehicleWithTable, tableBody } from './support/test-data';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

type CreatedTable = VeTableResource & { headRevisionId: string };

/** The values of the helper's default 3 × 4 table, a valid revision of it. */
const baseValues = tableBody().values;

/** A small table whose numbers the export and compare tests below check by hand. */
const smallTable = {
  name: 'Main VE / E85',
  rpmAxis: [800, 2500, 10000],
  mapAxisKpa: [30, 101.3],
  values: [
    [35.5, 60, 72.25],
    [80, 99.9, 101],
  ],
};

describe('revisions routes', () => {
  let t: TestApp;
  let shop: TestShop;
  let otherShop: TestShop;
  let tuner: ApiClient;
  let operator: ApiClient;
  let otherTuner: ApiClient;
  let vehicle: Vehicle;
  let foreign: CreatedTable;

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'revisions');
    otherShop = await createTestShop(t.db, 'revisions-other');
    tuner = await signedIn(t.app, shop.emails.tuner, TEST_PASSWORD);
    operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
    otherTuner = await signedIn(t.app, otherShop.emails.tuner, TEST_PASSWORD);
    vehicle = await createVehicle(tuner);
    foreign = (await createVehicleWithTable(otherTuner)).table;
  });
  afterAll(() => t.close());

  /** Adds a revision as the tuner and returns the answer. */
  function addRevision(table: CreatedTable, body: object) {
    return tuner.post(`/api/tables/${table.id}/revisions`, body);
  }

  describe('POST /api/tables/:id/revisions', () => {
    it('When a tuner adds a revision, then 201, number 2, a draft, and the table’s head', async () => {
      const table = await createTable(tuner, vehicle.id);
      const values = [
        [41, 45, 50, 48],
        [55, 62, 70, 68],
        [70, 80, 88, 86.5],
      ];
      const res = await addRevision(table, {
        parentId: table.headRevisionId,
        values,
        message: 'Richer at idle',
      });
      expect(res.status).toBe(201);
      expect(res.body).toEqual({
        id: expect.any(String),
        tableId: table.id,
        parentId: table.headRevisionId,
        number: 2,
        status: 'draft',
        values,
        message: 'Richer at idle',
        authorId: shop.userIds[shop.emails.tuner],
        authorName: expect.any(String),
        analysisId: null,
        applied: null,
        createdAt: expect.any(String),
      });
      expect((await tuner.get(`/api/tables/${table.id}`)).body.headRevisionId).toBe(res.body.id);
    });

    it('When a revision starts again from revision 1, then it still takes the next number', async () => {
      const table = await createTable(tuner, vehicle.id);
      const values = baseValues;
      await addRevision(table, { parentId: table.headRevisionId, values, message: 'b' });
      const res = await addRevision(table, { parentId: table.headRevisionId, values });
      expect(res.status).toBe(201);
      expect(res.body).toMatchObject({ number: 3, parentId: table.headRevisionId, message: '' });
    });

    it('When six revisions are added at once, then they are numbered 2 to 7 without gaps', async () => {
      const table = await createTable(tuner, vehicle.id);
      const values = baseValues;
      const answers = await Promise.all(
        Array.from({ length: 6 }, (_, i) =>
          addRevision(table, { parentId: table.headRevisionId, values, message: `r${i}` }),
        ),
      );
      expect(answers.map((a) => a.status)).toEqual([201, 201, 201, 201, 201, 201]);
      const numbers = answers.map((a) => a.body.number as number).sort((x, y) => x - y);
      expect(numbers).toEqual([2, 3, 4, 5, 6, 7]);
      const head = (await tuner.get(`/api/tables/${table.id}`)).body.headRevisionId;
      expect(answers.find((a) => a.body.number === 7)?.body.id).toBe(head);
    });

    it.each(['operator', 'reviewer'] as const)(
      'When the %s adds a revision, then 403',
      async (role) => {
        const table = await createTable(tuner, vehicle.id);
        const client = await signedIn(t.app, shop.emails[role], TEST_PASSWORD);
        const res = await client.post(`/api/tables/${table.id}/revisions`, {
          parentId: table.headRevisionId,
          values: baseValues,
        });
        expect(res.status).toBe(403);
      },
    );

    it('When the table or the parent belongs to another shop, then 404', async () => {
      const table = await createTable(tuner, vehicle.id);
      const onForeign = await tuner.post(`/api/tables/${foreign.id}/revisions`, {
        parentId: foreign.headRevisionId,
        values: smallTable.values,
      });
      expect(onForeign.status).toBe(404);
      const foreignParent = await addRevision(table, {
        parentId: foreign.headRevisionId,
        values: baseValues,
      });
      expect(foreignParent.status).toBe(404);
      const unknownParent = await addRevision(table, {
        parentId: randomUUID(),
        values: baseValues,
      });
      expect(unknownParent.status).toBe(404);
    });

    it('When the parent is a revision of another table of the shop, then 409', async () => {
      const table = await createTable(tuner, vehicle.id);
      const other = await createTable(tuner, vehicle.id);
      const res = await addRevision(table, {
        parentId: other.headRevisionId,
        values: baseValues,
      });
      expect(res.status).toBe(409);
      expect(res.body.error.code).toBe('conflict');
    });

    it('When the values do not fit the axes, then 400 naming the row and nothing is stored', async () => {
      const table = await createTable(tuner, vehicle.id);
      const ragged = await addRevision(table, {
        parentId: table.headRevisionId,
        values: [
          [40, 45, 50, 48],
          [55, 62, 70, 68],
          [70, 80, 88],
        ],
      });
      expect(ragged.status).toBe(400);
      expect(ragged.body.error.details.issues).toEqual([
        { path: 'body.values', message: 'table.values[2] has 3 columns, rpmAxis 4' },
      ]);
      const short = await addRevision(table, {
        parentId: table.headRevisionId,
        values: baseValues.slice(0, 2),
      });
      expect(short.body.error.details.issues[0].message).toBe(
        'table.values has 2 rows, mapAxisKpa 3',
      );
      const zero = await addRevision(table, {
        parentId: table.headRevisionId,
        values: [
          [40, 0, 50, 48],
          [55, 62, 70, 68],
          [70, 80, 88, 85],
        ],
      });
      expect(zero.body.error.details.issues[0].path).toBe('body.values.0.1');
      expect((await tuner.get(`/api/tables/${table.id}/revisions`)).body.total).toBe(1);
    });
  });

  describe('GET /api/revisions/:id', () => {
    it('When an operator reads a revision, then it has its values', async () => {
      const table = await createTable(tuner, vehicle.id, smallTable);
      const res = await operator.get(`/api/revisions/${table.headRevisionId}`);
      expect(res.status).toBe(200);
      expect(res.body).toMatchObject({ number: 1, values: smallTable.values, tableId: table.id });
    });

    it('When the revision belongs to another shop, then 404; a malformed id, 400', async () => {
      expect((await tuner.get(`/api/revisions/${foreign.headRevisionId}`)).status).toBe(404);
      expect((await tuner.get('/api/revisions/nope')).status).toBe(400);
    });
  });

  describe('GET /api/revisions/:id/export', () => {
    let table: CreatedTable;

    beforeAll(async () => {
      table = await createTable(tuner, vehicle.id, smallTable);
    });

    it('When exported as CSV, then the text is the grid with the corner label', async () => {
      const res = await operator.get(`/api/revisions/${table.headRevisionId}/export?format=csv`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('text/csv; charset=utf-8');
      expect(res.headers['content-disposition']).toBe('attachment; filename=main-ve-e85-r1.csv');
      expect(res.text).toBe(
        'map_kpa\\rpm,800,2500,10000\r\n30,35.5,60,72.25\r\n101.3,80,99.9,101\r\n',
      );
    });

    it('When exported as TSV, then tabs separate the same fields', async () => {
      const res = await tuner.get(`/api/revisions/${table.headRevisionId}/export?format=tsv`);
      expect(res.status).toBe(200);
      expect(res.headers['content-type']).toBe('text/tab-separated-values; charset=utf-8');
      expect(res.headers['content-disposition']).toBe('attachment; filename=main-ve-e85-r1.tsv');
      expect(res.text).toBe(
        'map_kpa\\rpm\t800\t2500\t10000\r\n30\t35.5\t60\t72.25\r\n101.3\t80\t99.9\t101\r\n',
      );
    });

    it('When no format is given, then CSV; another format, then 400', async () => {
      const plain = await tuner.get(`/api/revisions/${table.headRevisionId}/export`);
      expect(plain.headers['content-type']).toBe('text/csv; charset=utf-8');
      const xlsx = await tuner.get(`/api/revisions/${table.headRevisionId}/export?format=xlsx`);
      expect(xlsx.status).toBe(400);
      expect(xlsx.body.error.details.issues[0]).toEqual({
        path: 'query.format',
        message: 'format must be csv or tsv',
      });
    });

    it('When the revision belongs to another shop, then 404', async () => {
      const res = await tuner.get(`/api/revisions/${foreign.headRevisionId}/export`);
      expect(res.status).toBe(404);
    });
  });

  describe('GET /api/revisions/compare', () => {
    const axes = { rpmAxis: [1000, 2000, 3000], mapAxisKpa: [40, 100] };
    let table: CreatedTable;
    let b: Revision;

    beforeAll(async () => {
      table = await createTable(tuner, vehicle.id, {
        ...axes,
        values: [
          [50, 60, 70],
          [80, 90, 100],
        ],
      });
      const res = await addRevision(table, {
        parentId: table.headRevisionId,
        values: [
          [55, 60, 70],
          [72, 90, 99],
        ],
        message: 'Leaner at high load',
      });
      b = res.body as Revision;
    });

    it('When a reviewer compares two revisions, then the diff and summary are as by hand', async () => {
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      const res = await reviewer.get(`/api/revisions/compare?a=${table.headRevisionId}&b=${b.id}`);
      expect(res.status).toBe(200);
      expect(res.body.a).toMatchObject({ id: table.headRevisionId, number: 1 });
      expect(res.body.b).toMatchObject({ id: b.id, number: 2, values: b.values });
      // By hand: 50→55 is +5 points (+10 %), 80→72 is −8 (−10 %), 100→99 is −1 (−1 %).
      expect(res.body.diff.absolute).toEqual([
        [5, 0, 0],
        [-8, 0, -1],
      ]);
      const percent = res.body.diff.percent as number[][];
      [
        [10, 0, 0],
        [-10, 0, -1],
      ].forEach((row, r) => row.forEach((v, c) => expect(percent[r]?.[c]).toBeCloseTo(v, 10)));
      // Three cells moved; mean |change| (10 + 10 + 1) / 3 = 7 %; one richer, two leaner.
      const { summary } = res.body;
      expect(summary).toMatchObject({ cellsChanged: 3, richer: 1, leaner: 2 });
      expect(summary.meanChangePct).toBeCloseTo(7, 10);
      expect(summary.maxChangePct).toBeCloseTo(10, 10);
    });

    it('When the tables have different axes, then 409; the same axes, then 200', async () => {
      const wider = await createTable(tuner, vehicle.id, {
        rpmAxis: [1000, 2000, 3500],
        mapAxisKpa: axes.mapAxisKpa,
        values: [
          [50, 60, 70],
          [80, 90, 100],
        ],
      });
      const res = await tuner.get(`/api/revisions/compare?a=${b.id}&b=${wider.headRevisionId}`);
      expect(res.status).toBe(409);
      const twin = await createTable(tuner, vehicle.id, {
        ...axes,
        values: [
          [50, 60, 70],
          [80, 90, 100],
        ],
      });
      const same = await tuner.get(`/api/revisions/compare?a=${b.id}&b=${twin.headRevisionId}`);
      expect(same.status).toBe(200);
      expect(same.body.summary.cellsChanged).toBe(3);
    });

    it('When either revision belongs to another shop or is missing, then 404', async () => {
      const a = table.headRevisionId;
      const foreignB = await tuner.get(`/api/revisions/compare?a=${a}&b=${foreign.headRevisionId}`);
      expect(foreignB.status).toBe(404);
      const foreignA = await tuner.get(`/api/revisions/compare?a=${foreign.headRevisionId}&b=${a}`);
      expect(foreignA.status).toBe(404);
      expect((await tuner.get(`/api/revisions/compare?a=${a}&b=${randomUUID()}`)).status).toBe(404);
    });

    it('When a or b is missing from the query, then 400 on the query, not on an id', async () => {
      const res = await tuner.get(`/api/revisions/compare?a=${table.headRevisionId}`);
      expect(res.status).toBe(400);
      expect(res.body.error.details.issues[0].path).toBe('query.b');
    });
  });
});
