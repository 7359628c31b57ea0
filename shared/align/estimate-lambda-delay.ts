import { requireChannel, type ColumnarLog } from '../core/channels';
import {
  findDelayEvents,
  type DelayEventKind,
  type FindDelayEventsOptions,
} from './find-delay-events';
import { interpolateAtTime } from './interpolate-at-time';
import { logAirflowGps, type AirflowSource } from './log-airflow';
import { stepAnswerLag, tipInAnswerLag, type EventLagOptions } from './measure-event-lag';
import { DEFAULT_K_GRAMS, DEFAULT_MIN_AIRFLOW_GPS, DEFAULT_TAU0_S } from './transport-delay';

/** Options of {@link estimateLambdaDelay}. */
export interface EstimateLambdaDelayOptions
  extends AirflowSource, FindDelayEventsOptions, EventLagOptions {
  /** K kept when the events cannot separate τ₀ from K, grams. Default 1 (DEFAULT_K_GRAMS). */
  readonly fallbackKGrams?: number;
  /** Airflow floor, g/s, as in the delay model. Default 1. */
  readonly minAirflowGps?: number;
}

/** One timed event. */
export interface DelayEvent {
  /** What changed. */
  readonly kind: DelayEventKind;
  /** When it changed, s. */
  readonly timeS: number;
  /** Airflow at that time, g/s (NaN when unknown). */
  readonly airflowGps: number;
  /** Measured delay, s (NaN when unmeasured). */
  readonly lagS: number;
  /** `used` in the fit, set aside as an `outlier`, or `unmeasured`. */
  readonly status: 'used' | 'outlier' | 'unmeasured';
  /** Why it was not used. */
  readonly note?: string;
}

/** What the log says about its own delay. */
export interface LambdaDelayEstimate {
  /** Fixed part, s (the default when nothing could be fitted). */
  readonly tau0S: number;
  /** Flow part, grams (the fallback when only τ₀ could be fitted). */
  readonly kGrams: number;
  /** What was fitted: both, τ₀ alone with K kept, or nothing (defaults returned). */
  readonly method: 'tau0AndK' | 'tau0Only' | 'none';
  /** Every event found, timed or not. */
  readonly events: readonly DelayEvent[];
  /** Root-mean-square misfit of the used events, s (NaN when nothing was fitted). */
  readonly residualS: number;
  /** How far to trust the figures. */
  readonly quality: 'good' | 'fair' | 'poor';
  /** The reason for the quality, in words for the user. */
  readonly reason: string;
}

/**
 * Estimates τ₀ and K of τ = τ₀ + K/ṁ (reference.md §6) from the log itself: it finds steps of
 * commanded lambda, fuel-cut edges and tip-ins, times the measured lambda's answer to each
 * (two-point step fit, or the peak of the lambda rate after a tip-in), and fits the line
 * τ = τ₀ + K·(1/ṁ) over the events by least squares, setting aside once any event more than
 * three robust deviations (and 40 ms) off the line. The spread of 1/ṁ across the events decides
 * whether K can be fitted; if not, K stays at `fallbackKGrams` and only τ₀ is fitted.
 * Quality: `good` needs both fitted from ≥ 5 events, physical values and an RMS misfit ≤ 30 ms;
 * `fair` is ≥ 3 events within 60 ms, or τ₀ alone; anything less is `poor`.
 */
