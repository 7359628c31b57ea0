import type { UnitSystem } from '@shared/contracts/preferences';
import type { Vehicle } from '@shared/contracts/vehicles';
import { roadSpeedKph } from '@shared/physics/road-speed';
import { formatQuantity } from '../../ui/units/format-quantity';
import { FUEL_LABELS } from './vehicle-form';

/**
 * One line on a vehicle's engine in the user's units, e.g. "1.6 L · 4 cylinders · 440 cc/min
 * injectors" or "97.6 ci · 4 cylinders · 43.4 lb/h injectors" (lb/h at the fuel's density).
 */
export function engineSummary(vehicle: Vehicle, units: UnitSystem = 'metric'): string {
  const { displacementL, cylinders, injectorCcMin, fuel } = vehicle.engine;
  const displacement = formatQuantity('displacement', displacementL, units);
  const flow = formatQuantity('injectorFlow', injectorCcMin, units, { fuel });
  return `${displacement} · ${cylinders} cylinders · ${flow} injectors`;
}

/** The fuel and its stoichiometric AFR, e.g. "Gasoline (AFR 14.7)". */
export function fuelSummary(vehicle: Vehicle): string {
  return `${FUEL_LABELS[vehicle.engine.fuel]} (AFR ${vehicle.engine.stoichAfr.toFixed(1)})`;
}

/** The gearing in the user's units, e.g. "6 gears · final drive 4.06 · tyre 632 mm". */
export function gearingSummary(vehicle: Vehicle, units: UnitSystem = 'metric'): string {
  const { gearRatios, finalDrive, tireDiameterMm } = vehicle.gearing;
  const tyre = formatQuantity('tyreDiameter', tireDiameterMm, units, {
    digits: units === 'metric' ? { min: 0, max: 0 } : undefined,
  });
  return `${gearRatios.length} gears · final drive ${finalDrive} · tyre ${tyre}`;
}

/**
 * Road speed per 1000 rpm in the highest gear (the smallest ratio), e.g. "43.9 km/h", from the
 * road-speed relation of `shared/physics`; null without gears.
 */
export function topGearSpeedText(vehicle: Vehicle, units: UnitSystem = 'metric'): string | null {
  const { gearRatios, finalDrive, tireDiameterMm } = vehicle.gearing;
  if (gearRatios.length === 0) return null;
  const top = Math.min(...gearRatios);
  const kph = roadSpeedKph(1000, tireDiameterMm / 1000, top, finalDrive);
  return formatQuantity('speed', kph, units);
}
