/** Small helpers on a time-stamped series (internal to shared/align; not re-exported). */

/** Median of the finite values with time in [from, to]; NaN when there are none. */
export function windowMedian(
  time: Float64Array,
  values: Float64Array,
  from: number,
  to: number,
): number {
  const picked: number[] = [];
  for (let i = firstIndexAfter(time, from - 1e-12); i < time.length && time[i] <= to; i++) {
    if (!Number.isNaN(values[i])) picked.push(values[i]);
  }
  if (picked.length === 0) return NaN;
  picked.sort((x, y) => x - y);
  const m = picked.length >> 1;
  return picked.length % 2 === 1 ? picked[m] : (picked[m - 1] + picked[m]) / 2;
}

/** First index whose time is above `t` (time.length when none). */
export function firstIndexAfter(time: Float64Array, t: number): number {
  let lo = 0;
  let hi = time.length;
  while (lo < hi) {
    const mid = (lo + hi) >> 1;
    if (time[mid] > t) hi = mid;
    else lo = mid + 1;
  }
  return lo;
}
