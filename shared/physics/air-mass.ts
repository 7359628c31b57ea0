/**
 * Speed-density air mass (reference.md §1): the air an engine draws from its manifold pressure,
 * intake air temperature, speed and displacement, scaled by the manifold-referenced volumetric
 * efficiency the ECU's VE table holds.
 */
import { celsiusToKelvin } from '../units';
import { requireFinite, requireInteger, requireNonNegative, requirePositive } from './check-number';

/** Universal gas constant as the U.S. Standard Atmosphere 1976 gives it, J/(mol·K). */
export const GAS_CONSTANT_USSA = 8.31432;
/** Molar mass of dry air (USSA-1976), kg/mol. */
export const MOLAR_MASS_AIR = 0.0289644;
/** Specific gas constant of dry air, J/(kg·K): 8.31432 / 0.0289644 = 287.053. */
export const R_AIR = GAS_CONSTANT_USSA / MOLAR_MASS_AIR;

/**
 * Density of dry air in kg/m³ at an absolute pressure in kPa and a temperature in °C, from the
 * ideal gas law ρ = p / (R·T). Humidity is ignored: it changes the result by under 1 % at
 * ordinary intake temperatures, well inside the VE table's own error.
 */
export function airDensity(pressureKpa: number, temperatureC: number): number {
  requirePositive(pressureKpa, 'airDensity: pressureKpa');
  const kelvin = celsiusToKelvin(requireFinite(temperatureC, 'airDensity: temperatureC'));
  if (kelvin <= 0) throw new Error(`airDensity: temperatureC must be above −273.15 °C`);
  return (pressureKpa * 1000) / (R_AIR * kelvin);
}

/**
 * Air mass flow in g/s of a four-stroke engine: ṁ = VE · ρ(MAP, IAT) · V_d · N / 120. A
 * four-stroke cylinder draws once every two revolutions, hence the half intake event per
 * cylinder per revolution. `veFraction` is the manifold-referenced VE as a fraction (0.85, not
 * 85), `displacementL` the whole engine's swept volume in litres.
 */
export function airMassFlowGps(
  veFraction: number,
  mapKpa: number,
  iatC: number,
  displacementL: number,
  rpm: number,
): number {
  requirePositive(veFraction, 'airMassFlowGps: veFraction');
  requirePositive(displacementL, 'airMassFlowGps: displacementL');
  const revsPerSecond = requireNonNegative(rpm, 'airMassFlowGps: rpm') / 60;
  const density = airDensity(mapKpa, iatC);
  // kg/s → g/s; litres → m³.
  return veFraction * density * (displacementL / 1000) * (revsPerSecond / 2) * 1000;
}

/**
 * Air mass trapped per intake event (one cylinder filling) in mg: VE · ρ · V_d / n_cyl. It does
 * not depend on engine speed; there are n_cyl · N / 120 such events per second.
 */
export function airMassPerEventMg(
  veFraction: number,
  mapKpa: number,
  iatC: number,
  displacementL: number,
  cylinders: number,
): number {
  requirePositive(veFraction, 'airMassPerEventMg: veFraction');
  requirePositive(displacementL, 'airMassPerEventMg: displacementL');
  requireInteger(cylinders, 'airMassPerEventMg: cylinders');
  const density = airDensity(mapKpa, iatC);
  // kg → mg is 1e6; litres → m³ is 1e-3.
  return (veFraction * density * (displacementL / 1000) * 1e6) / cylinders;
}

/** Intake events per second of a four-stroke engine: n_cyl · N / 120. */
export function intakeEventsPerSecond(cylinders: number, rpm: number): number {
  requireInteger(cylinders, 'intakeEventsPerSecond: cylinders');
  requireFinite(rpm, 'intakeEventsPerSecond: rpm');
  return (cylinders * rpm) / 120;
}
