import { requireChannel, type Channel, type ColumnarLog } from '../core/channels';
import {
  type FilterOptions,
  type FilterResult,
  type FilterRule,
  type FunnelDetail,
  type FunnelStep,
} from './filter-rules';
import { detectLambdaCeiling, markClimbToLean, markOverrunEntry } from './lambda-ceiling';
import { medianTimeStep } from './order-statistics';
import { compileSampleExpression, evaluateSampleExpression } from './sample-expression';
import { savitzkyGolaySeries } from './savitzky-golay-series';

/** Slack on settle-time comparisons, seconds (see `withSettle`). */
const SETTLE_SLACK_S = 1e-9;

/**
 * What one rule decided: the samples it removes (over the whole log) and what it found in the
 * log, or why it was skipped.
 */
type RuleOutcome = { readonly label: string } & (
  { readonly removes: Uint8Array; readonly detail?: FunnelDetail } | { readonly skipped: string }
);

/** Shared per-call state: the log, its time and the rates already taken. */
interface RuleContext {
  readonly log: ColumnarLog;
  readonly time: Float64Array;
  readonly keep: Uint8Array;
  readonly rateOf: (channel: Channel) => Float64Array;
}

/**
 * Applies `rules` to the samples of `log` in order and reports the funnel. Each rule counts
 * only the samples still kept when it runs, so the order decides which rule is charged for a
 * sample that several would remove. A rule whose channel the log lacks is skipped, with a note,
 * rather than failing the analysis. Rates are Savitzky–Golay derivatives against the time
 * channel (uneven steps handled by local fits); a rate that cannot be computed (NaN around the
 * sample) fails its rule, since steady state is then unproven. Settle times are measured from
 * the last offending sample, whether or not an earlier rule had already removed it. The log is
 * not changed.
 */
export function filterSamples(
  log: ColumnarLog,
  rules: readonly FilterRule[],
  options: FilterOptions = {},
): FilterResult {
  const { rateWindowS = 0.3, ratePolyOrder = 2 } = options;
  if (!Array.isArray(rules)) throw new Error('filterSamples: rules must be an array');
  if (!(rateWindowS > 0) || !Number.isFinite(rateWindowS)) {
    throw new Error('filterSamples: options.rateWindowS must be a positive number of seconds');
  }
  if (!Number.isInteger(ratePolyOrder) || ratePolyOrder < 1) {
    throw new Error('filterSamples: options.ratePolyOrder must be an integer ≥ 1');
  }
  const time = requireChannel(log, 'time');
  for (let i = 1; i < time.length; i++) {
    if (!(time[i] >= time[i - 1])) {
      throw new Error(`filterSamples: log time must ascend (sample ${i} is before ${i - 1})`);
    }
  }
  const windowLength = rateWindowSamples(time, rateWindowS);
  const rates = new Map<Channel, Float64Array>();
  const keep = new Uint8Array(log.length).fill(1);
  const context: RuleContext = {
    log,
    time,
    keep,
    rateOf: (channel) => {
      let rate = rates.get(channel);
      if (!rate) {
        rate = savitzkyGolaySeries(time, requireChannel(log, channel), {
          windowLength,
          polyOrder: Math.min(ratePolyOrder, windowLength - 1),
          derivative: 1,
        });
        rates.set(channel, rate);
      }
      return rate;
    },
  };
  let remaining = log.length;
  const funnel: FunnelStep[] = rules.map((rule, index) => {
    const outcome = ruleOutcome(rule, index, context);
    if ('skipped' in outcome) {
      const step = { rule: rule.kind, label: outcome.label, status: 'skipped' as const };
      return { ...step, note: outcome.skipped, removed: 0, remaining };
    }
    let removed = 0;
    for (let i = 0; i < keep.length; i++) {
      if (keep[i] === 1 && outcome.removes[i] === 1) {
        keep[i] = 0;
        removed++;
      }
    }
    remaining -= removed;
    const step = { rule: rule.kind, label: outcome.label, status: 'applied' as const };
    return outcome.detail
      ? { ...step, removed, remaining, detail: outcome.detail }
      : { ...step, removed, remaining };
  });
  return { keep, total: log.length, funnel };
}

/** The odd sample count nearest to `windowS` at the log's median time step (at least 3). */
function rateWindowSamples(time: Float64Array, windowS: number): number {
  const median = medianTimeStep(time);
  if (Number.isNaN(median)) return 3;
  const samples = Math.round(windowS / median) + 1;
  return Math.max(3, samples % 2 === 1 ? samples : samples + 1);
}

