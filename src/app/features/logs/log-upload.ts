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
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { HttpEventType } from '@angular/common/http';
import { MatButtonModule } from '@angular/material/button';
import { MatDialog } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatProgressBarModule } from '@angular/material/progress-bar';
import { MatSelectModule } from '@angular/material/select';
import { RouterLink } from '@angular/router';
import type { ColumnMappingInput, LogKind, LogResource } from '@shared/contracts/logs';
import type { Vehicle } from '@shared/contracts/vehicles';
import { map, of, switchMap, takeWhile, timer, type Observable } from 'rxjs';
import { LogsApi } from '../../core/api/logs-api';
import { TablesApi } from '../../core/api/tables-api';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { checkMapping, type MappingCheck } from './mapping-check';
import { MappingDialog, type MappingDialogData } from './mapping-dialog';
import {
  beyondTableText,
  formatBytes,
  isPending,
  sentFraction,
  statusLabel,
  uploadFailure,
  type UploadFailure,
} from './log-text';
import { revisionGroupsOf } from './revision-groups-of';
import type { RevisionGroup } from './upload-target';

/** How often a log being parsed is asked about, in milliseconds. */
const POLL_MS = 500;

/** Where an upload is. */
type UploadPhase = 'idle' | 'checking' | 'mapping' | 'sending' | 'parsing' | 'done';

/** The phases in which a new upload cannot start. */
const BUSY: ReadonlySet<UploadPhase> = new Set(['checking', 'mapping', 'sending', 'parsing']);

/**
 * The upload area: a vehicle, a kind, the ECU revision the log was recorded with and a CSV file
 * (dropped or picked). Before sending, the file's header is read in the browser: with a saved
 * mapping for it, or a sure suggestion, the file goes at once; otherwise the mapping dialog asks
 * first. Then the bytes are sent and the server's parsing followed until the log is ready or
 * failed. Every state of the uploaded log is emitted so the list beside it stays current.
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
  private readonly tablesApi = inject(TablesApi);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);
  private readonly preferences = inject(DisplayPreferences);

  /** The shop's vehicles to choose from. */
  readonly vehicles = input.required<readonly Vehicle[]>();

  /** Each new state of the uploaded log, with its vehicle's label. */
  readonly logChanged = output<{ log: LogResource; vehicleLabel: string }>();

  /** The chosen vehicle's id. */
  protected readonly vehicleId = signal<string | null>(null);
  /** Road drive or dyno session. */
  protected readonly kind = signal<LogKind>('road');
  /** The revision the ECU ran while the log was recorded; null when not known. */
  protected readonly ecuRevisionId = signal<string | null>(null);
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
  /** How the columns were settled, in words, once sent. */
  protected readonly mappingNote = signal<string | null>(null);
  /** Why the upload was refused, if it was. */
  protected readonly failure = signal<UploadFailure | null>(null);

  /** The chosen vehicle's tables with their revisions, for the ECU revision select. */
  protected readonly revisions = rxResource({
    params: () => this.vehicleId() ?? undefined,
    stream: ({ params }) => this.revisionGroupsOf(params),
    defaultValue: [] as RevisionGroup[],
  });

  /** Whether the form is complete and nothing is in flight. */
  protected readonly canSend = computed(
    () => this.vehicleId() !== null && this.file() !== null && !BUSY.has(this.phase()),
  );

  /** Once the log is read: one sentence per table of its vehicle it runs past the top of. */
  protected readonly beyond = computed(() =>
    (this.log()?.beyondTables ?? []).map((b) => beyondTableText(b, this.preferences.units())),
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

  /** Picks a vehicle; its revisions differ, so the ECU revision goes back to "not known". */
  protected chooseVehicle(id: string): void {
    this.vehicleId.set(id);
    this.ecuRevisionId.set(null);
  }

  /** Checks the file's columns (asking when unsure), then sends it and follows its parsing. */
  protected send(): void {
    const vehicle = this.vehicles().find((v) => v.id === this.vehicleId());
    const file = this.file();
    if (vehicle === undefined || file === null) return;
    this.phase.set('checking');
    this.log.set(null);
    this.failure.set(null);
    this.mappingNote.set(null);
    checkMapping(file, (signature) => this.api.findMappingPreset(signature))
      .pipe(
        switchMap((check) => this.settleMapping(check, file, vehicle)),
        takeUntilDestroyed(this.destroyRef),
      )
      .subscribe({
        next: (settled) => {
          if (settled === null) {
            this.phase.set('idle');
            this.mappingNote.set('Not uploaded: the column mapping was cancelled.');
            return;
          }
          this.mappingNote.set(settled.note);
          this.transmit(vehicle, file, settled.mapping);
        },
        error: (error: unknown) => this.fail(error),
      });
  }

  /** The mapping to send (none: the server's preset or suggestion), or null when cancelled. */
  private settleMapping(
    check: MappingCheck,
    file: File,
    vehicle: Vehicle,
  ): Observable<{ mapping?: ColumnMappingInput; note: string } | null> {
    if (check.kind === 'ready') {
      const note =
        check.reason === 'preset'
          ? 'Columns read with the shop’s saved mapping for this header.'
          : 'Columns recognised from the header.';
      return of({ note });
    }
    this.phase.set('mapping');
    const data: MappingDialogData = {
      fileName: file.name,
      vehicleLabel: vehicle.label,
      stoichAfr: vehicle.engine.stoichAfr,
      sniff: check.sniff,
      suggestion: check.suggestion,
    };
    return this.dialog
      .open<MappingDialog, MappingDialogData, ColumnMappingInput>(MappingDialog, {
        data,
        width: '1100px',
        maxWidth: '96vw',
        autoFocus: 'dialog',
      })
      .afterClosed()
      .pipe(
        map((mapping) =>
          mapping === undefined
            ? null
            : { mapping, note: 'Columns read with your mapping, now saved for this header.' },
        ),
      );
  }

  /** Sends the file with the chosen fields, then follows its parsing. */
  private transmit(vehicle: Vehicle, file: File, mapping: ColumnMappingInput | undefined): void {
    this.phase.set('sending');
    this.sent.set(0);
    const ecuRevisionId = this.ecuRevisionId();
    this.api
      .upload(vehicle.id, file, {
        kind: this.kind(),
        ...(mapping !== undefined && { mapping: JSON.stringify(mapping) }),
        ...(ecuRevisionId !== null && { ecuRevisionId }),
      })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (event) => {
          if (event.type === HttpEventType.UploadProgress) {
            this.sent.set(sentFraction(event.loaded, event.total));
          } else if (event.type === HttpEventType.Response && event.body !== null) {
            this.sent.set(1);
            this.follow(event.body.id, vehicle.label);
          }
        },
        error: (error: unknown) => this.fail(error),
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
        error: (error: unknown) => this.fail(error),
      });
  }

  /** Shows why the upload stopped and lets the user try again. */
  private fail(error: unknown): void {
    this.phase.set('idle');
    this.failure.set(uploadFailure(error));
  }

  /** A vehicle's tables with their revisions, as select groups. */
  private revisionGroupsOf(vehicleId: string): Observable<RevisionGroup[]> {
    return revisionGroupsOf(this.tablesApi, vehicleId);
  }

  /** Keeps a chosen file and forgets the last outcome. */
  private chooseFile(file: File | null): void {
    if (file === null) return;
    this.file.set(file);
    this.failure.set(null);
    this.mappingNote.set(null);
    if (this.phase() === 'done') this.phase.set('idle');
  }
}
