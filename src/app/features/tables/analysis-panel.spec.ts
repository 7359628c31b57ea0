import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatButtonToggleHarness } from '@angular/material/button-toggle/testing';
import { MatCheckboxHarness } from '@angular/material/checkbox/testing';
import { MatExpansionPanelHarness } from '@angular/material/expansion/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatRadioButtonHarness, MatRadioGroupHarness } from '@angular/material/radio/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { MatSliderHarness } from '@angular/material/slider/testing';
import type { AnalysisCell } from '@shared/contracts/analyses';
import type { LogResource } from '@shared/contracts/logs';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import type { AnalysisResource } from '../../core/api/analyses-api';
import { AnalysisPanel, type AnalyseRequest, type ApplyRequest } from './analysis-panel';
import { PREVIEW_DEBOUNCE_MS } from './proposal-preview';
import { computeProposalPreview } from './proposal-preview-compute';

const LOGS = [
  { id: 'log-1', fileName: 'pull-1.csv', kind: 'dyno', durationS: 300, sampleCount: 6000 },
  { id: 'log-2', fileName: 'drive.csv', kind: 'road', durationS: 900, sampleCount: 18000 },
] as LogResource[];

const RPM = [1000, 2000, 3000, 4000];
const MAP = [40, 70, 100];
const BASE = [
  [40, 45, 50, 48],
  [60, 70, 75, 72],
  [80, 90, 95, 92],
];

/** A cell measured `ratio` with `weight`; no data with weight 0. */
function cell(ratio: number, weight: number): AnalysisCell {
  const hasData = weight > 0;
  return {
    samples: hasData ? 40 : 0,
    weight,
    ratio: hasData ? ratio : null,
    spread: hasData ? 0.01 : null,
    effectiveCount: hasData ? 30 : 0,
    lambdaErrorPct: hasData ? (ratio - 1) * 100 : null,
    worstLeanPct: null,
    lambdaMeasured: hasData ? ratio : null,
    lambdaCommanded: hasData ? 1 : null,
    proposal: null,
    changePct: null,
    status: hasData ? 'trusted' : 'no_data',
  };
}

/** An analysis of the 3×4 table: lean (1.08) on the left, rich (0.95) on the right, a hole. */
function analysis(): AnalysisResource {
  const cells = BASE.map((row, r) =>
    row.map((_, c) => (r === 2 && c === 3 ? cell(1, 0) : cell(c < 2 ? 1.08 : 0.95, 20))),
  );
  const resource: AnalysisResource & { settings: object } = {
    id: 'an-1',
    tableId: 't-1',
    baseRevisionId: 'rev-1',
    logIds: ['log-1'],
    cells,
    proposal: BASE.map((row) => [...row]),
    filterReport: { logs: [], samplesUsed: 5000, cellsTrusted: 11 },
    leanFlags: [],
    createdAt: '2026-03-01T10:00:00.000Z',
    settings: { minWeight: 10, maxStepPercent: 6 },
  };
  return resource;
}

/** Lets the preview's debounce (0 ms here) and the effects run. */
async function settle(fixture: ComponentFixture<AnalysisPanel>): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve, 5));
  await fixture.whenStable();
}

/** Settles until `isDone` holds (the preview travels timer → promise → effect), or gives up. */
async function settleUntil(
  fixture: ComponentFixture<AnalysisPanel>,
  isDone: () => boolean,
): Promise<void> {
  for (let round = 0; round < 40 && !isDone(); round++) await settle(fixture);
}

