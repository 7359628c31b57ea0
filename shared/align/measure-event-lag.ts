import { firstIndexAfter, windowMedian } from './series-window';

/** Options of the lag measurements. */
export interface EventLagOptions {
  /** Longest lag looked for, s. Default 1.2. */
  readonly maxLagS?: number;
  /** Span before the event that gives the starting level, s. Default 0.3. */
  readonly preS?: number;
  /** Span after `maxLagS` that gives the final level, s. Default 0.4. */
  readonly postS?: number;
  /** Smallest change of measured lambda that counts as an answer. Default 0.02. */
  readonly minChange?: number;
}

/**
 * A measured lag (with the sensor's time constant when the method found it), or why there is
 * none.
 */
export type EventLag =
  { readonly lagS: number; readonly timeConstantS?: number } | { readonly unmeasured: string };

/**
 * Times the sensor's answer to a step (a commanded-lambda step or a fuel-cut edge) by the
 * two-point method for a first-order lag plus dead time: with the answer normalised from its
 * starting level (median over `preS` before the event) to its final level (median over `postS`
 * after `maxLagS`), it crosses 28.3 % at θ + T/3 and 63.2 % at θ + T, so T = 1.5 (t₆₃ − t₂₈) and
 * the dead time θ = t₆₃ − T. Crossing times are interpolated linearly between samples, so
 * uneven steps are fine and the result is not tied to the sample grid. The sensor's time
 * constant T is thereby kept out of the delay. (Two-point identification of a first-order
 * process with dead time: common process-control practice, no published source here.)
 */
export function stepAnswerLag(
  time: Float64Array,
  lambda: Float64Array,
  causeTimeS: number,
  options: EventLagOptions = {},
): EventLag {
  const { maxLagS = 1.2, preS = 0.3, postS = 0.4, minChange = 0.02 } = options;
  const start = windowMedian(time, lambda, causeTimeS - preS, causeTimeS);
  const end = windowMedian(time, lambda, causeTimeS + maxLagS, causeTimeS + maxLagS + postS);
  if (Number.isNaN(start) || Number.isNaN(end)) {
    return { unmeasured: 'too little lambda data before or after the event' };
  }
  const change = end - start;
  if (!(Math.abs(change) >= minChange)) {
    return { unmeasured: `measured lambda changed by ${Math.abs(change).toFixed(3)} only` };
  }
  const from = firstIndexAfter(time, causeTimeS);
  const last = causeTimeS + maxLagS + postS;
  const t28 = crossingTime(time, lambda, from, last, start + 0.283 * change, change > 0);
  if (Number.isNaN(t28.timeS)) return { unmeasured: 'the answer never reached 28 %' };
  const t63 = crossingTime(time, lambda, t28.index, last, start + 0.632 * change, change > 0);
  if (Number.isNaN(t63.timeS)) return { unmeasured: 'the answer never reached 63 %' };
  const timeConstantS = 1.5 * (t63.timeS - t28.timeS);
  const lagS = t63.timeS - timeConstantS - causeTimeS;
  if (!(lagS >= 0 && lagS <= maxLagS)) {
    return { unmeasured: `the answer's start (${lagS.toFixed(3)} s) is outside 0–${maxLagS} s` };
  }
  return { lagS, timeConstantS };
}

/**
 * Times the sensor's answer to a throttle tip-in, whose mixture excursion (lean or rich, by how
 * the enrichment matches the wall film) has no known size or shape but starts with the throttle
 * movement. The tip-in's start is taken as an impulse, so its cross-correlation with the lambda
 * rate is the lambda rate itself: the lag is where |dλ/dt| peaks after the start, refined by a
 * parabola through the peak. Rates are first differences at interval midpoints. A lagging
 * sensor changes fastest in the first whole interval after its answer begins, whose midpoint
 * lies half a step to a step after that start, so half the step is taken off; what remains is
 * up to half a step late, which is why steps are preferred when both exist.
 */
export function tipInAnswerLag(
  time: Float64Array,
  lambda: Float64Array,
  causeTimeS: number,
  options: EventLagOptions = {},
): EventLag {
  const { maxLagS = 1.2 } = options;
  const first = Math.max(1, firstIndexAfter(time, causeTimeS));
  const stop = Math.min(time.length, firstIndexAfter(time, causeTimeS + maxLagS) + 2);
  const mid: number[] = [];
  const rate: number[] = [];
  for (let i = first; i < stop; i++) {
    const dt = time[i] - time[i - 1];
    const r = (lambda[i] - lambda[i - 1]) / dt;
    if (!(dt > 0) || Number.isNaN(r)) continue;
    mid.push((time[i] + time[i - 1]) / 2);
    rate.push(Math.abs(r));
  }
  if (mid.length < 3) return { unmeasured: 'too little lambda data after the tip-in' };
  let best = 0;
  for (let k = 1; k < rate.length; k++) if (rate[k] > rate[best]) best = k;
  const sorted = [...rate].sort((a, b) => a - b);
  if (!(rate[best] > 3 * sorted[sorted.length >> 1])) {
    return { unmeasured: 'no clear answer of lambda to the tip-in' };
  }
  if (best === 0 || best === rate.length - 1) {
    return { unmeasured: 'the answer peaks at the edge of the lag range' };
  }
  // Parabola through the peak and its neighbours, on their (possibly uneven) midpoints.
  const [x0, x1, x2] = [mid[best - 1], mid[best], mid[best + 1]];
  const [y0, y1, y2] = [rate[best - 1], rate[best], rate[best + 1]];
  const d01 = (y1 - y0) / (x1 - x0);
  const d12 = (y2 - y1) / (x2 - x1);
  const curvature = (d12 - d01) / (x2 - x0);
  const peakS = curvature < 0 ? (x0 + x1) / 2 - d01 / (2 * curvature) : x1;
  const halfStepS = (x2 - x0) / 4;
  const lagS = Math.min(Math.max(peakS, x0), x2) - halfStepS - causeTimeS;
  return lagS >= 0 && lagS <= maxLagS
    ? { lagS }
    : { unmeasured: `the answer's peak (${lagS.toFixed(3)} s) is outside 0–${maxLagS} s` };
}

/** When `values` first crosses `level` (upwards if `isRising`) from sample `from` up to `until`. */
function crossingTime(
  time: Float64Array,
  values: Float64Array,
  from: number,
  until: number,
  level: number,
  isRising: boolean,
): { timeS: number; index: number } {
  const sign = isRising ? 1 : -1;
  for (let i = Math.max(1, from); i < time.length && time[i - 1] <= until; i++) {
    const before = sign * (values[i - 1] - level);
    const after = sign * (values[i] - level);
    if (before < 0 && after >= 0) {
      const f = before / (before - after);
      return { timeS: time[i - 1] + f * (time[i] - time[i - 1]), index: i };
    }
  }
  return { timeS: NaN, index: -1 };
}
