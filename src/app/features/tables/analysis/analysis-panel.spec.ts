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
import type { LogResource } from '@shared/contracts/logs';
import { fillField, noAnimations } from '../../../../testing/harness-helpers';
import { ASSUMED_GUARD, SMALL_TABLE, leanRichAnalysis } from '../../../../testing/table-fixtures';
import { AnalysisPanel, type AnalyseRequest, type ApplyRequest } from './analysis-panel';
import type { ApplyValue } from './analysis-apply-model';
import { type PreviewResult, computeProposalPreview } from '../preview/proposal-preview-compute';

const LOGS = [
  { id: 'log-1', fileName: 'pull-1.csv', kind: 'dyno', durationS: 300, sampleCount: 6000 },
  { id: 'log-2', fileName: 'drive.csv', kind: 'road', durationS: 900, sampleCount: 18000 },
] as LogResource[];

const { rpmAxis: RPM, mapAxisKpa: MAP, values: BASE } = SMALL_TABLE;

/** What the store would compute for the fixture's analysis with the guard on or off. */
function previewOf(guard: boolean): PreviewResult {
  return computeProposalPreview({
    rpmAxis: RPM,
    mapAxisKpa: MAP,
    baseValues: BASE,
    cells: leanRichAnalysis().cells,
    settings: {
      minWeight: 10,
      maxStepPercent: 6,
      guard: { loadLineKpa: 91.19, leanAllowancePercent: 1 },
    },
    apply: { stepFraction: 0.5, smooth: 0.3, fill: true, guard },
  });
}

/** Lets the effects run. */
async function settle(fixture: ComponentFixture<AnalysisPanel>): Promise<void> {
  await new Promise((resolve) => setTimeout(resolve, 5));
  await fixture.whenStable();
}

describe('AnalysisPanel', () => {
  let fixture: ComponentFixture<AnalysisPanel>;
  const host = () => fixture.nativeElement as HTMLElement;
  let loader: HarnessLoader;
  let analysed: AnalyseRequest[];
  let applied: ApplyRequest[];
  let sentOptions: (ApplyValue | null)[];

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [noAnimations, provideRouter([])] });
    fixture = TestBed.createComponent(AnalysisPanel);
    loader = TestbedHarnessEnvironment.loader(fixture);
    analysed = [];
    applied = [];
    sentOptions = [];
    fixture.componentInstance.analyse.subscribe((request) => analysed.push(request));
    fixture.componentInstance.apply.subscribe((request) => applied.push(request));
    fixture.componentInstance.applyOptions.subscribe((options) => sentOptions.push(options));
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
    fixture.componentRef.setInput('analysis', leanRichAnalysis());
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

  it('When the step fraction changes, then the new options are sent for the preview, and the message sends none', async () => {
    await showAnalysis([], [[0, 0]]);
    // A new analysis starts the options afresh, at its own step fraction (the fixture's none: 0.5).
    expect(sentOptions.at(-1)).toMatchObject({ scope: 'all', stepFraction: 0.5, guard: true });

    const slider = await loader.getHarness(MatSliderHarness);
    await (await slider.getEndThumb()).setValue(0.9);
    await settle(fixture);
    expect(sentOptions.at(-1)).toMatchObject({ stepFraction: 0.9, smooth: 0.3, fill: true });

    const sent = sentOptions.length;
    await fillField(loader, 'Message of the draft', 'third pull');
    await settle(fixture);
    expect(sentOptions).toHaveLength(sent);
  });

  it('When an option is out of range, then no options are sent, so there is no preview', async () => {
    await showAnalysis();
    await (
      await loader.getHarness(
        MatSlideToggleHarness.with({ label: 'Limit how far the fill reaches' }),
      )
    ).check();
    await fillField(loader, 'Fill reach', '101');
    await settle(fixture);
    expect(sentOptions.at(-1)).toBeNull();
  });

  it('When the preview comes, then its changes and the cell held under load are told', async () => {
    await showAnalysis();
    const preview = previewOf(true);
    // The fixture's hole under load is held at its base value.
    expect([preview.heldCount, preview.origin[2]?.[3], preview.values[2]?.[3]]).toEqual([
      1,
      'held',
      92,
    ]);
    fixture.componentRef.setInput('preview', preview);
    await settle(fixture);
    expect(host().querySelector('[data-testid="preview-held"]')?.textContent).toContain(
      '1 cell held under load: needs data.',
    );
    expect(host().textContent).toContain('Cells: 11 measured, 0 filled from neighbours, 1 held');
    expect(host().textContent).toMatch(/\d+ cells change: mean/);

    fixture.componentRef.setInput('isPreviewing', true);
    await settle(fixture);
    expect(host().textContent).toContain('(updating…)');
  });

  it('When the guard is turned off, then a caution shows, the options and the body say so', async () => {
    await showAnalysis();
    expect(host().querySelector('[role="alert"]')).toBeNull();

    const guard = await loader.getHarness(
      MatCheckboxHarness.with({ label: 'Fuel-safety guard under load' }),
    );
    expect(await guard.isChecked()).toBe(true);
    await guard.uncheck();
    await settle(fixture);

    expect(host().querySelector('[role="alert"]')?.textContent).toContain(
      'Guard off: the fill and the smoothing may lean cells under load that no log measured',
    );
    expect(sentOptions.at(-1)?.guard).toBe(false);
    fixture.componentRef.setInput('preview', previewOf(false));
    await settle(fixture);
    expect(host().querySelector('[data-testid="preview-held"]')?.textContent).toContain(
      'Fuel-safety guard off: no cell is held under load.',
    );

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Apply as draft' }))).click();
    expect(applied.at(-1)?.body.guard).toBe(false);
  });

  it('When the preview cannot be computed, then the core’s sentence is shown', async () => {
    await showAnalysis();
    fixture.componentRef.setInput('previewError', 'the base table has 2 rows, the evidence 3');
    await settle(fixture);
    expect(host().querySelector('.preview')?.textContent).toContain(
      'The preview could not be computed: the base table has 2 rows, the evidence 3',
    );
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
      ...leanRichAnalysis(),
      guard: { ...ASSUMED_GUARD, loadLineKpa: 76.5, baroKpa: 85, baroSource: 'logged' },
    });
    await settle(fixture);
    // 76.5 kPa = 11.0954 psi; 85 kPa = 12.328 psi (NIST SP 811, 2008 edition, Appendix B.8).
    expect(host().querySelector('[data-testid="guard-figures"]')?.textContent?.trim()).toBe(
      'Load line 11.1 psi(a) (90 % of 12.33 psi(a) barometric pressure, read from the logs’ barometer); lean allowance 1 %.',
    );
    expect(host().querySelector('[data-testid="guard-assumed"]')).toBeNull();
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
      ...leanRichAnalysis(),
      leanFlags: [flag, { ...flag, col: 1, weight: 0.3, severity: 'watch' as const }],
    });
    await settle(fixture);
    const text = host().textContent ?? '';
    expect(text).toContain('1 lean-under-load flag, 1 more to watch (too little data)');
    expect(text).toContain('“Warning”: richen the cell before the next full-load run.');
  });
});
