/**
 * Order statistics the filter rules share: the k-th smallest value by selection, a quantile of a
 * channel's finite values and a log's median time step.
 */

/**
 * The k-th smallest of `values` (from 0), as `sorted[k]` would be, found by selection in O(n)
 * rather than a sort: a million steps sort in about 100 ms. Reorders `values`, which must hold
 * no NaN.
 */
export function kthSmallest(values: Float64Array, k: number): number {
  let lo = 0;
  let hi = values.length - 1;
  while (lo < hi) {
    // Hoare partition around the middle value; equal values may land on either side.
    const pivot = values[(lo + hi) >> 1];
    let i = lo;
    let j = hi;
    while (i <= j) {
      while (values[i] < pivot) i++;
      while (values[j] > pivot) j--;
      if (i <= j) {
        const t = values[i];
        values[i] = values[j];
        values[j] = t;
        i++;
        j--;
      }
    }
    if (k <= j) hi = j;
    else if (k >= i) lo = i;
    else return values[k];
  }
  return values[k];
}

/**
 * The `q` quantile (0–1, nearest rank below) of the finite values of `data` at the samples where
 * `include` holds; NaN when there are none. `data` is not changed.
 */
export function quantileWhere(
  data: Float64Array,
  q: number,
  include: (i: number) => boolean = () => true,
): number {
  const picked = new Float64Array(data.length);
  let count = 0;
  for (let i = 0; i < data.length; i++) {
    if (Number.isFinite(data[i]) && include(i)) picked[count++] = data[i];
  }
  if (count === 0) return Number.NaN;
  return kthSmallest(picked.subarray(0, count), Math.min(count - 1, Math.floor(q * count)));
}

/** The median of the positive steps between successive times; NaN when there is none. */
export function medianTimeStep(time: Float64Array): number {
  const steps = new Float64Array(Math.max(0, time.length - 1));
  let count = 0;
  for (let i = 1; i < time.length; i++) {
    const d = time[i] - time[i - 1];
    if (d > 0) steps[count++] = d;
  }
  if (count === 0) return Number.NaN;
  return kthSmallest(steps.subarray(0, count), count >> 1);
}
