/**
 * The seeded log simulator: a vehicle driven on the road or held on a dyno, its ECU fuelling
 * from a wrong VE table, and a wideband reading the result through transport delay, sensor lag
 * and noise. `simulateSamples` yields one sample at a time so a million-row file can be
 * streamed; `simulateLog` collects a run into the pipeline's `ColumnarLog`.
 */
import { type ColumnarLog } from '../core/channels';
import { type VeTable, validateTable } from '../core/table';
import { airMassFlowGps } from '../physics/air-mass';
import { DEMO_HATCH } from './demo-vehicles';
import {
  createDynoOperator,
  defaultDynoHolds,
  type DynoHold,
  dynoGearFor,
  dynoSessionSeconds,
} from './dyno-operator';
import { createSimEcu } from './ecu-model';
import { steadyBoostKpa, steadyMapKpa } from './engine-model';
import { createRoadDriver } from './road-driver';
import { createSeededRandom, type SeededRandom } from './seeded-random';
import { type SimVehicle } from './sim-vehicle';
import {
  ecuVeTable,
  type LambdaTargetTable,
  lambdaTargetTable,
  trueVeFraction,
} from './ve-surface';
import { createSimWideband, type WidebandOptions } from './wideband-model';
import { samplesToLog, type SimSample } from './sim-sample';

/** Options of a simulation. Every field has a default. */
export interface SimulationOptions {
  /** The vehicle; default the demo hatch. */
  vehicle?: SimVehicle;
  /** A road drive or a steady dyno session; default `road`. */
  kind?: 'road' | 'dyno';
  /** Seed of every random choice; the same seed gives the same log. Default 1. */
  seed?: number;
  /** Samples per second, 1–1000; default 20. */
  sampleRateHz?: number;
  /** Length of the log, s; default 600 on the road, one pass of the holds on the dyno. */
  durationS?: number;
  /** The VE table the ECU runs; default {@link ecuVeTable} of the vehicle. */
  ecuTable?: VeTable;
  /** The commanded-lambda table; default {@link lambdaTargetTable} of the vehicle. */
  lambdaTable?: LambdaTargetTable;
  /** Barometric pressure, kPa; default 101.3. */
  baroKpa?: number;
  /** Ambient temperature, °C; default 25. */
  ambientC?: number;
  /** Coolant temperature at the start, °C; default 30 on the road (a cold start), 80 on a dyno. */
  startEctC?: number;
  /** Road: highest speed the driver aims for, km/h; default 120. */
  speedCapKph?: number;
  /** Dyno: the holds to run (repeated to fill the duration); default {@link defaultDynoHolds}. */
  holds?: readonly DynoHold[];
  /** Dyno: the gear, 1-based; default the gear closest to 1:1. */
  dynoGear?: number;
  /**
   * Wideband delay, lag, noise and range settings; `maxLambda` is the ceiling the sensor reports
   * on fuel cut (default 1.6).
   */
  wideband?: WidebandOptions;
}

/** Manifold filling time constant, s: a few engine cycles at ordinary speeds. */
const MANIFOLD_TIME_S = 0.08;

function positiveOption(value: number | undefined, fallback: number, name: string): number {
  const v = value ?? fallback;
  if (!Number.isFinite(v) || v <= 0)
    throw new Error(`simulate: options.${name} must be greater than 0`);
  return v;
}

