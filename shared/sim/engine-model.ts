/**
 * The simulated engine's air path and torque, kept simple but physical enough that throttle,
 * speed and boost produce manifold pressures and accelerations of the right size.
 */
import { trueVeFraction } from './ve-surface';
import { type SimVehicle } from './sim-vehicle';

/** Lowest manifold pressure on a closed throttle (idle air and the engine's own leakage), kPa. */
export const OVERRUN_MAP_KPA = 18;

/** Effective throttle opening: idle air bypass plus a progressive plate. */
function throttleArea(tpsPct: number): number {
  return 0.0167 + Math.pow(Math.min(100, Math.max(0, tpsPct)) / 100, 1.6);
}

/**
 * Manifold pressure as a share of the pressure before the throttle. A throttle flows about the
 * same whatever the manifold pressure while it is choked, and the engine's demand grows with
 * speed and manifold pressure; balancing the two gives c / √(1 + c²) with c the ratio of
 * throttle capacity to engine demand.
 */
export function manifoldShare(tpsPct: number, rpm: number): number {
  const c = (18 * throttleArea(tpsPct)) / (Math.max(rpm, 300) / 1000);
  return c / Math.sqrt(1 + c * c);
}

/** Boost (kPa gauge) the turbocharger settles at for a throttle and speed. */
export function steadyBoostKpa(tpsPct: number, rpm: number, vehicle: SimVehicle): number {
  if (vehicle.maxBoostKpa <= 0) return 0;
  const span = vehicle.boostFullRpm - vehicle.boostOnsetRpm;
  const x = Math.min(1, Math.max(0, (rpm - vehicle.boostOnsetRpm) / span));
  const spool = x * x * (3 - 2 * x);
  const demand = Math.min(1, Math.max(0, (tpsPct - 35) / 50));
  return vehicle.maxBoostKpa * spool * demand;
}

/** Steady manifold pressure, kPa absolute, for an upstream pressure (baro + boost). */
export function steadyMapKpa(tpsPct: number, rpm: number, upstreamKpa: number): number {
  return Math.max(OVERRUN_MAP_KPA, upstreamKpa * manifoldShare(tpsPct, rpm));
}

/** Steady MAP including boost at a throttle and speed. */
export function steadyMapWithBoostKpa(
  tpsPct: number,
  rpm: number,
  baroKpa: number,
  vehicle: SimVehicle,
): number {
  return steadyMapKpa(tpsPct, rpm, baroKpa + steadyBoostKpa(tpsPct, rpm, vehicle));
}

/**
 * The throttle that holds `mapKpa` at `rpm` once everything has settled, by bisection (the
 * steady MAP rises monotonically with throttle). Returns 100 when the target is out of reach.
 */
export function throttleForMap(
  mapKpa: number,
  rpm: number,
  baroKpa: number,
  vehicle: SimVehicle,
): number {
  if (steadyMapWithBoostKpa(100, rpm, baroKpa, vehicle) <= mapKpa) return 100;
  if (steadyMapWithBoostKpa(0, rpm, baroKpa, vehicle) >= mapKpa) return 0;
  let low = 0;
  let high = 100;
  for (let i = 0; i < 40; i++) {
    const mid = (low + high) / 2;
    if (steadyMapWithBoostKpa(mid, rpm, baroKpa, vehicle) < mapKpa) low = mid;
    else high = mid;
  }
  return (low + high) / 2;
}

/**
 * Brake torque in N·m from mean effective pressures: indicated work grows with the trapped air
 * (VE · MAP / T), friction with speed, pumping loss with manifold vacuum. With the fuel cut the
 * engine only drags. The constants give about 1 MPa brake mean effective pressure at full load
 * on a naturally aspirated engine, ordinary for a modern four-valve engine.
 */
export function engineTorqueNm(
  rpm: number,
  mapKpa: number,
  iatC: number,
  baroKpa: number,
  isFuelCut: boolean,
  vehicle: SimVehicle,
): number {
  const ve = trueVeFraction(rpm, mapKpa, vehicle.veShape);
  const imep = isFuelCut ? 0 : (12 * ve * mapKpa * 298.15) / (iatC + 273.15);
  const fmep = 90 + 0.012 * rpm + 3e-6 * rpm * rpm;
  const pmep = 0.9 * Math.max(0, baroKpa - mapKpa);
  const bmepKpa = imep - fmep - pmep;
  return (bmepKpa * 1000 * (vehicle.engine.displacementL / 1000)) / (4 * Math.PI);
}