export function estimateLambdaDelay(
  log: ColumnarLog,
  options: EstimateLambdaDelayOptions = {},
): LambdaDelayEstimate {
  const { fallbackKGrams = DEFAULT_K_GRAMS, minAirflowGps = DEFAULT_MIN_AIRFLOW_GPS } = options;
  if (!(fallbackKGrams >= 0)) throw new Error('estimateLambdaDelay: fallbackKGrams must be ≥ 0');
  if (!(minAirflowGps > 0)) throw new Error('estimateLambdaDelay: minAirflowGps must be > 0');
  const time = requireChannel(log, 'time');
  const lambda = requireChannel(log, 'lambda');
  const airflow = logAirflowGps(log, options, 'estimateLambdaDelay');
  const timed = findDelayEvents(log, options).map((candidate): DelayEvent => {
    const at = candidate.causeTimeS;
    const airflowGps = interpolateAtTime(time, airflow, at);
    const lag =
      candidate.kind === 'tipIn'
        ? tipInAnswerLag(time, lambda, at, options)
        : stepAnswerLag(time, lambda, at, options);
    const base = { kind: candidate.kind, timeS: at, airflowGps };
    if ('unmeasured' in lag) {
      return { ...base, lagS: NaN, status: 'unmeasured', note: lag.unmeasured };
    }
    if (Number.isNaN(airflowGps)) {
      return { ...base, lagS: lag.lagS, status: 'unmeasured', note: 'airflow unknown' };
    }
    return { ...base, lagS: lag.lagS, status: 'used' };
  });
  const x = (e: DelayEvent) => 1 / Math.max(e.airflowGps, minAirflowGps);
  let events = timed;
  let fit = fitDelayLine(events.filter(isUsed), x, fallbackKGrams);
  if (fit && events.filter(isUsed).length >= 4) {
    const residuals = events.filter(isUsed).map((e) => Math.abs(e.lagS - fit!.predict(x(e))));
    const limit = Math.max(3 * 1.4826 * median(residuals), 0.04);
    events = events.map((e) =>
      isUsed(e) && Math.abs(e.lagS - fit!.predict(x(e))) > limit
        ? {
            ...e,
            status: 'outlier',
            note: `${(1000 * (e.lagS - fit!.predict(x(e)))).toFixed(0)} ms off the line`,
          }
        : e,
    );
    fit = fitDelayLine(events.filter(isUsed), x, fallbackKGrams);
  }
  const used = events.filter(isUsed);
  if (!fit) {
    return {
      tau0S: DEFAULT_TAU0_S,
      kGrams: DEFAULT_K_GRAMS,
      method: 'none',
      events,
      residualS: NaN,
      quality: 'poor',
      reason: `${used.length} timed event${used.length === 1 ? '' : 's'} (of ${events.length} found): defaults kept`,
    };
  }
  const residualS = Math.sqrt(
    used.reduce((sum, e) => sum + (e.lagS - fit!.predict(x(e))) ** 2, 0) / used.length,
  );
  const isPhysical = fit.tau0S >= 0 && fit.tau0S <= 1 && fit.kGrams >= 0 && fit.kGrams <= 20;
  const figures = `${used.length} events, RMS misfit ${(residualS * 1000).toFixed(0)} ms`;
  let quality: LambdaDelayEstimate['quality'];
  let reason: string;
  if (!isPhysical) {
    quality = 'poor';
    reason = `${figures}; fitted values are not physical (τ₀ 0–1 s, K 0–20 g expected)`;
  } else if (fit.method === 'tau0Only') {
    quality = residualS <= 0.06 ? 'fair' : 'poor';
    reason = `${figures}; airflow range too narrow to separate τ₀ and K, K kept at ${fallbackKGrams} g`;
  } else if (used.length >= 5 && residualS <= 0.03) {
    quality = 'good';
    reason = figures;
  } else if (used.length >= 3 && residualS <= 0.06) {
    quality = 'fair';
    reason = `${figures}; more events or a tighter fit would make it good`;
  } else {
    quality = 'poor';
    reason = `${figures}; too few events or too much scatter`;
  }
  return {
    tau0S: fit.tau0S,
    kGrams: fit.kGrams,
    method: fit.method,
    events,
    residualS,
    quality,
    reason,
  };
}

/** Whether an event takes part in the fit. */
function isUsed(e: DelayEvent): boolean {
  return e.status === 'used';
}

interface DelayLine {
  readonly tau0S: number;
  readonly kGrams: number;
  readonly method: 'tau0AndK' | 'tau0Only';
  readonly predict: (x: number) => number;
}

/**
 * Least-squares line lag = τ₀ + K·x. Needs 2 events; K is fitted only when x spreads by at least
 * half its mean (an airflow range of about 1.7 : 1), below which K and τ₀ trade off freely.
 */
function fitDelayLine(
  used: readonly DelayEvent[],
  x: (e: DelayEvent) => number,
  fallbackKGrams: number,
): DelayLine | null {
  if (used.length < 2) return null;
  const xs = used.map(x);
  const ys = used.map((e) => e.lagS);
  const meanX = xs.reduce((s, v) => s + v, 0) / xs.length;
  const meanY = ys.reduce((s, v) => s + v, 0) / ys.length;
  const spread = Math.max(...xs) - Math.min(...xs);
  if (used.length >= 3 && spread >= 0.5 * meanX) {
    let sxx = 0;
    let sxy = 0;
    for (let i = 0; i < xs.length; i++) {
      sxx += (xs[i] - meanX) ** 2;
      sxy += (xs[i] - meanX) * (ys[i] - meanY);
    }
    const kGrams = sxy / sxx;
    const tau0S = meanY - kGrams * meanX;
    return { tau0S, kGrams, method: 'tau0AndK', predict: (v) => tau0S + kGrams * v };
  }
  const tau0S = meanY - fallbackKGrams * meanX;
  return {
    tau0S,
    kGrams: fallbackKGrams,
    method: 'tau0Only',
    predict: (v) => tau0S + fallbackKGrams * v,
  };
}

/** Median of a non-empty list. */
function median(values: readonly number[]): number {
  const sorted = [...values].sort((a, b) => a - b);
  const m = sorted.length >> 1;
  return sorted.length % 2 === 1 ? sorted[m] : (sorted[m - 1] + sorted[m]) / 2;
}