/** Yields the samples of a simulated log, one per time step, in time order. */
export function* simulateSamples(options: SimulationOptions = {}): Generator<SimSample> {
  const vehicle = options.vehicle ?? DEMO_HATCH;
  const kind = options.kind ?? 'road';
  const seed = options.seed ?? 1;
  const rate = positiveOption(options.sampleRateHz, 20, 'sampleRateHz');
  if (rate > 1000) throw new Error('simulate: options.sampleRateHz must be at most 1000');
  const baroKpa = positiveOption(options.baroKpa, 101.3, 'baroKpa');
  const ambientC = options.ambientC ?? 25;
  const ecuTable = options.ecuTable ?? ecuVeTable(vehicle);
  validateTable(ecuTable, 'simulate: options.ecuTable');
  const lambdaTable = options.lambdaTable ?? lambdaTargetTable(vehicle);
  const holds = options.holds ?? defaultDynoHolds(vehicle, baroKpa);
  const durationS = positiveOption(
    options.durationS,
    kind === 'road' ? 600 : dynoSessionSeconds(holds) + 4 * holds.length,
    'durationS',
  );
  // Separate streams per part, so a change in one part's draws leaves the others' alone.
  const randomFor = (part: number): SeededRandom =>
    createSeededRandom((Math.imul(seed | 0, 2654435761) + part * 40503) >>> 0);
  const driverRandom = randomFor(1);
  const knockRandom = randomFor(4);
  const channelRandom = randomFor(5);
  const driver =
    kind === 'road'
      ? createRoadDriver(
          vehicle,
          { speedCapKph: options.speedCapKph ?? 120, startIdleS: 45 },
          driverRandom,
        )
      : createDynoOperator(vehicle, holds, options.dynoGear ?? dynoGearFor(vehicle), driverRandom);
  const ecu = createSimEcu(vehicle, ecuTable, lambdaTable, randomFor(2));
  const wideband = createSimWideband(options.wideband ?? {}, randomFor(3));
  const { engine } = vehicle;

  const dtS = 1 / rate;
  const count = Math.floor(durationS * rate);
  let mapKpa = steadyMapKpa(0, vehicle.idleRpm, baroKpa);
  let boostKpa = 0;
  let iatC = ambientC + 8;
  let ectC = options.startEctC ?? (kind === 'road' ? 30 : 80);
  let lambdaMeasured = 1;
  let isFuelCut = false;
  let knockDeg = 0;
  for (let i = 0; i < count; i++) {
    const timeS = i * dtS;
    const point = driver.step(dtS, { mapKpa, iatC, ectC, baroKpa, isFuelCut });
    const rpm = Math.max(0, point.rpm);

    // Air path: the turbo builds boost slowly, the manifold fills fast.
    const boostGoal = steadyBoostKpa(point.tpsPct, rpm, vehicle);
    boostKpa += (boostGoal - boostKpa) * (1 - Math.exp(-dtS / vehicle.turboLagS));
    const mapGoal = steadyMapKpa(point.tpsPct, rpm, baroKpa + boostKpa);
    mapKpa += (mapGoal - mapKpa) * (1 - Math.exp(-dtS / MANIFOLD_TIME_S));

    // Temperatures: heat soak at low air speed and charge heating under boost; the coolant
    // warms with the fuel burnt until the thermostat holds it near 90 °C.
    const trueVe = trueVeFraction(rpm, mapKpa, vehicle.veShape);
    const airGps = rpm > 0 ? airMassFlowGps(trueVe, mapKpa, iatC, engine.displacementL, rpm) : 0;
    const iatGoal =
      ambientC + 12 * Math.exp(-point.coolingAirKph / 25) + 0.08 * Math.max(0, mapKpa - baroKpa);
    iatC += (iatGoal - iatC) * (1 - Math.exp(-dtS / 20));
    ectC =
      ectC < 88
        ? ectC + dtS * (0.1 + 0.015 * airGps)
        : ectC + (90 + 0.03 * airGps - ectC) * (1 - Math.exp(-dtS / 40));

    const out = ecu.step({ dtS, rpm, mapKpa, iatC, ectC, tpsPct: point.tpsPct, lambdaMeasured });
    isFuelCut = out.isFuelCut;
    // λ = true air / (AFR_st · fuel), with the ECU's fuel computed for its own air estimate.
    const lambdaExhaust =
      out.isFuelCut || out.fuelMgPerEvent <= 0
        ? Number.POSITIVE_INFINITY
        : (out.lambdaTarget * (trueVe * 100)) /
          out.veEcuPct /
          (1 + out.stftPct / 100) /
          (1 + out.ltftPct / 100) /
          out.enrichment;
    lambdaMeasured = wideband.read(timeS, dtS, lambdaExhaust, airGps);

    // Occasional light knock under boost at low speed, retard decaying at 1°/s.
    knockDeg = Math.max(0, knockDeg - dtS);
    if (mapKpa > 140 && rpm < 4000 && knockRandom.next() < 0.3 * dtS)
      knockDeg += knockRandom.between(1, 3);

    yield {
      timeS,
      rpm,
      mapKpa: mapKpa + 0.1 * channelRandom.normal(),
      baroKpa,
      lambdaMeasured,
      lambdaTarget: out.lambdaTarget,
      iatC,
      ectC,
      tpsPct: point.tpsPct,
      stftPct: out.stftPct,
      ltftPct: out.ltftPct,
      closedLoop: out.isClosedLoop ? 1 : 0,
      fuelCut: out.isFuelCut ? 1 : 0,
      gear: point.gear,
      speedKph: point.speedKph,
      knockDeg,
      injDutyPct: out.injDutyPct,
      truth: {
        lambdaExhaust,
        trueVePct: trueVe * 100,
        ecuVePct: out.veEcuPct,
        mapKpa,
        airGps,
        enrichment: out.enrichment,
      },
    };
  }
}

/** Simulates a whole log and returns it as a `ColumnarLog` in canonical units. */
export function simulateLog(options: SimulationOptions = {}): ColumnarLog {
  return samplesToLog(simulateSamples(options));
}
