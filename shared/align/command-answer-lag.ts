import { interpolateAtTime } from './interpolate-at-time';
import { type EventLag, type EventLagOptions } from './measure-event-lag';
import { firstIndexAfter } from './series-window';

/** Options of {@link commandAnswerLag}. */
export interface CommandAnswerLagOptions extends EventLagOptions {
  /**
   * The sensor's time constant, s, when the log's clean steps gave it; otherwise it is fitted
   * with the lag from 0.02–0.25 s.
   */
  readonly timeConstantS?: number;
  /** Least share of the measured lambda's variance the fitted answer must explain. Default 0.85. */
  readonly minExplained?: number;
  /** Largest standard error of a ramp's lag, from the fit's own scatter, s. Default 0.015. */
  readonly maxLagSeS?: number;
}

/** Grid of the fit, s: fine against a 20–100 Hz log, and the parabola refines the lag further. */
const GRID_S = 0.005;

/** Time constants tried when none is given, s (UEGO 50–100 ms, reference.md §6, and margin). */
const TIME_CONSTANTS_S = [0.02, 0.035, 0.05, 0.065, 0.08, 0.1, 0.125, 0.15, 0.2, 0.25];

/**
 * Times the sensor's answer to a change of commanded lambda that ramps over several samples (a
 * table lookup following MAP), where a two-point step fit does not apply. The answer is modelled
 * as the command, linear between samples, through a first-order lag T and a dead time θ, scaled
 * and offset freely (λ_meas ≈ a + b·lag_T(λ_cmd)(t − θ); the scale takes up a mixture error that
 * moves with the command, which a wrong table does). θ is the lag: it is searched on a 5 ms grid
 * from 0 to `maxLagS` by least squares over the span from `preS` before the change to `postS`
 * after `maxLagS` past it, and refined by a parabola. On a slow ramp only θ + T is well defined,
 * which is why a T measured on the log's clean steps is best passed in. The fit is refused when
 * the answer runs against the command, is smaller than `minChange`, or explains less than
 * `minExplained` of the variance (something else moved the mixture: tip-in fuel, trims).
 */
