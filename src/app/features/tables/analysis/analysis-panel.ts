import {
  ChangeDetectionStrategy,
  Component,
  computed,
  effect,
  input,
  output,
  signal,
  untracked,
  viewChild,
} from '@angular/core';
import { toSignal } from '@angular/core/rxjs-interop';
import { DecimalPipe } from '@angular/common';
import { FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatRadioModule } from '@angular/material/radio';
import { MatSlideToggleModule } from '@angular/material/slide-toggle';
import { MatSliderModule } from '@angular/material/slider';
import { RouterLink } from '@angular/router';
import type { LogResource } from '@shared/contracts/logs';
import type { UnitSystem } from '@shared/contracts/preferences';
import { map } from 'rxjs';
import { STANDARD_BARO_KPA } from '@shared/correct/load-guard';
import type { AnalysisResource } from '../../../core/api/analyses-api';
import { formatQuantity } from '../../../ui/units/format-quantity';
import {
  type ApplyValue,
  defaultApplyValue,
  sameApplyOptions,
  settingsOfAnalysis,
  toApplyBody,
} from './analysis-apply-model';
import { APPLY_MESSAGE_MAX_LENGTH } from './analysis-setting-ranges';
import { enableWhen, numberControl } from './analysis-settings-controls';
import { AnalysisSettingsForm } from './analysis-settings-form';
import {
  GUARD_EXPLAINED,
  GUARD_OFF_CAUTION,
  GUARD_SETTING_HINT,
  LEAN_WORDS_EXPLAINED,
  delayLine,
  guardLine,
  heldLine,
  keptLine,
  leanCountText,
  lockedLine,
  logLine,
  originLine,
  previewSummaryLine,
} from './analysis-text';
import {
  type CellRef,
  type PreviewResult,
  countOrigins,
  summarisePreview,
} from '../preview/proposal-preview-compute';
import type { TableBusy } from '../table-store';

import type { AnalyseRequest, ApplyRequest } from './analysis-requests';

export type { AnalyseRequest, ApplyRequest };

/**
 * The analysis panel: pick parsed logs of the vehicle and the settings, run an analysis against
 * the revision shown, read each log's filter funnel and delay, and apply the proposal as a
 * draft revision to all cells or only the selected ones, with a live preview of the result.
 * It only shows and asks: the workspace's `AnalysisStore` runs, applies and computes the
 * preview from the options this panel sends.
 */
@Component({
  selector: 'app-analysis-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AnalysisSettingsForm,
    DecimalPipe,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatRadioModule,
    MatSlideToggleModule,
    MatSliderModule,
    ReactiveFormsModule,
    RouterLink,
  ],
  templateUrl: './analysis-panel.html',
  styleUrl: './analysis-panel.scss',
})
export class AnalysisPanel {
  /** Parsed logs of the vehicle, newest first. */
  readonly logs = input.required<readonly LogResource[]>();
  /** The latest analysis, if any. */
  readonly analysis = input<AnalysisResource | null>(null);
  /** What the workspace waits for. */
  readonly busy = input<TableBusy>(null);
  /** The revision the analysis starts from, for the hint. */
  readonly baseNumber = input<number | null>(null);
  /** Number of the revision a new run analyses (the loaded head); default `baseNumber`. */
  readonly runNumber = input<number | null>(null);
  /** Whether the grid has unsaved edits (an analysis runs on the saved revision). */
  readonly isDirty = input(false);
  /** VE of the analysed base revision `[row][col]`, for the preview's summary. */
  readonly baseValues = input<readonly (readonly number[])[]>([]);
  /** Cells selected in the grid as `[row, col]`. */
  readonly selectedCells = input<readonly CellRef[]>([]);
  /** Locked cells as `[row, col]`: an apply keeps their value. */
  readonly lockedCells = input<readonly CellRef[]>([]);
  /** RPM breakpoints of the table (columns). */
  readonly rpmAxis = input<readonly number[]>([]);
  /** MAP breakpoints of the table, kPa (rows). */
  readonly mapAxisKpa = input<readonly number[]>([]);
  /** The server's refusal of the last run, shown at the field it concerns; null for none. */
  readonly analyseError = input<string | null>(null);
  /** The user's unit system, for the guard's pressures. */
  readonly units = input<UnitSystem>('metric');
  /** The table's vehicle, whose page holds the guard's settings; null hides the link. */
  readonly vehicleId = input<string | null>(null);
  /**
   * What the draft would hold with the options sent: VE `[row][col]` rounded as stored, each
   * cell's origin and the held count; null while there is none.
   */
  readonly preview = input<PreviewResult | null>(null);
  /** Why the preview could not be computed, or null. */
  readonly previewError = input<string | null>(null);
  /** Whether a preview is on its way. */
  readonly isPreviewing = input(false);

