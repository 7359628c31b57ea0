/** One event on the delay line: x = 1/ṁ (s/g), y = the measured lag (s). */
export interface DelayPoint {
  /** 1/ṁ, s/g. */
  readonly x: number;
  /** Measured lag, s. */
  readonly y: number;
}

/** A fitted line lag = τ₀ + K·x with its uncertainty. */
export interface DelayLine {
  /** Fixed part, s. */
  readonly tau0S: number;
  /** Flow part, grams. */
  readonly kGrams: number;
  /** Whether K was fitted or kept at the fallback. */
  readonly method: 'tau0AndK' | 'tau0Only';
  /** Standard error of τ₀, s. */
  readonly tau0SeS: number;
  /** Standard error of K, g (0 when K was kept, not fitted). */
  readonly kSeG: number;
  /** Robust scatter of the events about the line, s. */
  readonly scaleS: number;
  /** The line's lag at `x`, s. */
  readonly predict: (x: number) => number;
}

/** Huber's tuning constant: 95 % efficiency on normal scatter (Huber 1964, common practice). */
const HUBER_C = 1.345;

/**
 * Scatter floor, s: event timings from a 20–100 Hz log by different methods do not agree better
 * than about 10 ms, so a tighter-looking handful of events is not trusted further.
 */
const MIN_SCALE_S = 0.01;

/**
 * Robust line lag = τ₀ + K·x: Theil–Sen to start (the median of pairwise slopes, which a third
 * of bad events cannot move far), then Huber-weighted least squares, so events off the line
 * count linearly instead of quadratically. Needs 2 events; K is fitted only from 3 events whose
 * x spreads by at least half its mean (an airflow range of about 1.7 : 1), below which τ₀ and
 * K trade off freely and K stays at `fallbackKGrams`. Standard errors are the weighted
 * least-squares ones with the robust scatter, so a τ₀ reached only by extrapolating from low
 * flows comes with the large error it deserves.
 */
export function fitDelayLine(
  points: readonly DelayPoint[],
  fallbackKGrams: number,
): DelayLine | null {
  const n = points.length;
  if (n < 2) return null;
  const xs = points.map((p) => p.x);
  const meanX = xs.reduce((s, v) => s + v, 0) / n;
  const fitsK = n >= 3 && Math.max(...xs) - Math.min(...xs) >= 0.5 * meanX;
  let k = fitsK ? theilSenSlope(points) : fallbackKGrams;
  let tau0 = median(points.map((p) => p.y - k * p.x));
  let weights = points.map(() => 1);
  let scale = MIN_SCALE_S;
  for (let iteration = 0; iteration < 30; iteration++) {
    const residuals = points.map((p) => p.y - tau0 - k * p.x);
    scale = Math.max(1.4826 * median(residuals.map(Math.abs)), MIN_SCALE_S);
    weights = residuals.map((r) => Math.min(1, (HUBER_C * scale) / Math.max(Math.abs(r), 1e-12)));
    const next = weightedLine(points, weights, fitsK ? null : fallbackKGrams);
    const moved = Math.abs(next.tau0 - tau0) + Math.abs(next.k - k) * meanX;
    tau0 = next.tau0;
    k = next.k;
    if (moved < 1e-7) break;
  }
  const sw = weights.reduce((s, w) => s + w, 0);
  const xw = points.reduce((s, p, i) => s + weights[i] * p.x, 0) / sw;
  const sxx = points.reduce((s, p, i) => s + weights[i] * (p.x - xw) ** 2, 0);
  const dof = Math.max(1, sw - (fitsK ? 2 : 1));
  const rss = points.reduce((s, p, i) => s + weights[i] * (p.y - tau0 - k * p.x) ** 2, 0);
  // The larger of the robust and the weighted scatter: a handful of events can look tight.
  const s2 = Math.max(scale * scale, rss / dof);
  const tau0SeS = fitsK ? Math.sqrt(s2 * (1 / sw + (xw * xw) / sxx)) : Math.sqrt(s2 / sw);
  const kSeG = fitsK ? Math.sqrt(s2 / sxx) : 0;
  const [t, g] = [tau0, k];
  return {
    tau0S: t,
    kGrams: g,
    method: fitsK ? 'tau0AndK' : 'tau0Only',
    tau0SeS,
    kSeG,
    scaleS: scale,
    predict: (x) => t + g * x,
  };
}

/** Weighted least squares; with `fixedK` only the intercept is fitted. */
function weightedLine(
  points: readonly DelayPoint[],
  weights: readonly number[],
  fixedK: number | null,
): { tau0: number; k: number } {
  const sw = weights.reduce((s, w) => s + w, 0);
  const xw = points.reduce((s, p, i) => s + weights[i] * p.x, 0) / sw;
  const yw = points.reduce((s, p, i) => s + weights[i] * p.y, 0) / sw;
  if (fixedK !== null) return { tau0: yw - fixedK * xw, k: fixedK };
  let sxx = 0;
  let sxy = 0;
  points.forEach((p, i) => {
    sxx += weights[i] * (p.x - xw) ** 2;
    sxy += weights[i] * (p.x - xw) * (p.y - yw);
  });
  const k = sxy / sxx;
  return { tau0: yw - k * xw, k };
}

/** Median of the slopes between every pair of points with different x (Theil 1950, Sen 1968). */
function theilSenSlope(points: readonly DelayPoint[]): number {
  const slopes: number[] = [];
  for (let i = 0; i < points.length; i++) {
    for (let j = i + 1; j < points.length; j++) {
      const dx = points[j].x - points[i].x;
      if (Math.abs(dx) > 1e-9) slopes.push((points[j].y - points[i].y) / dx);
    }
  }
  return slopes.length > 0 ? median(slopes) : 0;
}

/** Median of a non-empty list. */
export function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const m = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[m] : (sorted[m - 1] + sorted[m]) / 2;
}
