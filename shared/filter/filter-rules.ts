/**
 * The steady-state rules a log's samples pass through before they count towards a correction,
 * and the shapes of their result. Defaults are common practice in the trade (reference.md §7,
 * all [P]): warm-up below 70 °C coolant, throttle rate 10 %/s with 0.5 s to settle, RPM rate
 * 300 rpm/s, MAP rate 20 kPa/s, fuel cut plus 1 s, lambda outside 0.65–1.3.
 */

/** Leave out samples while the engine is cold (coolant below `minEctC`). */
export interface WarmUpRule {
  readonly kind: 'warmUp';
  /** Lowest coolant temperature kept, °C. Default 70. */
  readonly minEctC?: number;
}

/**
 * Leave out fuel cut and the time the sensor needs to come back from free air. A sample is in
 * fuel cut when the `fuelCut` flag is 1; or when measured lambda is at or above
 * `leanLimitLambda`; or when it is at the lean ceiling the log's own wideband reports on fresh
 * air (found from a plateau of its leanest readings on a closed throttle, since controllers
 * report different ceilings, λ 1.36 on some; see `detectLambdaCeiling`) or climbing fast into it;
 * or, with throttle and engine speed logged, when lambda climbs lean on a closed throttle above
 * idle (the overrun going into cut; see `markOverrunEntry`). Any of these channels may be
 * absent. The ceiling found is shown in the funnel (`FunnelStep.detail.ceilingLambda`).
 */
export interface FuelCutRule {
  readonly kind: 'fuelCut';
  /**
   * Measured lambda at or above which the sample counts as fuel cut, whatever ceiling the log
   * shows. Default 1.6.
   */
  readonly leanLimitLambda?: number;
  /** Seconds after the last fuel-cut sample also left out. Default 1. */
  readonly settleS?: number;
}

/**
 * Leave out throttle transients (tip-in enrichment; tip-out wets and dries the port walls too)
 * and the time after them.
 */
export interface TipInRule {
  readonly kind: 'tipIn';
  /** Largest throttle rate kept, %/s. Default 10. */
  readonly maxTpsRatePctPerS?: number;
  /** Seconds after the last fast-throttle sample also left out. Default 0.5. */
  readonly settleS?: number;
  /** `both` (default) limits opening and closing; `opening` only tip-ins. */
  readonly direction?: 'both' | 'opening';
}

/** Leave out samples where engine speed changes faster than `maxRpmPerS` either way. */
export interface RpmRateRule {
  readonly kind: 'rpmRate';
  /** Largest |dRPM/dt| kept, rpm/s. Default 300. */
  readonly maxRpmPerS?: number;
  /** Seconds after the last fast sample also left out. Default 0. */
  readonly settleS?: number;
}

/** Leave out samples where manifold pressure changes faster than `maxKpaPerS` either way. */
export interface MapRateRule {
  readonly kind: 'mapRate';
  /** Largest |dMAP/dt| kept, kPa/s. Default 20. */
  readonly maxKpaPerS?: number;
  /** Seconds after the last fast sample also left out. Default 0. */
  readonly settleS?: number;
}

/** Leave out measured lambda outside [min, max] (sensor not ready, misfire, saturation) or NaN. */
export interface LambdaRangeRule {
  readonly kind: 'lambdaRange';
  /** Default 0.65. */
  readonly min?: number;
  /** Default 1.3. */
  readonly max?: number;
}

/** Keep only closed-loop or only open-loop samples (the `closedLoop` flag). */
export interface LoopModeRule {
  readonly kind: 'loopMode';
  /** Which samples are kept. */
  readonly keep: 'closed' | 'open';
}

/** Leave out samples with knock retard above `maxDeg`. */
export interface KnockRule {
  readonly kind: 'knock';
  /** Largest retard kept, degrees. Default 0 (any retard is left out). */
  readonly maxDeg?: number;
}

/** Keep only samples where the user's expression holds (see `compileSampleExpression`). */
export interface ExpressionRule {
  readonly kind: 'expression';
  /** For example `rpm > 1500 and tps < 90`. */
  readonly source: string;
}

/** One filter rule; rules run in the order given. */
export type FilterRule =
  | WarmUpRule
  | FuelCutRule
  | TipInRule
  | RpmRateRule
  | MapRateRule
  | LambdaRangeRule
  | LoopModeRule
  | KnockRule
  | ExpressionRule;

/** The kind of a rule. */
export type FilterRuleKind = FilterRule['kind'];

/** The rule set a new analysis starts with, in its order. */
export const DEFAULT_FILTER_RULES: readonly FilterRule[] = [
  { kind: 'warmUp', minEctC: 70 },
  { kind: 'fuelCut', leanLimitLambda: 1.6, settleS: 1 },
  { kind: 'tipIn', maxTpsRatePctPerS: 10, settleS: 0.5, direction: 'both' },
  { kind: 'rpmRate', maxRpmPerS: 300, settleS: 0 },
  { kind: 'mapRate', maxKpaPerS: 20, settleS: 0 },
  { kind: 'lambdaRange', min: 0.65, max: 1.3 },
];

/** Options of `filterSamples` (how rates are taken). */
export interface FilterOptions {
  /**
   * Span of the Savitzky–Golay fit behind every rate, seconds; turned into an odd number of
   * samples (at least 3) from the log's median time step. Longer spans quiet sensor noise but
   * blur short transients. Default 0.3.
   */
  readonly rateWindowS?: number;
  /** Degree of the local polynomial behind the rates. Default 2. */
  readonly ratePolyOrder?: number;
}

/** What a rule found in the log, beside its counts (each field only where it applies). */
export interface FunnelDetail {
  /** `fuelCut`: the lean ceiling the log's wideband reports, lambda. */
  readonly ceilingLambda?: number;
}

/** One line of the funnel: what a rule did to the samples still in. */
export interface FunnelStep {
  /** The rule's kind. */
  readonly rule: FilterRuleKind;
  /** The rule in words, with its limits, for display. */
  readonly label: string;
  /** `skipped` when the log lacks a channel the rule needs. */
  readonly status: 'applied' | 'skipped';
  /** Why the rule was skipped (which channel is missing); absent when applied. */
  readonly note?: string;
  /** Samples this rule removed among those earlier rules kept. */
  readonly removed: number;
  /** Samples still kept after this rule. */
  readonly remaining: number;
  /** What the rule found in the log (the fuel-cut rule: the ceiling); absent when nothing. */
  readonly detail?: FunnelDetail;
}

/** What `filterSamples` returns. */
export interface FilterResult {
  /** 1 for each sample kept, 0 for each removed. */
  readonly keep: Uint8Array;
  /** Samples in the log before any rule. */
  readonly total: number;
  /** One step per rule, in order. */
  readonly funnel: readonly FunnelStep[];
}
