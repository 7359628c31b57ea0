import type { AnalysisSettingsBody } from '@shared/contracts/analyses';
import { DEFAULT_FILTER_RULES, type FilterRule } from '@shared/filter/filter-rules';
import { optionalNumber } from './analysis-setting-ranges';

/** The filter rules the form offers, each with an on/off switch and its parameters. */
export interface FilterRulesValue {
  /** Leave out a cold engine. */
  warmUp: { on: boolean; minEctC: number | null };
  /** Leave out fuel cut and the sensor's return from free air. */
  fuelCut: { on: boolean; leanLimitLambda: number | null; settleS: number | null };
  /** Leave out throttle transients. */
  tipIn: {
    on: boolean;
    maxTpsRatePctPerS: number | null;
    settleS: number | null;
    direction: 'both' | 'opening';
  };
  /** Leave out fast RPM changes. */
  rpmRate: { on: boolean; maxRpmPerS: number | null; settleS: number | null };
  /** Leave out fast MAP changes. */
  mapRate: { on: boolean; maxKpaPerS: number | null; settleS: number | null };
  /** Leave out lambda readings outside a range. */
  lambdaRange: { on: boolean; min: number | null; max: number | null };
  /** Keep only closed- or only open-loop samples. */
  loopMode: { on: boolean; keep: 'closed' | 'open' };
  /** Leave out knock retard. */
  knock: { on: boolean; maxDeg: number | null };
}

/** The analysis settings as the form holds them (null: an emptied number field). */
export interface SettingsValue {
  /** The rule switches and parameters. */
  filters: FilterRulesValue;
  /** A keep-condition over channel names; '' for none. */
  expression: string;
  /** Use each log's own delay estimate (falling back to τ₀/K) or always τ₀/K. */
  delayMode: 'estimate' | 'fixed';
  /** Fixed part of the wideband delay, s. */
  tau0S: number | null;
  /** Flow part of the wideband delay, g. */
  kGrams: number | null;
  /** Fraction of the correction the analysis's proposal applies. */
  stepFraction: number | null;
  /** Largest change of a cell in one round, %. */
  maxStepPercent: number | null;
  /** Least weight before a cell is trusted. */
  minWeight: number | null;
  /** Whether trusted cells must also have a small spread. */
  limitSpread: boolean;
  /** Largest spread of a trusted cell (with `limitSpread`). */
  maxSpread: number | null;
  /** MAP at or above which lean readings count as under load, kPa. */
  leanLoadKpa: number | null;
  /** Lean error that raises a warning, %. */
  warnLeanPercent: number | null;
}

/**
 * The defaults of the shared core where it has no exported constant: `proposeTable` (step 0.5,
 * largest step 15 %, minimum weight 5, no spread limit), `accumulateCells` / `flagLeanCells`
 * (under load from 90 kPa, warning at 5 %), `analyseLogs` (τ₀ 0.1 s, K 1 g, estimate on) and
 * `filterSamples` (knock retard 0°). The spec checks that these give the same analysis as
 * sending no settings at all.
 */
export const CORE_DEFAULTS = {
  stepFraction: 0.5,
  maxStepPercent: 15,
  minWeight: 5,
  leanLoadKpa: 90,
  warnLeanPercent: 5,
  tau0S: 0.1,
  kGrams: 1,
  knockMaxDeg: 0,
  smooth: 0.3,
} as const;

/** The default rule of `kind` from `DEFAULT_FILTER_RULES`. */
function defaultRule<K extends FilterRule['kind']>(kind: K): Extract<FilterRule, { kind: K }> {
  const rule = DEFAULT_FILTER_RULES.find((r) => r.kind === kind);
  if (!rule) throw new Error(`DEFAULT_FILTER_RULES has no "${kind}" rule`);
  return rule as Extract<FilterRule, { kind: K }>;
}