/** Evaluates one rule over the whole log. */
function ruleOutcome(rule: FilterRule, index: number, context: RuleContext): RuleOutcome {
  const { log, time } = context;
  const where = `filterSamples: rules[${index}]`;
  const channel = (name: Channel): Float64Array | undefined => log.channels[name];
  const missing = (name: Channel) => `the log has no "${name}" channel`;
  switch (rule.kind) {
    case 'warmUp': {
      const minEctC = finiteOption(rule.minEctC, 70, `${where}.minEctC`);
      const label = `warm-up: coolant below ${minEctC} °C`;
      const ect = channel('ect');
      if (!ect) return { label, skipped: missing('ect') };
      return { label, removes: mark(log.length, (i) => !(ect[i] >= minEctC)) };
    }
    case 'fuelCut': {
      const lean = positiveOption(rule.leanLimitLambda, 1.6, `${where}.leanLimitLambda`);
      const settleS = settleOption(rule.settleS, 1, `${where}.settleS`);
      const flag = channel('fuelCut');
      const lambda = channel('lambda');
      // The ceiling this log's wideband reports on fresh air (controllers differ: 1.36, 1.6…),
      // the sensor's rise into it, and the climb into cut on a closed throttle, so a cut shows
      // without the flag and with a ceiling under `lean`.
      const ceiling = lambda ? detectLambdaCeiling(log) : null;
      const intoCeiling = ceiling
        ? markClimbToLean(log, context.rateOf('lambda'), ceiling.fromLambda)
        : null;
      const overrun =
        lambda && channel('tps') && channel('rpm')
          ? markOverrunEntry(log, context.rateOf('lambda'))
          : null;
      const found = [
        'flag',
        `lambda ≥ ${lean}`,
        ...(ceiling ? [`lambda at the log's ceiling ${roundLambda(ceiling.lambda)}`] : []),
        ...(overrun ? ['closed-throttle overrun'] : []),
      ];
      const listed = `${found.slice(0, -1).join(', ')}, or ${found[found.length - 1]}`;
      const label = `fuel cut (${listed}) and ${settleS} s after`;
      if (!flag && !lambda) return { label, skipped: 'the log has no "fuelCut" or "lambda"' };
      const ceilingFrom = ceiling ? ceiling.fromLambda : Number.POSITIVE_INFINITY;
      const inCut = mark(
        log.length,
        (i) =>
          (flag !== undefined && flag[i] >= 0.5) ||
          (lambda !== undefined && (lambda[i] >= lean || lambda[i] >= ceilingFrom)) ||
          (intoCeiling !== null && intoCeiling[i] === 1) ||
          (overrun !== null && overrun[i] === 1),
      );
      const removes = withSettle(inCut, time, settleS);
      return ceiling
        ? { label, removes, detail: { ceilingLambda: ceiling.lambda } }
        : { label, removes };
    }
    case 'tipIn': {
      const limit = positiveOption(rule.maxTpsRatePctPerS, 10, `${where}.maxTpsRatePctPerS`);
      const settleS = settleOption(rule.settleS, 0.5, `${where}.settleS`);
      const isOpeningOnly = rule.direction === 'opening';
      const label = `throttle ${isOpeningOnly ? 'opening' : 'rate'} above ${limit} %/s and ${settleS} s after`;
      if (!channel('tps')) return { label, skipped: missing('tps') };
      const rate = context.rateOf('tps');
      const fast = mark(log.length, (i) =>
        isOpeningOnly ? !(rate[i] <= limit) : !(Math.abs(rate[i]) <= limit),
      );
      return { label, removes: withSettle(fast, time, settleS) };
    }
    case 'rpmRate':
    case 'mapRate': {
      const isRpm = rule.kind === 'rpmRate';
      const limit = isRpm
        ? positiveOption(rule.maxRpmPerS, 300, `${where}.maxRpmPerS`)
        : positiveOption(rule.maxKpaPerS, 20, `${where}.maxKpaPerS`);
      const settleS = settleOption(rule.settleS, 0, `${where}.settleS`);
      const name: Channel = isRpm ? 'rpm' : 'map';
      const label = `${isRpm ? 'RPM' : 'MAP'} rate above ${limit} ${isRpm ? 'rpm/s' : 'kPa/s'}${
        settleS > 0 ? ` and ${settleS} s after` : ''
      }`;
      if (!channel(name)) return { label, skipped: missing(name) };
      const rate = context.rateOf(name);
      const fast = mark(log.length, (i) => !(Math.abs(rate[i]) <= limit));
      return { label, removes: withSettle(fast, time, settleS) };
    }
    case 'lambdaRange': {
      const min = positiveOption(rule.min, 0.65, `${where}.min`);
      const max = positiveOption(rule.max, 1.3, `${where}.max`);
      if (!(max > min)) throw new Error(`${where}: max must be above min`);
      const label = `lambda outside ${min}–${max}`;
      const lambda = channel('lambda');
      if (!lambda) return { label, skipped: missing('lambda') };
      return { label, removes: mark(log.length, (i) => !(lambda[i] >= min && lambda[i] <= max)) };
    }
    case 'loopMode': {
      if (rule.keep !== 'closed' && rule.keep !== 'open') {
        throw new Error(`${where}.keep must be "closed" or "open"`);
      }
      const isClosedKept = rule.keep === 'closed';
      const label = `${isClosedKept ? 'open' : 'closed'} loop (only ${rule.keep} loop kept)`;
      const flag = channel('closedLoop');
      if (!flag) return { label, skipped: missing('closedLoop') };
      return { label, removes: mark(log.length, (i) => flag[i] >= 0.5 !== isClosedKept) };
    }
    case 'knock': {
      const maxDeg = finiteOption(rule.maxDeg, 0, `${where}.maxDeg`);
      const label = `knock retard above ${maxDeg}°`;
      const knock = channel('knock');
      if (!knock) return { label, skipped: missing('knock') };
      return { label, removes: mark(log.length, (i) => knock[i] > maxDeg) };
    }
    case 'expression': {
      const label = `expression: ${rule.source}`;
      const present = Object.keys(log.channels) as Channel[];
      const expression = compileSampleExpression(rule.source, present);
      const holds = evaluateSampleExpression(expression, log, context.keep);
      return { label, removes: mark(log.length, (i) => holds[i] === 0) };
    }
    default: {
      const unknown: { kind?: unknown } = rule;
      throw new Error(`${where}.kind "${String(unknown.kind)}" is not a filter rule`);
    }
  }
}

