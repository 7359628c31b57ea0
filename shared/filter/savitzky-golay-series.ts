import { polynomialFitWeights, savitzkyGolayCoefficients } from './savitzky-golay';

/** Options of {@link savitzkyGolaySeries}. */
export interface SavitzkyGolaySeriesOptions {
  /** Samples in each local fit; odd so the fit is centred. Default 7. */
  windowLength?: number;
  /** Degree of the local polynomial. Default 2. */
  polyOrder?: number;
  /** 0 smooths; 1 gives the rate per second of time; 2 the second derivative. Default 0. */
  derivative?: number;
}

/** Relative spread of time steps under which the grid counts as even (cached weights). */
const EVEN_STEP_TOLERANCE = 1e-9;

/**
 * Smooths a time series, or takes its derivative against time, by a local least-squares
 * polynomial (Savitzky–Golay). Each sample is fitted over the `windowLength` samples centred on
 * it, shifted inwards at the ends of the series, and the fit is evaluated at that sample's own
 * time. On an even time grid this is exactly scipy's `savgol_filter(..., mode='interp')`; on an
 * uneven grid the fit uses the real time offsets, so logs polled at irregular intervals need no
 * resampling. Samples whose time or value is NaN are left out of the fits; a sample whose
 * window holds fewer than `polyOrder + 1` usable points (or whose own time is NaN) gives NaN.
 *
 * Cost: O(n · windowLength · polyOrder) on an even grid (weights cached per window position);
 * on an uneven grid one small (polyOrder + 1)² solve per sample as well.
 */
export function savitzkyGolaySeries(
  time: Float64Array,
  values: Float64Array,
  options: SavitzkyGolaySeriesOptions = {},
): Float64Array {
  const { windowLength = 7, polyOrder = 2, derivative = 0 } = options;
  if (time.length !== values.length) {
    throw new Error(
      `savitzkyGolaySeries: time has ${time.length} samples but values has ${values.length}`,
    );
  }
  if (!Number.isInteger(windowLength) || windowLength < 3 || windowLength % 2 === 0) {
    throw new Error('savitzkyGolaySeries: windowLength must be an odd integer ≥ 3');
  }
  if (!Number.isInteger(polyOrder) || polyOrder < 0 || polyOrder >= windowLength) {
    throw new Error('savitzkyGolaySeries: polyOrder must be an integer in [0, windowLength)');
  }
  if (!Number.isInteger(derivative) || derivative < 0) {
    throw new Error('savitzkyGolaySeries: derivative must be a non-negative integer');
  }
  const n = time.length;
  const out = new Float64Array(n).fill(NaN);
  if (n < polyOrder + 1) return out;
  const width = Math.min(windowLength, n);
  const half = (windowLength - 1) / 2;
  const step = evenStep(time);
  const order = Math.min(polyOrder, width - 1);
  // On an even grid the weights depend only on the sample's place in its window: one set for
  // the interior, a few for the ends, each made once.
  const cached: (Float64Array | undefined)[] = [];
  const evenWeights = (position: number): Float64Array =>
    (cached[position] ??= savitzkyGolayCoefficients(width, order, {
      derivative,
      delta: step as number,
      position,
    }));
  // unusable[j]: how many samples before j have a NaN time or value, so that a window's count
  // of them is one subtraction.
  const unusable = new Int32Array(n + 1);
  for (let j = 0; j < n; j++) {
    unusable[j + 1] = unusable[j] + (Number.isNaN(time[j]) || Number.isNaN(values[j]) ? 1 : 0);
  }
  const centre = step !== null && width === windowLength ? evenWeights(half) : null;
  const offsets = new Float64Array(width);
  const picked = new Float64Array(width);

  for (let i = 0; i < n; i++) {
    if (
      centre !== null &&
      i >= half &&
      i + 3 + half < n &&
      unusable[i + 4 + half] === unusable[i - half]
    ) {
      // Four full interior windows: four sums side by side, each added in the same order as
      // alone (so the same result), which lets the processor overlap their additions.
      const lo = i - half;
      let s0 = 0;
      let s1 = 0;
      let s2 = 0;
      let s3 = 0;
      for (let k = 0; k < width; k++) {
        const w = centre[k];
        s0 += w * values[lo + k];
        s1 += w * values[lo + k + 1];
        s2 += w * values[lo + k + 2];
        s3 += w * values[lo + k + 3];
      }
      out[i] = s0;
      out[i + 1] = s1;
      out[i + 2] = s2;
      out[i + 3] = s3;
      i += 3;
      continue;
    }
    const ti = time[i];
    if (Number.isNaN(ti)) continue;
    const lo = Math.max(0, Math.min(i - half, n - width));
    if (step !== null && unusable[lo + width] === unusable[lo]) {
      // A full window on an even grid: a plain weighted sum, the convolution of scipy.
      const weights = i - lo === half && centre !== null ? centre : evenWeights(i - lo);
      let sum = 0;
      for (let k = 0; k < width; k++) sum += weights[k] * values[lo + k];
      out[i] = sum;
      continue;
    }
    let usable = 0;
    for (let j = lo; j < lo + width; j++) {
      if (Number.isNaN(time[j]) || Number.isNaN(values[j])) continue;
      offsets[usable] = time[j] - ti;
      picked[usable] = values[j];
      usable++;
    }
    if (usable < polyOrder + 1) continue;
    let weights: Float64Array;
    try {
      weights = polynomialFitWeights(offsets.subarray(0, usable), polyOrder, derivative);
    } catch {
      continue; // repeated timestamps left too few distinct points: the value is unknown
    }
    let sum = 0;
    for (let k = 0; k < usable; k++) sum += weights[k] * picked[k];
    out[i] = sum;
  }
  return out;
}

/** The common time step when the grid is even (all steps equal within tolerance), else null. */
function evenStep(time: Float64Array): number | null {
  const n = time.length;
  if (n < 2) return null;
  const first = time[1] - time[0];
  if (!(first > 0)) return null;
  for (let i = 2; i < n; i++) {
    const d = time[i] - time[i - 1];
    if (!(Math.abs(d - first) <= EVEN_STEP_TOLERANCE * Math.max(first, Math.abs(time[i])))) {
      return null;
    }
  }
  return first;
}
