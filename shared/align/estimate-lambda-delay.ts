import { requireChannel, type ColumnarLog } from '../core/channels';
import { commandAnswerLag, type CommandAnswerLagOptions } from './command-answer-lag';
import {
  findDelayEvents,
  type DelayEventCandidate,
  type DelayEventKind,
  type FindDelayEventsOptions,
} from './find-delay-events';
import { fitDelayLine, median, type DelayLine } from './fit-delay-line';
import { logAirflowGps, type AirflowSource } from './log-airflow';
import { stepAnswerLag, tipInAnswerLag, type EventLag } from './measure-event-lag';
import { transitAirflow } from './transit-airflow';
import { DEFAULT_K_GRAMS, DEFAULT_MIN_AIRFLOW_GPS, DEFAULT_TAU0_S } from './transport-delay';

/** Options of {@link estimateLambdaDelay}. */
export interface EstimateLambdaDelayOptions
  extends AirflowSource, FindDelayEventsOptions, CommandAnswerLagOptions {
  /** K kept when the events cannot separate τ₀ from K, grams. Default 1 (DEFAULT_K_GRAMS). */
  readonly fallbackKGrams?: number;
  /** Airflow floor, g/s, as in the delay model. Default 1. */
  readonly minAirflowGps?: number;
  /**
   * Largest doubt an event's airflow may leave in its delay, s: K·(1/ṁ_low − 1/ṁ_high) over the
   * flows seen while its gas travelled, with K = `fallbackKGrams`. The τ₀ + K/ṁ model does not
   * say which of those flows sets the delay (the flow when the gas was burnt, when it arrives,
   * or their mean all have a case), so an event whose answer depends on that is set aside.
   * Default 0.03.
   */
  readonly maxFlowDoubtS?: number;
}

/** One timed event. */
export interface DelayEvent {
  /** What changed. */
  readonly kind: DelayEventKind;
  /** When it changed, s. */
  readonly timeS: number;
  /**
   * Airflow the event's gas travelled with, g/s: the harmonic mean from the change to its
   * answer (the flow at the change when unmeasured; NaN when unknown).
   */
  readonly airflowGps: number;
  /** Measured delay, s (NaN when unmeasured). */
  readonly lagS: number;
  /**
   * `used` in the fit; set aside as an `outlier` off the line; `setAside` when timed but not
   * trusted (the airflow changed on the way, or a rough tip-in where cleaner events exist); or
   * `unmeasured`.
   */
  readonly status: 'used' | 'outlier' | 'setAside' | 'unmeasured';
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
  /** Standard error of τ₀, s (NaN when nothing was fitted). */
  readonly tau0UncertaintyS: number;
  /** Standard error of K, grams (0 when K was kept; NaN when nothing was fitted). */
  readonly kUncertaintyG: number;
  /** How far to trust the figures. */
  readonly quality: 'good' | 'fair' | 'poor';
  /** The reason for the quality, in words for the user. */
  readonly reason: string;
}

/** Sensor time constant assumed when the log cannot measure it, s (UEGO 50–100 ms, §6). */
const DEFAULT_SENSOR_LAG_S = 0.075;

/** Half-width of that range, s: how far an assumed lag can move a ramp's timing. */
const SENSOR_LAG_DOUBT_S = 0.025;

/** Fewest clean events (steps and commanded ramps) that make tip-ins unnecessary. */
const ENOUGH_CLEAN_EVENTS = 3;

/**
 * Estimates τ₀ and K of τ = τ₀ + K/ṁ (reference.md §6) from the log itself. It finds changes of
 * commanded lambda, fuel-cut edges and tip-ins, and times the measured lambda's answer to each:
 * a two-point first-order fit for steps (which keeps the sensor's own lag out of the delay), a
 * least-squares fit of the lagged command for commanded ramps (with the sensor lag the steps
 * measured), and the peak lambda rate for tip-ins. Each event's airflow is the one its gas
 * travelled with, from the change to its answer; where that flow changed by more than
 * what `maxFlowDoubtS` allows (a tip-in, a fuel cut ended by the throttle, an idle wandering at
 * low flow) the event is set aside, since which flow sets its delay is model-dependent. Tip-ins, whose answer has no known shape, are set
 * aside when three cleaner events exist. The line is fitted robustly (Theil–Sen, then Huber);
 * events more than three robust deviations (and 40 ms) off it are outliers.
 * Quality: `good` needs both fitted from ≥ 5 events, physical values, an RMS misfit ≤ 30 ms,
 * τ₀ known to 15 ms and the delay at the lowest flow seen known to 30 ms from K; `fair` needs
 * ≥ 3 events within 60 ms and those uncertainties within 30 and 60 ms, or τ₀ alone known to
 * 30 ms; anything less is `poor`, so a τ₀ extrapolated from idle-only events says so.
 */
