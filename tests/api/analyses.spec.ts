import { analysisResourceSchema } from '../../shared/contracts/analyses';
import { revisionSchema, type Revision } from '../../shared/contracts/tables';
import type { VeTable } from '../../shared/core/table';
import {
  csvText,
  DEMO_HATCH,
  ecuVeTable,
  simulateSamples,
  trueVeTable,
  type CsvStyle,
} from '../../shared/sim';
import { signedIn, type ApiClient } from './support/api-client';
import { createTable, createVehicle } from './support/test-data';
import { postLog, waitForLog } from './support/test-logs';
import { startTestApp, type TestApp } from './support/test-app';
import { createTestShop, TEST_PASSWORD, type TestShop } from './support/test-shop';

const vehicleFacts = {
  label: 'Analysis test hatch',
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

/** Mean |table/truth − 1| over all cells, %. */
function errorPct(values: readonly (readonly number[])[], truth: VeTable): number {
  let sum = 0;
  let n = 0;
  values.forEach((row, r) =>
    row.forEach((v, c) => {
      sum += Math.abs(v / (truth.values[r]?.[c] as number) - 1);
      n++;
    }),
  );
  return (100 * sum) / n;
}

/** Parses the exported CSV back into values. */
function valuesFromCsv(text: string): number[][] {
  return text
    .trim()
    .split(/\r?\n/)
    .slice(1)
    .map((line) => line.split(',').slice(1).map(Number));
}

describe('analyses', () => {
  let t: TestApp;
  let shop: TestShop;
  let other: TestShop;
  let tuner: ApiClient;
  let tableId: string;
  let baseRevisionId: string;
  let vehicleId: string;
  const logIds: string[] = [];
  const ecu = ecuVeTable(DEMO_HATCH);
  const truth = trueVeTable(DEMO_HATCH);

  async function uploadSession(
    kind: 'road' | 'dyno',
    style: CsvStyle,
    seed: number,
  ): Promise<string> {
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
    const res = await postLog(
      tuner,
      vehicleId,
      text,
      { kind, ecuRevisionId: baseRevisionId },
      `${kind}-${style}.csv`,
    );
    expect(res.status).toBe(202);
    const log = await waitForLog(tuner, res.body.id as string, ['ready', 'failed'], 60_000);
    expect(log.status).toBe('ready');
    return log.id;
  }

  beforeAll(async () => {
    t = await startTestApp();
    shop = await createTestShop(t.db, 'analyses');
    other = await createTestShop(t.db, 'analyses-other');
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
    logIds.push(await uploadSession('road', 'snake', 11));
    logIds.push(await uploadSession('dyno', 'bracketed', 12));
    logIds.push(await uploadSession('road', 'unitsrow', 13));
  }, 120_000);
  afterAll(() => t.close());

  describe('POST /api/tables/:id/analyses → POST /api/analyses/:id/apply → export', () => {
    it('When a tuner analyses logs in every style and applies, then the export is closer to the truth', async () => {
      const created = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds,
      });
      expect(created.status).toBe(201);
      // The answer is exactly the shared contract (server and client both use it).
      const analysis = analysisResourceSchema.parse(created.body);
      expect(analysis.cells).toHaveLength(16);
      expect(analysis.cells[0]).toHaveLength(16);
      expect(analysis.proposal).toHaveLength(16);
      expect(analysis.filterReport.logs).toHaveLength(3);
      expect(analysis.filterReport.logs[0].funnel.length).toBeGreaterThan(3);
      expect(analysis.filterReport.cellsTrusted).toBeGreaterThan(30);
      expect(Array.isArray(analysis.leanFlags)).toBe(true);

      const applied = await tuner.post(`/api/analyses/${analysis.id}/apply`, { stepFraction: 1 });
      expect(applied.status).toBe(201);
      const revision = revisionSchema.parse(applied.body);
      expect(revision).toMatchObject({ number: 2, status: 'draft', parentId: baseRevisionId });
      expect(revision.analysisId).toBe(analysis.id);

      const exported = await tuner.get(`/api/revisions/${revision.id}/export?format=csv`);
      expect(exported.status).toBe(200);
      const before = errorPct(ecu.values, truth);
      const after = errorPct(valuesFromCsv(exported.text), truth);
      expect(after).toBeLessThan(0.75 * before);

      const read = await tuner.get(`/api/analyses/${analysis.id}`);
      expect(read.status).toBe(200);
      expect(read.body.proposal).toEqual(analysis.proposal);
    });

    it('When cells are locked or only some are selected, then the others keep the base values', async () => {
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds,
      });
      const trusted: [number, number][] = [];
      analysis.cells.forEach((row: { status: string; changePct: number }[], r: number) =>
        row.forEach(
          (cell, c) =>
            cell.status === 'trusted' && Math.abs(cell.changePct) > 0.5 && trusted.push([r, c]),
        ),
      );
      expect(trusted.length).toBeGreaterThan(2);
      const [lockedCell, onlyCell] = trusted as [[number, number], [number, number]];
      const locked = await tuner.post(`/api/analyses/${analysis.id}/apply`, {
        lockedCells: [lockedCell],
      });
      expect(locked.status).toBe(201);
      expect(locked.body.values[lockedCell[0]][lockedCell[1]]).toBe(
        ecu.values[lockedCell[0]]?.[lockedCell[1]],
      );

      const only = await tuner.post(`/api/analyses/${analysis.id}/apply`, {
        onlyCells: [onlyCell],
        smooth: 0,
      });
      expect(only.status).toBe(201);
      let changed = 0;
      (only.body.values as number[][]).forEach((row, r) =>
        row.forEach((v, c) => v !== ecu.values[r]?.[c] && changed++),
      );
      expect(changed).toBe(1);
      expect(only.body.values[onlyCell[0]][onlyCell[1]]).not.toBe(
        ecu.values[onlyCell[0]]?.[onlyCell[1]],
      );
    });

    it('When a road log is applied with the defaults, then no guessed cell under load is leaner than the base beyond the allowance', async () => {
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[0]],
      });
      // The simulated logs carry no barometer and start with the engine running.
      expect(analysis.guard).toMatchObject({
        loadLinePercentOfBaro: 90,
        leanAllowancePercent: 1,
        baroSource: 'assumed',
      });
      expect(analysis.guard.loadLineKpa).toBeCloseTo(91.19, 2);
      const applied = await tuner.post(`/api/analyses/${analysis.id}/apply`, {});
      expect(applied.status).toBe(201);
      const revision = applied.body as Revision;
      expect(revision.applied).not.toBeNull();
      const record = revision.applied as NonNullable<Revision['applied']>;
      expect(record.guard).toEqual(analysis.guard);
      expect(record.counts.measured).toBeGreaterThan(10);
      const floor = 1 - analysis.guard.leanAllowancePercent / 100;
      let guessedUnderLoad = 0;
      record.origin.forEach((row, r) =>
        row.forEach((origin, c) => {
          const base = ecu.values[r]?.[c] as number;
          const value = revision.values[r]?.[c] as number;
          if (origin === 'held') expect(value).toBe(base);
          if ((ecu.mapAxisKpa[r] as number) < analysis.guard.loadLineKpa) return;
          if (origin === 'filled' || origin === 'held') {
            guessedUnderLoad++;
            // Stored VE is rounded to hundredths.
            expect(value).toBeGreaterThanOrEqual(base * floor - 0.005);
          }
        }),
      );
      expect(guessedUnderLoad).toBeGreaterThan(0);
      expect(record.heldCells).toHaveLength(record.counts.held);
      for (const [r, c] of record.heldCells) expect(record.origin[r]?.[c]).toBe('held');

      const read = await tuner.get(`/api/revisions/${revision.id}`);
      expect(read.body.applied).toEqual(record);
    });

    it('When the tuner turns the guard off, then the revision records it and says so', async () => {
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[0]],
      });
      const off = await tuner.post(`/api/analyses/${analysis.id}/apply`, { guard: false });
      expect(off.status).toBe(201);
      expect(off.body.applied.guard).toBeNull();
      expect(off.body.applied.counts.held).toBe(0);
      expect(off.body.message).toMatch(/guard under load turned OFF/);
    });

    it('When the vehicle moves its load line, then the analysis guard follows it', async () => {
      const patched = await tuner.patch(`/api/vehicles/${vehicleId}`, {
        fuelSafety: { loadLinePercentOfBaro: 80, leanAllowancePercent: 0.5 },
      });
      expect(patched.status).toBe(200);
      expect(patched.body.fuelSafety).toEqual({
        loadLinePercentOfBaro: 80,
        leanAllowancePercent: 0.5,
      });
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[0]],
      });
      expect(analysis.guard.loadLineKpa).toBeCloseTo(81.06, 2);
      expect(analysis.guard.leanAllowancePercent).toBe(0.5);
      const bad = await tuner.patch(`/api/vehicles/${vehicleId}`, {
        fuelSafety: { leanAllowancePercent: 20 },
      });
      expect(bad.status).toBe(400);
      await tuner.patch(`/api/vehicles/${vehicleId}`, {
        fuelSafety: { loadLinePercentOfBaro: 90, leanAllowancePercent: 1 },
      });
    });

    it('When the settings are invalid, then 400 names the field', async () => {
      const zero = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds,
        settings: { stepFraction: 0 },
      });
      expect(zero.status).toBe(400);
      expect(zero.body.error.message).toMatch(/stepFraction/);
      const rule = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds,
        settings: { filters: [{ kind: 'moonPhase' }] },
      });
      expect(rule.status).toBe(400);
      const expression = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[1]],
        settings: { filters: [{ kind: 'expression', source: 'evaluate("1")' }] },
      });
      expect(expression.status).toBe(400);
      const cell = await tuner.post(
        `/api/analyses/${(await tuner.post(`/api/tables/${tableId}/analyses`, { baseRevisionId, logIds: [logIds[1]] })).body.id}/apply`,
        {
          lockedCells: [[99, 0]],
        },
      );
      expect(cell.status).toBe(400);
      expect(cell.body.error.message).toMatch(/lockedCells/);
    });

    it('When an operator or reviewer analyses or applies, then 403', async () => {
      const operator = await signedIn(t.app, shop.emails.operator, TEST_PASSWORD);
      expect(
        (await operator.post(`/api/tables/${tableId}/analyses`, { baseRevisionId, logIds })).status,
      ).toBe(403);
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[1]],
      });
      const reviewer = await signedIn(t.app, shop.emails.reviewer, TEST_PASSWORD);
      expect((await reviewer.post(`/api/analyses/${analysis.id}/apply`, {})).status).toBe(403);
      expect((await reviewer.get(`/api/analyses/${analysis.id}`)).status).toBe(200);
    });

    it('When another shop asks, then its table, logs and analyses are 404', async () => {
      const { body: analysis } = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId,
        logIds: [logIds[1]],
      });
      const stranger = await signedIn(t.app, other.emails.tuner, TEST_PASSWORD);
      expect(
        (await stranger.post(`/api/tables/${tableId}/analyses`, { baseRevisionId, logIds })).status,
      ).toBe(404);
      expect((await stranger.get(`/api/analyses/${analysis.id}`)).status).toBe(404);
      expect((await stranger.post(`/api/analyses/${analysis.id}/apply`, {})).status).toBe(404);
      const theirVehicle = await createVehicle(stranger, vehicleFacts);
      const theirTable = await createTable(stranger, theirVehicle.id, {
        rpmAxis: [...ecu.rpmAxis],
        mapAxisKpa: [...ecu.mapAxisKpa],
        values: ecu.values.map((row) => [...row]),
      });
      const mixed = await stranger.post(`/api/tables/${theirTable.id}/analyses`, {
        baseRevisionId: theirTable.headRevisionId,
        logIds: [logIds[0]],
      });
      expect(mixed.status).toBe(404);
    });

    it('When a log of another vehicle or a base revision of another table is given, then 409', async () => {
      const second = await createVehicle(tuner, { ...vehicleFacts, label: 'Second hatch' });
      const secondTable = await createTable(tuner, second.id, {
        rpmAxis: [...ecu.rpmAxis],
        mapAxisKpa: [...ecu.mapAxisKpa],
        values: ecu.values.map((row) => [...row]),
      });
      const wrongLog = await tuner.post(`/api/tables/${secondTable.id}/analyses`, {
        baseRevisionId: secondTable.headRevisionId,
        logIds: [logIds[0]],
      });
      expect(wrongLog.status).toBe(409);
      const wrongBase = await tuner.post(`/api/tables/${tableId}/analyses`, {
        baseRevisionId: secondTable.headRevisionId,
        logIds,
      });
      expect(wrongBase.status).toBe(409);
    });
  });
});
