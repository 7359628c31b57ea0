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
import { provideRouter } from '@angular/router';
import type { AnalysisCell } from '@shared/contracts/analyses';
import type { LogResource } from '@shared/contracts/logs';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
import { ASSUMED_GUARD } from '../../../testing/table-fixtures';
import type { AnalysisResource } from '../../core/api/analyses-api';
import { AnalysisPanel, type AnalyseRequest, type ApplyRequest } from './analysis-panel';
import { PREVIEW_DEBOUNCE_MS } from './proposal-preview';
import { type PreviewResult, computeProposalPreview } from './proposal-preview-compute';

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

/**
 * An analysis of the 3×4 table: lean (1.08) on the left, rich (0.95) on the right, a hole at
 * 100 kPa × 4000 rpm. The hole sits above the guard's 91.19 kPa line and its neighbours would
 * fill it leaner, so the guard holds it.
 */
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
    guard: ASSUMED_GUARD,
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
  const host = () => fixture.nativeElement as HTMLElement;
  let loader: HarnessLoader;
  let analysed: AnalyseRequest[];
  let applied: ApplyRequest[];
  let previews: (PreviewResult | null)[];

  beforeEach(async () => {
    TestBed.configureTestingModule({
      providers: [noAnimations, provideRouter([]), { provide: PREVIEW_DEBOUNCE_MS, useValue: 0 }],
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
    fixture.componentRef.setInput('vehicleId', 'v-7');
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
          guard: true,
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
        // The analysis's own trust and step limits and its guard, as the server's apply reads them.
        settings: {
          minWeight: 10,
          maxStepPercent: 6,
          guard: { loadLineKpa: 91.19, leanAllowancePercent: 1 },
        },
        apply: { stepFraction, smooth: 0.3, fill: true, lockedCells: [[0, 0]], guard: true },
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
    expect(second?.values[0]?.[0]).toBe(40);
    expect(second?.origin[0]?.[0]).toBe('locked');
    expect((fixture.nativeElement as HTMLElement).textContent).toMatch(/\d+ cells change: mean/);
  });

  it('When the analysis is shown, then the guard’s figures and the assumed pressure are told', async () => {
    await showAnalysis();
    const text = (fixture.nativeElement as HTMLElement).textContent ?? '';
    expect(text).toContain(
      'Load line 91.2 kPa (90 % of 101.3 kPa barometric pressure, assumed as standard sea-level pressure',
    );
    expect(text).toContain('lean allowance 1 %.');
    const assumed = host().querySelector('[data-testid="guard-assumed"]');
    expect(assumed?.textContent).toContain('assumed as standard sea-level pressure (101.3 kPa)');
    expect(assumed?.textContent).toContain('the load line can be changed on');
    expect(assumed?.querySelector('a')?.getAttribute('href')).toBe('/vehicles/v-7');

    fixture.componentRef.setInput('units', 'imperial');
    fixture.componentRef.setInput('analysis', {
      ...analysis(),
      guard: { ...ASSUMED_GUARD, loadLineKpa: 76.5, baroKpa: 85, baroSource: 'logged' },
    });
    await settle(fixture);
    // 76.5 kPa = 11.0954 psi; 85 kPa = 12.328 psi (NIST SP 811, 2008 edition, Appendix B.8).
    expect(host().querySelector('[data-testid="guard-figures"]')?.textContent?.trim()).toBe(
      'Load line 11.1 psi(a) (90 % of 12.33 psi(a) barometric pressure, read from the logs’ barometer); lean allowance 1 %.',
    );
    expect(host().querySelector('[data-testid="guard-assumed"]')).toBeNull();
  });

  it('When the preview holds a cell under load, then the summary counts it', async () => {
    await showAnalysis();
    await settleUntil(fixture, () => !!previews.at(-1));
    const preview = previews.at(-1);
    expect(preview?.heldCount).toBe(1);
    expect(preview?.origin[2]?.[3]).toBe('held');
    // Held: the base value stays.
    expect(preview?.values[2]?.[3]).toBe(92);
    expect(host().querySelector('[data-testid="preview-held"]')?.textContent).toContain(
      '1 cell held under load: needs data.',
    );
    expect(host().textContent).toContain('Cells: 11 measured, 0 filled from neighbours, 1 held');
  });

  it('When the guard is turned off, then a caution shows, the preview leans and the body says so', async () => {
    await showAnalysis();
    await settleUntil(fixture, () => !!previews.at(-1));
    const guarded = previews.at(-1);
    expect(host().querySelector('[role="alert"]')).toBeNull();

    const guard = await loader.getHarness(
      MatCheckboxHarness.with({ label: 'Fuel-safety guard under load' }),
    );
    expect(await guard.isChecked()).toBe(true);
    await guard.uncheck();
    await settleUntil(fixture, () => previews.at(-1) !== guarded);

    expect(host().querySelector('[role="alert"]')?.textContent).toContain(
      'Guard off: the fill and the smoothing may lean cells under load that no log measured',
    );
    const unguarded = previews.at(-1);
    expect(unguarded?.guard).toBeNull();
    expect(unguarded?.heldCount).toBe(0);
    // The hole under load is now filled leaner than its base.
    expect(unguarded?.values[2]?.[3]).toBeLessThan(92);
    expect(host().querySelector('[data-testid="preview-held"]')?.textContent).toContain(
      'Fuel-safety guard off: no cell is held under load.',
    );

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Apply as draft' }))).click();
    expect(applied.at(-1)?.body.guard).toBe(false);
  });

  it('When flags are loud or only watched, then the summary counts them apart and explains the words', async () => {
    const flag = {
      row: 2,
      col: 0,
      rpm: 1000,
      mapKpa: 100,
      leanPercent: 8,
      worstLeanPercent: null,
      weight: 20,
      severity: 'warn' as const,
    };
    fixture.componentRef.setInput('analysis', {
      ...analysis(),
      leanFlags: [flag, { ...flag, col: 1, weight: 0.3, severity: 'watch' as const }],
    });
    await settle(fixture);
    const text = host().textContent ?? '';
    expect(text).toContain('1 lean-under-load flag, 1 more to watch (too little data)');
    expect(text).toContain('“Warning”: richen the cell before the next full-load run.');
  });
});