describe('AnalysisPanel', () => {
  let fixture: ComponentFixture<AnalysisPanel>;
  let loader: HarnessLoader;
  let analysed: AnalyseRequest[];
  let applied: ApplyRequest[];
  let previews: (number[][] | null)[];

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [noAnimations, { provide: PREVIEW_DEBOUNCE_MS, useValue: 0 }],
    });
    fixture = TestBed.createComponent(AnalysisPanel);
    loader = TestbedHarnessEnvironment.loader(fixture);
    analysed = [];
    applied = [];
    previews = [];
    fixture.componentInstance.analyse.subscribe((request) => analysed.push(request));
    fixture.componentInstance.apply.subscribe((request) => applied.push(request));
    fixture.componentInstance.preview.subscribe((values) => previews.push(values));
    fixture.componentRef.setInput('logs', LOGS);
    fixture.componentRef.setInput('baseNumber', 4);
    fixture.componentRef.setInput('rpmAxis', RPM);
    fixture.componentRef.setInput('mapAxisKpa', MAP);
    fixture.componentRef.setInput('baseValues', BASE);
    await settle(fixture);
  });

  /** Shows the analysis with `selected` and `locked` cells. */
  async function showAnalysis(
    selected: [number, number][] = [],
    locked: [number, number][] = [],
  ): Promise<void> {
    fixture.componentRef.setInput('analysis', analysis());
    fixture.componentRef.setInput('selectedCells', selected);
    fixture.componentRef.setInput('lockedCells', locked);
    await settle(fixture);
  }

  it('When logs and settings are chosen, then running emits the log ids and the settings', async () => {
    await (await loader.getHarness(MatCheckboxHarness.with({ label: /drive\.csv/ }))).check();
    await (await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Filters' }))).expand();
    await (await loader.getHarness(MatSlideToggleHarness.with({ label: 'Warm-up' }))).uncheck();
    await (await loader.getHarness(MatSlideToggleHarness.with({ label: 'Knock' }))).check();
    await fillField(loader, 'Largest RPM rate', '500');
    await fillField(loader, 'Filter expression (optional)', 'gear >= 3');
    const delay = await loader.getHarness(
      MatExpansionPanelHarness.with({ title: 'Wideband delay' }),
    );
    await delay.expand();
    await (
      await loader.getHarness(MatButtonToggleHarness.with({ text: 'Fixed τ₀ and K' }))
    ).check();
    await fillField(loader, 'Delay τ₀', '0.2');

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Run analysis' }))).click();

    expect(analysed).toEqual([
      {
        logIds: ['log-2'],
        settings: {
          delay: { estimate: false, tau0S: 0.2, kGrams: 1 },
          filters: [
            { kind: 'fuelCut', leanLimitLambda: 1.6, settleS: 1 },
            { kind: 'tipIn', maxTpsRatePctPerS: 10, settleS: 0.5, direction: 'both' },
            { kind: 'rpmRate', maxRpmPerS: 500, settleS: 0 },
            { kind: 'mapRate', maxKpaPerS: 20, settleS: 0 },
            { kind: 'lambdaRange', min: 0.65, max: 1.3 },
            { kind: 'knock', maxDeg: 0 },
            { kind: 'expression', source: 'gear >= 3' },
          ],
          stepFraction: 0.5,
          maxStepPercent: 15,
          minWeight: 5,
          leanLoadKpa: 90,
          warnLeanPercent: 5,
        },
      },
    ]);
  });

  it('When a setting is out of range, then its field says the range and running is refused', async () => {
    await (await loader.getHarness(MatCheckboxHarness.with({ label: /pull-1\.csv/ }))).check();
    await (
      await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Step and trust' }))
    ).expand();
    await fillField(loader, 'Step fraction', '1.5');

    const field = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Step fraction' }),
    );
    expect(await field.getTextErrors()).toEqual(['Step fraction must be above 0 and at most 1.']);
    const run = await loader.getHarness(MatButtonHarness.with({ text: 'Run analysis' }));
    expect(await run.isDisabled()).toBe(true);
  });

  it('When the server refuses the expression, then its message shows at the field', async () => {
    const message = 'expression "rpm >> 2": unknown name "foo" (channels are: time, rpm)';
    fixture.componentRef.setInput('analyseError', message);
    await settle(fixture);

    const filters = await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Filters' }));
    expect(await filters.isExpanded()).toBe(true);
    const field = await loader.getHarness(
      MatFormFieldHarness.with({ floatingLabelText: 'Filter expression (optional)' }),
    );
    expect(await field.getTextErrors()).toEqual([message]);
  });

  it('When only the selected cells are applied, then the body names them and the locks', async () => {
    const selected: [number, number][] = [
      [0, 1],
      [1, 2],
    ];
    await showAnalysis(selected, [[2, 0]]);
    const scope = await loader.getHarness(MatRadioGroupHarness);
    await scope.checkRadioButton({ label: /Only the selected cells \(2\)/ });
    await fillField(loader, 'Message of the draft', 'third pull, selection');

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Apply as draft' }))).click();

    expect(applied).toEqual([
      {
        body: {
          stepFraction: 0.5,
          smooth: 0.3,
          fill: true,
          lockedCells: [[2, 0]],
          onlyCells: selected,
          message: 'third pull, selection',
        },
      },
    ]);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      '1 locked cell keeps its value.',
    );
  });

  it('When nothing is selected, then "only the selected cells" cannot be chosen', async () => {
    await showAnalysis();
    const only = await loader.getHarness(
      MatRadioButtonHarness.with({ label: /Only the selected cells/ }),
    );
    expect(await only.isDisabled()).toBe(true);
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Select cells in the grid to apply to them only.',
    );
  });

  it('When the step fraction changes, then a new preview equal to the server’s is emitted', async () => {
    expect(previews.at(-1)).toBeNull();
    await showAnalysis([], [[0, 0]]);
    const resource = analysis();
    const expected = (stepFraction: number) =>
      computeProposalPreview({
        rpmAxis: RPM,
        mapAxisKpa: MAP,
        baseValues: BASE,
        cells: resource.cells,
        // The analysis's own trust and step limits, as the server's apply reads them.
        settings: { minWeight: 10, maxStepPercent: 6 },
        apply: { stepFraction, smooth: 0.3, fill: true, lockedCells: [[0, 0]] },
      });
    await settleUntil(fixture, () => !!previews.at(-1));
    const first = previews.at(-1);
    expect(first).toEqual(expected(0.5));

    const slider = await loader.getHarness(MatSliderHarness);
    await (await slider.getEndThumb()).setValue(0.9);
    await settleUntil(fixture, () => previews.at(-1) !== first);

    const second = previews.at(-1);
    expect(second).toEqual(expected(0.9));
    expect(second).not.toEqual(first);
    // The locked cell keeps its value in every preview.
    expect(second?.[0]?.[0]).toBe(40);
    expect((fixture.nativeElement as HTMLElement).textContent).toMatch(/\d+ cells change: mean/);
  });
});
