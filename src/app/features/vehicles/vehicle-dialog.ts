import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  inject,
  signal,
} from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { FormControl, FormGroup, ReactiveFormsModule, Validators } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MAT_DIALOG_DATA, MatDialogModule, MatDialogRef } from '@angular/material/dialog';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatSelectModule } from '@angular/material/select';
import type { Vehicle } from '@shared/contracts/vehicles';
import type { Fuel } from '@shared/units';
import { apiErrorMessage } from '../../core/api/api-error';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { rangeText } from '../../ui/units/display-range';
import {
  DEFAULT_FUEL_SAFETY_VALUES,
  FUEL_OPTIONS,
  type VehicleFormValue,
  limitError,
  stoichAfrFor,
  tyreDiameterMm,
  vehicleFormValue,
  vehicleRequest,
} from './vehicle-form';
import { gearRatiosList, numberControl, wholeNumber } from './vehicle-form-controls';
import {
  MEASURED_FIELDS,
  type MeasuredField,
  type ShownOrigin,
  type VehicleLimitField,
  formLimits,
  inputStep,
  metricValue,
  shownValue,
} from './vehicle-form-units';

/** What the vehicle dialog is opened with: the vehicle to edit, or null to create one. */
export interface VehicleDialogData {
  /** The vehicle to edit; null creates a new one. */
  vehicle: Vehicle | null;
}

/**
 * The vehicle form's controls; numbers are null while their field is empty. The measured fields
 * (displacement, injector flow, tyre diameter) hold values in the user's units; they are turned
 * into the API's metric units on save.
 */
interface VehicleForm {
  label: FormControl<string>;
  description: FormControl<string>;
  displacementL: FormControl<number | null>;
  cylinders: FormControl<number | null>;
  fuel: FormControl<Fuel>;
  stoichAfr: FormControl<number | null>;
  injectorCcMin: FormControl<number | null>;
  tireDiameterMm: FormControl<number | null>;
  gearRatios: FormControl<string>;
  finalDrive: FormControl<number | null>;
  loadLinePercentOfBaro: FormControl<number | null>;
  leanAllowancePercent: FormControl<number | null>;
}

/** The tyre-size helper's controls (never sent; they only fill the diameter). */
interface TyreSizeForm {
  widthMm: FormControl<number | null>;
  aspectPct: FormControl<number | null>;
  rimIn: FormControl<number | null>;
}

/**
 * Dialog that creates a vehicle or edits one. It sends the request itself, so a refusal from
 * the server is shown above the buttons; it closes with the stored vehicle.
 */
@Component({
  selector: 'app-vehicle-dialog',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    ReactiveFormsModule,
    MatDialogModule,
    MatFormFieldModule,
    MatInputModule,
    MatSelectModule,
    MatButtonModule,
    MatIconModule,
  ],
  templateUrl: './vehicle-dialog.html',
  styleUrl: './vehicle-dialog.scss',
})
export class VehicleDialog {
  private readonly api = inject(VehiclesApi);
  private readonly dialogRef = inject<MatDialogRef<VehicleDialog, Vehicle>>(MatDialogRef);
  private readonly destroyRef = inject(DestroyRef);
  private readonly data = inject<VehicleDialogData | null>(MAT_DIALOG_DATA, { optional: true });

  /**
   * The units the form is typed in, fixed when the dialog opens (the account menu sits behind
   * the dialog, so they cannot change while it is open).
   */
  protected readonly units = inject(DisplayPreferences).units();

  /** The fuel chosen in the form: lb/h limits and conversions depend on its density. */
  private readonly fuel = signal<Fuel>(this.data?.vehicle?.engine.fuel ?? 'gasoline');

  /**
   * What the form put into each measured field and the metric value behind it: an untouched
   * field is sent back exactly, never through a rounded conversion.
   */
  private readonly origins: Partial<Record<MeasuredField, ShownOrigin>> = {};

  /** The vehicle being edited, or null when creating. */
  protected readonly vehicle = this.data?.vehicle ?? null;

  /** The fuels with their names. */
  protected readonly fuelOptions = FUEL_OPTIONS;

  /** The ranges in the shown units, for hints, suffixes and messages. */
  protected readonly limits = computed(() => formLimits(this.units, this.fuel()));

  /** The form, empty for a new vehicle (gasoline, its AFR prefilled) or the vehicle's values. */
  protected readonly form = new FormGroup<VehicleForm>({
    label: new FormControl('', {
      nonNullable: true,
      validators: [Validators.required, Validators.maxLength(120), Validators.pattern(/\S/)],
    }),
    description: new FormControl('', {
      nonNullable: true,
      validators: [Validators.maxLength(2000)],
    }),
    displacementL: numberControl(() => this.limits().displacementL),
    cylinders: numberControl(() => this.limits().cylinders, wholeNumber),
    fuel: new FormControl<Fuel>('gasoline', { nonNullable: true }),
    stoichAfr: numberControl(() => this.limits().stoichAfr),
    injectorCcMin: numberControl(() => this.limits().injectorCcMin),
    tireDiameterMm: numberControl(() => this.limits().tireDiameterMm),
    gearRatios: new FormControl('', { nonNullable: true, validators: [gearRatiosList] }),
    finalDrive: numberControl(() => this.limits().finalDrive),
    loadLinePercentOfBaro: numberControl(() => this.limits().loadLinePercentOfBaro),
    leanAllowancePercent: numberControl(() => this.limits().leanAllowancePercent),
  });

