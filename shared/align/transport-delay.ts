import { R_AIR } from '../physics';

/**
 * Wideband transport delay. The simplified model τ = τ₀ + K / ṁ_air (reference.md §6) has a
 * fixed part τ₀ (sensor response and logging latency, plus the engine cycles from injection to
 * exhaust, which the model folds in) and a part that shrinks as flow grows: the time the gas
 * takes to sweep the pipe before the sensor. K is a mass, in grams: the gas the flow must push
 * past the sensor (about the exhaust held between the valves and the sensor).
 */

/** Default fixed delay, s: sensor plus logging latency (common practice, reference.md §6 [P]). */
export const DEFAULT_TAU0_S = 0.1;

/**
 * Default flow term, grams. With τ₀ = 0.1 s it gives 0.43 s at an idle flow of 3 g/s and
 * 0.12 s at 50 g/s, inside the 0.3–0.5 s idle and 0.1–0.2 s high-load totals of reference.md
 * §6 (common practice [P]).
 */
export const DEFAULT_K_GRAMS = 1;

/**
 * Airflow below which the delay stops growing, g/s. An engine that is turning draws more than
 * this (a 1 L engine idles near 2 g/s); below it the flow estimate is noise (engine stopping,
 * cranking) and 1/ṁ would send the delay off to many seconds.
 */
export const DEFAULT_MIN_AIRFLOW_GPS = 1;

/** Parameters of the delay model. */
export interface TransportDelayModel {
  /** Fixed part, s. Default {@link DEFAULT_TAU0_S}. */
  readonly tau0S?: number;
  /** Flow part, grams. Default {@link DEFAULT_K_GRAMS}. */
  readonly kGrams?: number;
  /** Airflow floor, g/s. Default {@link DEFAULT_MIN_AIRFLOW_GPS}. */
  readonly minAirflowGps?: number;
}

/** τ = τ₀ + K / max(ṁ, floor) in seconds; NaN when the airflow is NaN. */
export function transportDelayS(airflowGps: number, model: TransportDelayModel = {}): number {
  const {
    tau0S = DEFAULT_TAU0_S,
    kGrams = DEFAULT_K_GRAMS,
    minAirflowGps = DEFAULT_MIN_AIRFLOW_GPS,
  } = model;
  if (!(tau0S >= 0) || !Number.isFinite(tau0S)) {
    throw new Error('transportDelayS: tau0S must be a finite number ≥ 0');
  }
  if (!(kGrams >= 0) || !Number.isFinite(kGrams)) {
    throw new Error('transportDelayS: kGrams must be a finite number ≥ 0');
  }
  if (!(minAirflowGps > 0)) throw new Error('transportDelayS: minAirflowGps must be > 0');
  if (kGrams === 0) return tau0S;
  return tau0S + kGrams / Math.max(airflowGps, minAirflowGps);
}

/** Inputs of {@link exhaustPipeDelayS}. */
export interface ExhaustPipeDelayInput {
  /** Pipe volume between the exhaust valves and the sensor, litres. */
  readonly pipeVolumeL: number;
  /** Air mass flow into the engine, g/s. */
  readonly airflowGps: number;
  /** Exhaust gas temperature in the pipe, kelvin. */
  readonly exhaustTempK: number;
  /** Exhaust pressure in the pipe, kPa absolute. Default 101.325 (no back pressure). */
  readonly exhaustPressureKpa?: number;
  /** Lambda burnt, for the fuel mass the exhaust carries. Default 1. */
  readonly lambda?: number;
  /** Stoichiometric AFR of the fuel. Default 14.7. */
  readonly stoichAfr?: number;
}

/**
 * The pipe term of the physical delay model, in seconds: the gas mass held in the pipe,
 * V·p/(R·T), divided by the exhaust mass flow ṁ_ex = ṁ_air (1 + 1/(λ·AFR_st)) (reference.md §6).
 * The exhaust is treated as air (R = 287.053 J/(kg·K)); its real gas constant is within a few
 * percent. It shows where the 1/ṁ shape of the simplified model comes from, and gives a first K
 * for a new vehicle from its pipe volume (K ≈ V·p/(R·T) in grams).
 */
export function exhaustPipeDelayS(input: ExhaustPipeDelayInput): number {
  const { pipeVolumeL, airflowGps, exhaustTempK } = input;
  const { exhaustPressureKpa = 101.325, lambda = 1, stoichAfr = 14.7 } = input;
  const positives: [string, number][] = [
    ['pipeVolumeL', pipeVolumeL],
    ['airflowGps', airflowGps],
    ['exhaustTempK', exhaustTempK],
    ['exhaustPressureKpa', exhaustPressureKpa],
    ['lambda', lambda],
    ['stoichAfr', stoichAfr],
  ];
  for (const [name, value] of positives) {
    if (!(value > 0) || !Number.isFinite(value)) {
      throw new Error(`exhaustPipeDelayS: ${name} must be a positive number`);
    }
  }
  const gasInPipeG =
    ((exhaustPressureKpa * 1000 * (pipeVolumeL / 1000)) / (R_AIR * exhaustTempK)) * 1000;
  const exhaustFlowGps = airflowGps * (1 + 1 / (lambda * stoichAfr));
  return gasInPipeG / exhaustFlowGps;
}