/** A 0/1 array with 1 where `test` holds. */
function mark(length: number, test: (i: number) => boolean): Uint8Array {
  const out = new Uint8Array(length);
  for (let i = 0; i < length; i++) out[i] = test(i) ? 1 : 0;
  return out;
}

/**
 * `marked` widened forward in time: every sample within `settleS` after a marked one. A
 * nanosecond of slack keeps a sample exactly `settleS` later inside despite binary rounding of
 * decimal timestamps (0.9 − 0.7 is 0.20000000000000007).
 */
function withSettle(marked: Uint8Array, time: Float64Array, settleS: number): Uint8Array {
  if (settleS === 0) return marked;
  const out = new Uint8Array(marked.length);
  let lastMarkedS = -Infinity;
  for (let i = 0; i < marked.length; i++) {
    if (marked[i] === 1) lastMarkedS = time[i];
    out[i] = marked[i] === 1 || time[i] - lastMarkedS <= settleS + SETTLE_SLACK_S ? 1 : 0;
  }
  return out;
}

/** Lambda rounded to 0.01 for a label (1.36, 1.6). */
function roundLambda(value: number): number {
  return Math.round(value * 100) / 100;
}

/** An option's value or its default, required finite. */
function finiteOption(value: number | undefined, fallback: number, name: string): number {
  const v = value ?? fallback;
  if (!Number.isFinite(v)) throw new Error(`${name} must be a finite number`);
  return v;
}

/** An option's value or its default, required positive. */
function positiveOption(value: number | undefined, fallback: number, name: string): number {
  const v = value ?? fallback;
  if (!(v > 0) || !Number.isFinite(v)) throw new Error(`${name} must be a positive number`);
  return v;
}

/** A settle time or its default, required ≥ 0 s. */
function settleOption(value: number | undefined, fallback: number, name: string): number {
  const v = value ?? fallback;
  if (!(v >= 0) || !Number.isFinite(v)) throw new Error(`${name} must be ≥ 0 seconds`);
  return v;
}
