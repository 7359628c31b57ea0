import { veAtSamples } from '../accumulate';
import { alignLambda, estimateLambdaDelay, type LambdaDelayEstimate } from '../align';
import { requireChannel, type ColumnarLog } from '../core/channels';
import type { VeTable } from '../core/table';
import { DEFAULT_FILTER_RULES, filterSamples, type FilterRule, type FunnelStep } from '../filter';
import { airMassFlowGps } from '../physics';

/** The wideband delay applied to a log and where it came from. */
export interface DelayUsed {
  /** Fixed part τ₀, s. */
  readonly tau0S: number;
  /** Flow part K, grams (τ = τ₀ + K/ṁ). */
  readonly kGrams: number;
  /** `estimate`: the log's own estimate; `settings`: the given or default figures. */
  readonly source: 'estimate' | 'settings';
}

/** How to prepare one log: the table the ECU ran, the engine, the delay and the filter. */
export interface PrepareLogOptions {
  /** The VE table the ECU ran when the log was recorded. */
  readonly ecuTable: VeTable;
  /** Displacement, litres: for the airflow behind the delay. */
  readonly displacementL: number;
  /**
   * The delay: estimate from the log (used when it rates itself better than `poor`) or fixed
   * figures. Defaults τ₀ 0.1 s, K 1 g, estimate on.
   */
  readonly delay?: {
    readonly tau0S?: number;
    readonly kGrams?: number;
    readonly estimate?: boolean;
  };
  /** Filter rules in order. Default `DEFAULT_FILTER_RULES`. */
  readonly rules?: readonly FilterRule[];
}

/** One log after the steps before accumulation. */
export interface PreparedLog {
  /** The VE (%) the ECU ran at each sample. */
  readonly veUsed: Float64Array;
  /** The log with lambda (and its target and trims) shifted by the delay used. */
  readonly aligned: ColumnarLog;
  /** 1 for each sample the filter keeps, 0 for each it removes. */
  readonly keep: Uint8Array;
  /** What each rule removed, in order. */
  readonly funnel: readonly FunnelStep[];
  /** The log's own delay estimate (null when estimation was off). */
  readonly delayEstimate: LambdaDelayEstimate | null;
  /** The delay applied. */
  readonly delayUsed: DelayUsed;
}

/** Speed-density airflow per sample, g/s, from the VE (%) the ECU ran; IAT 25 °C where absent. */
function airflowFromTable(
  log: ColumnarLog,
  veUsed: Float64Array,
  displacementL: number,
): Float64Array {
  const rpm = requireChannel(log, 'rpm');
  const map = requireChannel(log, 'map');
  const iat = log.channels.iat;
  const out = new Float64Array(log.length);
  for (let i = 0; i < log.length; i++) {
    const iatC = iat && Number.isFinite(iat[i]) ? (iat[i] as number) : 25;
    const ok = (rpm[i] as number) > 0 && (map[i] as number) > 0 && (veUsed[i] as number) > 0;
    out[i] = ok
      ? airMassFlowGps(
          (veUsed[i] as number) / 100,
          map[i] as number,
          iatC,
          displacementL,
          rpm[i] as number,
        )
      : NaN;
  }
  return out;
}

/**
 * The steps of an analysis before accumulation, for one log: the VE the ECU ran → the airflow
 * behind the wideband delay (far closer than one nominal VE, which misjudges overrun flow by
 * more than half, so the log's own delay estimate holds) → lambda shifted by the delay (the log's
 * estimate when better than `poor`, else the fixed figures) → the filter rules. The analysis,
 * the kept samples of an analysis and a log's series all go through here, so they agree.
 */
export function prepareLog(log: ColumnarLog, options: PrepareLogOptions): PreparedLog {
  const delay = options.delay ?? {};
  const rpm = requireChannel(log, 'rpm');
  const map = requireChannel(log, 'map');
  const veUsed = veAtSamples(options.ecuTable, rpm, map);
  const airflowGps = airflowFromTable(log, veUsed, options.displacementL);
  const estimate = delay.estimate === false ? null : estimateLambdaDelay(log, { airflowGps });
  const useEstimate =
    estimate !== null && estimate.quality !== 'poor' && estimate.method !== 'none';
  const delayUsed: DelayUsed = useEstimate
    ? { tau0S: estimate.tau0S, kGrams: estimate.kGrams, source: 'estimate' }
    : { tau0S: delay.tau0S ?? 0.1, kGrams: delay.kGrams ?? 1, source: 'settings' };
  const aligned = alignLambda(log, {
    tau0S: delayUsed.tau0S,
    kGrams: delayUsed.kGrams,
    airflowGps,
  }).log;
  const filtered = filterSamples(aligned, options.rules ?? DEFAULT_FILTER_RULES);
  return {
    veUsed,
    aligned,
    keep: filtered.keep,
    funnel: filtered.funnel,
    delayEstimate: estimate,
    delayUsed,
  };
}
