import type { CreateVehicleInput, Vehicle } from '@shared/contracts/vehicles';
import { FUELS, type Fuel, STOICH_AFR } from '@shared/units';

/** A closed range a field must lie in, with its unit (the same ranges as the server's). */
export interface FieldLimit {
  /** How the field is named in messages. */
  name: string;
  /** Lowest accepted value. */
  min: number;
  /** Highest accepted value. */
  max: number;
  /** Unit written after the numbers, or empty. */
  unit: string;
}

/** Ranges of the vehicle's numbers, as `shared/contracts/vehicles` checks them. */
export const VEHICLE_LIMITS = {
  displacementL: { name: 'Displacement', min: 0.05, max: 20, unit: 'L' },
  cylinders: { name: 'Cylinders', min: 1, max: 16, unit: '' },
  stoichAfr: { name: 'Stoichiometric AFR', min: 1, max: 40, unit: '' },
  injectorCcMin: { name: 'Injector flow', min: 10, max: 10000, unit: 'cc/min' },
  tireDiameterMm: { name: 'Tyre diameter', min: 200, max: 1500, unit: 'mm' },
  gearRatio: { name: 'Each gear ratio', min: 0.2, max: 10, unit: '' },
  finalDrive: { name: 'Final drive', min: 1, max: 10, unit: '' },
  loadLinePercentOfBaro: { name: 'Load line', min: 50, max: 150, unit: '%' },
  leanAllowancePercent: { name: 'Lean allowance', min: 0, max: 5, unit: '%' },
} as const satisfies Record<string, FieldLimit>;

/**
 * The fuel-safety settings a new vehicle starts with (as `DEFAULT_FUEL_SAFETY` of
 * `shared/contracts/vehicles`, kept here so zod stays out of the bundle): cells at or above 90 %
 * of the barometric pressure count as under load, and a guess may lean such a cell by at most
 * 1 % unless a log measured it.
 */
export const DEFAULT_FUEL_SAFETY_VALUES = {
  loadLinePercentOfBaro: 90,
  leanAllowancePercent: 1,
} as const;

/** The most gears a vehicle may have. */
export const MAX_GEARS = 12;

/** Display names of the fuels. */
export const FUEL_LABELS: Readonly<Record<Fuel, string>> = {
  gasoline: 'Gasoline',
  e10: 'E10',
  e85: 'E85',
  ethanol: 'Ethanol',
  methanol: 'Methanol',
  custom: 'Custom',
};

/** The fuels in menu order with their names. */
export const FUEL_OPTIONS = FUELS.map((fuel) => ({ fuel, label: FUEL_LABELS[fuel] }));

/** The message for a number outside its range, e.g. "Displacement must be 0.05–20 L." */
export function rangeMessage(limit: FieldLimit): string {
  return `${limit.name} must be ${limit.min}–${limit.max}${limit.unit ? ` ${limit.unit}` : ''}.`;
}

/**
 * The message for a numeric field's validation errors (`required`, `min`, `max`, `whole`), or
 * null when it has none.
 */
export function limitError(
  errors: Readonly<Record<string, unknown>> | null,
  limit: FieldLimit,
): string | null {
  if (errors === null) return null;
  if (errors['required']) {
    return `Enter the ${limit.name.toLowerCase()}${limit.unit ? ` in ${limit.unit}` : ''}.`;
  }
  if (errors['min'] || errors['max']) return rangeMessage(limit);
  if (errors['whole']) return `${limit.name} must be a whole number.`;
  return null;
}

/** Whether `value` is a finite number within `limit`. */
export function isWithin(value: number, limit: FieldLimit): boolean {
  return Number.isFinite(value) && value >= limit.min && value <= limit.max;
}

/** The stoichiometric AFR to prefill for a fuel, to 2 decimals; null for `custom`. */
export function stoichAfrFor(fuel: Fuel): number | null {
  return fuel === 'custom' ? null : Math.round(STOICH_AFR[fuel] * 100) / 100;
}

/** The gear ratios read from a comma-separated list, or why they cannot be. */
export type GearRatiosResult = { ratios: number[]; error: null } | { ratios: null; error: string };

/**
 * Reads gear ratios typed as "3.36, 2.09, 1.47" (spaces or semicolons may also separate them).
 * Refuses an empty list, more than 12 gears, an entry that is not a number and one outside
 * 0.2–10, naming the gear.
 */
