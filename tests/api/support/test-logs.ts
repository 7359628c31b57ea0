import type request from 'supertest';
import { revisions, vehicles, veTables } from '../../../db/schema';
import type { Database } from '../../../server/db';
import type { LogResource, LogStatus } from '../../../shared/contracts/logs';
import { csvText, DEMO_HATCH, simulateSamples, type CsvStyle } from '../../../shared/sim';
import type { ApiClient } from './api-client';

/** The demo hatch's stoichiometric AFR: the vehicles made here run on gasoline. */
export const TEST_STOICH_AFR = DEMO_HATCH.engine.stoichAfr;

/** Inserts a vehicle (the demo hatch's facts) straight into a shop; returns its id. */
export async function insertTestVehicle(
  db: Database,
  shopId: string,
  label = 'Log test hatch',
): Promise<string> {
  const { engine, gearing } = DEMO_HATCH;
  const [row] = await db
    .insert(vehicles)
    .values({
      shopId,
      label,
      displacementL: engine.displacementL,
      cylinders: engine.cylinders,
      fuel: engine.fuel,
      stoichAfr: engine.stoichAfr,
      injectorCcMin: engine.injectorCcMin,
      tireDiameterMm: gearing.tireDiameterMm,
      gearRatios: [...gearing.gearRatios],
      finalDrive: gearing.finalDrive,
    })
    .returning({ id: vehicles.id });
  if (!row) throw new Error('insertTestVehicle: no row');
  return row.id;
}

/** Inserts a small table with its first revision on a vehicle; returns the revision's id. */
export async function insertTestRevision(
  db: Database,
  shopId: string,
  vehicleId: string,
  authorId: string,
): Promise<string> {
  const [table] = await db
    .insert(veTables)
    .values({ shopId, vehicleId, name: 'Main VE', rpmAxis: [1000, 3000], mapAxisKpa: [40, 100] })
    .returning({ id: veTables.id });
  if (!table) throw new Error('insertTestRevision: no table');
  const [revision] = await db
    .insert(revisions)
    .values({
      shopId,
      tableId: table.id,
      number: 1,
      values: [
        [40, 50],
        [70, 85],
      ],
      authorId,
    })
    .returning({ id: revisions.id });
  if (!revision) throw new Error('insertTestRevision: no revision');
  return revision.id;
}

/** A simulated 60 s dyno session of the demo hatch as CSV text in one of the simulator's styles. */
export function simulatedCsv(style: CsvStyle, seed: number, durationS = 60): string {
  return csvText(simulateSamples({ vehicle: DEMO_HATCH, kind: 'dyno', seed, durationS }), style, {
    stoichAfr: TEST_STOICH_AFR,
  });
}

/** The text fields of an upload. */
export interface UploadFields {
  mapping?: object | string;
  kind?: string;
  ecuRevisionId?: string;
}

/** Uploads a log as `client` (multipart, with the XSRF header as the browser sends it). */
export function postLog(
  client: ApiClient,
  vehicleId: string,
  content: string | Buffer,
  fields: UploadFields = {},
  fileName = 'session.csv',
): request.Test {
  let req = client.agent
    .post(`/api/vehicles/${vehicleId}/logs`)
    .set('X-XSRF-TOKEN', client.xsrf)
    .field('kind', fields.kind ?? 'dyno');
  if (fields.mapping !== undefined) {
    const text =
      typeof fields.mapping === 'string' ? fields.mapping : JSON.stringify(fields.mapping);
    req = req.field('mapping', text);
  }
  if (fields.ecuRevisionId !== undefined) req = req.field('ecuRevisionId', fields.ecuRevisionId);
  return req.attach('file', Buffer.isBuffer(content) ? content : Buffer.from(content), fileName);
}

/** Polls `GET /api/logs/:id` until the log is in one of `statuses`; returns it. */
export async function waitForLog(
  client: ApiClient,
  logId: string,
  statuses: readonly LogStatus[] = ['ready', 'failed'],
  timeoutMs = 20_000,
): Promise<LogResource> {
  const deadline = Date.now() + timeoutMs;
  for (;;) {
    const res = await client.get(`/api/logs/${logId}`);
    if (res.status !== 200) throw new Error(`GET /api/logs/${logId} answered ${res.status}`);
    const log = res.body as LogResource;
    if (statuses.includes(log.status)) return log;
    if (Date.now() > deadline) {
      throw new Error(`log ${logId} is still ${log.status} after ${timeoutMs} ms`);
    }
    await new Promise((resolve) => setTimeout(resolve, 50));
  }
}