/** The form's starting point: the core's rules and defaults; loop mode and knock off. */
export function defaultSettingsValue(): SettingsValue {
  const warmUp = defaultRule('warmUp');
  const fuelCut = defaultRule('fuelCut');
  const tipIn = defaultRule('tipIn');
  const rpmRate = defaultRule('rpmRate');
  const mapRate = defaultRule('mapRate');
  const lambdaRange = defaultRule('lambdaRange');
  return {
    filters: {
      warmUp: { on: true, minEctC: warmUp.minEctC ?? null },
      fuelCut: {
        on: true,
        leanLimitLambda: fuelCut.leanLimitLambda ?? null,
        settleS: fuelCut.settleS ?? null,
      },
      tipIn: {
        on: true,
        maxTpsRatePctPerS: tipIn.maxTpsRatePctPerS ?? null,
        settleS: tipIn.settleS ?? null,
        direction: tipIn.direction ?? 'both',
      },
      rpmRate: {
        on: true,
        maxRpmPerS: rpmRate.maxRpmPerS ?? null,
        settleS: rpmRate.settleS ?? null,
      },
      mapRate: {
        on: true,
        maxKpaPerS: mapRate.maxKpaPerS ?? null,
        settleS: mapRate.settleS ?? null,
      },
      lambdaRange: { on: true, min: lambdaRange.min ?? null, max: lambdaRange.max ?? null },
      // Not in the default set; the rule has no default side, closed loop is offered first.
      loopMode: { on: false, keep: 'closed' },
      knock: { on: false, maxDeg: CORE_DEFAULTS.knockMaxDeg },
    },
    expression: '',
    delayMode: 'estimate',
    tau0S: CORE_DEFAULTS.tau0S,
    kGrams: CORE_DEFAULTS.kGrams,
    stepFraction: CORE_DEFAULTS.stepFraction,
    maxStepPercent: CORE_DEFAULTS.maxStepPercent,
    minWeight: CORE_DEFAULTS.minWeight,
    limitSpread: false,
    maxSpread: 0.05,
    leanLoadKpa: CORE_DEFAULTS.leanLoadKpa,
    warnLeanPercent: CORE_DEFAULTS.warnLeanPercent,
  };
}

/** The filter rules switched on, in the core's order, then loop mode, knock and expression. */
function filterRules(value: SettingsValue): FilterRule[] {
  const f = value.filters;
  const rules: FilterRule[] = [];
  if (f.warmUp.on) rules.push({ kind: 'warmUp', ...optionalNumber('minEctC', f.warmUp.minEctC) });
  if (f.fuelCut.on) {
    rules.push({
      kind: 'fuelCut',
      ...optionalNumber('leanLimitLambda', f.fuelCut.leanLimitLambda),
      ...optionalNumber('settleS', f.fuelCut.settleS),
    });
  }
  if (f.tipIn.on) {
    rules.push({
      kind: 'tipIn',
      ...optionalNumber('maxTpsRatePctPerS', f.tipIn.maxTpsRatePctPerS),
      ...optionalNumber('settleS', f.tipIn.settleS),
      direction: f.tipIn.direction,
    });
  }
  if (f.rpmRate.on) {
    rules.push({
      kind: 'rpmRate',
      ...optionalNumber('maxRpmPerS', f.rpmRate.maxRpmPerS),
      ...optionalNumber('settleS', f.rpmRate.settleS),
    });
  }
  if (f.mapRate.on) {
    rules.push({
      kind: 'mapRate',
      ...optionalNumber('maxKpaPerS', f.mapRate.maxKpaPerS),
      ...optionalNumber('settleS', f.mapRate.settleS),
    });
  }
  if (f.lambdaRange.on) {
    rules.push({
      kind: 'lambdaRange',
      ...optionalNumber('min', f.lambdaRange.min),
      ...optionalNumber('max', f.lambdaRange.max),
    });
  }
  if (f.loopMode.on) rules.push({ kind: 'loopMode', keep: f.loopMode.keep });
  if (f.knock.on) rules.push({ kind: 'knock', ...optionalNumber('maxDeg', f.knock.maxDeg) });
  const source = value.expression.trim();
  if (source) rules.push({ kind: 'expression', source });
  return rules;
}

