import { firstIndexAfter } from './series-window';
import { interpolateAtTime } from './interpolate-at-time';

/** The airflow over a span of a log. */
export interface TransitAirflow {
  /** Harmonic mean, g/s: 1/ṁ averaged over time, as the delay's K/ṁ term averages it. */
  readonly harmonicGps: number;
  /** Lowest airflow in the span, g/s. */
  readonly minGps: number;
  /** Highest airflow in the span, g/s. */
  readonly maxGps: number;
}

/**
 * The airflow (floored at `minGps`) from `fromS` to `toS`: both ends read by interpolation plus
 * every sample between, each weighted by the time it covers. NaN throughout when any is unknown,
 * since a gap may hide the very change that matters.
 */
export function transitAirflow(
  time: Float64Array,
  airflow: Float64Array,
  fromS: number,
  toS: number,
  minGps: number,
): TransitAirflow {
  const ts = [fromS];
  const vs = [interpolateAtTime(time, airflow, fromS)];
  for (let i = firstIndexAfter(time, fromS); i < time.length && time[i] < toS; i++) {
    ts.push(time[i]);
    vs.push(airflow[i]);
  }
  if (toS > fromS) {
    ts.push(toS);
    vs.push(interpolateAtTime(time, airflow, toS));
  }
  if (vs.some((v) => Number.isNaN(v))) return { harmonicGps: NaN, minGps: NaN, maxGps: NaN };
  const flows = vs.map((v) => Math.max(v, minGps));
  if (ts.length === 1) return { harmonicGps: flows[0], minGps: flows[0], maxGps: flows[0] };
  let inverse = 0;
  for (let k = 1; k < ts.length; k++)
    inverse += ((ts[k] - ts[k - 1]) * (1 / flows[k - 1] + 1 / flows[k])) / 2;
  return {
    harmonicGps: (toS - fromS) / inverse,
    minGps: Math.min(...flows),
    maxGps: Math.max(...flows),
  };
}