export function commandAnswerLag(
  time: Float64Array,
  lambda: Float64Array,
  target: Float64Array,
  spanS: readonly [number, number],
  options: CommandAnswerLagOptions = {},
): EventLag {
  const { maxLagS = 1.2, preS = 0.3, postS = 0.4, minChange = 0.02 } = options;
  const { timeConstantS, minExplained = 0.85, maxLagSeS = 0.015 } = options;
  const [startS, endS] = spanS;
  const fromS = startS - preS;
  const toS = endS + maxLagS + postS;
  const rows: number[] = [];
  for (let i = firstIndexAfter(time, fromS - 1e-12); i < time.length && time[i] <= toS; i++) {
    if (Number.isFinite(lambda[i])) rows.push(i);
  }
  if (rows.length < 8) return { unmeasured: 'too little lambda data around the change' };
  // The command on a fine grid reaching back far enough for the longest lag.
  const g0 = fromS - maxLagS;
  const n = Math.ceil((toS - g0) / GRID_S) + 2;
  const command = new Float64Array(n);
  let held = NaN;
  for (let k = 0; k < n; k++) {
    const v = interpolateAtTime(time, target, g0 + k * GRID_S);
    held = Number.isNaN(v) ? held : v;
    command[k] = held;
  }
  const firstKnown = command.findIndex((v) => !Number.isNaN(v));
  if (firstKnown < 0) return { unmeasured: 'no commanded lambda around the change' };
  command.fill(command[firstKnown], 0, firstKnown);
  const taus = timeConstantS !== undefined ? [timeConstantS] : TIME_CONSTANTS_S;
  const lags = Math.floor(maxLagS / GRID_S);
  let best = { sse: Infinity, tau: 0, lag: 0, slope: 0, sses: new Float64Array(0) };
  for (const tau of taus) {
    const lagged = firstOrderLag(command, tau);
    const sses = new Float64Array(lags + 1);
    for (let j = 0; j <= lags; j++) {
      const fit = regress(rows, time, lambda, lagged, g0 + j * GRID_S);
      sses[j] = fit.sse;
      if (fit.sse < best.sse) best = { sse: fit.sse, tau, lag: j, slope: fit.slope, sses };
    }
  }
  const y = rows.map((i) => lambda[i]);
  const meanY = y.reduce((s, v) => s + v, 0) / y.length;
  const syy = y.reduce((s, v) => s + (v - meanY) ** 2, 0);
  const change = command[command.length - 1] - command[0];
  if (!(best.slope > 0)) return { unmeasured: 'measured lambda ran against the command' };
  if (!(Math.abs(best.slope * change) >= minChange)) {
    return {
      unmeasured: `measured lambda followed the command by ${Math.abs(best.slope * change).toFixed(3)} only`,
    };
  }
  const explained = syy > 0 ? 1 - best.sse / syy : 0;
  if (!(explained >= minExplained)) {
    return {
      unmeasured: `the command explains ${(100 * explained).toFixed(0)} % of lambda's movement`,
    };
  }
  const j = best.lag;
  if (j === 0 || j === lags) return { unmeasured: `the answer lies outside 0–${maxLagS} s` };
  const [a, b, c] = [best.sses[j - 1], best.sses[j], best.sses[j + 1]];
  const curvature = a - 2 * b + c;
  // Standard error of θ from the curvature of the misfit (Gauss–Newton: var θ ≈ 2σ²/SSE''):
  // a slow or small change leaves the misfit flat, and its θ is then a guess.
  const sigma2 = best.sse / Math.max(1, rows.length - 4);
  const lagSeS = curvature > 0 ? Math.sqrt((2 * sigma2) / (curvature / GRID_S ** 2)) : Infinity;
  if (!(lagSeS <= maxLagSeS)) {
    return {
      unmeasured: `the change is too slow or small to time (±${(1000 * lagSeS).toFixed(0)} ms)`,
    };
  }
  const lagS = j * GRID_S + (GRID_S * (a - c)) / (2 * curvature);
  return { lagS, timeConstantS: best.tau };
}

/** First-order lag with time constant `tau` on the fine grid, starting settled. */
function firstOrderLag(input: Float64Array, tau: number): Float64Array {
  const out = new Float64Array(input.length);
  const alpha = 1 - Math.exp(-GRID_S / tau);
  let y = input[0];
  for (let k = 0; k < input.length; k++) {
    y += (input[k] - y) * alpha;
    out[k] = y;
  }
  return out;
}

/** Least-squares a + b·x of the rows' lambda on the lagged command read at t − θ. */
function regress(
  rows: readonly number[],
  time: Float64Array,
  lambda: Float64Array,
  lagged: Float64Array,
  shiftedStartS: number,
): { sse: number; slope: number } {
  let sx = 0;
  let sy = 0;
  let sxx = 0;
  let sxy = 0;
  let syy = 0;
  for (const i of rows) {
    const g = (time[i] - shiftedStartS) / GRID_S;
    const k = Math.max(0, Math.min(lagged.length - 2, Math.floor(g)));
    const f = Math.min(1, Math.max(0, g - k));
    const x = lagged[k] + f * (lagged[k + 1] - lagged[k]);
    const y = lambda[i];
    sx += x;
    sy += y;
    sxx += x * x;
    sxy += x * y;
    syy += y * y;
  }
  const m = rows.length;
  const vxx = sxx - (sx * sx) / m;
  const vxy = sxy - (sx * sy) / m;
  const vyy = syy - (sy * sy) / m;
  if (!(vxx > 1e-12)) return { sse: vyy, slope: 0 };
  return { sse: vyy - (vxy * vxy) / vxx, slope: vxy / vxx };
}
