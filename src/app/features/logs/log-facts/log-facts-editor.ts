import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  input,
  linkedSignal,
  output,
  signal,
} from '@angular/core';
import { rxResource, takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatSelectModule } from '@angular/material/select';
import { hasAnyRole } from '@shared/auth/access';
import type { LogKind, LogResource } from '@shared/contracts/logs';
import { apiErrorMessage } from '../../../core/api/api-error';
import { LogsApi } from '../../../core/api/logs-api';
import { TablesApi } from '../../../core/api/tables-api';
import { Session } from '../../../core/auth/session';
import { Notifier } from '../../../core/notify/notifier';
import { revisionGroupsOf } from '../revision-groups-of';

/**
 * What can be put right after an upload: the log's kind and the revision its ECU ran (a log
 * uploaded without one is measured against each analysis's base revision — said here, so it can
 * be fixed), and deleting the log. Tuners and operators change; tuners and admins delete.
 */
@Component({
  selector: 'app-log-facts-editor',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [MatButtonModule, MatFormFieldModule, MatSelectModule],
  templateUrl: './log-facts-editor.html',
  styleUrl: './log-facts-editor.scss',
})
export class LogFactsEditor {
  private readonly logsApi = inject(LogsApi);
  private readonly tablesApi = inject(TablesApi);
  private readonly notifier = inject(Notifier);
  private readonly destroyRef = inject(DestroyRef);
  private readonly session = inject(Session);
  private readonly roles = computed(() => this.session.user()?.roles ?? []);

  /** The log. */
  readonly log = input.required<LogResource>();
  /** The log as stored after a change. */
  readonly changed = output<LogResource>();
  /** The log is gone. */
  readonly deleted = output<void>();

  /** Whether the user may change the log's facts. */
  protected readonly canChange = computed(() => hasAnyRole(this.roles(), ['tuner', 'operator']));
  /** Whether the user may delete the log. */
  protected readonly canDelete = computed(() => hasAnyRole(this.roles(), ['tuner', 'admin']));

  /** The kind chosen (starts as stored). */
  protected readonly kind = linkedSignal<LogKind>(() => this.log().kind);
  /** The ECU revision chosen (starts as stored; null: not known). */
  protected readonly ecuRevisionId = linkedSignal<string | null>(() => this.log().ecuRevisionId);
  /** Whether the delete button asks for confirmation now. */
  protected readonly isConfirmingDelete = signal(false);
  /** Whether a request is running. */
  protected readonly isBusy = signal(false);

  /** The vehicle's tables with their revisions, for the revision select. */
  protected readonly revisions = rxResource({
    params: () => this.log().vehicleId,
    stream: ({ params }) => revisionGroupsOf(this.tablesApi, params),
    defaultValue: [],
  });

  /** Whether the choices differ from what is stored. */
  protected readonly isChanged = computed(
    () => this.kind() !== this.log().kind || this.ecuRevisionId() !== this.log().ecuRevisionId,
  );

  /** Stores the chosen kind and revision. */
  protected save(): void {
    this.isBusy.set(true);
    this.logsApi
      .change(this.log().id, { kind: this.kind(), ecuRevisionId: this.ecuRevisionId() })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (log) => {
          this.isBusy.set(false);
          this.notifier.news('Log updated.');
          this.changed.emit(log);
        },
        error: (error: unknown) => {
          this.isBusy.set(false);
          this.notifier.requestFailed(error, 'The log could not be changed.');
        },
      });
  }

  /** First press asks; the second deletes. */
  protected remove(): void {
    if (!this.isConfirmingDelete()) {
      this.isConfirmingDelete.set(true);
      return;
    }
    this.isBusy.set(true);
    this.logsApi
      .remove(this.log().id)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: () => {
          this.notifier.news(`${this.log().fileName} deleted.`);
          this.deleted.emit();
        },
        error: (error: unknown) => {
          this.isBusy.set(false);
          this.isConfirmingDelete.set(false);
          this.notifier.failure(apiErrorMessage(error, 'The log could not be deleted.'));
        },
      });
  }
}
