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
   * the first after, the unbiased guess when the logger saw it somewhere in that interval.
   */
  readonly causeTimeS: number;
}

/** Options of {@link findDelayEvents}. */
export interface FindDelayEventsOptions {
  /** Smallest jump in commanded lambda between two samples that counts as a step. Default 0.03. */
  readonly minTargetStep?: number;
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
 * Finds the events the delay estimate can time: steps in commanded lambda, both edges of the
 * fuel-cut flag, and throttle tip-ins (the first interval whose opening rate passes
 * `tipInRatePctPerS`). Channels the log lacks give no events of their kind. Where events fall
 * within `isolationS` of each other only one is kept, by priority (commanded step, then fuel
 * cut, then tip-in) and then by time, since overlapping answers cannot be told apart.
 */
export function findDelayEvents(
  log: ColumnarLog,
  options: FindDelayEventsOptions = {},
): DelayEventCandidate[] {
  const { minTargetStep = 0.03, tipInRatePctPerS = 50, isolationS = 2 } = options;
  if (!(minTargetStep > 0)) throw new Error('findDelayEvents: minTargetStep must be > 0');
  if (!(tipInRatePctPerS > 0)) throw new Error('findDelayEvents: tipInRatePctPerS must be > 0');
  if (!(isolationS >= 0)) throw new Error('findDelayEvents: isolationS must be ≥ 0');
  const time = requireChannel(log, 'time');
  const found: DelayEventCandidate[] = [];
  const add = (kind: DelayEventKind, i: number) =>
    found.push({ kind, index: i, causeTimeS: (time[i - 1] + time[i]) / 2 });
  const target = log.channels.lambdaTarget;
  const cut = log.channels.fuelCut;
  const tps = log.channels.tps;
  let wasOpening = true; // no tip-in at the very start: the run-up before it is unknown
  for (let i = 1; i < log.length; i++) {
    if (!(time[i] > time[i - 1])) continue;
    if (target && Math.abs(target[i] - target[i - 1]) >= minTargetStep) add('lambdaTargetStep', i);
    if (cut && cut[i] >= 0.5 !== cut[i - 1] >= 0.5 && !Number.isNaN(cut[i] + cut[i - 1])) {
      add('fuelCutEdge', i);
    }
    if (tps) {
      const isOpening = (tps[i] - tps[i - 1]) / (time[i] - time[i - 1]) > tipInRatePctPerS;
      if (isOpening && !wasOpening) add('tipIn', i);
      wasOpening = isOpening;
    }
  }
  const byPriority = [...found].sort(
    (a, b) => PRIORITY[a.kind] - PRIORITY[b.kind] || a.causeTimeS - b.causeTimeS,
  );
  const kept: DelayEventCandidate[] = [];
  for (const event of byPriority) {
    if (kept.every((k) => Math.abs(k.causeTimeS - event.causeTimeS) >= isolationS))
      kept.push(event);
  }
  // An event dropped for a neighbour still spoils that neighbour when the two overlap.
  const isolated = kept.filter((event) =>
    found.every(
      (other) =>
        other === event ||
        Math.abs(other.causeTimeS - event.causeTimeS) >= isolationS ||
        PRIORITY[other.kind] > PRIORITY[event.kind],
    ),
  );
  return isolated.sort((a, b) => a.causeTimeS - b.causeTimeS);
}