  /** The tyre-size helper. */
  protected readonly tyreSize = new FormGroup<TyreSizeForm>({
    widthMm: new FormControl<number | null>(null, { nonNullable: true }),
    aspectPct: new FormControl<number | null>(null, { nonNullable: true }),
    rimIn: new FormControl<number | null>(null, { nonNullable: true }),
  });

  /** Why the last attempt failed, if it did. */
  protected readonly errorMessage = signal<string | null>(null);

  /** Whether the request is on its way. */
  protected readonly isSubmitting = signal(false);

  constructor() {
    if (this.vehicle === null) {
      this.form.controls.stoichAfr.setValue(stoichAfrFor('gasoline'));
      this.form.patchValue(DEFAULT_FUEL_SAFETY_VALUES);
    } else {
      const value = vehicleFormValue(this.vehicle);
      for (const field of Object.keys(MEASURED_FIELDS) as MeasuredField[]) {
        value[field] = this.show(field, value[field]);
      }
      this.form.setValue(value);
    }
    this.form.controls.fuel.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((fuel) => this.changeFuel(fuel));
  }

  /** The message under a numeric field, or null. */
  protected rangeError(field: Exclude<VehicleLimitField, 'gearRatio'>): string | null {
    return limitError(this.form.controls[field].errors, this.limits()[field]);
  }

  /** The accepted range of a measured field in the shown unit, e.g. "3.1–1220.4 ci". */
  protected rangeHint(field: MeasuredField): string {
    return rangeText(this.limits()[field], MEASURED_FIELDS[field], this.units);
  }

  /** The spinner step of a measured field. */
  protected step(field: MeasuredField): number {
    return inputStep(field, this.units);
  }

  /** The message under the gear ratios, or null. */
  protected gearRatiosError(): string | null {
    const errors = this.form.controls.gearRatios.errors;
    return typeof errors?.['gearRatios'] === 'string' ? errors['gearRatios'] : null;
  }

  /** The diameter the tyre size gives, in the shown unit, or null while it is incomplete. */
  protected sizeDiameter(): number | null {
    const { widthMm, aspectPct, rimIn } = this.tyreSize.getRawValue();
    const mm = tyreDiameterMm(widthMm ?? 0, aspectPct ?? 0, rimIn ?? 0);
    return mm === null ? null : shownValue('tireDiameterMm', mm, this.units, this.fuel());
  }

  /** Copies the diameter computed from the tyre size into the diameter field. */
  protected useSizeDiameter(): void {
    const { widthMm, aspectPct, rimIn } = this.tyreSize.getRawValue();
    const mm = tyreDiameterMm(widthMm ?? 0, aspectPct ?? 0, rimIn ?? 0);
    if (mm === null) return;
    this.form.controls.tireDiameterMm.setValue(this.show('tireDiameterMm', mm));
    this.form.controls.tireDiameterMm.markAsTouched();
  }

  /**
   * Closes without a result. (A bare `mat-dialog-close` attribute would close with "", which
   * the pages would take for a saved vehicle.)
   */
  protected cancel(): void {
    this.dialogRef.close();
  }

  /** Sends the vehicle and closes the dialog with the stored one. */
  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    // Every required number is non-null once the form is valid.
    const shown = this.form.getRawValue() as VehicleFormValue;
    const metric: VehicleFormValue = { ...shown };
    for (const field of Object.keys(MEASURED_FIELDS) as MeasuredField[]) {
      metric[field] = metricValue(field, shown[field], this.units, shown.fuel, this.origins[field]);
    }
    const body = vehicleRequest(metric);
    this.isSubmitting.set(true);
    this.errorMessage.set(null);
    const request =
      this.vehicle === null ? this.api.create(body) : this.api.update(this.vehicle.id, body);
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (vehicle) => this.dialogRef.close(vehicle),
      error: (error: unknown) => {
        this.isSubmitting.set(false);
        this.errorMessage.set(apiErrorMessage(error, 'The vehicle could not be saved.'));
      },
    });
  }

  /** A metric value as the field shows it, remembered so an untouched field is sent exactly. */
  private show(field: MeasuredField, metric: number): number {
    const shown = shownValue(field, metric, this.units, this.fuel());
    this.origins[field] = { shown, metric };
    return shown;
  }

  /**
   * A new fuel brings its own stoichiometric ratio (a custom fuel keeps what is there for the
   * user to set). In lb/h the injector's figure is said again at the new fuel's density: the
   * injectors are the same, only the mass they flow changes.
   */
  private changeFuel(fuel: Fuel): void {
    const previous = this.fuel();
    const injector = this.form.controls.injectorCcMin;
    const shown = injector.value;
    const ccMin =
      shown === null || this.units === 'metric'
        ? null
        : metricValue('injectorCcMin', shown, this.units, previous, this.origins.injectorCcMin);
    this.fuel.set(fuel);
    if (ccMin !== null) injector.setValue(this.show('injectorCcMin', ccMin));
    injector.updateValueAndValidity();
    const afr = stoichAfrFor(fuel);
    if (afr !== null) this.form.controls.stoichAfr.setValue(afr);
    this.form.controls.stoichAfr.markAsTouched();
  }
}
