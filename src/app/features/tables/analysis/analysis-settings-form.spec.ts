import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatExpansionPanelHarness } from '@angular/material/expansion/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { fillField, noAnimations } from '../../../../testing/harness-helpers';
import { AnalysisSettingsForm, isExpressionError } from './analysis-settings-form';
import { defaultSettingsValue, toSettingsBody } from './analysis-settings-model';

describe('AnalysisSettingsForm', () => {
  let fixture: ComponentFixture<AnalysisSettingsForm>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [noAnimations] });
    fixture = TestBed.createComponent(AnalysisSettingsForm);
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  /** The input of the form field labelled `label`. */
  async function input(label: string): Promise<MatInputHarness> {
    const field = await loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
    const control = await field.getControl(MatInputHarness);
    if (!control) throw new Error(`no input in "${label}"`);
    return control;
  }

  it('When nothing is touched, then the body is the core’s defaults', () => {
    expect(fixture.componentInstance.body()).toEqual(toSettingsBody(defaultSettingsValue()));
  });

  it('When a rule is switched off, then its limits are disabled and cannot block', async () => {
    await (await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Filters' }))).expand();
    await fillField(loader, 'Lowest coolant temperature', '200');
    expect(fixture.componentInstance.body()).toBeNull();

    await (await loader.getHarness(MatSlideToggleHarness.with({ label: 'Warm-up' }))).uncheck();

    expect(await (await input('Lowest coolant temperature')).isDisabled()).toBe(true);
    expect(fixture.componentInstance.body()?.filters?.map((rule) => rule.kind)).not.toContain(
      'warmUp',
    );
  });

  it('When the lambda range is upside down, then it is refused with a sentence', async () => {
    await (await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Filters' }))).expand();
    await fillField(loader, 'Highest lambda', '0.6');

    expect(fixture.componentInstance.body()).toBeNull();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Highest lambda must be above lowest lambda.',
    );
  });

  it('When the spread limit is switched on, then the body carries it', async () => {
    await (
      await loader.getHarness(MatExpansionPanelHarness.with({ title: 'Step and trust' }))
    ).expand();
    expect(await (await input('Largest spread')).isDisabled()).toBe(true);

    await (
      await loader.getHarness(MatSlideToggleHarness.with({ label: 'Limit the spread' }))
    ).check();
    await fillField(loader, 'Largest spread', '0.04');

    expect(fixture.componentInstance.body()?.maxSpread).toBe(0.04);
  });

  it('When the analysis shown had other settings, then they can be taken over and reset', async () => {
    fixture.componentRef.setInput('seed', { minWeight: 12, delay: { estimate: false } });
    await fixture.whenStable();

    await (
      await loader.getHarness(
        MatButtonHarness.with({ text: 'Use the settings of the analysis shown' }),
      )
    ).click();
    expect(fixture.componentInstance.body()).toMatchObject({
      minWeight: 12,
      delay: { estimate: false, tau0S: 0.1, kGrams: 1 },
    });

    await (await loader.getHarness(MatButtonHarness.with({ text: 'Reset to defaults' }))).click();
    expect(fixture.componentInstance.body()).toEqual(toSettingsBody(defaultSettingsValue()));
  });

  it('When the server refuses something else, then its message shows under the form', async () => {
    fixture.componentRef.setInput('serverError', 'Log 1 belongs to another vehicle');
    await fixture.whenStable();
    expect((fixture.nativeElement as HTMLElement).textContent).toContain(
      'Log 1 belongs to another vehicle',
    );
  });
});

