import { ChangeDetectionStrategy, Component, computed, input, output, signal } from '@angular/core';
import { DecimalPipe } from '@angular/common';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatCheckboxModule } from '@angular/material/checkbox';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSliderModule } from '@angular/material/slider';
import type { LogResource } from '@shared/contracts/logs';
import type { AnalysisResource } from '../../core/api/analyses-api';
import { delayLine, keptLine, logLine } from './analysis-text';
import type { TableBusy } from './table-store';

/** What "Apply as draft" asks for. */
export interface ApplyRequest {
  /** Fraction of the correction to apply, 0.1–1. */
  readonly stepFraction: number;
  /** Message of the new revision. */
  readonly message: string;
}

/**
 * The analysis panel: pick parsed logs of the vehicle, run an analysis against the revision
 * shown, read each log's filter funnel and delay, and apply the proposal as a draft revision.
 */
@Component({
  selector: 'app-analysis-panel',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DecimalPipe,
    FormsModule,
    MatButtonModule,
    MatCheckboxModule,
    MatFormFieldModule,
    MatInputModule,
    MatSliderModule,
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
  /** Whether the grid has unsaved edits (an analysis runs on the saved revision). */
  readonly isDirty = input(false);
  /** Run an analysis of these logs. */
  readonly analyse = output<string[]>();
  /** Apply the analysis as a draft. */
  readonly apply = output<ApplyRequest>();

  private readonly chosenIds = signal<ReadonlySet<string>>(new Set());

  /** The step fraction of the apply, 0.1–1. */
  protected readonly stepFraction = signal(0.5);
  /** The message of the applied revision. */
  protected readonly message = signal('');
  /** Whether any log is chosen. */
  protected readonly hasChoice = computed(() => this.chosenIds().size > 0);
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

  /** A log in words. */
  protected readonly logLine = logLine;

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

  /** Runs the analysis with the chosen logs, in list order. */
  protected run(): void {
    this.analyse.emit(
      this.logs()
        .filter((log) => this.chosenIds().has(log.id))
        .map((l) => l.id),
    );
  }

  /** Applies the analysis at the chosen step. */
  protected applyDraft(): void {
    this.apply.emit({ stepFraction: this.stepFraction(), message: this.message().trim() });
  }
}