export function parseGearRatios(text: string): GearRatiosResult {
  const parts = text.trim() === '' ? [] : text.trim().split(/\s*[,;]\s*|\s+/);
  if (parts.length === 0) return { ratios: null, error: 'Enter at least one gear ratio.' };
  if (parts.length > MAX_GEARS) {
    return { ratios: null, error: `At most ${MAX_GEARS} gears (${parts.length} given).` };
  }
  const ratios: number[] = [];
  for (const [index, part] of parts.entries()) {
    const ratio = part === '' ? Number.NaN : Number(part);
    if (!Number.isFinite(ratio)) {
      return { ratios: null, error: `Gear ${index + 1}: “${part}” is not a number.` };
    }
    if (!isWithin(ratio, VEHICLE_LIMITS.gearRatio)) {
      return {
        ratios: null,
        error: `Gear ${index + 1}: ${ratio} is outside ${VEHICLE_LIMITS.gearRatio.min}–${VEHICLE_LIMITS.gearRatio.max}.`,
      };
    }
    ratios.push(ratio);
  }
  return { ratios, error: null };
}

/** Gear ratios written back as the form shows them: "3.36, 2.09, 1.47". */
export function formatGearRatios(ratios: readonly number[]): string {
  return ratios.join(', ');
}

/**
 * Overall tyre diameter in mm from a size like 205/55 R16: rim + two sidewalls, the sidewall
 * being `aspect` percent of the width. Rounded to 0.1 mm; null when any part is not positive.
 */
export function tyreDiameterMm(widthMm: number, aspectPct: number, rimIn: number): number | null {
  if (!(widthMm > 0) || !(aspectPct > 0) || !(rimIn > 0)) return null;
  const mm = rimIn * 25.4 + (2 * widthMm * aspectPct) / 100;
  return Math.round(mm * 10) / 10;
}

/** The vehicle form's values once every field is valid. */
export interface VehicleFormValue {
  /** Short name. */
  label: string;
  /** Free text. */
  description: string;
  /** Displacement in litres. */
  displacementL: number;
  /** Cylinder count. */
  cylinders: number;
  /** The fuel. */
  fuel: Fuel;
  /** Stoichiometric AFR. */
  stoichAfr: number;
  /** Injector flow in cc/min. */
  injectorCcMin: number;
  /** Overall tyre diameter in mm. */
  tireDiameterMm: number;
  /** Gear ratios as typed. */
  gearRatios: string;
  /** Final drive ratio. */
  finalDrive: number;
  /** MAP at or above which a cell counts as under load, % of the barometric pressure. */
  loadLinePercentOfBaro: number;
  /** How much leaner a guess may make a cell under load that no log measured, %. */
  leanAllowancePercent: number;
}

/**
 * The request body for a valid form. A known fuel whose AFR was left at the prefilled value
 * sends no `stoichAfr`, so the server stores its exact figure rather than our rounded one.
 */
export function vehicleRequest(value: VehicleFormValue): CreateVehicleInput {
  const ratios = parseGearRatios(value.gearRatios).ratios ?? [];
  const isDefaultAfr = value.fuel !== 'custom' && value.stoichAfr === stoichAfrFor(value.fuel);
  return {
    label: value.label.trim(),
    description: value.description.trim(),
    engine: {
      displacementL: value.displacementL,
      cylinders: value.cylinders,
      fuel: value.fuel,
      ...(isDefaultAfr ? {} : { stoichAfr: value.stoichAfr }),
      injectorCcMin: value.injectorCcMin,
    },
    gearing: {
      tireDiameterMm: value.tireDiameterMm,
      gearRatios: ratios,
      finalDrive: value.finalDrive,
    },
    fuelSafety: {
      loadLinePercentOfBaro: value.loadLinePercentOfBaro,
      leanAllowancePercent: value.leanAllowancePercent,
    },
  };
}

/**
 * The form's values for an existing vehicle. A fuel's own AFR is shown as prefilled (2 decimals)
 * so that saving sends none; any other ratio is kept exactly.
 */
export function vehicleFormValue(vehicle: Vehicle): VehicleFormValue {
  const { engine, gearing } = vehicle;
  const fuelAfr = engine.fuel === 'custom' ? null : STOICH_AFR[engine.fuel];
  const isFuelAfr = fuelAfr !== null && Math.abs(engine.stoichAfr - fuelAfr) < 1e-9;
  return {
    label: vehicle.label,
    description: vehicle.description,
    displacementL: engine.displacementL,
    cylinders: engine.cylinders,
    fuel: engine.fuel,
    stoichAfr: isFuelAfr ? (stoichAfrFor(engine.fuel) ?? engine.stoichAfr) : engine.stoichAfr,
    injectorCcMin: engine.injectorCcMin,
    tireDiameterMm: gearing.tireDiameterMm,
    gearRatios: formatGearRatios(gearing.gearRatios),
    finalDrive: gearing.finalDrive,
    loadLinePercentOfBaro: vehicle.fuelSafety.loadLinePercentOfBaro,
    leanAllowancePercent: vehicle.fuelSafety.leanAllowancePercent,
  };
}