/** The settings body of `POST /api/tables/:id/analyses` for a form value. */
export function toSettingsBody(value: SettingsValue): AnalysisSettingsBody {
  return {
    delay: {
      estimate: value.delayMode === 'estimate',
      ...optionalNumber('tau0S', value.tau0S),
      ...optionalNumber('kGrams', value.kGrams),
    },
    filters: filterRules(value),
    ...optionalNumber('stepFraction', value.stepFraction),
    ...optionalNumber('maxStepPercent', value.maxStepPercent),
    ...optionalNumber('minWeight', value.minWeight),
    ...(value.limitSpread ? optionalNumber('maxSpread', value.maxSpread) : {}),
    ...optionalNumber('leanLoadKpa', value.leanLoadKpa),
    ...optionalNumber('warnLeanPercent', value.warnLeanPercent),
  };
}

/**
 * A form value from stored settings (an analysis's own): fields that are absent take the
 * defaults; rules absent from a given list are off; several expressions are joined with `and`
 * (the rules run one after the other, so the result is the same).
 */
export function fromSettingsBody(body: AnalysisSettingsBody): SettingsValue {
  const start = defaultSettingsValue();
  const filters = start.filters;
  const pick = (given: number | undefined, fallback: number | null) => given ?? fallback;
  let expressions: string[] = [];
  if (body.filters) {
    for (const rule of Object.values(filters)) rule.on = false;
    expressions = [];
    for (const rule of body.filters) {
      switch (rule.kind) {
        case 'warmUp':
          filters.warmUp = { on: true, minEctC: pick(rule.minEctC, filters.warmUp.minEctC) };
          break;
        case 'fuelCut':
          filters.fuelCut = {
            on: true,
            leanLimitLambda: pick(rule.leanLimitLambda, filters.fuelCut.leanLimitLambda),
            settleS: pick(rule.settleS, filters.fuelCut.settleS),
          };
          break;
        case 'tipIn':
          filters.tipIn = {
            on: true,
            maxTpsRatePctPerS: pick(rule.maxTpsRatePctPerS, filters.tipIn.maxTpsRatePctPerS),
            settleS: pick(rule.settleS, filters.tipIn.settleS),
            direction: rule.direction ?? 'both',
          };
          break;
        case 'rpmRate':
          filters.rpmRate = {
            on: true,
            maxRpmPerS: pick(rule.maxRpmPerS, filters.rpmRate.maxRpmPerS),
            settleS: pick(rule.settleS, filters.rpmRate.settleS),
          };
          break;
        case 'mapRate':
          filters.mapRate = {
            on: true,
            maxKpaPerS: pick(rule.maxKpaPerS, filters.mapRate.maxKpaPerS),
            settleS: pick(rule.settleS, filters.mapRate.settleS),
          };
          break;
        case 'lambdaRange':
          filters.lambdaRange = {
            on: true,
            min: pick(rule.min, filters.lambdaRange.min),
            max: pick(rule.max, filters.lambdaRange.max),
          };
          break;
        case 'loopMode':
          filters.loopMode = { on: true, keep: rule.keep };
          break;
        case 'knock':
          filters.knock = { on: true, maxDeg: pick(rule.maxDeg, filters.knock.maxDeg) };
          break;
        case 'expression':
          expressions.push(rule.source.trim());
          break;
      }
    }
  }
  const delay = body.delay ?? {};
  return {
    filters,
    expression:
      expressions.length > 1
        ? expressions.map((e) => `(${e})`).join(' and ')
        : (expressions[0] ?? ''),
    delayMode: delay.estimate === false ? 'fixed' : 'estimate',
    tau0S: pick(delay.tau0S, start.tau0S),
    kGrams: pick(delay.kGrams, start.kGrams),
    stepFraction: pick(body.stepFraction, start.stepFraction),
    maxStepPercent: pick(body.maxStepPercent, start.maxStepPercent),
    minWeight: pick(body.minWeight, start.minWeight),
    limitSpread: body.maxSpread !== undefined,
    maxSpread: pick(body.maxSpread, start.maxSpread),
    leanLoadKpa: pick(body.leanLoadKpa, start.leanLoadKpa),
    warnLeanPercent: pick(body.warnLeanPercent, start.warnLeanPercent),
  };
}
