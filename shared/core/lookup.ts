/**
 * Where `x` falls on an ascending axis: the lower breakpoint index `i` and the fraction `f` in
 * [0, 1] towards `i + 1`. Outside the axis the position is clamped to its ends (no
 * extrapolation), so `f` is 0 at the low end and 1 at the high end (`i = n - 2`).
 */
export interface AxisPosition {
  /** Lower breakpoint index, 0 ≤ i ≤ n − 2. */
  i: number;
  /** Fraction towards breakpoint i + 1, 0 ≤ f ≤ 1. */
  f: number;
}

/** Locates `x` on `axis` (ascending, at least 2 breakpoints) with clamping at the ends. */
export function locate(axis: ArrayLike<number>, x: number): AxisPosition {
  const n = axis.length;
  const first = axis[0] as number;
  const last = axis[n - 1] as number;
  if (!(x > first)) return { i: 0, f: 0 };
  if (x >= last) return { i: n - 2, f: 1 };
  let lo = 0;
  let hi = n - 1;
  while (hi - lo > 1) {
    const mid = (lo + hi) >> 1;
    if ((axis[mid] as number) <= x) lo = mid;
    else hi = mid;
  }
  const a = axis[lo] as number;
  const b = axis[lo + 1] as number;
  return { i: lo, f: (x - a) / (b - a) };
}
