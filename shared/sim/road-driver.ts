/**
 * A simulated driver on a public road: idles while the engine warms, accelerates through the
 * gears at varied throttle, cruises over gentle grades, slows on a closed throttle (fuel cut),
 * stops and idles again, never aiming above the speed cap. The vehicle obeys a simple
 * longitudinal model: engine torque through the gearing against rolling, aerodynamic, grade and
 * brake forces.
 */
import { rpmAtSpeed } from '../physics/road-speed';
import { engineTorqueNm } from './engine-model';
import { type EngineState, type OperatingPoint, type SimDriver } from './operating-point';
import { createWander, type SeededRandom } from './seeded-random';
import { type SimVehicle } from './sim-vehicle';

type Manoeuvre =
  | { kind: 'idle'; untilS: number }
  | { kind: 'accelerate'; targetKph: number; tpsPct: number; shiftRpm: number }
  | { kind: 'cruise'; targetKph: number; untilS: number }
  | { kind: 'decelerate'; targetKph: number; brakeMs2: number };

const GRAVITY = 9.80665;
const AIR_DENSITY = 1.2;
const DRIVELINE_EFFICIENCY = 0.92;
const SHIFT_S = 0.35;

/** Settings of a road drive. */
export interface RoadDriveOptions {
  /** Highest speed the driver aims for, km/h. */
  readonly speedCapKph: number;
  /** Idle time at the start (engine warming), s. */
  readonly startIdleS: number;
}

