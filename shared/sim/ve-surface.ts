/**
 * The simulator's hidden truth: each vehicle's true VE surface, the wrong table its ECU runs,
 * and the lambda its ECU commands. Tests compare analyses against these.
 */
import { locate } from '../core/lookup';
import { type VeTable, validateAxis } from '../core/table';
import { type EcuErrorField, type SimVehicle, type TableAxes, type VeShape } from './sim-vehicle';

/** A table of commanded lambda, laid out like a VE table (`values[row][col]`). */
export interface LambdaTargetTable {
  /** RPM breakpoints (columns). */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints, kPa absolute (rows). */
  readonly mapAxisKpa: readonly number[];
  /** Commanded lambda, `values[row][col]`. */
  readonly values: readonly (readonly number[])[];
}

/**
 * True manifold-referenced VE (fraction) at a speed and MAP. The speed curve peaks near the
 * torque peak (charge heating and backflow lower it at low speed, friction and choking at high
 * speed: Heywood Ch. 6, from memory). Residual gas lowers it at low MAP, more so at low speed;
 * intake tuning ripples it more at high load; turbine back-pressure lowers it under boost at
 * high speed. These terms interact, so the surface is not separable.
 */
export function trueVeFraction(rpm: number, mapKpa: number, shape: VeShape): number {
  const x = (rpm - shape.peakRpm) / 1000;
  const speedCurve = shape.peakVe - (x < 0 ? shape.lowSpeedDrop : shape.highSpeedDrop) * x * x;
  const load = Math.min(mapKpa, 100) / 100;
  const residual =
    mapKpa < 100
      ? shape.residual * (100 / Math.max(mapKpa, 15) - 1) * Math.pow(1500 / (rpm + 700), 0.7)
      : 0;
  const ripple = shape.ripple * Math.sin((Math.PI * (rpm - 1200)) / 2200) * load;
  const boost = Math.max(0, mapKpa / 100 - 1);
  const backPressure = shape.boostPenalty * boost * Math.pow(rpm / 6000, 2);
  return Math.min(1.15, Math.max(0.25, speedCurve - residual + ripple - backPressure));
}

/** The ECU table's relative error at a point: ecuVE = trueVE · (1 + error). */
export function ecuErrorFraction(rpm: number, mapKpa: number, field: EcuErrorField): number {
  const wave =
    field.amplitude *
    Math.sin((2 * Math.PI * rpm) / 5600 + 0.7) *
    Math.cos((Math.PI * mapKpa) / 160 - 0.3);
  const tilt = (field.tilt * (rpm - 3500)) / 3500;
  const bump =
    field.bumpDepth *
    Math.exp(-(((rpm - field.bumpRpm) / 700) ** 2) - ((mapKpa - field.bumpMapKpa) / 25) ** 2);
  return wave + tilt + field.offset + bump;
}

function tableOf(
  axes: TableAxes,
  valueAt: (rpm: number, mapKpa: number) => number,
  name: string,
): VeTable {
  validateAxis(axes.rpmAxis, `${name}: axes.rpmAxis`);
  validateAxis(axes.mapAxisKpa, `${name}: axes.mapAxisKpa`);
  return {
    rpmAxis: [...axes.rpmAxis],
    mapAxisKpa: [...axes.mapAxisKpa],
    values: axes.mapAxisKpa.map((map) => axes.rpmAxis.map((rpm) => valueAt(rpm, map))),
  };
}

/** The vehicle's true VE in percent at each breakpoint (not rounded). */
export function trueVeTable(vehicle: SimVehicle, axes: TableAxes = vehicle.axes): VeTable {
  return tableOf(
    axes,
    (rpm, map) => 100 * trueVeFraction(rpm, map, vehicle.veShape),
    'trueVeTable',
  );
}

/** The table the vehicle's ECU runs, VE in percent rounded to 0.1 as a stored table would be. */
export function ecuVeTable(vehicle: SimVehicle, axes: TableAxes = vehicle.axes): VeTable {
  return tableOf(
    axes,
    (rpm, map) => {
      const ve = trueVeFraction(rpm, map, vehicle.veShape);
      return Math.round(1000 * ve * (1 + ecuErrorFraction(rpm, map, vehicle.ecuError))) / 10;
    },
    'ecuVeTable',
  );
}

/**
 * The lambda the ECU commands: 1.0 at part load (closed-loop cruise) and richer towards full
 * load, to the vehicle's full-load lambda (0.75–0.82 boosted, 0.85–0.90 NA is common practice),
 * plus a little more at the top of the speed range for exhaust-temperature margin.
 */
export function lambdaTargetAt(rpm: number, mapKpa: number, vehicle: SimVehicle): number {
  const boosted = vehicle.maxBoostKpa > 0;
  const startKpa = boosted ? 90 : 75;
  const fullKpa = boosted ? 140 : 98;
  const share = Math.min(1, Math.max(0, (mapKpa - startKpa) / (fullKpa - startKpa)));
  const topEnd = share * 0.02 * Math.min(1, Math.max(0, (rpm - 5000) / 1500));
  return Math.round(1000 * (1 - share * (1 - vehicle.wotLambda) - topEnd)) / 1000;
}

/** The ECU's commanded-lambda table on the given axes. */
export function lambdaTargetTable(
  vehicle: SimVehicle,
  axes: TableAxes = vehicle.axes,
): LambdaTargetTable {
  return tableOf(axes, (rpm, map) => lambdaTargetAt(rpm, map, vehicle), 'lambdaTargetTable');
}

/**
 * Bilinear lookup in a table laid out like a VE table, clamped at the ends of both axes as an
 * ECU does (no extrapolation).
 */
export function lookupBilinear(
  table: {
    rpmAxis: readonly number[];
    mapAxisKpa: readonly number[];
    values: readonly (readonly number[])[];
  },
  rpm: number,
  mapKpa: number,
): number {
  const col = locate(table.rpmAxis, rpm);
  const row = locate(table.mapAxisKpa, mapKpa);
  const low = table.values[row.i] as readonly number[];
  const high = table.values[row.i + 1] as readonly number[];
  const v00 = low[col.i] as number;
  const v01 = low[col.i + 1] as number;
  const v10 = high[col.i] as number;
  const v11 = high[col.i + 1] as number;
  return (
    (1 - row.f) * ((1 - col.f) * v00 + col.f * v01) + row.f * ((1 - col.f) * v10 + col.f * v11)
  );
}
