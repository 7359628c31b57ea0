import { ChangeDetectionStrategy, Component, DestroyRef, computed, inject } from '@angular/core';
import { takeUntilDestroyed, toSignal } from '@angular/core/rxjs-interop';
import { FormArray, FormControl, FormGroup, ReactiveFormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatSelectModule } from '@angular/material/select';
import type { ColumnMappingInput } from '@shared/contracts/logs';
import type { ChannelUnit } from '@shared/import/column-mapping';
import type { CsvSniff } from '@shared/import/sniff-csv';
import type { MappingSuggestion } from '@shared/import/suggest-mapping';
import { map } from 'rxjs';
import {
  CHANNEL_CHOICES,
  CHANNEL_LABELS,
  TRUSTED_CONFIDENCE,
  UNIT_LABELS,
  choiceProblems,
  initialMapping,
  mappingProblems,
  requiredLines,
  toMappingInput,
  unitForChoice,
  unitsFor,
  usesAfr,
  type ChannelChoice,
  type ColumnChoice,
  type MappingColumn,
} from './mapping-model';

/** What the mapping dialog is opened with. */
export interface MappingDialogData {
  /** The file's name, for the title. */
  readonly fileName: string;
  /** The vehicle's label. */
  readonly vehicleLabel: string;
  /** The vehicle's stoichiometric AFR, which AFR columns are converted with. */
  readonly stoichAfr: number;
  /** The file's head as sniffed. */
  readonly sniff: CsvSniff;
  /** The suggested mapping. */
  readonly suggestion: MappingSuggestion;
}

/** One column's controls. */
interface ChoiceForm {
  channel: FormControl<ChannelChoice>;
  unit: FormControl<ChannelUnit | null>;
}

/** How many data rows the preview shows. */
const PREVIEW_ROWS = 8;

/**
 * Dialog that asks which channel each CSV column holds, and in which unit, when the suggestion
 * is not sure enough: a preview of the first rows, a channel and unit per column pre-filled from
 * the suggestion (weak guesses marked "check"), and the channels an analysis needs with what is
 * missing or chosen twice. It closes with the mapping; the upload then saves it as the shop's
 * preset for this header.
 */
@Component({
  selector: 'app-mapping-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatButtonModule,
    MatDialogModule,
    MatFormFieldModule,
    MatIconModule,
    MatSelectModule,
  ],
  templateUrl: './mapping-dialog.html',
  styleUrl: './mapping-dialog.scss',
})
export class MappingDialog {
  private readonly dialogRef =
    inject<MatDialogRef<MappingDialog, ColumnMappingInput>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  /** The file and vehicle the mapping is for. */
  protected readonly data = inject<MappingDialogData>(MAT_DIALOG_DATA);

  private readonly start = initialMapping(this.data.sniff, this.data.suggestion);

  /** The file's columns. */
  protected readonly columns: readonly MappingColumn[] = this.start.columns;

  /** The first data rows, cell by cell. */
  protected readonly previewRows = this.data.sniff.sampleRows.slice(0, PREVIEW_ROWS);

  /** One channel and unit per column. */
  protected readonly form = new FormArray<FormGroup<ChoiceForm>>(
    this.start.choices.map(
      (choice) =>
        new FormGroup<ChoiceForm>({
          channel: new FormControl<ChannelChoice>(choice.channel, { nonNullable: true }),
          unit: new FormControl<ChannelUnit | null>(choice.unit),
        }),
    ),
  );

  /** The choices as they stand. */
  private readonly choices = toSignal(
    this.form.valueChanges.pipe(map((): ColumnChoice[] => this.form.getRawValue())),
    { initialValue: this.form.getRawValue() },
  );

  /** The channels an analysis needs, and how each stands. */
  protected readonly required = computed(() => requiredLines(this.columns, this.choices()));

  /** Every reason the mapping cannot be sent yet. */
  protected readonly problems = computed(() => mappingProblems(this.columns, this.choices()));

  /** The problems the required list does not already show (repeats, units). */
  protected readonly otherProblems = computed(() => choiceProblems(this.columns, this.choices()));

  /** Whether an AFR column is converted with the vehicle's stoichiometric AFR. */
  protected readonly isAfrUsed = computed(() => usesAfr(this.choices()));

  /** Whether gauge boost is read (it needs a barometer). */
  protected readonly isBoostUsed = computed(() =>
    this.choices().some((choice) => choice.channel === 'boost'),
  );

  /** The channels to pick from. */
  protected readonly channelChoices = CHANNEL_CHOICES;
  /** Channel names for people. */
  protected readonly channelLabels = CHANNEL_LABELS;
  /** Unit names for people. */
  protected readonly unitLabels = UNIT_LABELS;
  /** The units of a channel. */
  protected readonly unitsFor = unitsFor;
  /** Below this a suggestion is marked for checking. */
  protected readonly trusted = TRUSTED_CONFIDENCE;

  constructor() {
    // A new channel brings a unit that fits it: the file's stated one when it does.
    this.form.controls.forEach((group, i) => {
      group.controls.channel.valueChanges
        .pipe(takeUntilDestroyed(this.destroyRef))
        .subscribe((channel) => {
          group.controls.unit.setValue(unitForChoice(channel, this.columns[i]?.statedUnit ?? null));
        });
    });
  }

  /** A confidence as a whole percentage. */
  protected percent(confidence: number): string {
    return `${Math.round(confidence * 100)} %`;
  }

  /** Closes the dialog without a mapping: nothing is uploaded. */
  protected cancel(): void {
    this.dialogRef.close();
  }

  /** Closes the dialog with the mapping, once nothing is missing. */
  protected confirm(): void {
    if (this.problems().length > 0) return;
    this.dialogRef.close(toMappingInput(this.columns, this.form.getRawValue()));
  }
}
