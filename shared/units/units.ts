/**
 * Unit conversions to and from the pipeline's canonical units (kPa absolute, °C, s, km/h,
 * lambda). Each factor is defined once here; `units.spec.ts` checks them against mathjs's unit
 * system and the published values in tests/reference. Hot loops use these plain functions.
 */

/** Pressure units a log may use. */
export const PRESSURE_UNITS = ['kPa', 'psi', 'bar', 'inHg'] as const;
/** One pressure unit. */
export type PressureUnit = (typeof PRESSURE_UNITS)[number];

/** Temperature units a log may use. */
export const TEMPERATURE_UNITS = ['C', 'F', 'K'] as const;
/** One temperature unit. */
export type TemperatureUnit = (typeof TEMPERATURE_UNITS)[number];

/** Time units a log may use. */
export const TIME_UNITS = ['s', 'ms'] as const;
/** One time unit. */
export type TimeUnit = (typeof TIME_UNITS)[number];

/** Speed units a log may use. */
export const SPEED_UNITS = ['kph', 'mph'] as const;
/** One speed unit. */
export type SpeedUnit = (typeof SPEED_UNITS)[number];

/** Ways a log may express mixture: lambda, air-fuel ratio by mass, or equivalence ratio φ. */
export const MIXTURE_UNITS = ['lambda', 'afr', 'phi'] as const;
/** One mixture unit. */
export type MixtureUnit = (typeof MIXTURE_UNITS)[number];

/** kPa per psi: 4.4482216152605 N / (0.0254 m)² (NIST SP 811 App. B.8 gives 6.894757E+03 Pa). */
export const KPA_PER_PSI = 4.4482216152605 / (0.0254 * 0.0254) / 1000;
/** kPa per bar (exact by definition). */
export const KPA_PER_BAR = 100;
/** kPa per conventional inch of mercury (3386.389 Pa). */
export const KPA_PER_INHG = 3.386389;
/** Kelvin at 0 °C. */
export const KELVIN_AT_ZERO_C = 273.15;
/** Metres per statute mile (exact: 1609.344 m). */
export const KM_PER_MILE = 1.609344;

const KPA_PER: Readonly<Record<PressureUnit, number>> = {
  kPa: 1,
  psi: KPA_PER_PSI,
  bar: KPA_PER_BAR,
  inHg: KPA_PER_INHG,
};

/** The factor that turns a pressure in `unit` into kPa. */
export function kpaPer(unit: PressureUnit): number {
  return KPA_PER[unit];
}

/** A pressure in `unit` as kPa. */
export function toKpa(value: number, unit: PressureUnit): number {
  return value * KPA_PER[unit];
}

/** A pressure in kPa as `unit`. */
export function fromKpa(kpa: number, unit: PressureUnit): number {
  return kpa / KPA_PER[unit];
}

/** Absolute pressure from a gauge reading and the barometric (absolute) pressure, same unit. */
export function gaugeToAbsolute(gauge: number, baro: number): number {
  return gauge + baro;
}

/** A temperature in `unit` as °C. */
export function toCelsius(value: number, unit: TemperatureUnit): number {
  switch (unit) {
    case 'C':
      return value;
    case 'F':
      return (value - 32) / 1.8;
    case 'K':
      return value - KELVIN_AT_ZERO_C;
  }
}

/** A temperature in °C as `unit`. */
export function fromCelsius(celsius: number, unit: TemperatureUnit): number {
  switch (unit) {
    case 'C':
      return celsius;
    case 'F':
      return celsius * 1.8 + 32;
    case 'K':
      return celsius + KELVIN_AT_ZERO_C;
  }
}

/** °C as kelvin. */
export function celsiusToKelvin(celsius: number): number {
  return celsius + KELVIN_AT_ZERO_C;
}

/** The factor that turns a time in `unit` into seconds. */
export function secondsPer(unit: TimeUnit): number {
  return unit === 'ms' ? 0.001 : 1;
}

/** The factor that turns a speed in `unit` into km/h. */
export function kphPer(unit: SpeedUnit): number {
  return unit === 'mph' ? KM_PER_MILE : 1;
}
