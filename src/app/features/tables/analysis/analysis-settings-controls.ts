import {
  type AbstractControl,
  FormControl,
  FormGroup,
  type ValidationErrors,
  type ValidatorFn,
} from '@angular/forms';
import {
  type AnalysisSettingKey,
  EXPRESSION_MAX_LENGTH,
  SETTING_RANGES,
  type SettingKey,
  type SettingRange,
  lambdaOrderProblem,
  rangeProblem,
} from './analysis-setting-ranges';
import {
  type FilterRulesValue,
  type SettingsValue,
  defaultSettingsValue,
} from './analysis-settings-model';

/** Typed controls of a plain value: nested objects become groups, the rest controls. */
export type Controls<T> = {
  [K in keyof T]: [T[K]] extends [object] ? FormGroup<Controls<T[K]>> : FormControl<T[K]>;
};

/** The settings form. */
export type SettingsForm = FormGroup<Controls<SettingsValue>>;

/** A validator refusing values outside `range`, with the sentence to show as `range`. */
export function rangeValidator(range: SettingRange): ValidatorFn {
  return (control: AbstractControl<number | null>): ValidationErrors | null => {
    const problem = rangeProblem(range, control.value);
    return problem ? { range: problem } : null;
  };
}

/** A number control checked against the contract's range of `key`. */
export function numberControl(key: SettingKey, value: number | null): FormControl<number | null> {
  return new FormControl<number | null>(value, {
    nonNullable: true,
    validators: rangeValidator(SETTING_RANGES[key]),
  });
}

/** A fresh settings form at the core's defaults; rule limits are disabled while a rule is off. */
export function createSettingsForm(): SettingsForm {
  const d = defaultSettingsValue();
  const f = d.filters;
  const form: SettingsForm = new FormGroup({
    filters: new FormGroup({
      warmUp: ruleGroup(f.warmUp.on, {
        minEctC: numberControl('warmUp.minEctC', f.warmUp.minEctC),
      }),
      fuelCut: ruleGroup(f.fuelCut.on, {
        leanLimitLambda: numberControl('fuelCut.leanLimitLambda', f.fuelCut.leanLimitLambda),
        settleS: numberControl('fuelCut.settleS', f.fuelCut.settleS),
      }),
      tipIn: ruleGroup(f.tipIn.on, {
        maxTpsRatePctPerS: numberControl('tipIn.maxTpsRatePctPerS', f.tipIn.maxTpsRatePctPerS),
        settleS: numberControl('tipIn.settleS', f.tipIn.settleS),
        direction: new FormControl(f.tipIn.direction, { nonNullable: true }),
      }),
      rpmRate: ruleGroup(f.rpmRate.on, {
        maxRpmPerS: numberControl('rpmRate.maxRpmPerS', f.rpmRate.maxRpmPerS),
        settleS: numberControl('rpmRate.settleS', f.rpmRate.settleS),
      }),
      mapRate: ruleGroup(f.mapRate.on, {
        maxKpaPerS: numberControl('mapRate.maxKpaPerS', f.mapRate.maxKpaPerS),
        settleS: numberControl('mapRate.settleS', f.mapRate.settleS),
      }),
      lambdaRange: ruleGroup(f.lambdaRange.on, {
        min: numberControl('lambdaRange.min', f.lambdaRange.min),
        max: numberControl('lambdaRange.max', f.lambdaRange.max),
      }),
      loopMode: ruleGroup(f.loopMode.on, {
        keep: new FormControl(f.loopMode.keep, { nonNullable: true }),
      }),
      knock: ruleGroup(f.knock.on, { maxDeg: numberControl('knock.maxDeg', f.knock.maxDeg) }),
    }),
    expression: new FormControl(d.expression, {
      nonNullable: true,
      validators: (control: AbstractControl<string>) =>
        control.value.trim().length > EXPRESSION_MAX_LENGTH
          ? { range: `Expression: at most ${EXPRESSION_MAX_LENGTH} characters.` }
          : null,
    }),
    delayMode: new FormControl(d.delayMode, { nonNullable: true }),
    tau0S: numberControl('delay.tau0S', d.tau0S),
    kGrams: numberControl('delay.kGrams', d.kGrams),
    stepFraction: numberControl('stepFraction', d.stepFraction),
    maxStepPercent: numberControl('maxStepPercent', d.maxStepPercent),
    minWeight: numberControl('minWeight', d.minWeight),
    limitSpread: new FormControl(d.limitSpread, { nonNullable: true }),
    maxSpread: numberControl('maxSpread', d.maxSpread),
    leanLoadKpa: numberControl('leanLoadKpa', d.leanLoadKpa),
    warnLeanPercent: numberControl('warnLeanPercent', d.warnLeanPercent),
  });
  form.controls.filters.controls.lambdaRange.addValidators(lambdaRangeValidator);
  enableWhen([form.controls.limitSpread], [form.controls.maxSpread]);
  return form;
}

