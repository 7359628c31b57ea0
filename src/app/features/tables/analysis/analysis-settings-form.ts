import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  input,
  signal,
  untracked,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { type FormControl, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatExpansionModule } from '@angular/material/expansion';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import type { AnalysisSettingsBody } from '@shared/contracts/analyses';
import type { UnitSystem } from '@shared/contracts/preferences';
import { CHANNELS } from '@shared/core/channels';
import { map } from 'rxjs';
import {
  type AnalysisSettingKey,
  EXPRESSION_MAX_LENGTH,
  type SettingRange,
  lambdaOrderProblem,
} from './analysis-setting-ranges';
import {
  createSettingsForm,
  rangeValidator,
  settingsNumberControls,
} from './analysis-settings-controls';
import {
  type FilterRulesValue,
  type SettingsValue,
  defaultSettingsValue,
  fromSettingsBody,
  toSettingsBody,
} from './analysis-settings-model';
import {
  MEASURED_SETTING_KEYS,
  type ShownOrigins,
  settingsInMetric,
  settingsShown,
  shownSettingRange,
} from './analysis-settings-units';

/** One rule of the form as the template lists it. */
interface RuleView {
  /** The rule. */
  readonly kind: keyof FilterRulesValue;
  /** Its name. */
  readonly label: string;
  /** What it leaves out. */
  readonly description: string;
  /** Its number fields. */
  readonly fields: readonly AnalysisSettingKey[];
}

const RULES: readonly RuleView[] = [
  {
    kind: 'warmUp',
    label: 'Warm-up',
    description: 'Leaves out a cold engine.',
    fields: ['warmUp.minEctC'],
  },
  {
    kind: 'fuelCut',
    label: 'Fuel cut',
    description: 'Leaves out fuel cut and the sensor’s return from free air.',
    fields: ['fuelCut.leanLimitLambda', 'fuelCut.settleS'],
  },
  {
    kind: 'tipIn',
    label: 'Throttle transients',
    description: 'Leaves out fast throttle movement and the time after it.',
    fields: ['tipIn.maxTpsRatePctPerS', 'tipIn.settleS'],
  },
  {
    kind: 'rpmRate',
    label: 'RPM rate',
    description: 'Leaves out fast engine-speed changes.',
    fields: ['rpmRate.maxRpmPerS', 'rpmRate.settleS'],
  },
  {
    kind: 'mapRate',
    label: 'MAP rate',
    description: 'Leaves out fast manifold-pressure changes.',
    fields: ['mapRate.maxKpaPerS', 'mapRate.settleS'],
  },
  {
    kind: 'lambdaRange',
    label: 'Lambda range',
    description: 'Leaves out readings outside the range (sensor not ready, misfire).',
    fields: ['lambdaRange.min', 'lambdaRange.max'],
  },
  {
    kind: 'loopMode',
    label: 'Loop mode',
    description: 'Keeps only closed-loop or only open-loop samples.',
    fields: [],
  },
  {
    kind: 'knock',
    label: 'Knock',
    description: 'Leaves out samples with knock retard.',
    fields: ['knock.maxDeg'],
  },
];

/** Whether a server message is about the filter expression (it names the expression). */
export function isExpressionError(message: string): boolean {
  return /^expression "|SampleExpression/.test(message);
}

/**
 * The settings of the next analysis: filter rules with their limits and an optional
 * expression, the wideband delay, the step and trust limits and the lean-under-load limits,
 * grouped in expansion panels. Pressures (and the coolant temperature) are typed in the user's
 * units and sent metric; a field left as the form filled it sends its metric value unchanged.
 * `body()` is the settings for the API, null while a field is out of range.
 */
@Component({
  selector: 'app-analysis-settings-form',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatButtonToggleModule,
    MatExpansionModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatSlideToggleModule,
  ],
  templateUrl: './analysis-settings-form.html',
  styleUrl: './analysis-settings-form.scss',
})
export class AnalysisSettingsForm {
  /** The server's refusal of the last run (a bad expression is shown at its field). */
  readonly serverError = input<string | null>(null);
  /** Settings of the analysis shown, offered as a starting point. */
  readonly seed = input<AnalysisSettingsBody | null>(null);
  /** The user's unit system: the measured fields are typed in it. */
  readonly units = input<UnitSystem>('metric');

  /** The form. */
  protected readonly form = createSettingsForm();
  /** The rules in the order they run. */
  protected readonly rules = RULES;
  /** The channel names an expression may use. */
  protected readonly channels = CHANNELS.filter((c) => c !== 'boost').join(', ');
  /** Longest expression. */
  protected readonly expressionMax = EXPRESSION_MAX_LENGTH;
  /** The delay's number fields. */
  protected readonly delayKeys: readonly AnalysisSettingKey[] = ['delay.tau0S', 'delay.kGrams'];
  /** The step and trust number fields (the spread limit has its own switch). */
  protected readonly stepKeys: readonly AnalysisSettingKey[] = [
    'stepFraction',
    'maxStepPercent',
    'minWeight',
  ];
  /** The lean-under-load number fields. */
  protected readonly leanKeys: readonly AnalysisSettingKey[] = ['leanLoadKpa', 'warnLeanPercent'];
  /** Whether the filter panel is open (opened to show a refused expression). */
  protected readonly isFiltersOpen = signal(false);

