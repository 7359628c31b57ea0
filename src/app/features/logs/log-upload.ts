import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  output,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { HttpEventType } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import type { LogKind, LogResource } from '@shared/contracts/logs';
import type { Vehicle } from '@shared/contracts/vehicles';
import { switchMap, takeWhile, timer } from 'rxjs';
import { LogsApi } from '../../core/api/logs-api';
import {
  formatBytes,
  isPending,
  sentFraction,
  statusLabel,
  uploadFailure,
  type UploadFailure,
} from './log-text';

/** How often a log being parsed is asked about, in milliseconds. */
const POLL_MS = 500;

/** Where an upload is. */
type UploadPhase = 'idle' | 'sending' | 'parsing' | 'done';

/**
 * The upload area: a vehicle, a kind and a CSV file (dropped or picked), then the bytes sent and
 * the server's parsing followed until the log is ready or failed. Every state of the uploaded
 * log is emitted so the list beside it stays current.
 */
@Component({
  selector: 'app-log-upload',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    RouterLink,
    MatButtonModule,
    MatFormFieldModule,
    MatIconModule,
    MatProgressBarModule,
    MatSelectModule,
  ],
  templateUrl: './log-upload.html',
  styleUrl: './log-upload.scss',
})
export class LogUpload {
  private readonly api = inject(LogsApi);
  private readonly destroyRef = inject(DestroyRef);

  /** The shop's vehicles to choose from. */
  readonly vehicles = input.required<readonly Vehicle[]>();

  /** Each new state of the uploaded log, with its vehicle's label. */
  readonly logChanged = output<{ log: LogResource; vehicleLabel: string }>();

  /** The chosen vehicle's id. */
  protected readonly vehicleId = signal<string | null>(null);
  /** Road drive or dyno session. */
  protected readonly kind = signal<LogKind>('road');
  /** The chosen file. */
  protected readonly file = signal<File | null>(null);
  /** Whether a file is being dragged over the drop zone. */
  protected readonly isDragOver = signal(false);
  /** Where the upload is. */
  protected readonly phase = signal<UploadPhase>('idle');
  /** Fraction of bytes sent, or null while unknown. */
  protected readonly sent = signal<number | null>(null);
  /** The uploaded log as last polled. */
  protected readonly log = signal<LogResource | null>(null);
  /** Why the upload was refused, if it was. */
  protected readonly failure = signal<UploadFailure | null>(null);

  /** Whether the form is complete and nothing is in flight. */
  protected readonly canSend = computed(
    () =>
      this.vehicleId() !== null &&
      this.file() !== null &&
      this.phase() !== 'sending' &&
      this.phase() !== 'parsing',
  );

  /** The chip text of a log. */
  protected readonly statusLabel = statusLabel;
  /** A readable file size. */
  protected readonly formatBytes = formatBytes;

  /** Keeps the drop zone a drop target (the browser would otherwise open the file). */
  protected onDragOver(event: DragEvent): void {
    event.preventDefault();
    this.isDragOver.set(true);
  }

  /** Takes the first dropped file. */
  protected onDrop(event: DragEvent): void {
    event.preventDefault();
    this.isDragOver.set(false);
    this.chooseFile(event.dataTransfer?.files.item(0) ?? null);
  }

  /** Takes the file picked through the input. */
  protected onPick(event: Event): void {
    const inputElement = event.target as HTMLInputElement;
    this.chooseFile(inputElement.files?.item(0) ?? null);
    // Clearing lets the same file be picked again after a fix elsewhere.
    inputElement.value = '';
  }

  /** Sends the file, then follows its parsing. */
  protected send(): void {
    const vehicleId = this.vehicleId();
    const file = this.file();
    if (vehicleId === null || file === null) return;
    const vehicleLabel = this.vehicles().find((v) => v.id === vehicleId)?.label ?? '';
    this.phase.set('sending');
    this.sent.set(0);
    this.log.set(null);
    this.failure.set(null);
    this.api
      .upload(vehicleId, file, { kind: this.kind() })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (event) => {
          if (event.type === HttpEventType.UploadProgress) {
            this.sent.set(sentFraction(event.loaded, event.total));
          } else if (event.type === HttpEventType.Response && event.body !== null) {
            this.sent.set(1);
            this.follow(event.body.id, vehicleLabel);
          }
        },
        error: (error: unknown) => {
          this.phase.set('idle');
          this.failure.set(uploadFailure(error));
        },
      });
  }

  /** Polls the log until it is ready or failed. */
  private follow(id: string, vehicleLabel: string): void {
    this.phase.set('parsing');
    this.file.set(null);
    timer(0, POLL_MS)
      .pipe(
        switchMap(() => this.api.get(id)),
        takeWhile((log) => isPending(log), true),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (log) => {
          this.log.set(log);
          this.logChanged.emit({ log, vehicleLabel });
          if (!isPending(log)) this.phase.set('done');
        },
        error: (error: unknown) => {
          this.phase.set('idle');
          this.failure.set(uploadFailure(error));
        },
      });
  }

  /** Keeps a chosen file and forgets the last outcome. */
  private chooseFile(file: File | null): void {
    if (file === null) return;
    this.file.set(file);
    this.failure.set(null);
    if (this.phase() === 'done') this.phase.set('idle');
  }
}