  /** Run an analysis of these logs with these settings. */
  readonly analyse = output<AnalyseRequest>();
  /** Apply the analysis as a draft. */
  readonly apply = output<ApplyRequest>();
  /**
   * The apply options the preview depends on (not the message), whenever they change; null
   * while one is out of range.
   */
  readonly applyOptions = output<ApplyValue | null>();

  private readonly settingsForm = viewChild(AnalysisSettingsForm);
  private readonly chosenIds = signal<ReadonlySet<string>>(new Set());

  /** The apply options. */
  protected readonly applyForm = new FormGroup({
    scope: new FormControl<ApplyValue['scope']>('all', { nonNullable: true }),
    stepFraction: numberControl('apply.stepFraction', 0.5),
    smooth: numberControl('apply.smooth', 0.3),
    fill: new FormControl(true, { nonNullable: true }),
    guard: new FormControl(true, { nonNullable: true }),
    limitReach: new FormControl(false, { nonNullable: true }),
    maxReach: numberControl('apply.maxReach', 2),
    message: new FormControl('', { nonNullable: true }),
  });
  private readonly applyValue = toSignal(
    this.applyForm.valueChanges.pipe(map(() => this.applyForm.getRawValue())),
    { initialValue: this.applyForm.getRawValue() },
  );
  private readonly applyStatus = toSignal(this.applyForm.statusChanges, {
    initialValue: this.applyForm.status,
  });

