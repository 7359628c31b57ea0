import { requireChannel, type ColumnarLog } from '../core/channels';

/** What kind of change in the engine's input an event is. */
export type DelayEventKind = 'lambdaTargetStep' | 'fuelCutEdge' | 'tipIn';

/** A moment where the mixture changed for a known reason, so the sensor's answer can be timed. */
export interface DelayEventCandidate {
  /** What changed. */
  readonly kind: DelayEventKind;
  /** First sample showing the change. */
  readonly index: number;
  /**
   * When the change happened, s: the middle of the step between the last sample before it and
   * the first after, the unbiased guess when the logger saw it somewhere in that interval. For a
   * commanded lambda that ramps over several samples, the time it was half-way.
   */
  readonly causeTimeS: number;
  /** When the change began and ended, s (both `causeTimeS` for a change within one interval). */
  readonly spanS: readonly [number, number];
  /** Whether the change happened within one sample interval (a step) rather than a ramp. */
  readonly isStep: boolean;
  /** Fuel-cut edges: whether the cut began (true) or ended (false). */
  readonly isOnset?: boolean;
}

/** Options of {@link findDelayEvents}. */
export interface FindDelayEventsOptions {
  /** Smallest change of commanded lambda (a step, or a ramp) that counts. Default 0.03. */
  readonly minTargetStep?: number;
  /** Longest ramp of commanded lambda taken as one event, s. Default 1. */
  readonly maxTargetRampS?: number;
  /**
   * Fastest throttle movement, %/s, allowed from 0.3 s before a commanded change to its end: a
   * moving throttle brings transient fuel (tip-in enrichment, wall film) that moves the mixture
   * ahead of the command. Default 20.
   */
  readonly steadyThrottlePctPerS?: number;
  /** Throttle opening rate (between two samples) that starts a tip-in, %/s. Default 50. */
  readonly tipInRatePctPerS?: number;
  /**
   * Quiet time every accepted event needs around it, s: another event in that span would reach
   * the sensor during this one's answer. Default 2.
   */
  readonly isolationS?: number;
}

/** Priority when two events fall close together: the cleaner the input, the earlier. */
const PRIORITY: Readonly<Record<DelayEventKind, number>> = {
  lambdaTargetStep: 0,
  fuelCutEdge: 1,
  tipIn: 2,
};

/**
 * Commanded lambda moving slower than this is taken as still, per second so that the sample rate
 * does not matter: 0.03/s is a twentieth of the slowest change worth timing (0.03 in 1 s).
 */
const TARGET_STILL_PER_S = 0.03;

/** A sample gap inside a ramp that does not end it, s (an ECU can hold a value a sample or two). */
const RAMP_GAP_S = 0.15;

/**
 * Finds the events the delay estimate can time: changes of commanded lambda (a step within one
 * sample interval, or a monotonic ramp up to `maxTargetRampS` long, as a table lookup gives
 * while MAP moves), both edges of the fuel-cut flag, and throttle tip-ins (the first interval
 * whose opening rate passes `tipInRatePctPerS`). Channels the log lacks give no events of their
 * kind. Where events fall within `isolationS` of each other only one is kept, by priority
 * (commanded lambda, then fuel cut, then tip-in) and then by time, since overlapping answers
 * cannot be told apart.
 */
