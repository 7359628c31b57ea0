import { requireChannel, type ColumnarLog } from '../core/channels';
import { interpolateAtTime } from './interpolate-at-time';
import { logAirflowGps, type AirflowSource } from './log-airflow';
import { transportDelayS, type TransportDelayModel } from './transport-delay';

/** Options of {@link alignLambda}: the delay model and where the airflow comes from. */
export type AlignLambdaOptions = TransportDelayModel & AirflowSource;

/** What {@link alignLambda} returns. */
export interface LambdaAlignment {
  /** A new log whose `lambda` is the delay-compensated one; every other channel is shared. */
  readonly log: ColumnarLog;
  /** The delay τ applied at each sample, s (NaN where the airflow is unknown). */
  readonly delayS: Float64Array;
  /** Samples whose shifted time runs past the end of the log (their lambda is NaN). */
  readonly beyondEnd: number;
}

/**
 * Compensates the wideband's transport delay: the gas burnt at time t reaches the sensor at
 * t + τ(t), with τ = τ₀ + K / ṁ_air(t) (reference.md §6), so the lambda belonging to sample t is
 * the measured lambda at t + τ(t), read by linear interpolation in time. Measured lambda thus
 * moves earlier by τ. Samples whose t + τ runs past the last sample, or whose airflow is
 * unknown, get NaN (the filter's lambda-range rule then drops them). With `kGrams: 0` no
 * airflow is needed. The sensor's own first-order lag is not undone: it smears a step but does
 * not move its start, and τ₀ absorbs its mean.
 */
export function alignLambda(log: ColumnarLog, options: AlignLambdaOptions = {}): LambdaAlignment {
  const time = requireChannel(log, 'time');
  const lambda = requireChannel(log, 'lambda');
  for (let i = 1; i < time.length; i++) {
    if (!(time[i] >= time[i - 1])) {
      throw new Error(`alignLambda: log time must ascend (sample ${i} is before ${i - 1})`);
    }
  }
  const needsAirflow = (options.kGrams ?? 1) !== 0;
  const airflow = needsAirflow ? logAirflowGps(log, options, 'alignLambda') : null;
  const delayS = new Float64Array(log.length);
  const aligned = new Float64Array(log.length);
  const end = time[time.length - 1];
  let beyondEnd = 0;
  for (let i = 0; i < log.length; i++) {
    const tau = transportDelayS(airflow ? airflow[i] : 0, options);
    delayS[i] = tau;
    const at = time[i] + tau;
    if (at > end) beyondEnd++;
    aligned[i] = interpolateAtTime(time, lambda, at);
  }
  return {
    log: { length: log.length, channels: { ...log.channels, lambda: aligned } },
    delayS,
    beyondEnd,
  };
}