  /** Longest revision message. */
  protected readonly messageMax = APPLY_MESSAGE_MAX_LENGTH;
  /** Whether any log is chosen. */
  protected readonly hasChoice = computed(() => this.chosenIds().size > 0);
  /** Whether the settings are all within range. */
  protected readonly areSettingsValid = computed(() => this.settingsForm()?.isValid() ?? true);
  /** Settings of the analysis shown (offered to the form as a starting point). */
  protected readonly analysisSettings = computed(() => {
    const analysis = this.analysis();
    return analysis ? settingsOfAnalysis(analysis) : null;
  });
  /** Per analysed log: its name and report. */
  protected readonly reports = computed(() => {
    const names = new Map(this.logs().map((log) => [log.id, log.fileName]));
    return (this.analysis()?.filterReport.logs ?? []).map((report) => ({
      report,
      name: names.get(report.logId) ?? report.logId,
      kept: keptLine(report),
      delay: delayLine(report),
    }));
  });
  /** Whether "only the selected cells" is chosen while nothing is selected. */
  protected readonly isSelectionMissing = computed(
    () => this.applyValue().scope === 'selected' && this.selectedCells().length === 0,
  );
  /** The locked cells in words. */
  protected readonly lockedText = computed(() => lockedLine(this.lockedCells().length));
  /** The apply options the preview depends on; null while one is out of range. */
  private readonly previewOptions = computed(
    (): ApplyValue | null =>
      this.applyStatus() === 'VALID' ? { ...this.applyValue(), message: '' } : null,
    { equal: (a, b) => (a && b ? sameApplyOptions(a, b) : a === b) },
  );
  /** The preview's changes in words, null while there is none. */
  protected readonly previewText = computed(() => {
    const values = this.preview()?.values;
    if (!values) return null;
    const summary = summarisePreview(this.baseValues(), values);
    return previewSummaryLine(summary, this.rpmAxis(), this.mapAxisKpa());
  });
  /** The preview's held cells in words, and whether there are any; null while there is none. */
  protected readonly previewHeld = computed(() => {
    const result = this.preview();
    if (!result) return null;
    return { text: heldLine(result.heldCount, result.guard !== null), count: result.heldCount };
  });
  /** How the preview's cells got their values, in one line; null while there is none. */
  protected readonly previewOrigins = computed(() => {
    const result = this.preview();
    return result ? originLine(countOrigins(result.origin)) : null;
  });
  /** The analysis's lean flags counted (loud ones, then the ones to watch). */
  protected readonly leanCount = computed(() => leanCountText(this.analysis()?.leanFlags ?? []));
  /** Whether the analysis has any loud ("warning" or "stop") flag, whose words are explained. */
  protected readonly hasLoudFlags = computed(() =>
    (this.analysis()?.leanFlags ?? []).some((flag) => flag.severity !== 'watch'),
  );
  /** The analysis's guard in words, in the user's units; null without an analysis. */
  protected readonly guardText = computed(() => {
    const guard = this.analysis()?.guard;
    return guard ? guardLine(guard, this.units()) : null;
  });
  /** Standard sea-level pressure in the user's units, as the guard assumes it without a log's. */
  protected readonly standardBaro = computed(() =>
    formatQuantity('pressure', STANDARD_BARO_KPA, this.units()),
  );
  /** Whether the barometric pressure behind the load line was assumed. */
  protected readonly isBaroAssumed = computed(
    () => this.analysis()?.guard?.baroSource === 'assumed',
  );
  /** Whether the user turned the guard off for this apply. */
  protected readonly isGuardOff = computed(() => !this.applyValue().guard);

  /** What the guard does. */
  protected readonly guardExplained = GUARD_EXPLAINED;
  /** Where its settings live. */
  protected readonly guardSettingHint = GUARD_SETTING_HINT;
  /** The caution while it is off. */
  protected readonly guardOffCaution = GUARD_OFF_CAUTION;
  /** What "stop" and "warning" ask of the user. */
  protected readonly leanWords = LEAN_WORDS_EXPLAINED;

  /** A log in words. */
  protected readonly logLine = logLine;

  constructor() {
    const { fill, limitReach, maxReach } = this.applyForm.controls;
    enableWhen([fill], [limitReach]);
    enableWhen([fill, limitReach], [maxReach]);
    // A new analysis starts the apply options afresh, at its own step fraction.
    effect(() => {
      const settings = this.analysisSettings();
      untracked(() => this.applyForm.reset(defaultApplyValue(settings ?? {})));
    });
    // Sync outward: every change of the options the preview depends on goes to the workspace.
    effect(() => {
      const options = this.previewOptions();
      untracked(() => this.applyOptions.emit(options));
    });
  }

  /** Whether `id` is chosen. */
  protected isChosen(id: string): boolean {
    return this.chosenIds().has(id);
  }

  /** Chooses or drops a log. */
  protected toggle(id: string, checked: boolean): void {
    this.chosenIds.update((ids) => {
      const next = new Set(ids);
      if (checked) next.add(id);
      else next.delete(id);
      return next;
    });
  }

  /** Runs the analysis with the chosen logs, in list order, and the form's settings. */
  protected run(): void {
    const settings = this.settingsForm()?.body();
    if (!settings) return;
    const logIds = this.logs()
      .filter((log) => this.chosenIds().has(log.id))
      .map((log) => log.id);
    this.analyse.emit({ logIds, settings });
  }

  /** Applies the analysis with the chosen options as a draft. */
  protected applyDraft(): void {
    if (this.applyForm.invalid || this.isSelectionMissing()) return;
    const body = toApplyBody(
      this.applyForm.getRawValue(),
      this.selectedCells(),
      this.lockedCells(),
    );
    this.apply.emit({ body });
  }
}
