import { applyAnalysisRequestSchema, type AnalysisSettingsBody } from '@shared/contracts/analyses';
import { createGrid } from '@shared/core/table';
import { applyAnalysis } from '@shared/pipeline/apply-analysis';
import { DEMO_ROADSTER, ecuVeTable } from '@shared/sim';
import {
  type ApplyValue,
  applySettingsOf,
  defaultApplyValue,
  previewSettingsOf,
  settingsOfAnalysis,
  toApplyBody,
} from './analysis-apply-model';
import { defaultSettingsValue, toSettingsBody } from './analysis-settings-model';
import { loadGuardOf } from '../preview/proposal-preview-compute';

describe('settingsOfAnalysis and applySettingsOf', () => {
  it.each<[string, object, AnalysisSettingsBody]>([
    [
      'settings',
      { settings: { minWeight: 9, stepFraction: 0.4 } },
      { minWeight: 9, stepFraction: 0.4 },
    ],
    ['no settings', {}, {}],
    ['settings that are not an object', { settings: 'x' }, {}],
  ])('When the analysis has %s, then they are read as %j', (_, analysis, settings) => {
    expect(settingsOfAnalysis(analysis)).toEqual(settings);
  });

  it('When the apply reads the settings, then it takes only what the server takes', () => {
    expect(
      applySettingsOf({ minWeight: 9, maxStepPercent: 8, maxSpread: 0.1, stepFraction: 0.3 }),
    ).toEqual({ minWeight: 9, maxStepPercent: 8, maxSpread: 0.1 });
  });

  it('When a preview reads an analysis, then it takes the settings and the guard’s two figures', () => {
    const guard = {
      loadLineKpa: 88.2,
      loadLinePercentOfBaro: 90,
      leanAllowancePercent: 2,
      baroKpa: 98,
      baroSource: 'logged' as const,
    };
    expect(previewSettingsOf({ settings: { minWeight: 9, stepFraction: 0.3 }, guard })).toEqual({
      minWeight: 9,
      maxStepPercent: undefined,
      maxSpread: undefined,
      guard: { loadLineKpa: 88.2, leanAllowancePercent: 2 },
    });
    expect(previewSettingsOf({ settings: { minWeight: 9 } })).not.toHaveProperty('guard');
  });
});

describe('toApplyBody', () => {
  const selected = [
    [1, 2],
    [1, 3],
  ] as const;
  const locked = [[0, 0]] as const;
  const value = (change: Partial<ApplyValue>): ApplyValue => ({
    ...defaultApplyValue(),
    ...change,
  });

  it.each<[string, ApplyValue, object]>([
    [
      'all cells',
      value({}),
      { stepFraction: 0.5, smooth: 0.3, fill: true, guard: true, lockedCells: [[0, 0]] },
    ],
    [
      'the guard turned off',
      value({ guard: false }),
      { stepFraction: 0.5, smooth: 0.3, fill: true, guard: false, lockedCells: [[0, 0]] },
    ],
    [
      'only the selection, a reach and a message',
      value({ scope: 'selected', limitReach: true, maxReach: 3, message: '  third pull ' }),
      {
        stepFraction: 0.5,
        smooth: 0.3,
        fill: true,
        guard: true,
        maxReach: 3,
        lockedCells: [[0, 0]],
        onlyCells: [
          [1, 2],
          [1, 3],
        ],
        message: 'third pull',
      },
    ],
    [
      'a reach with fill off',
      value({ fill: false, limitReach: true, maxReach: 3 }),
      { stepFraction: 0.5, smooth: 0.3, fill: false, guard: true, lockedCells: [[0, 0]] },
    ],
  ])('When the options are %s, then the body is as expected and valid', (_, v, body) => {
    const result = toApplyBody(v, selected, locked);
    expect(result).toEqual(body);
    expect(applyAnalysisRequestSchema.safeParse(result).success).toBe(true);
  });

  it('When nothing is locked, then the body has no locked cells', () => {
    expect(toApplyBody(value({}), [], [])).not.toHaveProperty('lockedCells');
  });

  it('When an analysis ran at its own step, then the apply starts at that step', () => {
    expect(defaultApplyValue({ stepFraction: 0.3 }).stepFraction).toBe(0.3);
  });
});

/** The apply's defaults must be the core's: the same table as applying with no options. */
describe('the apply defaults against the shared core', () => {
  const base = ecuVeTable(DEMO_ROADSTER);

  it('When the apply options are untouched, then the table equals one applied with none', () => {
    const ratio = createGrid(base.mapAxisKpa.length, base.rpmAxis.length, 1.08);
    const weight = createGrid(ratio.rows, ratio.cols, 4.5);
    const spread = createGrid(ratio.rows, ratio.cols, 0.02);
    // Weights either side of the trust limit, and corrections past the step limit, so the fill,
    // the smoothing, the trust and the clamp all have something to decide.
    for (let i = 0; i < ratio.data.length; i += 3) weight.data[i] = 5.5;
    for (let i = 0; i < ratio.data.length; i += 7) ratio.data[i] = 1.5;
    const evidence = { ratio, weight, spread };
    const body = toApplyBody(defaultApplyValue(), [], []);
    const plain = applyAnalysis(base, evidence);
    const form = applyAnalysis(base, evidence, {
      stepFraction: body.stepFraction,
      smooth: body.smooth,
      fill: body.fill,
      ...applySettingsOf(toSettingsBody(defaultSettingsValue())),
      // On, with no analysis guard named: the core's default guard, as an apply without options.
      guard: loadGuardOf(undefined, body.guard),
    });
    expect(form.table.values).toEqual(plain.table.values);
    expect(plain.proposal.clamped.some((c) => c === 1)).toBe(true);
  });
});
