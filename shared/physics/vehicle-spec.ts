/**
 * The engine and gearing of a vehicle, shaped exactly as the API's vehicle record
 * (`engine`, `gearing`), so physics, simulator and plan take what the server stores.
 */
import { type Fuel } from '../units';

/** The engine facts the speed-density physics needs. */
export interface EngineSpec {
  /** Swept volume of the whole engine, litres. */
  readonly displacementL: number;
  /** Number of cylinders (one injector and one intake event per cylinder per cycle). */
  readonly cylinders: number;
  /** The fuel it runs on. */
  readonly fuel: Fuel;
  /** Stoichiometric AFR by mass of that fuel. */
  readonly stoichAfr: number;
  /** Injector rating at the rated fuel pressure, cc/min. */
  readonly injectorCcMin: number;
}

/** Driveline facts for road speed (the API spells the tyre field `tireDiameterMm`). */
export interface GearingSpec {
  /** Loaded tyre diameter, mm. */
  readonly tireDiameterMm: number;
  /** Gear ratios, first gear first. */
  readonly gearRatios: readonly number[];
  /** Final drive (axle) ratio. */
  readonly finalDrive: number;
}

/** Throws unless the engine facts are usable; `name` prefixes the error. */
export function validateEngineSpec(engine: EngineSpec, name = 'engine'): void {
  const positive: [number, string][] = [
    [engine.displacementL, 'displacementL'],
    [engine.stoichAfr, 'stoichAfr'],
    [engine.injectorCcMin, 'injectorCcMin'],
  ];
  for (const [value, field] of positive) {
    if (!Number.isFinite(value) || value <= 0) {
      throw new Error(`${name}.${field} must be greater than 0 (got ${String(value)})`);
    }
  }
  if (!Number.isInteger(engine.cylinders) || engine.cylinders < 1) {
    throw new Error(`${name}.cylinders must be a positive integer (got ${engine.cylinders})`);
  }
}

/** Throws unless the gearing is usable; `name` prefixes the error. */
export function validateGearingSpec(gearing: GearingSpec, name = 'gearing'): void {
  if (!Number.isFinite(gearing.tireDiameterMm) || gearing.tireDiameterMm <= 0) {
    throw new Error(`${name}.tireDiameterMm must be greater than 0`);
  }
  if (!Number.isFinite(gearing.finalDrive) || gearing.finalDrive <= 0) {
    throw new Error(`${name}.finalDrive must be greater than 0`);
  }
  if (gearing.gearRatios.length === 0) throw new Error(`${name}.gearRatios must not be empty`);
  gearing.gearRatios.forEach((ratio, i) => {
    if (!Number.isFinite(ratio) || ratio <= 0) {
      throw new Error(`${name}.gearRatios[${i}] must be greater than 0`);
    }
  });
}