/** Creates a road driver for `vehicle`. */
export function createRoadDriver(
  vehicle: SimVehicle,
  options: RoadDriveOptions,
  random: SeededRandom,
): SimDriver {
  const { gearRatios, finalDrive } = vehicle.gearing;
  const diameterM = vehicle.gearing.tireDiameterMm / 1000;
  const topGear = gearRatios.length;
  const capKph = Math.max(20, options.speedCapKph - 3);
  let timeS = 0;
  let speedMs = 0;
  let distanceM = 0;
  let gear = 0;
  let pendingGear = 0;
  let shiftLeftS = 0;
  let engineRpm = vehicle.idleRpm;
  let tps = 0;
  let cruiseIntegral = 0;
  let manoeuvre: Manoeuvre = { kind: 'idle', untilS: options.startIdleS };
  const idleWander = createWander(random, 1, 10);

  const ratioOf = (g: number): number => (gearRatios[g - 1] as number) * finalDrive;
  const coupledRpm = (g: number): number =>
    rpmAtSpeed(speedMs * 3.6, diameterM, gearRatios[g - 1] as number, finalDrive);
  /** The highest gear that keeps the engine at or above `minRpm`; gear 1 if none does. */
  const gearAbove = (minRpm: number): number => {
    for (let g = topGear; g >= 1; g--) if (coupledRpm(g) >= minRpm) return g;
    return 1;
  };
  const shiftTo = (g: number): void => {
    if (g === gear || shiftLeftS > 0) return;
    pendingGear = g;
    shiftLeftS = SHIFT_S;
  };
  const startAccelerating = (fromKph: number): Manoeuvre => {
    const r = random.next();
    const tpsPct =
      r < 0.35
        ? random.between(18, 40)
        : r < 0.75
          ? random.between(40, 75)
          : random.between(75, 100);
    const shiftRpm = Math.min(
      vehicle.redlineRpm - 100,
      2200 + (tpsPct / 100) * (vehicle.redlineRpm - 2500) + random.between(-200, 200),
    );
    const targetKph = Math.min(capKph, fromKph + random.between(20, 70));
    return { kind: 'accelerate', targetKph, tpsPct, shiftRpm };
  };
  const nextManoeuvre = (): Manoeuvre => {
    const kph = speedMs * 3.6;
    switch (manoeuvre.kind) {
      case 'idle':
        return startAccelerating(kph);
      case 'accelerate':
        cruiseIntegral = tps * 0.6;
        return {
          kind: 'cruise',
          targetKph: manoeuvre.targetKph,
          untilS: timeS + random.between(8, 45),
        };
      case 'cruise': {
        const r = random.next();
        if (r < 0.35 && kph < capKph - 15) return startAccelerating(kph);
        const brakeMs2 = random.between(0.2, 1.8);
        if (r < 0.7)
          return { kind: 'decelerate', targetKph: kph * random.between(0.35, 0.8), brakeMs2 };
        return { kind: 'decelerate', targetKph: 0, brakeMs2 };
      }
      case 'decelerate':
        if (manoeuvre.targetKph <= 0)
          return { kind: 'idle', untilS: timeS + random.between(4, 20) };
        return startAccelerating(kph);
    }
  };

  return {
    step(dtS: number, engine: EngineState): OperatingPoint {
      timeS += dtS;
      const kph = speedMs * 3.6;
      if (manoeuvre.kind === 'idle' && timeS >= manoeuvre.untilS) manoeuvre = nextManoeuvre();
      else if (manoeuvre.kind === 'accelerate' && kph >= manoeuvre.targetKph)
        manoeuvre = nextManoeuvre();
      else if (manoeuvre.kind === 'cruise' && timeS >= manoeuvre.untilS)
        manoeuvre = nextManoeuvre();
      else if (manoeuvre.kind === 'decelerate' && kph <= manoeuvre.targetKph)
        manoeuvre = nextManoeuvre();

      // The driver's throttle and gear choice for the manoeuvre.
      let tpsWanted = 0;
      let brakeMs2 = 0;
      let maxTpsRate = 200;
      switch (manoeuvre.kind) {
        case 'idle':
          if (kph < 2) gear = 0;
          break;
        case 'accelerate':
          tpsWanted = manoeuvre.tpsPct;
          if (gear === 0 && shiftLeftS <= 0) gear = kph < 15 ? 1 : gearAbove(2500);
          else if (gear > 0 && gear < topGear && engineRpm >= manoeuvre.shiftRpm) shiftTo(gear + 1);
          else if (
            manoeuvre.tpsPct > 60 &&
            gear > 1 &&
            engineRpm < 2500 &&
            coupledRpm(gear - 1) < manoeuvre.shiftRpm - 500
          ) {
            shiftTo(gear - 1); // kick down for a hard acceleration
          }
          break;
        case 'cruise': {
          const error = manoeuvre.targetKph - kph;
          cruiseIntegral = Math.min(80, Math.max(0, cruiseIntegral + 0.6 * error * dtS));
          tpsWanted = Math.min(100, Math.max(0, cruiseIntegral + 3 * error));
          maxTpsRate = 40;
          const wanted = gearAbove(1700);
          if (gear === 0) gear = wanted;
          else if (wanted > gear) shiftTo(gear + 1);
          else if (tps > 70 && gear > 1 && coupledRpm(gear - 1) < vehicle.redlineRpm - 1500)
            shiftTo(gear - 1);
          break;
        }
        case 'decelerate':
          brakeMs2 = manoeuvre.brakeMs2;
          if (manoeuvre.targetKph <= 0 && kph < 1.5) speedMs = 0; // the last metre to a stop
          if (kph < 18) gear = 0;
          else if (gear > 2 && engineRpm < 1300) shiftTo(gear - 1);
          break;
      }

      // Never past the cap: lift and brake (downhill grades would otherwise carry the car on).
      if (kph > capKph + 1) {
        tpsWanted = 0;
        brakeMs2 = Math.max(brakeMs2, 0.5 * (kph - capKph));
      } else if (manoeuvre.kind === 'cruise' && kph > manoeuvre.targetKph + 2) {
        brakeMs2 = 0.3 * (kph - manoeuvre.targetKph - 2);
      }

      // Gear changes open the clutch and lift the throttle for a moment.
      if (shiftLeftS > 0) {
        shiftLeftS -= dtS;
        tpsWanted = 0;
        maxTpsRate = 1000;
        if (shiftLeftS <= 0) gear = pendingGear;
      }
      const step = maxTpsRate * dtS;
      tps = Math.min(100, Math.max(0, tps + Math.max(-step * 3, Math.min(step, tpsWanted - tps))));

      // Engine speed: coupled to the wheels in gear (slipping the clutch on a launch).
      const coldIdle = Math.max(0, 60 - engine.ectC) * 5;
      const idleRpm = vehicle.idleRpm + coldIdle + idleWander.step(dtS);
      const isCoupled = gear > 0 && shiftLeftS <= 0;
      if (isCoupled) {
        const launchRpm = gear === 1 && manoeuvre.kind === 'accelerate' ? 1100 + 8 * tps : 0;
        engineRpm = Math.max(coupledRpm(gear), launchRpm, idleRpm * 0.9);
      } else {
        const towards = shiftLeftS > 0 ? coupledRpm(pendingGear) : idleRpm + tps * 30;
        engineRpm += (towards - engineRpm) * (1 - Math.exp(-dtS / 0.15));
      }
      engineRpm = Math.min(engineRpm, vehicle.redlineRpm + 200);

      // Longitudinal dynamics.
      const torque = isCoupled
        ? engineTorqueNm(
            engineRpm,
            engine.mapKpa,
            engine.iatC,
            engine.baroKpa,
            engine.isFuelCut,
            vehicle,
          )
        : 0;
      const ratio = isCoupled ? ratioOf(gear) : 0;
      const drive = (torque * ratio * DRIVELINE_EFFICIENCY) / (diameterM / 2);
      const grade = 0.02 * Math.sin((2 * Math.PI * distanceM) / 1800);
      const moving = speedMs > 0.05 ? 1 : 0;
      const resist =
        moving * vehicle.massKg * GRAVITY * (vehicle.rollingCoeff + grade) +
        0.5 * AIR_DENSITY * vehicle.dragAreaM2 * speedMs * speedMs +
        moving * vehicle.massKg * brakeMs2;
      const inertia = vehicle.massKg * (1.04 + 0.0025 * ratio * ratio);
      speedMs = Math.max(0, speedMs + ((drive - resist) / inertia) * dtS);
      distanceM += speedMs * dtS;

      return {
        rpm: engineRpm,
        tpsPct: tps,
        gear: isCoupled ? gear : 0,
        speedKph: speedMs * 3.6,
        coolingAirKph: speedMs * 3.6,
      };
    },
  };
}
