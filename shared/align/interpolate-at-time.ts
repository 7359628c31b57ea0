/**
 * The value of a sampled series at time `t` by linear interpolation between the two samples
 * around it; NaN before the first or after the last sample (no extrapolation), and NaN when
 * either neighbour is NaN. `time` must ascend; repeated timestamps are allowed (the later
 * sample wins). Binary search: O(log n).
 */
export function interpolateAtTime(time: Float64Array, values: Float64Array, t: number): number {
  const n = time.length;
  if (n === 0 || !(t >= time[0]) || !(t <= time[n - 1])) return NaN;
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if (time[mid] <= t) lo = mid;
    else hi = mid;
  }
  if (t === time[hi]) return values[hi];
  const span = time[hi] - time[lo];
  if (!(span > 0)) return values[lo];
  const f = (t - time[lo]) / span;
  return f === 0 ? values[lo] : values[lo] + f * (values[hi] - values[lo]);
}
