import { analysisSettingsSchema, type AnalysisSettingsBody } from '@shared/contracts/analyses';
import { type VeTable } from '@shared/core/table';
import { analyseLogs, type AnalysisSettings } from '@shared/pipeline';
import { DEMO_ROADSTER, ecuVeTable, simulateLog } from '@shared/sim';
import {
  CORE_DEFAULTS,
  type SettingsValue,
  defaultSettingsValue,
  fromSettingsBody,
  toSettingsBody,
} from './analysis-settings-model';

/** The table scaled by `factor` everywhere. */
function scaled(table: VeTable, factor: number): VeTable {
  return { ...table, values: table.values.map((row) => row.map((v) => v * factor)) };
}

/** The default form value with some fields changed. */
function withDefaults(change: (value: SettingsValue) => void): SettingsValue {
  const value = defaultSettingsValue();
  change(value);
  return value;
}

const DEFAULT_BODY: AnalysisSettingsBody = {
  delay: { estimate: true, tau0S: 0.1, kGrams: 1 },
  filters: [
    { kind: 'warmUp', minEctC: 70 },
    { kind: 'fuelCut', leanLimitLambda: 1.6, settleS: 1 },
    { kind: 'tipIn', maxTpsRatePctPerS: 10, settleS: 0.5, direction: 'both' },
    { kind: 'rpmRate', maxRpmPerS: 300, settleS: 0 },
    { kind: 'mapRate', maxKpaPerS: 20, settleS: 0 },
    { kind: 'lambdaRange', min: 0.65, max: 1.3 },
  ],
  stepFraction: 0.5,
  maxStepPercent: 15,
  minWeight: 5,
  leanLoadKpa: 90,
  warnLeanPercent: 5,
};

describe('toSettingsBody', () => {
  it.each<[string, SettingsValue, AnalysisSettingsBody]>([
    ['the defaults', defaultSettingsValue(), DEFAULT_BODY],
    [
      'warm-up off, knock and closed loop on, an expression',
      withDefaults((v) => {
        v.filters.warmUp.on = false;
        v.filters.knock.on = true;
        v.filters.loopMode = { on: true, keep: 'closed' };
        v.expression = '  rpm > 1500 and tps < 90 ';
      }),
      {
        ...DEFAULT_BODY,
        filters: [
          ...(DEFAULT_BODY.filters ?? []).slice(1),
          { kind: 'loopMode', keep: 'closed' },
          { kind: 'knock', maxDeg: 0 },
          { kind: 'expression', source: 'rpm > 1500 and tps < 90' },
        ],
      },
    ],
    [
      'a fixed delay and a spread limit',
      withDefaults((v) => {
        v.delayMode = 'fixed';
        v.tau0S = 0.25;
        v.kGrams = 2;
        v.limitSpread = true;
        v.maxSpread = 0.04;
      }),
      { ...DEFAULT_BODY, delay: { estimate: false, tau0S: 0.25, kGrams: 2 }, maxSpread: 0.04 },
    ],
    [
      'a spread value while its limit is off',
      withDefaults((v) => {
        v.maxSpread = 0.5;
      }),
      DEFAULT_BODY,
    ],
    [
      'every filter off',
      withDefaults((v) => {
        for (const rule of Object.values(v.filters)) rule.on = false;
      }),
      { ...DEFAULT_BODY, filters: [] },
    ],
  ])('When the form holds %s, then the body is as expected and valid', (_, value, body) => {
    const result = toSettingsBody(value);
    expect(result).toEqual(body);
    expect(analysisSettingsSchema.safeParse(result).success).toBe(true);
  });
});

describe('fromSettingsBody', () => {
  it.each<[string, SettingsValue]>([
    ['the defaults', defaultSettingsValue()],
    [
      'changed rules and limits',
      withDefaults((v) => {
        v.filters.tipIn = { on: true, maxTpsRatePctPerS: 25, settleS: 1, direction: 'opening' };
        v.filters.mapRate.on = false;
        v.filters.knock = { on: true, maxDeg: 2 };
        v.expression = 'ect > 80';
        v.delayMode = 'fixed';
        v.minWeight = 12;
        v.limitSpread = true;
        v.maxSpread = 0.1;
      }),
    ],
  ])('When %s go to the API and back, then the form value is the same', (_, value) => {
    expect(fromSettingsBody(toSettingsBody(value))).toEqual(value);
  });

  it('When no filters are given, then the default rules are on', () => {
    expect(fromSettingsBody({}).filters).toEqual(defaultSettingsValue().filters);
  });

  it('When several expressions are given, then they are joined with "and"', () => {
    const body: AnalysisSettingsBody = {
      filters: [
        { kind: 'expression', source: 'rpm > 1500' },
        { kind: 'expression', source: 'tps < 90' },
      ],
    };
    expect(fromSettingsBody(body).expression).toBe('(rpm > 1500) and (tps < 90)');
  });
});

/**
 * The form's defaults must be the core's: the same analysis as sending no settings, and the
 * same table as applying with no options. Simulated dyno session; common practice, no
 * published source for the figures themselves (see filter-rules.ts and reference.md).
 */
describe('the defaults against the shared core', () => {
  const vehicle = DEMO_ROADSTER;
  // The ECU runs a table 7 % short of air, so the engine runs lean, lean flags appear under load
  // and some corrections reach the step limit: every default below has something to decide.
  const base = scaled(ecuVeTable(vehicle), 0.93);
  const log = simulateLog({ vehicle, kind: 'dyno', seed: 5, ecuTable: base });
  const engine = { displacementL: vehicle.engine.displacementL };

  it('When the form is untouched, then the analysis equals one with no settings', () => {
    const plain = analyseLogs(base, [{ log }], engine);
    const form = analyseLogs(base, [{ log }], engine, {
      ...(toSettingsBody(defaultSettingsValue()) as AnalysisSettings),
    });
    expect(Array.from(form.cells.ratio.data)).toEqual(Array.from(plain.cells.ratio.data));
    expect(Array.from(form.proposal.values.data)).toEqual(Array.from(plain.proposal.values.data));
    expect(form.leanFlags).toEqual(plain.leanFlags);
    expect(plain.leanFlags.length).toBeGreaterThan(0);
    expect(form.logs.map((l) => [l.kept, l.delayUsed])).toEqual(
      plain.logs.map((l) => [l.kept, l.delayUsed]),
    );
  });

  it('When the delay is fixed, then the figures used are the core’s defaults', () => {
    const fixed = withDefaults((v) => (v.delayMode = 'fixed'));
    const form = analyseLogs(base, [{ log }], engine, toSettingsBody(fixed) as AnalysisSettings);
    const plain = analyseLogs(base, [{ log }], engine, { delay: { estimate: false } });
    expect(form.logs[0]?.delayUsed).toEqual(plain.logs[0]?.delayUsed);
    expect(form.logs[0]?.delayUsed).toMatchObject({
      tau0S: CORE_DEFAULTS.tau0S,
      kGrams: CORE_DEFAULTS.kGrams,
    });
  });
});