  private readonly fields = settingsNumberControls(this.form);
  /** The units the form's measured fields hold now (they follow `units`). */
  private readonly shownUnits = signal<UnitSystem>('metric');
  /** What the form put into each measured field, so an untouched one is sent exactly. */
  private origins: ShownOrigins = {};
  private readonly raw = toSignal(this.form.valueChanges.pipe(map(() => this.form.getRawValue())), {
    initialValue: this.form.getRawValue(),
  });
  private readonly status = toSignal(this.form.statusChanges, { initialValue: this.form.status });

  /** The settings for `POST /api/tables/:id/analyses`, null while a field is refused. */
  readonly body = computed(() =>
    this.status() === 'VALID'
      ? toSettingsBody(settingsInMetric(this.raw(), this.shownUnits(), this.origins))
      : null,
  );
  /** Whether every field is within its range. */
  readonly isValid = computed(() => this.status() === 'VALID');

  /** Rules switched on, of all, for the panel header. */
  protected readonly rulesOn = computed(() => {
    const filters = this.raw().filters;
    const on = Object.values(filters).filter((rule) => rule.on).length;
    const expression = this.raw().expression.trim() ? ' + expression' : '';
    return `${on} of ${RULES.length} rules on${expression}`;
  });
  /** The delay choice in words. */
  protected readonly delaySummary = computed(() =>
    this.raw().delayMode === 'estimate' ? 'Estimated from each log' : 'Fixed τ₀ and K',
  );
  /** The step and trust limits in words. */
  protected readonly stepSummary = computed(() => {
    const v = this.raw();
    return `step ${v.stepFraction ?? '–'}, at most ${v.maxStepPercent ?? '–'} %, weight ≥ ${v.minWeight ?? '–'}`;
  });
  /** The lean-under-load limits in words. */
  protected readonly leanSummary = computed(() => {
    const v = this.raw();
    const unit = shownSettingRange('leanLoadKpa', this.shownUnits()).unit;
    return `from ${v.leanLoadKpa ?? '–'} ${unit}, warn at ${v.warnLeanPercent ?? '–'} %`;
  });
  /** Why the lambda range is refused as a whole (max not above min), or null. */
  protected readonly lambdaRangeProblem = computed(() => {
    const range = this.raw().filters.lambdaRange;
    return range.on ? lambdaOrderProblem(range.min, range.max) : null;
  });
  /** The server's refusal when it is not about the expression (shown under the form). */
  protected readonly otherServerError = computed(() => {
    const message = this.serverError();
    return message && !isExpressionError(message) ? message : null;
  });

  constructor() {
    // The measured fields follow the user's units: what they hold is said again in the new ones.
    effect(() => {
      const units = this.units();
      untracked(() => this.showIn(units));
    });
    // Sync outward into the form: a refused expression is marked at its field and its panel
    // opens; typing in the field re-runs the validators and clears the mark.
    effect(() => {
      const message = this.serverError();
      if (!message || !isExpressionError(message)) return;
      untracked(() => {
        const control = this.form.controls.expression;
        control.setErrors({ ...control.errors, server: message });
        control.markAsTouched();
        this.isFiltersOpen.set(true);
      });
    });
  }

  /** The control of a number field. */
  protected control(key: AnalysisSettingKey): FormControl<number | null> {
    return this.fields[key];
  }

  /** The range of a number field, in the units it is typed in. */
  protected range(key: AnalysisSettingKey): SettingRange {
    return shownSettingRange(key, this.shownUnits());
  }

  /** The group of a rule. */
  protected ruleOn(kind: keyof FilterRulesValue): FormControl<boolean> {
    return this.form.controls.filters.controls[kind].controls.on;
  }

  /** Puts the settings of the analysis shown into the form. */
  protected useSeed(): void {
    const seed = this.seed();
    if (seed) this.fill(fromSettingsBody(seed));
  }

  /** Puts the core's defaults back. */
  protected reset(): void {
    this.fill(defaultSettingsValue());
  }

  /** Says the form's values again in `units`, with the measured fields' ranges in them. */
  private showIn(units: UnitSystem): void {
    const before = this.shownUnits();
    if (units === before) return;
    const metric = settingsInMetric(this.form.getRawValue(), before, this.origins);
    this.shownUnits.set(units);
    for (const key of MEASURED_SETTING_KEYS) {
      this.fields[key].setValidators(rangeValidator(shownSettingRange(key, units)));
    }
    this.fill(metric);
  }

  /** Puts a metric form value into the form, in the units it is typed in. */
  private fill(metric: SettingsValue): void {
    const { value, origins } = settingsShown(metric, this.shownUnits());
    this.origins = origins;
    this.form.setValue(value);
  }
}
