import type { HarnessLoader } from '@angular/cdk/testing';
import { TestbedHarnessEnvironment } from '@angular/cdk/testing/testbed';
import { type ComponentFixture, TestBed } from '@angular/core/testing';
import { MatButtonHarness } from '@angular/material/button/testing';
import { MatExpansionPanelHarness } from '@angular/material/expansion/testing';
import { MatInputHarness } from '@angular/material/input/testing';
import { MatFormFieldHarness } from '@angular/material/form-field/testing';
import { MatSlideToggleHarness } from '@angular/material/slide-toggle/testing';
import { fillField, noAnimations } from '../../../testing/harness-helpers';
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

describe('isExpressionError', () => {
  it.each([
    ['expression "rpm >": cannot be read (Unexpected end of expression)', true],
    ['SampleExpressionError: the log has no "knock" channel', true],
    ['Log 1 belongs to another vehicle', false],
  ])('When the server says %j, then it is about the expression: %p', (message, isAbout) => {
    expect(isExpressionError(message)).toBe(isAbout);
  });
});
