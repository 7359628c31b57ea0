import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { VeTableResource } from '@shared/contracts/tables';
import type { TableOrientation } from '@shared/table-file/table-labels';
import { apiErrorMessage } from '../../../core/api/api-error';
import { TablesApi } from '../../../core/api/tables-api';
import {
  SUGGESTED_MAP_BOOSTED,
  SUGGESTED_MAP_NA,
  SUGGESTED_RPM,
  draftFromAxes,
  draftFromText,
  type DraftTable,
  type FilePressureUnit,
  type StartShape,
} from './new-table-model';

/** What the dialog needs: the vehicle the table is for. */
export interface NewTableDialogData {
  readonly vehicleId: string;
  readonly vehicleLabel: string;
}

/** Where the new table comes from. */
type Source = 'file' | 'axes';

/** How many rows of values the preview shows. */
const PREVIEW_ROWS = 6;

/**
 * A new VE table for a vehicle, from a file or a pasted block with its axes (our export format
 * either way round, comma/semicolon/tab, decimal comma, a title or units row), or from axes the
 * tuner types and a starting estimate. The preview shows what will be stored; nothing is stored
 * until "Create table", and a refused file says the line and column at fault.
 */
@Component({
  selector: 'app-new-table-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    MatButtonModule,
    MatButtonToggleModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
  ],
  templateUrl: './new-table-dialog.html',
  styleUrl: './new-table-dialog.scss',
})
export class NewTableDialog {
  private readonly api = inject(TablesApi);
  private readonly dialogRef = inject<MatDialogRef<NewTableDialog, VeTableResource>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  /** The vehicle. */
  protected readonly data = inject<NewTableDialogData>(MAT_DIALOG_DATA);

  /** Where the table comes from. */
  protected readonly source = signal<Source>('file');
  /** The table's name. */
  protected readonly name = signal('Main VE');
  /** The file's or pasted block's text. */
  protected readonly text = signal('');
  /** The file chosen, if one was. */
  protected readonly fileName = signal<string | null>(null);
  /** Which axis runs down the first column. */
  protected readonly orientation = signal<TableOrientation | 'auto'>('auto');
  /** The unit of the file's MAP axis. */
  protected readonly pressureUnit = signal<FilePressureUnit>('auto');
  /** Typed RPM breakpoints. */
  protected readonly rpmText = signal(SUGGESTED_RPM);
  /** Typed MAP breakpoints, kPa absolute. */
  protected readonly mapText = signal(SUGGESTED_MAP_NA);
  /** Starting VE, %. */
  protected readonly startVe = signal(80);
  /** Starting shape. */
  protected readonly shape = signal<StartShape>('rising');
  /** Whether the table is being stored. */
  protected readonly isSaving = signal(false);
  /** Why storing failed, if it did. */
  protected readonly saveError = signal<string | null>(null);

  /** The suggestions for the MAP axis. */
  protected readonly suggestions = { na: SUGGESTED_MAP_NA, boosted: SUGGESTED_MAP_BOOSTED };

  /** The table the inputs make, or why they make none. */
  protected readonly draft = computed<DraftTable | null>(() => {
    if (this.source() === 'axes') {
      return draftFromAxes(this.rpmText(), this.mapText(), this.startVe(), this.shape());
    }
    return this.text().trim() === ''
      ? null
      : draftFromText(this.text(), this.orientation(), this.pressureUnit());
  });

  /** The first rows of the preview, highest MAP first as the grid shows them. */
  protected readonly previewRows = computed(() => {
    const draft = this.draft();
    if (!draft?.ok) return [];
    return draft.mapAxisKpa
      .map((map, r) => ({ map, values: draft.values[r] ?? [] }))
      .slice(0, PREVIEW_ROWS);
  });

  /** Whether "Create table" can be pressed. */
  protected readonly canCreate = computed(
    () => this.draft()?.ok === true && this.name().trim() !== '' && !this.isSaving(),
  );

  /** Reads a chosen file as text (the reader works on text; the file never leaves the page raw). */
  protected async readFile(event: Event): Promise<void> {
    const file = (event.target as HTMLInputElement).files?.[0];
    if (!file) return;
    this.fileName.set(file.name);
    this.text.set(await file.text());
    const draft = this.draft();
    if (draft?.ok && draft.title) this.name.set(draft.title.slice(0, 120));
  }

  /** The value of an input event's field. */
  protected valueOf(event: Event): string {
    return (event.target as HTMLInputElement | HTMLTextAreaElement).value;
  }

  /** Stores the table (its first revision is the values shown) and closes with it. */
  protected create(): void {
    const draft = this.draft();
    if (!draft?.ok || !this.canCreate()) return;
    this.isSaving.set(true);
    this.saveError.set(null);
    this.api
      .create(this.data.vehicleId, {
        name: this.name().trim(),
        rpmAxis: draft.rpmAxis,
        mapAxisKpa: draft.mapAxisKpa,
        values: draft.values,
      })
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (table) => this.dialogRef.close(table),
        error: (error: unknown) => {
          this.isSaving.set(false);
          this.saveError.set(apiErrorMessage(error, 'The table could not be created.'));
        },
      });
  }
}
