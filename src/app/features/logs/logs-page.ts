import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, computed, inject } from '@angular/core';
import { rxResource } from '@angular/core/rxjs-interop';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { RouterLink } from '@angular/router';
import type { LogResource } from '@shared/contracts/logs';
import { forkJoin, map, of } from 'rxjs';
import { apiErrorMessage } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Session } from '../../core/auth/session';
import { mergeLogRows, upsertLogRow, type LogRow } from './log-rows';
import { canUploadLogs, formatDuration, isPending, statusLabel } from './log-text';
import { LogUpload } from './log-upload';

/** The shop's logs across its vehicles, newest first, and the upload area for those who upload. */
@Component({
  selector: 'app-logs-page',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, RouterLink, MatProgressBarModule, LogUpload],
  templateUrl: './logs-page.html',
  styleUrl: './logs-page.scss',
})
export class LogsPage {
  private readonly vehiclesApi = inject(VehiclesApi);
  private readonly logsApi = inject(LogsApi);
  private readonly session = inject(Session);

  /** The shop's vehicles (the API's largest page; shops hold far fewer). */
  protected readonly vehicles = rxResource({
    stream: () => this.vehiclesApi.list({ limit: 100 }).pipe(map((res) => res.items)),
    defaultValue: [],
  });

  /** Every vehicle's logs, merged newest first. */
  protected readonly rows = rxResource({
    params: () => this.vehicles.value(),
    stream: ({ params }) =>
      params.length === 0
        ? of([] as LogRow[])
        : forkJoin(
            params.map((vehicle) =>
              this.logsApi
                .listForVehicle(vehicle.id)
                .pipe(map((res) => ({ vehicleLabel: vehicle.label, logs: res.items }))),
            ),
          ).pipe(map(mergeLogRows)),
    defaultValue: [] as LogRow[],
  });

  /** Whether the user may upload logs. */
  protected readonly canUpload = computed(() => canUploadLogs(this.session.user()?.roles ?? []));

  /** Why the list could not be loaded, if it could not. */
  protected readonly loadError = computed(() => {
    const error = this.vehicles.error() ?? this.rows.error();
    return error === undefined ? null : apiErrorMessage(error, 'The logs could not be loaded.');
  });

  /** The chip text of a log. */
  protected readonly statusLabel = statusLabel;
  /** Whether a log is still being read. */
  protected readonly isPending = isPending;
  /** A readable duration. */
  protected readonly formatDuration = formatDuration;

  /** Puts the uploaded log's latest state into the list. */
  protected showLog(change: { log: LogResource; vehicleLabel: string }): void {
    this.rows.update((rows) => upsertLogRow(rows, change.log, change.vehicleLabel));
  }
}

export default LogsPage;
