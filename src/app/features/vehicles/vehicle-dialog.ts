import { ChangeDetectionStrategy, Component, DestroyRef, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import {
  type AbstractControl,
  FormControl,
  FormGroup,
  ReactiveFormsModule,
  type ValidationErrors,
  type ValidatorFn,
  Validators,
} from '@angular/forms';
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
import {
  FUEL_OPTIONS,
  type FieldLimit,
  VEHICLE_LIMITS,
  type VehicleFormValue,
  limitError,
  parseGearRatios,
  stoichAfrFor,
  tyreDiameterMm,
  vehicleFormValue,
  vehicleRequest,
} from './vehicle-form';

/** What the vehicle dialog is opened with: the vehicle to edit, or null to create one. */
export interface VehicleDialogData {
  /** The vehicle to edit; null creates a new one. */
  vehicle: Vehicle | null;
}

/** The vehicle form's controls; numbers are null while their field is empty. */
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
}

/** The tyre-size helper's controls (never sent; they only fill the diameter). */
interface TyreSizeForm {
  widthMm: FormControl<number | null>;
  aspectPct: FormControl<number | null>;
  rimIn: FormControl<number | null>;
}

/** Names of the form's numeric fields that have a range. */
type RangedField = Exclude<keyof VehicleForm, 'label' | 'description' | 'fuel' | 'gearRatios'>;

/** Validator: the control holds a whole number. */
function wholeNumber(control: AbstractControl<number | null>): ValidationErrors | null {
  return control.value === null || Number.isInteger(control.value) ? null : { whole: true };
}

/** Validator: the text parses as a list of gear ratios; the error carries the reason. */
function gearRatiosList(control: AbstractControl<string>): ValidationErrors | null {
  const { error } = parseGearRatios(control.value);
  return error === null ? null : { gearRatios: error };
}

/** A required number control checked against `limit`. */
function numberControl(limit: FieldLimit, ...more: ValidatorFn[]): FormControl<number | null> {
  return new FormControl<number | null>(null, {
    nonNullable: true,
    validators: [
      Validators.required,
      Validators.min(limit.min),
      Validators.max(limit.max),
      ...more,
    ],
  });
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

  /** The vehicle being edited, or null when creating. */
  protected readonly vehicle = this.data?.vehicle ?? null;

  /** The fuels with their names. */
  protected readonly fuelOptions = FUEL_OPTIONS;

  /** The ranges, for hints. */
  protected readonly limits = VEHICLE_LIMITS;

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
    displacementL: numberControl(VEHICLE_LIMITS.displacementL),
    cylinders: numberControl(VEHICLE_LIMITS.cylinders, wholeNumber),
    fuel: new FormControl<Fuel>('gasoline', { nonNullable: true }),
    stoichAfr: numberControl(VEHICLE_LIMITS.stoichAfr),
    injectorCcMin: numberControl(VEHICLE_LIMITS.injectorCcMin),
    tireDiameterMm: numberControl(VEHICLE_LIMITS.tireDiameterMm),
    gearRatios: new FormControl('', { nonNullable: true, validators: [gearRatiosList] }),
    finalDrive: numberControl(VEHICLE_LIMITS.finalDrive),
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
    } else {
      this.form.setValue(vehicleFormValue(this.vehicle));
    }
    // A known fuel brings its own ratio; a custom fuel keeps what is there for the user to set.
    this.form.controls.fuel.valueChanges
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((fuel) => {
        const afr = stoichAfrFor(fuel);
        if (afr !== null) this.form.controls.stoichAfr.setValue(afr);
        this.form.controls.stoichAfr.markAsTouched();
      });
  }

  /** The message under a numeric field, or null. */
  protected rangeError(field: RangedField): string | null {
    return limitError(this.form.controls[field].errors, VEHICLE_LIMITS[field]);
  }

  /** The message under the gear ratios, or null. */
  protected gearRatiosError(): string | null {
    const errors = this.form.controls.gearRatios.errors;
    return typeof errors?.['gearRatios'] === 'string' ? errors['gearRatios'] : null;
  }

  /** The diameter the tyre size gives, or null while it is incomplete. */
  protected sizeDiameter(): number | null {
    const { widthMm, aspectPct, rimIn } = this.tyreSize.getRawValue();
    return tyreDiameterMm(widthMm ?? 0, aspectPct ?? 0, rimIn ?? 0);
  }

  /** Copies the diameter computed from the tyre size into the diameter field. */
  protected useSizeDiameter(): void {
    const diameter = this.sizeDiameter();
    if (diameter === null) return;
    this.form.controls.tireDiameterMm.setValue(diameter);
    this.form.controls.tireDiameterMm.markAsTouched();
  }

  /** Sends the vehicle and closes the dialog with the stored one. */
  protected save(): void {
    if (this.form.invalid) {
      this.form.markAllAsTouched();
      return;
    }
    // Every required number is non-null once the form is valid.
    const body = vehicleRequest(this.form.getRawValue() as VehicleFormValue);
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
}