export function estimateLambdaDelay(
  log: ColumnarLog,
  options: EstimateLambdaDelayOptions = {},
): LambdaDelayEstimate {
  const { fallbackKGrams = DEFAULT_K_GRAMS, minAirflowGps = DEFAULT_MIN_AIRFLOW_GPS } = options;
  const { maxFlowDoubtS = 0.03 } = options;
  if (!(fallbackKGrams >= 0)) throw new Error('estimateLambdaDelay: fallbackKGrams must be ≥ 0');
  if (!(minAirflowGps > 0)) throw new Error('estimateLambdaDelay: minAirflowGps must be > 0');
  if (!(maxFlowDoubtS >= 0)) throw new Error('estimateLambdaDelay: maxFlowDoubtS must be ≥ 0');
  const time = requireChannel(log, 'time');
  const lambda = requireChannel(log, 'lambda');
  const target = log.channels.lambdaTarget;
  const airflow = logAirflowGps(log, options, 'estimateLambdaDelay');
  const candidates = findDelayEvents(log, options);
  // Steps first: their two-point fits measure the sensor's time constant for the ramps.
  const lags = new Map<DelayEventCandidate, EventLag>();
  for (const c of candidates) {
    if (c.kind === 'tipIn') lags.set(c, tipInAnswerLag(time, lambda, c.causeTimeS, options));
    else if (c.isStep) lags.set(c, stepAnswerLag(time, lambda, c.causeTimeS, options));
  }
  const stepTimeConstants = [...lags.values()].flatMap((lag) =>
    'timeConstantS' in lag && lag.timeConstantS !== undefined ? [lag.timeConstantS] : [],
  );
  // Without two clean steps to measure it, the sensor's lag is taken mid-range; a ramp then
  // cannot tell it from the delay, so the range's half-width joins τ₀'s uncertainty below.
  const isLagAssumed = options.timeConstantS === undefined && stepTimeConstants.length < 2;
  const timeConstantS =
    options.timeConstantS ?? (isLagAssumed ? DEFAULT_SENSOR_LAG_S : median(stepTimeConstants));
  for (const c of candidates) {
    if (lags.has(c) || !target) continue;
    lags.set(c, commandAnswerLag(time, lambda, target, c.spanS, { ...options, timeConstantS }));
  }
  let events = candidates.map((c): DelayEvent => {
    const lag = lags.get(c) as EventLag;
    const base = { kind: c.kind, timeS: c.causeTimeS };
    if ('unmeasured' in lag) {
      const at = transitAirflow(time, airflow, c.spanS[0], c.spanS[1], minAirflowGps);
      return {
        ...base,
        airflowGps: at.harmonicGps,
        lagS: NaN,
        status: 'unmeasured',
        note: lag.unmeasured,
      };
    }
    const flow = transitAirflow(time, airflow, c.spanS[0], c.spanS[1] + lag.lagS, minAirflowGps);
    const timed = { ...base, airflowGps: flow.harmonicGps, lagS: lag.lagS };
    if (Number.isNaN(flow.harmonicGps)) {
      return { ...timed, status: 'unmeasured', note: 'airflow unknown' };
    }
    if (fallbackKGrams * (1 / flow.minGps - 1 / flow.maxGps) > maxFlowDoubtS) {
      const range = `${flow.minGps.toFixed(1)}–${flow.maxGps.toFixed(1)} g/s`;
      return { ...timed, status: 'setAside', note: `airflow moved ${range} on the way` };
    }
    return { ...timed, status: 'used' };
  });
  const cleanUsed = events.filter((e) => isUsed(e) && e.kind !== 'tipIn').length;
  if (cleanUsed >= ENOUGH_CLEAN_EVENTS) {
    events = events.map((e) =>
      isUsed(e) && e.kind === 'tipIn'
        ? { ...e, status: 'setAside', note: `${cleanUsed} cleaner events; tip-ins time roughly` }
        : e,
    );
  }
  const point = (e: DelayEvent) => ({ x: 1 / Math.max(e.airflowGps, minAirflowGps), y: e.lagS });
  let fit = fitDelayLine(events.filter(isUsed).map(point), fallbackKGrams);
  if (fit && events.filter(isUsed).length >= 4) {
    const line = fit;
    const limit = Math.max(3 * line.scaleS, 0.04);
    const off = (e: DelayEvent) => e.lagS - line.predict(point(e).x);
    events = events.map((e) =>
      isUsed(e) && Math.abs(off(e)) > limit
        ? { ...e, status: 'outlier', note: `${(1000 * off(e)).toFixed(0)} ms off the line` }
        : e,
    );
    fit = fitDelayLine(events.filter(isUsed).map(point), fallbackKGrams);
  }
  const used = events.filter(isUsed);
  if (!fit) {
    return {
      tau0S: DEFAULT_TAU0_S,
      kGrams: DEFAULT_K_GRAMS,
      method: 'none',
      events,
      residualS: NaN,
      tau0UncertaintyS: NaN,
      kUncertaintyG: NaN,
      quality: 'poor',
      reason: `${used.length} timed event${used.length === 1 ? '' : 's'} (of ${events.length} found): defaults kept`,
    };
  }
  const isRamp = candidates.map((c) => c.kind === 'lambdaTargetStep' && !c.isStep);
  const hasAssumedLag = isLagAssumed && events.some((e, i) => isUsed(e) && isRamp[i]);
  const line = hasAssumedLag
    ? { ...fit, tau0SeS: Math.hypot(fit.tau0SeS, SENSOR_LAG_DOUBT_S) }
    : fit;
  const residualS = Math.sqrt(
    used.reduce((sum, e) => sum + (e.lagS - line.predict(point(e).x)) ** 2, 0) / used.length,
  );
  const maxX = Math.max(...used.map((e) => point(e).x));
  const meanX = used.reduce((sum, e) => sum + point(e).x, 0) / used.length;
  const { quality, reason } = rate(line, used.length, residualS, maxX, meanX, fallbackKGrams);
  return {
    tau0S: line.tau0S,
    kGrams: line.kGrams,
    method: line.method,
    events,
    residualS,
    tau0UncertaintyS: line.tau0SeS,
    kUncertaintyG: line.kSeG,
    quality,
    reason,
  };
}

