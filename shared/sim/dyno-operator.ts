/**
 * A simulated steady-state dyno session: the dyno holds engine speed (speed-control mode), the
 * operator sets the throttle for each target MAP, lets it settle, holds, and cools the engine
 * at light load after boosted holds (reference.md §9).
 */
import { roadSpeedKph } from '../physics/road-speed';
import { steadyMapWithBoostKpa, throttleForMap } from './engine-model';
import { type EngineState, type OperatingPoint, type SimDriver } from './operating-point';
import { createWander, type SeededRandom } from './seeded-random';
import { type SimVehicle } from './sim-vehicle';

/** One step of a dyno session. */
export interface DynoHold {
  /** `hold` for a measured point, `cooldown` for light-load running between them. */
  readonly kind: 'hold' | 'cooldown';
  /** Engine speed the dyno holds, rpm. */
  readonly rpm: number;
  /** Manifold pressure the operator aims for, kPa absolute. */
  readonly mapKpa: number;
  /** Time to let MAP, lambda and temperatures settle, s. */
  readonly settleS: number;
  /** Time held once settled, s. */
  readonly holdS: number;
}

/** Speed and throttle rates of the operator and dyno. */
const RPM_RATE = 400;
const TPS_RATE = 50;
/** Cooling air of the dyno's fan, km/h. */
const FAN_KPH = 30;

/**
 * A default session for `vehicle`: 1500 rpm to 600 below the redline in 500 rpm steps, MAP
 * stepped upward by 15 kPa from 40 kPa, then a hold at the most the engine makes at that speed
 * with the throttle open (less 2 kPa); settle 3 s
 * and hold 4 s (2–5 s each is common practice), boosted holds settle 2 s and hold 3 s, and a
 * 20 s cooldown at light load after each speed that was boosted.
 */
export function defaultDynoHolds(vehicle: SimVehicle, baroKpa = 101.3): DynoHold[] {
  const holds: DynoHold[] = [];
  const holdAt = (rpm: number, mapKpa: number): DynoHold => {
    const isBoosted = mapKpa > baroKpa;
    return { kind: 'hold', rpm, mapKpa, settleS: isBoosted ? 2 : 3, holdS: isBoosted ? 3 : 4 };
  };
  for (let rpm = 1500; rpm <= vehicle.redlineRpm - 600; rpm += 500) {
    // The most this speed can make with the throttle open, less a margin the operator keeps.
    const topKpa = Math.min(195, steadyMapWithBoostKpa(100, rpm, baroKpa, vehicle) - 2);
    for (let mapKpa = 40; mapKpa < topKpa - 5; mapKpa += 15) holds.push(holdAt(rpm, mapKpa));
    holds.push(holdAt(rpm, Math.round(topKpa)));
    if (topKpa > baroKpa)
      holds.push({ kind: 'cooldown', rpm: 2000, mapKpa: 45, settleS: 0, holdS: 20 });
  }
  return holds;
}

/** Total time of a session's holds, not counting the moves between them, s. */
export function dynoSessionSeconds(holds: readonly DynoHold[]): number {
  return holds.reduce((sum, hold) => sum + hold.settleS + hold.holdS, 0);
}

/** Creates the operator of a dyno session that runs `holds` over and over in `gear` (1-based). */
export function createDynoOperator(
  vehicle: SimVehicle,
  holds: readonly DynoHold[],
  gear: number,
  random: SeededRandom,
): SimDriver {
  if (holds.length === 0) throw new Error('createDynoOperator: holds must not be empty');
  const ratio = vehicle.gearing.gearRatios[gear - 1];
  if (ratio === undefined) throw new Error(`createDynoOperator: gear ${gear} does not exist`);
  let index = 0;
  let phase: 'move' | 'settle' | 'hold' = 'move';
  let phaseLeftS = 0;
  let rpm = vehicle.idleRpm;
  let tps = 0;
  let tpsGoal = Number.NaN;
  const rpmWander = createWander(random, 1.5, 4);
  const tpsWander = createWander(random, 2, 0.15);
  return {
    step(dtS: number, engine: EngineState): OperatingPoint {
      const hold = holds[index] as DynoHold;
      if (Number.isNaN(tpsGoal))
        tpsGoal = throttleForMap(hold.mapKpa, hold.rpm, engine.baroKpa, vehicle);
      const rpmStep = RPM_RATE * dtS;
      rpm += Math.max(-rpmStep, Math.min(rpmStep, hold.rpm - rpm));
      const tpsStep = TPS_RATE * dtS;
      tps += Math.max(-tpsStep, Math.min(tpsStep, tpsGoal - tps));
      if (phase === 'move' && Math.abs(rpm - hold.rpm) < 1e-6 && Math.abs(tps - tpsGoal) < 1e-6) {
        phase = 'settle';
        phaseLeftS = hold.settleS;
      }
      if (phase !== 'move') {
        phaseLeftS -= dtS;
        if (phaseLeftS <= 0 && phase === 'settle') {
          phase = 'hold';
          phaseLeftS += hold.holdS;
        }
        if (phaseLeftS <= 0 && phase === 'hold') {
          index = (index + 1) % holds.length;
          phase = 'move';
          tpsGoal = Number.NaN;
        }
      }
      const shownTps = Math.min(100, Math.max(0, tps + tpsWander.step(dtS)));
      const speedKph = roadSpeedKph(
        rpm,
        vehicle.gearing.tireDiameterMm / 1000,
        ratio,
        vehicle.gearing.finalDrive,
      );
      return {
        rpm: rpm + rpmWander.step(dtS),
        tpsPct: shownTps,
        gear,
        speedKph,
        coolingAirKph: FAN_KPH,
      };
    },
  };
}

/** The gear a chassis dyno session runs in: the one whose ratio is closest to 1:1. */
export function dynoGearFor(vehicle: SimVehicle): number {
  let best = 1;
  vehicle.gearing.gearRatios.forEach((ratio, i) => {
    const current = vehicle.gearing.gearRatios[best - 1] as number;
    if (Math.abs(Math.log(ratio)) < Math.abs(Math.log(current))) best = i + 1;
  });
  return best;
}
