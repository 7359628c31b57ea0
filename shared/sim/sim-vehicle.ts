/**
 * What the simulator knows about a vehicle: the API's vehicle facts (label, engine, gearing)
 * plus the hidden truth a real car would not tell us — its true VE surface, how wrong its ECU's
 * table is, and the road-load and boost figures that shape its logs.
 */
import { type EngineSpec, type GearingSpec } from '../physics/vehicle-spec';

/** The breakpoints of a table. */
export interface TableAxes {
  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa absolute (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
}

/** 16 RPM × 16 MAP breakpoints, 500–7000 rpm and 20–200 kPa, for a turbocharged engine. */
export const BOOSTED_AXES: TableAxes = {
  rpmAxis: [
    500, 800, 1100, 1400, 1700, 2000, 2400, 2800, 3200, 3600, 4000, 4500, 5000, 5500, 6200, 7000,
  ],
  mapAxisKpa: [20, 30, 40, 50, 60, 70, 80, 90, 100, 110, 120, 135, 150, 165, 180, 200],
};

/** 16 RPM × 16 MAP breakpoints, 500–7000 rpm and 20–105 kPa, for a naturally aspirated engine. */
export const NA_AXES: TableAxes = {
  rpmAxis: BOOSTED_AXES.rpmAxis,
  mapAxisKpa: [20, 25, 30, 35, 40, 45, 50, 55, 60, 65, 70, 75, 80, 88, 96, 105],
};

/**
 * Parameters of a true VE surface (fractions, not percent). The surface is built in
 * `ve-surface.ts` from a speed curve, a residual-gas penalty that grows at low MAP and low
 * speed, an intake-tuning ripple that grows with load, and a turbine back-pressure penalty
 * under boost at high speed, so it is not a product of one-dimensional curves.
 */
export interface VeShape {
  /** VE at the peak, at full load (fraction). */
  readonly peakVe: number;
  /** Engine speed of the VE peak (near the torque peak), rpm. */
  readonly peakRpm: number;
  /** Loss per (1000 rpm)² below the peak. */
  readonly lowSpeedDrop: number;
  /** Loss per (1000 rpm)² above the peak. */
  readonly highSpeedDrop: number;
  /** Residual-gas penalty factor at low MAP. */
  readonly residual: number;
  /** Amplitude of the intake-tuning ripple at full load. */
  readonly ripple: number;
  /** Back-pressure penalty per bar of boost at 6000 rpm. */
  readonly boostPenalty: number;
}

/** How wrong the ECU's table is: a smooth field of a few percent plus one local bump. */
export interface EcuErrorField {
  /** Amplitude of the smooth waviness (fraction). */
  readonly amplitude: number;
  /** Tilt across the speed range (fraction from 3500 rpm to 7000 rpm). */
  readonly tilt: number;
  /** Overall offset (fraction; negative: the table is low, the engine runs lean). */
  readonly offset: number;
  /** Centre of the local bump, rpm. */
  readonly bumpRpm: number;
  /** Centre of the local bump, kPa. */
  readonly bumpMapKpa: number;
  /** Depth of the bump (fraction; negative: too little fuel there). */
  readonly bumpDepth: number;
}

/** A simulated vehicle. */
export interface SimVehicle {
  /** Invented label, e.g. "Demo hatch 1.6T". */
  readonly label: string;
  /** One line about it. */
  readonly description: string;
  /** Engine facts as the API stores them. */
  readonly engine: EngineSpec;
  /** Gearing facts as the API stores them. */
  readonly gearing: GearingSpec;
  /** Kerb mass with driver, kg. */
  readonly massKg: number;
  /** Drag coefficient × frontal area, m². */
  readonly dragAreaM2: number;
  /** Rolling-resistance coefficient. */
  readonly rollingCoeff: number;
  /** Warm idle speed, rpm. */
  readonly idleRpm: number;
  /** Highest engine speed the driver uses, rpm. */
  readonly redlineRpm: number;
  /** Largest boost the turbocharger makes, kPa gauge (0: naturally aspirated). */
  readonly maxBoostKpa: number;
  /** Speed where boost starts to build, rpm. */
  readonly boostOnsetRpm: number;
  /** Speed from which full boost is available, rpm. */
  readonly boostFullRpm: number;
  /** Time constant of boost build-up, s. */
  readonly turboLagS: number;
  /** Commanded lambda at full load. */
  readonly wotLambda: number;
  /** The true VE surface. */
  readonly veShape: VeShape;
  /** The error of the table its ECU runs. */
  readonly ecuError: EcuErrorField;
  /** Breakpoints of its tables. */
  readonly axes: TableAxes;
}