/** A rule's group whose limits follow its switch. */
function ruleGroup<T extends Record<string, AbstractControl>>(
  on: boolean,
  limits: T,
): FormGroup<T & { on: FormControl<boolean> }> {
  const toggle = new FormControl(on, { nonNullable: true });
  const group = new FormGroup({ ...limits, on: toggle });
  enableWhen([toggle], Object.values(limits));
  return group;
}

/**
 * Keeps `controls` enabled only while every one of `toggles` is on: a switched-off option's
 * limits neither look editable nor block the form. The subscriptions live exactly as long as
 * these controls do.
 */
export function enableWhen(
  toggles: readonly FormControl<boolean>[],
  controls: readonly AbstractControl[],
): void {
  const sync = () => {
    const on = toggles.every((t) => t.value);
    // emitEvent false: the toggle's own change goes on to re-check its parent right after this
    // (the toggles share a parent with the controls), so the form's status and value follow.
    controls.forEach((c) =>
      on ? c.enable({ emitEvent: false }) : c.disable({ emitEvent: false }),
    );
  };
  sync();
  for (const toggle of toggles) {
    toggle.valueChanges.subscribe(sync);
  }
}

/** Refuses a lambda range whose highest value is not above its lowest. */
function lambdaRangeValidator(control: AbstractControl): ValidationErrors | null {
  const { min, max } = (control as FormGroup<Controls<FilterRulesValue['lambdaRange']>>).controls;
  const problem = min.disabled ? null : lambdaOrderProblem(min.value, max.value);
  return problem ? { order: problem } : null;
}

/** The number fields of a settings form by key. */
export function settingsNumberControls(
  form: SettingsForm,
): Record<AnalysisSettingKey, FormControl<number | null>> {
  const f = form.controls.filters.controls;
  const c = form.controls;
  return {
    'warmUp.minEctC': f.warmUp.controls.minEctC,
    'fuelCut.leanLimitLambda': f.fuelCut.controls.leanLimitLambda,
    'fuelCut.settleS': f.fuelCut.controls.settleS,
    'tipIn.maxTpsRatePctPerS': f.tipIn.controls.maxTpsRatePctPerS,
    'tipIn.settleS': f.tipIn.controls.settleS,
    'rpmRate.maxRpmPerS': f.rpmRate.controls.maxRpmPerS,
    'rpmRate.settleS': f.rpmRate.controls.settleS,
    'mapRate.maxKpaPerS': f.mapRate.controls.maxKpaPerS,
    'mapRate.settleS': f.mapRate.controls.settleS,
    'lambdaRange.min': f.lambdaRange.controls.min,
    'lambdaRange.max': f.lambdaRange.controls.max,
    'knock.maxDeg': f.knock.controls.maxDeg,
    'delay.tau0S': c.tau0S,
    'delay.kGrams': c.kGrams,
    stepFraction: c.stepFraction,
    maxStepPercent: c.maxStepPercent,
    minWeight: c.minWeight,
    maxSpread: c.maxSpread,
    leanLoadKpa: c.leanLoadKpa,
    warnLeanPercent: c.warnLeanPercent,
  };
}
