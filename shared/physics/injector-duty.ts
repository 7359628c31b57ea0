/**
 * Fuel per intake event and the injector duty it needs. Duty near 100 % means the injector is
 * open for the whole cycle and cannot add fuel any more, so the mixture goes lean exactly where
 * the engine is most loaded: the product warns well before that.
 */
import { type Fuel } from '../units';
import { requireNonNegative, requirePositive } from './check-number';

/**
 * Liquid fuel density in g/cc at about 15 °C, used to turn an injector's volumetric rating into
 * mass flow. Gasoline 0.745 is common practice, no published source; ethanol 0.789 is the figure
 * the fuel blends in `shared/units` assume; the blends are volume-weighted from those two.
 */
export const FUEL_DENSITY_GCC: Readonly<Record<Exclude<Fuel, 'custom'>, number>> = {
  gasoline: 0.745,
  e10: 0.9 * 0.745 + 0.1 * 0.789,
  e85: 0.15 * 0.745 + 0.85 * 0.789,
  ethanol: 0.789,
  methanol: 0.792,
};

/** Duty at or above which the product warns (common practice, no published source). */
export const DUTY_WARN_PCT = 85;
/** Duty at or above which the product calls the cell critical (common practice). */
export const DUTY_CRITICAL_PCT = 95;

/** How close a duty figure is to the injector's limit. */
export type DutyLevel = 'ok' | 'warn' | 'critical';

/** Thresholds for {@link dutyLevel}. */
export interface DutyThresholds {
  /** Duty in percent from which to warn; default {@link DUTY_WARN_PCT}. */
  warnPct?: number;
  /** Duty in percent from which the cell is critical; default {@link DUTY_CRITICAL_PCT}. */
  criticalPct?: number;
}

/**
 * Fuel mass per intake event in mg for a commanded lambda: m_f = m_air / (λ · AFR_st).
 */
export function fuelPerEventMg(airMg: number, lambdaCmd: number, stoichAfr: number): number {
  requireNonNegative(airMg, 'fuelPerEventMg: airMg');
  requirePositive(lambdaCmd, 'fuelPerEventMg: lambdaCmd');
  requirePositive(stoichAfr, 'fuelPerEventMg: stoichAfr');
  return airMg / (lambdaCmd * stoichAfr);
}

/**
 * Injector duty in percent of the engine cycle (two revolutions) needed to deliver
 * `fuelMgPerEvent` through one injector per cylinder, injecting once per cycle.
 *
 * Assumptions, all of which make the figure a lower bound: the injector flows its rating
 * (`injectorCcMin`, cc/min at the rated fuel pressure, no pressure correction); no dead time
 * (opening delay adds a fixed time per pulse on top of this); one injector per cylinder.
 */
export function injectorDutyPct(
  fuelMgPerEvent: number,
  rpm: number,
  injectorCcMin: number,
  fuelDensityGcc: number = FUEL_DENSITY_GCC.gasoline,
): number {
  requireNonNegative(fuelMgPerEvent, 'injectorDutyPct: fuelMgPerEvent');
  requireNonNegative(rpm, 'injectorDutyPct: rpm');
  requirePositive(injectorCcMin, 'injectorDutyPct: injectorCcMin');
  requirePositive(fuelDensityGcc, 'injectorDutyPct: fuelDensityGcc');
  // cc/min · g/cc = g/min; · 1000 mg/g / 60 000 ms/min = mg/ms.
  const flowMgPerMs = (injectorCcMin * fuelDensityGcc) / 60;
  const pulseMs = fuelMgPerEvent / flowMgPerMs;
  const cycleMs = 120_000 / rpm;
  return (pulseMs / cycleMs) * 100;
}

/** Classifies a duty figure against the warning thresholds. */
export function dutyLevel(dutyPct: number, thresholds: DutyThresholds = {}): DutyLevel {
  const warnPct = thresholds.warnPct ?? DUTY_WARN_PCT;
  const criticalPct = thresholds.criticalPct ?? DUTY_CRITICAL_PCT;
  if (!(warnPct < criticalPct)) {
    throw new Error('dutyLevel: thresholds.warnPct must be below thresholds.criticalPct');
  }
  if (dutyPct >= criticalPct) return 'critical';
  if (dutyPct >= warnPct) return 'warn';
  return 'ok';
}