describe('AnalysisSettingsForm in imperial units', () => {
  let fixture: ComponentFixture<AnalysisSettingsForm>;
  let loader: HarnessLoader;

  beforeEach(async () => {
    TestBed.configureTestingModule({ providers: [noAnimations] });
    fixture = TestBed.createComponent(AnalysisSettingsForm);
    fixture.componentRef.setInput('units', 'imperial');
    loader = TestbedHarnessEnvironment.loader(fixture);
    await fixture.whenStable();
  });

  /** The form field labelled `label` in the panel titled `panel` (opened first). */
  async function field(panel: string, label: string): Promise<MatFormFieldHarness> {
    await (await loader.getHarness(MatExpansionPanelHarness.with({ title: panel }))).expand();
    return loader.getHarness(MatFormFieldHarness.with({ floatingLabelText: label }));
  }

  /** What a field's input holds. */
  async function valueOf(harness: MatFormFieldHarness): Promise<string> {
    const control = await harness.getControl(MatInputHarness);
    if (!control) throw new Error('the field has no input');
    return control.getValue();
  }

  /** The text of a field's unit suffix. */
  async function suffix(harness: MatFormFieldHarness): Promise<string> {
    return (await harness.getSuffixText()).trim();
  }

  it('When an imperial user opens the form, then the pressures read in psi(a) and psi/s', async () => {
    // 90 kPa = 13.05 psi; 20 kPa/s = 2.90 psi/s (1 psi = 6.894757 kPa, NIST SP 811, 2008
    // edition, Appendix B.8) [S]
    const load = await field('Lean under load', 'Under load from');
    expect(await valueOf(load)).toBe('13.05');
    expect(await suffix(load)).toBe('psi(a)');
    const rate = await field('Filters', 'Largest MAP rate');
    expect(await valueOf(rate)).toBe('2.9');
    expect(await suffix(rate)).toBe('psi/s');
  });

  it('When an imperial user types 14.7 psi(a) as the load line, then the API gets about 101.35 kPa', async () => {
    await field('Lean under load', 'Under load from');
    await fillField(loader, 'Under load from', '14.7');
    // 14.7 psi × 6.894757 kPa/psi = 101.35293 kPa (NIST SP 811, 2008 edition, Appendix B.8) [S]
    expect(fixture.componentInstance.body()?.leanLoadKpa).toBeCloseTo(101.35293, 4);
    // The untouched MAP rate goes back as stored, not through the rounded 2.9 psi/s.
    const mapRate = fixture.componentInstance.body()?.filters?.find((r) => r.kind === 'mapRate');
    expect(mapRate).toEqual({ kind: 'mapRate', maxKpaPerS: 20, settleS: 0 });
  });

  it('When an imperial user leaves the fields as filled, then the stored metric values go back exactly', async () => {
    expect(fixture.componentInstance.body()).toEqual(toSettingsBody(defaultSettingsValue()));

    // 87.3 kPa shows as 12.66 psi(a), which is 87.2872 kPa: only the remembered value is exact.
    fixture.componentRef.setInput('seed', {
      leanLoadKpa: 87.3,
      filters: [
        { kind: 'mapRate', maxKpaPerS: 33.3 },
        { kind: 'warmUp', minEctC: 65.5 },
      ],
    });
    await fixture.whenStable();
    await (
      await loader.getHarness(
        MatButtonHarness.with({ text: 'Use the settings of the analysis shown' }),
      )
    ).click();
    expect(await valueOf(await field('Lean under load', 'Under load from'))).toBe('12.66');
    const body = fixture.componentInstance.body();
    expect(body?.leanLoadKpa).toBe(87.3);
    expect(body?.filters).toEqual([
      { kind: 'warmUp', minEctC: 65.5 },
      { kind: 'mapRate', maxKpaPerS: 33.3, settleS: 0 },
    ]);
  });

  it('When a pressure is beyond its range, then the message gives the range in psi(a)', async () => {
    await field('Lean under load', 'Under load from');
    await fillField(loader, 'Under load from', '80');
    // 500 kPa = 72.5189 psi, rounded inward so every accepted value is one the server accepts.
    expect(await (await field('Lean under load', 'Under load from')).getTextErrors()).toEqual([
      'Under load from must be from 0 to 72.51 psi(a).',
    ]);
    expect(fixture.componentInstance.body()).toBeNull();
  });

  it('When the user switches back to metric, then a typed value is said again in kPa', async () => {
    await field('Lean under load', 'Under load from');
    await fillField(loader, 'Under load from', '14.7');
    fixture.componentRef.setInput('units', 'metric');
    await fixture.whenStable();
    const load = await field('Lean under load', 'Under load from');
    expect(await suffix(load)).toBe('kPa');
    expect(Number(await valueOf(load))).toBeCloseTo(101.35293, 4);
    expect(fixture.componentInstance.body()?.leanLoadKpa).toBeCloseTo(101.35293, 4);
    expect(fixture.componentInstance.body()?.maxStepPercent).toBe(15);
  });
});

describe('isExpressionError', () => {
  it.each([
    ['expression "rpm >": cannot be read (Unexpected end of expression)', true],
    ['SampleExpressionError: the log has no "knock" channel', true],
    ['Log 1 belongs to another vehicle', false],
  ])('When the server says %j, then it is about the expression: %p', (message, isAbout) => {
    expect(isExpressionError(message)).toBe(isAbout);
  });
});
