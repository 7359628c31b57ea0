import { DatePipe, DecimalPipe } from '@angular/common';
import { ChangeDetectionStrategy, Component, input } from '@angular/core';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatTableModule } from '@angular/material/table';
import type { LogResource } from '@shared/contracts/logs';
import { durationText, isLogPending, logStatusText } from './vehicle-detail-text';

/** A vehicle's logs: file, kind, the revision the ECU ran, parse state with progress, samples, duration and date. */
@Component({
  selector: 'app-vehicle-logs',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [DatePipe, DecimalPipe, MatProgressBarModule, MatTableModule],
  template: `
    <table mat-table [dataSource]="logs()" [trackBy]="trackById" class="logs">
      <caption class="cs-visually-hidden">
        Logs of this vehicle
      </caption>
      <ng-container matColumnDef="fileName">
        <th mat-header-cell *matHeaderCellDef scope="col">File</th>
        <td mat-cell *matCellDef="let log" class="file">{{ log.fileName }}</td>
      </ng-container>
      <ng-container matColumnDef="kind">
        <th mat-header-cell *matHeaderCellDef scope="col">Kind</th>
        <td mat-cell *matCellDef="let log">{{ log.kind === 'dyno' ? 'Dyno' : 'Road' }}</td>
      </ng-container>
      <ng-container matColumnDef="ecuRevision">
        <th mat-header-cell *matHeaderCellDef scope="col">ECU ran</th>
        <td mat-cell *matCellDef="let log">{{ ecuRevisionText(log) }}</td>
      </ng-container>
      <ng-container matColumnDef="status">
        <th mat-header-cell *matHeaderCellDef scope="col">Status</th>
        <td mat-cell *matCellDef="let log">
          <span class="chip" [class]="'status-' + log.status">{{ statusText(log) }}</span>
          @if (isPending(log)) {
            <mat-progress-bar
              class="progress"
              [mode]="log.status === 'queued' ? 'indeterminate' : 'determinate'"
              [value]="log.progress * 100"
              [attr.aria-label]="'Reading ' + log.fileName"
            />
          }
          @if (log.error; as error) {
            <div class="failure">{{ error.message }}</div>
          }
        </td>
      </ng-container>
      <ng-container matColumnDef="samples">
        <th mat-header-cell *matHeaderCellDef scope="col" class="number">Samples</th>
        <td mat-cell *matCellDef="let log" class="number">
          {{ log.sampleCount === null ? '—' : (log.sampleCount | number) }}
        </td>
      </ng-container>
      <ng-container matColumnDef="duration">
        <th mat-header-cell *matHeaderCellDef scope="col" class="number">Duration</th>
        <td mat-cell *matCellDef="let log" class="number">{{ duration(log.durationS) }}</td>
      </ng-container>
      <ng-container matColumnDef="createdAt">
        <th mat-header-cell *matHeaderCellDef scope="col">Uploaded</th>
        <td mat-cell *matCellDef="let log">{{ log.createdAt | date: 'medium' }}</td>
      </ng-container>
      <tr mat-header-row *matHeaderRowDef="columns"></tr>
      <tr mat-row *matRowDef="let log; columns: columns"></tr>
      <tr class="mat-row" *matNoDataRow>
        <td class="mat-cell empty" [attr.colspan]="columns.length">No logs recorded yet.</td>
      </tr>
    </table>
  `,
  styleUrl: './vehicle-logs.scss',
})
export class VehicleLogs {
  /** The logs, newest first. */
  readonly logs = input.required<LogResource[]>();
  /** Short labels of the vehicle's revisions by id ("Main VE r3"), for the revision a log ran. */
  readonly revisionLabels = input<Readonly<Record<string, string>>>({});

  /** Column order. */
  protected readonly columns = [
    'fileName',
    'kind',
    'ecuRevision',
    'status',
    'samples',
    'duration',
    'createdAt',
  ];

  /** The chip text. */
  protected readonly statusText = logStatusText;
  /** Whether a log is still being read. */
  protected readonly isPending = isLogPending;
  /** A readable duration. */
  protected readonly duration = durationText;

  /** The revision the ECU ran when the log was recorded, or why it is not shown. */
  protected ecuRevisionText(log: LogResource): string {
    if (!log.ecuRevisionId) return 'Not given';
    return this.revisionLabels()[log.ecuRevisionId] ?? 'A revision no longer listed';
  }

  /** Keeps rows in place across reloads. */
  protected readonly trackById = (_index: number, log: LogResource): string => log.id;
}
