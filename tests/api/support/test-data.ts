import type { CreateTableRequest, VeTableResource } from '../../../shared/contracts/tables';
import type { CreateVehicleInput, Vehicle } from '../../../shared/contracts/vehicles';
import type { ApiClient } from './api-client';

/** An invented four-cylinder road car on gasoline; `overrides` replace top-level fields. */
export function vehicleBody(overrides: Partial<CreateVehicleInput> = {}): CreateVehicleInput {
  return {
    label: 'Test hatch 2.0 turbo',
    description: 'Bigger intercooler, 3 in downpipe',
    engine: { displacementL: 2, cylinders: 4, fuel: 'gasoline', injectorCcMin: 550 },
    gearing: { tireDiameterMm: 634, gearRatios: [3.45, 2.05, 1.38, 1.03, 0.8], finalDrive: 3.9 },
    ...overrides,
  };
}

/** A small 3 × 4 table (MAP 40, 70, 100 kPa × RPM 1000–4000); `overrides` replace fields. */
export function tableBody(overrides: Partial<CreateTableRequest> = {}): CreateTableRequest {
  return {
    name: 'Main VE',
    rpmAxis: [1000, 2000, 3000, 4000],
    mapAxisKpa: [40, 70, 100],
    values: [
      [40, 45, 50, 48],
      [55, 62, 70, 68],
      [70, 80, 88, 85],
    ],
    ...overrides,
  };
}

/** Throws with the answer's text unless the status is `expected` (keeps arrange steps honest). */
function expectStatus(res: { status: number; text: string }, expected: number, what: string): void {
  if (res.status !== expected) {
    throw new Error(`${what} answered ${res.status}, not ${expected}: ${res.text}`);
  }
}

/** Creates a vehicle as `client` (a tuner or admin) and returns it. */
export async function createVehicle(
  client: ApiClient,
  overrides: Partial<CreateVehicleInput> = {},
): Promise<Vehicle> {
  const res = await client.post('/api/vehicles', vehicleBody(overrides));
  expectStatus(res, 201, 'POST /api/vehicles');
  return res.body as Vehicle;
}

/** Creates a table with its first revision on a vehicle as `client` (a tuner). */
export async function createTable(
  client: ApiClient,
  vehicleId: string,
  overrides: Partial<CreateTableRequest> = {},
): Promise<VeTableResource & { headRevisionId: string }> {
  const res = await client.post(`/api/vehicles/${vehicleId}/tables`, tableBody(overrides));
  expectStatus(res, 201, `POST /api/vehicles/${vehicleId}/tables`);
  return res.body as VeTableResource & { headRevisionId: string };
}

/** Creates a vehicle and a table on it as `client` (a tuner); returns both. */
export async function createVehicleWithTable(
  client: ApiClient,
  table: Partial<CreateTableRequest> = {},
): Promise<{ vehicle: Vehicle; table: VeTableResource & { headRevisionId: string } }> {
  const vehicle = await createVehicle(client);
  return { vehicle, table: await createTable(client, vehicle.id, table) };
}
