import type { Vehicle } from '@shared/contracts/vehicles';
import { FUEL_LABELS } from './vehicle-form';

/** One line on a vehicle's engine, e.g. "1.6 L · 4 cylinders · 440 cc/min injectors". */
export function engineSummary(vehicle: Vehicle): string {
  const { displacementL, cylinders, injectorCcMin } = vehicle.engine;
  return `${displacementL.toFixed(1)} L · ${cylinders} cylinders · ${injectorCcMin} cc/min injectors`;
}

/** The fuel and its stoichiometric AFR, e.g. "Gasoline (AFR 14.7)". */
export function fuelSummary(vehicle: Vehicle): string {
  return `${FUEL_LABELS[vehicle.engine.fuel]} (AFR ${vehicle.engine.stoichAfr.toFixed(1)})`;
}

/** The gearing, e.g. "6 gears · final drive 4.06 · tyre 632 mm". */
export function gearingSummary(vehicle: Vehicle): string {
  const { gearRatios, finalDrive, tireDiameterMm } = vehicle.gearing;
  return `${gearRatios.length} gears · final drive ${finalDrive} · tyre ${Math.round(tireDiameterMm)} mm`;
}
