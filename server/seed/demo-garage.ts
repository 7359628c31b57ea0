import { createHash, randomUUID } from 'node:crypto';
import { mkdirSync, writeFileSync } from 'node:fs';
import { join } from 'node:path';
import { gzipSync } from 'node:zlib';
import { and, eq } from 'drizzle-orm';
import { createVehicleRequestSchema } from '../../shared/contracts/vehicles';
import {
  csvText,
  DEMO_HATCH,
  DEMO_ROADSTER,
  DEMO_WAGON,
  ecuVeTable,
  simulateSamples,
  type CsvStyle,
} from '../../shared/sim';
import type { SimVehicle } from '../../shared/sim/sim-vehicle';
import type { AppConfig } from '../config';
import type { AppContext } from '../context';
import type { Database } from '../db';
import { findSignInCandidate, type SessionUserRecord } from '../repositories/users.repository';
import { createAnalysis } from '../services/analyses.service';
import { parseStoredLog } from '../services/log-parse.service';
import { uploadTmpDir, type ReceivedFile } from '../services/log-storage.service';
import { uploadLog } from '../services/log-upload.service';
import { createTable } from '../services/tables.service';
import { addVehicle } from '../services/vehicles.service';
import { vehicles } from '../../db/schema';

/** One simulated session of a demo vehicle. */
interface DemoSession {
  kind: 'road' | 'dyno';
  style: CsvStyle;
  seed: number;
}

/** A demo vehicle, the sessions logged on it, and whether an analysis is run over them. */
interface DemoVehiclePlan {
  vehicle: SimVehicle;
  sessions: DemoSession[];
  analyse: boolean;
}

/** The demo shop's garage: every vehicle, label and log is invented by our simulator. */
const DEMO_GARAGE: Record<string, { tuner: string; plans: DemoVehiclePlan[] }> = {
  demo: {
    tuner: 'tuner@cellsmith.test',
    plans: [
      {
        vehicle: DEMO_HATCH,
        sessions: [
          { kind: 'road', style: 'snake', seed: 101 },
          { kind: 'dyno', style: 'bracketed', seed: 102 },
        ],
        analyse: true,
      },
      {
        vehicle: DEMO_ROADSTER,
        sessions: [{ kind: 'road', style: 'unitsrow', seed: 201 }],
        analyse: true,
      },
      {
        vehicle: DEMO_WAGON,
        sessions: [{ kind: 'dyno', style: 'snake', seed: 301 }],
        analyse: false,
      },
    ],
  },
  other: {
    tuner: 'tuner@other.test',
    plans: [
      {
        vehicle: DEMO_ROADSTER,
        sessions: [{ kind: 'road', style: 'snake', seed: 401 }],
        analyse: true,
      },
    ],
  },
};

async function vehicleExists(db: Database, shopId: string, label: string): Promise<boolean> {
  const rows = await db
    .select({ id: vehicles.id })
    .from(vehicles)
    .where(and(eq(vehicles.shopId, shopId), eq(vehicles.label, label)))
    .limit(1);
  return rows.length > 0;
}

/** A simulated session written as CSV and received as an upload would be. */
function receivedSession(
  dataDir: string,
  plan: DemoVehiclePlan,
  session: DemoSession,
): ReceivedFile {
  const { vehicle } = plan;
  const text = csvText(
    simulateSamples({
      vehicle,
      kind: session.kind,
      seed: session.seed,
      durationS: session.kind === 'road' ? 900 : undefined,
    }),
    session.style,
    { vehicleLabel: vehicle.label, stoichAfr: vehicle.engine.stoichAfr },
  );
  const bytes = Buffer.from(text);
  const tmpPath = join(uploadTmpDir(dataDir), `${randomUUID()}.csv.gz`);
  mkdirSync(uploadTmpDir(dataDir), { recursive: true });
  writeFileSync(tmpPath, gzipSync(bytes, { level: 1 }));
  return {
    tmpPath,
    fileName: `${vehicle.label.toLowerCase().replace(/\W+/g, '-')}-${session.kind}-${session.seed}.csv`,
    sizeBytes: bytes.length,
    sha256: createHash('sha256').update(bytes).digest('hex'),
    head: bytes.subarray(0, 256 * 1024),
  };
}

/** Adds one demo vehicle with its table, its parsed logs and (if planned) an analysis. */
async function seedVehicle(
  ctx: AppContext,
  tuner: SessionUserRecord,
  plan: DemoVehiclePlan,
): Promise<void> {
  const { vehicle } = plan;
  const created = await addVehicle(
    ctx.db,
    tuner,
    createVehicleRequestSchema.parse({
      label: vehicle.label,
      description: vehicle.description,
      engine: vehicle.engine,
      gearing: vehicle.gearing,
    }),
  );
  const start = ecuVeTable(vehicle);
  const table = await createTable(ctx.db, tuner, created.id, {
    name: 'Main VE',
    rpmAxis: [...start.rpmAxis],
    mapAxisKpa: [...start.mapAxisKpa],
    values: start.values.map((row) => [...row]),
  });
  const logIds: string[] = [];
  for (const session of plan.sessions) {
    const file = receivedSession(ctx.config.dataDir, plan, session);
    const upload = await uploadLog(
      ctx,
      tuner,
      created.id,
      { kind: session.kind, ecuRevisionId: table.headRevisionId ?? undefined },
      file,
    );
    logIds.push(upload.id);
  }
  if (plan.analyse && table.headRevisionId) {
    await createAnalysis(ctx.db, tuner, table.id, { baseRevisionId: table.headRevisionId, logIds });
  }
}

/**
 * Seeds the demo shops' vehicles: each gets a table (the simulator's deliberately wrong ECU
 * table), simulated road and dyno logs stored and parsed as uploads are, and an analysis, so a
 * new user sees the job done on first start. Idempotent: a vehicle whose label the shop already
 * has is left alone. Returns how many vehicles were added.
 */
export async function seedDemoGarage(db: Database, config: AppConfig): Promise<number> {
  const ctx: AppContext = {
    config,
    db,
    mailer: { send: () => Promise.resolve(), close: () => undefined },
    capturedMailDir: null,
    // Parse at once, in this process: the seed must finish with every log ready.
    logJobs: {
      enqueueParse: async (target) => {
        await parseStoredLog({ db, dataDir: config.dataDir }, target, {
          pieceBytes: 1 << 20,
          signal: new AbortController().signal,
          isFinalAttempt: true,
        });
      },
    },
  };
  let added = 0;
  for (const { tuner: email, plans } of Object.values(DEMO_GARAGE)) {
    const candidate = await findSignInCandidate(db, email);
    if (!candidate) continue;
    const { passwordHash: _hash, isDisabled: _disabled, ...tuner } = candidate;
    for (const plan of plans) {
      if (await vehicleExists(db, tuner.shopId, plan.vehicle.label)) continue;
      await seedVehicle(ctx, tuner, plan);
      added++;
    }
  }
  return added;
}