export function findDelayEvents(
  log: ColumnarLog,
  options: FindDelayEventsOptions = {},
): DelayEventCandidate[] {
  const { minTargetStep = 0.03, maxTargetRampS = 1, tipInRatePctPerS = 50 } = options;
  const { isolationS = 2, steadyThrottlePctPerS = 20 } = options;
  if (!(minTargetStep > 0)) throw new Error('findDelayEvents: minTargetStep must be > 0');
  if (!(maxTargetRampS >= 0)) throw new Error('findDelayEvents: maxTargetRampS must be ≥ 0');
  if (!(tipInRatePctPerS > 0)) throw new Error('findDelayEvents: tipInRatePctPerS must be > 0');
  if (!(isolationS >= 0)) throw new Error('findDelayEvents: isolationS must be ≥ 0');
  const time = requireChannel(log, 'time');
  const found: DelayEventCandidate[] = [];
  const mid = (i: number) => (time[i - 1] + time[i]) / 2;
  const add = (kind: DelayEventKind, i: number, isOnset?: boolean) =>
    found.push({
      kind,
      index: i,
      causeTimeS: mid(i),
      spanS: [mid(i), mid(i)],
      isStep: true,
      isOnset,
    });
  const cut = log.channels.fuelCut;
  const tps = log.channels.tps;
  let wasOpening = true; // no tip-in at the very start: the run-up before it is unknown
  for (let i = 1; i < log.length; i++) {
    if (!(time[i] > time[i - 1])) continue;
    if (cut && cut[i] >= 0.5 !== cut[i - 1] >= 0.5 && !Number.isNaN(cut[i] + cut[i - 1])) {
      add('fuelCutEdge', i, cut[i] >= 0.5);
    }
    if (tps) {
      const isOpening = (tps[i] - tps[i - 1]) / (time[i] - time[i - 1]) > tipInRatePctPerS;
      if (isOpening && !wasOpening) add('tipIn', i);
      wasOpening = isOpening;
    }
  }
  const target = log.channels.lambdaTarget;
  if (target) {
    const changes = targetChanges(time, target, minTargetStep, maxTargetRampS);
    const isSteady = (c: DelayEventCandidate) =>
      !tps || maxRate(time, tps, c.spanS[0] - 0.3, c.spanS[1]) <= steadyThrottlePctPerS;
    found.push(...changes.filter(isSteady));
  }
  const gap = (a: DelayEventCandidate, b: DelayEventCandidate) =>
    Math.max(0, b.spanS[0] - a.spanS[1], a.spanS[0] - b.spanS[1]);
  const byPriority = [...found].sort(
    (a, b) => PRIORITY[a.kind] - PRIORITY[b.kind] || a.causeTimeS - b.causeTimeS,
  );
  const kept: DelayEventCandidate[] = [];
  for (const event of byPriority) {
    if (kept.every((k) => gap(k, event) >= isolationS)) kept.push(event);
  }
  // An event dropped for a neighbour still spoils that neighbour when the two overlap. A
  // cleaner kind is spoiled by a rougher one only when that moves the mixture by itself: a
  // fuel-cut edge does (to the sensor's lean limit); a tip-in beside a commanded change is the
  // same throttle movement that moved the command.
  const spoils = (other: DelayEventCandidate, event: DelayEventCandidate) =>
    PRIORITY[other.kind] <= PRIORITY[event.kind] || other.kind === 'fuelCutEdge';
  const isolated = kept.filter((event) =>
    found.every(
      (other) => other === event || gap(other, event) >= isolationS || !spoils(other, event),
    ),
  );
  return isolated.sort((a, b) => a.causeTimeS - b.causeTimeS);
}

/**
 * Monotonic runs of commanded lambda whose net change reaches `minStep` within `maxRampS`. A run
 * ends where the command turns back or stands still for longer than {@link RAMP_GAP_S}.
 */
function targetChanges(
  time: Float64Array,
  target: Float64Array,
  minStep: number,
  maxRampS: number,
): DelayEventCandidate[] {
  const out: DelayEventCandidate[] = [];
  let first = -1; // first sample of the run that differs from the one before it
  let last = -1; // last sample of the run that moved
  let sign = 0;
  const close = () => {
    if (first < 0) return;
    const before = target[first - 1];
    const change = target[last] - before;
    const startS = (time[first - 1] + time[first]) / 2;
    const endS = (time[last - 1] + time[last]) / 2;
    if (Math.abs(change) >= minStep && endS - startS <= maxRampS) {
      // Half-way: where the command crossed the middle of its change, between samples.
      let half = last;
      for (let i = first; i <= last; i++) {
        if (sign * (target[i] - before) >= sign * change * 0.5) {
          half = i;
          break;
        }
      }
      const causeTimeS = (time[half - 1] + time[half]) / 2;
      out.push({
        kind: 'lambdaTargetStep',
        index: first,
        causeTimeS,
        spanS: [startS, endS],
        isStep: first === last,
      });
    }
    first = -1;
    sign = 0;
  };
  for (let i = 1; i < time.length; i++) {
    const step = target[i] - target[i - 1];
    if (!(time[i] > time[i - 1]) || Number.isNaN(step)) {
      close();
      continue;
    }
    if (Math.abs(step) < TARGET_STILL_PER_S * (time[i] - time[i - 1])) {
      if (first >= 0 && time[i] - time[last] > RAMP_GAP_S) close();
      continue;
    }
    const s = Math.sign(step);
    if (first >= 0 && s !== sign) close();
    if (first < 0) {
      first = i;
      sign = s;
    }
    last = i;
  }
  close();
  return out;
}

/** Largest |rate| of `values` between samples within [fromS, toS], per second. */
function maxRate(time: Float64Array, values: Float64Array, fromS: number, toS: number): number {
  let most = 0;
  for (let i = 1; i < time.length && time[i - 1] <= toS; i++) {
    if (time[i] < fromS || !(time[i] > time[i - 1])) continue;
    const rate = Math.abs(values[i] - values[i - 1]) / (time[i] - time[i - 1]);
    if (rate > most || Number.isNaN(rate)) most = Number.isNaN(rate) ? Infinity : rate;
  }
  return most;
}
