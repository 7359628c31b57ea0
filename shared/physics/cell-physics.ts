/**
 * Per-cell physics shown beside a VE table: the airflow each cell implies and the injector duty
 * needed to fuel it, with a warning level where the duty nears the injector's limit.
 */
import { createGrid, type Grid, type VeTable, validateTable } from '../core/table';
import { airMassFlowGps, airMassPerEventMg } from './air-mass';
import {
  type DutyLevel,
  dutyLevel,
  type DutyThresholds,
  FUEL_DENSITY_GCC,
  fuelPerEventMg,
  injectorDutyPct,
} from './injector-duty';
import { type EngineSpec, validateEngineSpec } from './vehicle-spec';

/** Commanded lambda at a cell, by RPM and MAP. */
export type LambdaAt = (rpm: number, mapKpa: number) => number;

/** Options of {@link cellPhysics}. */
export interface CellPhysicsOptions {
  /** Intake air temperature assumed in every cell, °C; default 25. */
  iatC?: number;
  /** Commanded lambda: a number or a function of the cell; default {@link assumedPowerLambda}. */
  lambdaCmd?: number | LambdaAt;
  /** Fuel density, g/cc; default from the engine's fuel (gasoline's for a custom fuel). */
  fuelDensityGcc?: number;
  /** Duty warning thresholds; default 85 % and 95 %. */
  thresholds?: DutyThresholds;
}

/** The per-cell results of {@link cellPhysics}, grids in table orientation. */
export interface CellPhysics {
  /** Air mass flow, g/s. */
  readonly airflowGps: Grid;
  /** Injector duty, % of the cycle. */
  readonly dutyPct: Grid;
  /** Duty level per cell, `levels[row][col]`. */
  readonly levels: readonly (readonly DutyLevel[])[];
  /** Whether any cell reaches the warning threshold. */
  readonly hasWarning: boolean;
}

/**
 * A commanded lambda to assume when the caller has no target table: stoichiometric up to 80 kPa,
 * richening linearly to 0.80 at 100 kPa and above. It errs rich (more fuel, more duty) under
 * load on purpose, so a duty warning is never missed for want of a target.
 */
export function assumedPowerLambda(_rpm: number, mapKpa: number): number {
  if (mapKpa <= 80) return 1;
  if (mapKpa >= 100) return 0.8;
  return 1 - (0.2 * (mapKpa - 80)) / 20;
}

/** Airflow and injector duty for every cell of `table` (VE in percent) on `engine`. */
export function cellPhysics(
  table: VeTable,
  engine: EngineSpec,
  options: CellPhysicsOptions = {},
): CellPhysics {
  validateTable(table, 'cellPhysics: table');
  validateEngineSpec(engine, 'cellPhysics: engine');
  const iatC = options.iatC ?? 25;
  const lambdaOption = options.lambdaCmd ?? assumedPowerLambda;
  const lambdaAt: LambdaAt = typeof lambdaOption === 'number' ? () => lambdaOption : lambdaOption;
  const density =
    options.fuelDensityGcc ??
    (engine.fuel === 'custom' ? FUEL_DENSITY_GCC.gasoline : FUEL_DENSITY_GCC[engine.fuel]);
  const rows = table.mapAxisKpa.length;
  const cols = table.rpmAxis.length;
  const airflowGps = createGrid(rows, cols);
  const dutyPct = createGrid(rows, cols);
  const levels: DutyLevel[][] = [];
  let hasWarning = false;
  for (let r = 0; r < rows; r++) {
    const mapKpa = table.mapAxisKpa[r] as number;
    const rowLevels: DutyLevel[] = [];
    for (let c = 0; c < cols; c++) {
      const rpm = table.rpmAxis[c] as number;
      const ve = ((table.values[r] as readonly number[])[c] as number) / 100;
      const i = r * cols + c;
      airflowGps.data[i] = airMassFlowGps(ve, mapKpa, iatC, engine.displacementL, rpm);
      const airMg = airMassPerEventMg(ve, mapKpa, iatC, engine.displacementL, engine.cylinders);
      const fuelMg = fuelPerEventMg(airMg, lambdaAt(rpm, mapKpa), engine.stoichAfr);
      const duty = injectorDutyPct(fuelMg, rpm, engine.injectorCcMin, density);
      dutyPct.data[i] = duty;
      const level = dutyLevel(duty, options.thresholds);
      if (level !== 'ok') hasWarning = true;
      rowLevels.push(level);
    }
    levels.push(rowLevels);
  }
  return { airflowGps, dutyPct, levels, hasWarning };
}