/** Whether an event takes part in the fit. */
function isUsed(e: DelayEvent): boolean {
  return e.status === 'used';
}

/** The smallest τ₀ a real wideband and logger can have, s (see `rate`). */
const MIN_PLAUSIBLE_TAU0_S = 0.02;

/** The quality rules of {@link estimateLambdaDelay}, with the reason in words. */
function rate(
  fit: DelayLine,
  count: number,
  residualS: number,
  maxX: number,
  meanX: number,
  fallbackKGrams: number,
): Pick<LambdaDelayEstimate, 'quality' | 'reason'> {
  const ms = (s: number) => `${(1000 * s).toFixed(0)} ms`;
  const kSpreadS = fit.kSeG * maxX; // the delay's uncertainty at the lowest flow, from K alone
  const figures =
    `${count} events, RMS misfit ${ms(residualS)}, τ₀ ±${ms(fit.tau0SeS)}` +
    (fit.method === 'tau0AndK' ? `, K ±${fit.kSeG.toFixed(2)} g` : '');
  // τ₀ holds the sensor's response and the logger's latency, 0.05–0.2 s in practice (reference
  // §6, common practice): well under 20 ms means the fit traded τ₀ against K, not a real sensor.
  const isPhysical =
    fit.tau0S >= MIN_PLAUSIBLE_TAU0_S && fit.tau0S <= 1 && fit.kGrams >= 0 && fit.kGrams <= 20;
  if (!isPhysical) {
    return {
      quality: 'poor',
      reason: `${figures}; fitted values are not physical (τ₀ 0.02–1 s, K 0–20 g expected)`,
    };
  }
  if (fit.method === 'tau0Only') {
    // K is a guess: were it half wrong, the delay far from these events' flow would move by
    // K/2 · x̄ (at high flow; as much again the other way at low flow).
    const guessDoubtS = 0.5 * fallbackKGrams * meanX;
    const isFair = residualS <= 0.06 && fit.tau0SeS <= 0.03 && guessDoubtS <= 0.03;
    return {
      quality: isFair ? 'fair' : 'poor',
      reason: `${figures}; airflow range too narrow to separate τ₀ and K, K kept at ${fallbackKGrams} g`,
    };
  }
  if (count >= 5 && residualS <= 0.03 && fit.tau0SeS <= 0.015 && kSpreadS <= 0.03) {
    return { quality: 'good', reason: figures };
  }
  if (count >= 3 && residualS <= 0.06 && fit.tau0SeS <= 0.03 && kSpreadS <= 0.06) {
    return {
      quality: 'fair',
      reason: `${figures}; more events or a tighter fit would make it good`,
    };
  }
  const why =
    fit.tau0SeS > 0.03
      ? 'τ₀ is an extrapolation: the events need a wider range of airflow'
      : 'too few events or too much scatter';
  return { quality: 'poor', reason: `${figures}; ${why}` };
}
