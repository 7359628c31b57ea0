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
  const cached = new Map<number, Float64Array>();
  const offsets = new Float64Array(width);
  const picked = new Float64Array(width);

  for (let i = 0; i < n; i++) {
    const ti = time[i];
    if (Number.isNaN(ti)) continue;
    const lo = Math.max(0, Math.min(i - half, n - width));
    let usable = 0;
    for (let j = lo; j < lo + width; j++) {
      if (Number.isNaN(time[j]) || Number.isNaN(values[j])) continue;
      offsets[usable] = time[j] - ti;
      picked[usable] = values[j];
      usable++;
    }
    if (usable < polyOrder + 1) continue;
    let weights: Float64Array;
    if (step !== null && usable === width) {
      const position = i - lo;
      let w = cached.get(position);
      if (!w) {
        w = savitzkyGolayCoefficients(width, Math.min(polyOrder, width - 1), {
          derivative,
          delta: step,
          position,
        });
        cached.set(position, w);
      }
      weights = w;
    } else {
      try {
        weights = polynomialFitWeights(offsets.subarray(0, usable), polyOrder, derivative);
      } catch {
        continue; // repeated timestamps left too few distinct points: the value is unknown
      }
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
