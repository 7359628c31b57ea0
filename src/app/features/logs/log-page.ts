import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject, input } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { Router, RouterLink } from '@angular/router';
import { switchMap, takeWhile, timer } from 'rxjs';
import { apiErrorMessage, isHttpStatus } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { displaySummaryRows, mappingRows, summaryRows } from './log-rows';
import { LogFactsEditor } from './log-facts/log-facts-editor';
import { LogSeriesChart } from './log-series-chart';
import {
  beyondTableText,
  MAPPING_SOURCE_LABELS,
  formatBytes,
  formatDuration,
  isPending,
  statusLabel,
} from './log-text';

/** How often a log still being parsed is asked about, in milliseconds. */
const POLL_MS = 500;

/** How many of the reported problems are listed. */
const SHOWN_PROBLEMS = 20;

/**
 * One log: its facts, the mapping used, a time-series chart with the filter's verdict (deferred
 * until it scrolls into view, so the charts library loads only then), the channel summary and the
 * parse report.
 */
@Component({
  selector: 'app-log-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    DatePipe,
    DecimalPipe,
    RouterLink,
    MatButtonModule,
    MatIconModule,
    MatProgressBarModule,
    LogSeriesChart,
    LogFactsEditor,
  ],
  templateUrl: './log-page.html',
  styleUrl: './log-page.scss',
})
export class LogPage {
  private readonly logsApi = inject(LogsApi);
  private readonly vehiclesApi = inject(VehiclesApi);
  private readonly preferences = inject(DisplayPreferences);
  private readonly router = inject(Router);

  /** The log's id, from the route. */
  readonly id = input.required<string>();

  /** The log, asked about again every half second while it is queued or parsing. */
  protected readonly log = rxResource({
    params: () => this.id(),
    stream: ({ params }) =>
      timer(0, POLL_MS).pipe(
        switchMap(() => this.logsApi.get(params)),
        takeWhile((log) => isPending(log), true),
      ),
  });

  /** The log's vehicle, for its label. */
  protected readonly vehicle = rxResource({
    params: () => (this.log.hasValue() ? this.log.value().vehicleId : undefined),
    stream: ({ params }) => this.vehiclesApi.get(params),
  });

  /** Whether the log does not exist in this shop. */
  protected readonly isMissing = computed(() => isHttpStatus(this.log.error(), 404));

  /** Why the log could not be loaded, other than being missing. */
  protected readonly loadError = computed(() => {
    const error = this.log.error();
    if (error === undefined || this.isMissing()) return null;
    return apiErrorMessage(error, 'The log could not be loaded.');
  });

  /** The mapping used, channel by channel. */
  protected readonly mapping = computed(() =>
    this.log.hasValue() ? mappingRows(this.log.value().mapping) : [],
  );

  /** Where the mapping came from, in words. */
  protected readonly mappingSource = computed(() => {
    const source = this.log.hasValue() ? this.log.value().parseReport?.mappingSource : undefined;
    return source === undefined ? 'not recorded' : MAPPING_SOURCE_LABELS[source];
  });

  /** Each channel's figures. */
  protected readonly summary = computed(() =>
    this.log.hasValue()
      ? displaySummaryRows(
          summaryRows(this.log.value().channelSummary),
          this.preferences.units(),
          this.preferences.mixture(),
          this.vehicle.hasValue() ? this.vehicle.value().engine.stoichAfr : null,
        )
      : [],
  );

  /** One sentence per table of the vehicle this log runs past the top of. */
  protected readonly beyond = computed(() =>
    this.log.hasValue()
      ? (this.log.value().beyondTables ?? []).map((b) =>
          beyondTableText(b, this.preferences.units()),
        )
      : [],
  );

  /** The first problems of the parse report. */
  protected readonly problems = computed(() =>
    this.log.hasValue()
      ? (this.log.value().parseReport?.problems ?? []).slice(0, SHOWN_PROBLEMS)
      : [],
  );

  /** Back to the logs list (the log is gone). */
  protected leave(): void {
    void this.router.navigate(['/logs']);
  }

  /** The chip text of a log. */
  protected readonly statusLabel = statusLabel;
  /** Whether a log is still being read. */
  protected readonly isPending = isPending;
  /** A readable duration. */
  protected readonly formatDuration = formatDuration;
  /** A readable file size. */
  protected readonly formatBytes = formatBytes;
}

export default LogPage;
