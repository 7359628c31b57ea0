/**
 * Display conversions between the API's metric units and the units a user chose to see. The API,
 * the database and the pipeline always speak metric (kPa absolute, °C, L, cc/min, mm, km/h,
 * lambda); only what is shown and typed changes. Factors come from `shared/units` where they
 * exist there; the few it lacks are defined below from exact definitions.
 */
import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import { FUEL_DENSITY_GCC } from '@shared/physics/injector-duty';
import {
  type Fuel,
  afrFromLambda,
  fromCelsius,
  fromKpa,
  kphPer,
  lambdaFromAfr,
  toCelsius,
  toKpa,
} from '@shared/units';

/** Millimetres per inch (exact: the international inch is 25.4 mm). */
export const MM_PER_INCH = 25.4;
/** Cubic centimetres per cubic inch (exact: 2.54³). */
export const CC_PER_CUBIC_INCH = 2.54 ** 3;
/** Grams per avoirdupois pound (exact: 0.45359237 kg). */
export const GRAMS_PER_POUND = 453.59237;

/** Quantities whose unit follows the user's unit system. Mixture is handled on its own. */
export const QUANTITIES = [
  'pressure',
  'temperature',
  'displacement',
  'injectorFlow',
  'tyreDiameter',
  'speed',
] as const;
/** One quantity shown in metric or imperial units. */
export type Quantity = (typeof QUANTITIES)[number];

/** Unit labels per unit system. Pressure is always absolute here (MAP), hence "psi(a)". */
export const UNIT_LABELS: Readonly<Record<UnitSystem, Readonly<Record<Quantity, string>>>> = {
  metric: {
    pressure: 'kPa',
    temperature: '°C',
    displacement: 'L',
    injectorFlow: 'cc/min',
    tyreDiameter: 'mm',
    speed: 'km/h',
  },
  imperial: {
    pressure: 'psi(a)',
    temperature: '°F',
    displacement: 'ci',
    injectorFlow: 'lb/h',
    tyreDiameter: 'in',
    speed: 'mph',
  },
};

/** Labels of the two mixture displays: lambda, or air-fuel ratio by mass. */
export const MIXTURE_LABELS: Readonly<Record<MixtureDisplay, string>> = {
  lambda: 'λ',
  afr: 'AFR',
};

/** What some conversions need besides the value: injector flow needs the fuel's density. */
export interface ConversionContext {
  /** The vehicle's fuel; its liquid density turns cc/min into lb/h (gasoline's when absent). */
  fuel?: Fuel;
}

/**
 * Liquid density in g/cc of a fuel, as the injector-duty physics uses it (`shared/physics`);
 * a custom fuel has no known density, so gasoline's is used, as the physics does too.
 */
export function fuelDensityGcc(fuel: Fuel = 'gasoline'): number {
  return fuel === 'custom' ? FUEL_DENSITY_GCC.gasoline : FUEL_DENSITY_GCC[fuel];
}

/** Absolute pressure in kPa as psi (absolute). */
export function kpaToPsi(kpa: number): number {
  return fromKpa(kpa, 'psi');
}

/** Absolute pressure in psi as kPa. */
export function psiToKpa(psi: number): number {
  return toKpa(psi, 'psi');
}

/** °C as °F. */
export function celsiusToFahrenheit(celsius: number): number {
  return fromCelsius(celsius, 'F');
}

/** °F as °C. */
export function fahrenheitToCelsius(fahrenheit: number): number {
  return toCelsius(fahrenheit, 'F');
}

/** Litres as cubic inches. */
export function litresToCubicInches(litres: number): number {
  return (litres * 1000) / CC_PER_CUBIC_INCH;
}

/** Cubic inches as litres. */
export function cubicInchesToLitres(cubicInches: number): number {
  return (cubicInches * CC_PER_CUBIC_INCH) / 1000;
}

/** Injector flow in cc/min as lb/h of a fuel of `densityGcc` (mass flow depends on the fuel). */
export function ccMinToLbH(ccPerMin: number, densityGcc: number): number {
  return (ccPerMin * densityGcc * 60) / GRAMS_PER_POUND;
}

/** Injector flow in lb/h of a fuel of `densityGcc` as cc/min. */
export function lbHToCcMin(poundsPerHour: number, densityGcc: number): number {
  return (poundsPerHour * GRAMS_PER_POUND) / (60 * densityGcc);
}

/** Millimetres as inches. */
export function mmToInches(mm: number): number {
  return mm / MM_PER_INCH;
}

/** Inches as millimetres. */
export function inchesToMm(inches: number): number {
  return inches * MM_PER_INCH;
}

/** km/h as mph. */
export function kphToMph(kph: number): number {
  return kph / kphPer('mph');
}

/** mph as km/h. */
export function mphToKph(mph: number): number {
  return mph * kphPer('mph');
}

/** The unit label of `quantity` in `units`, e.g. "psi(a)" for pressure in imperial. */
export function unitLabel(quantity: Quantity, units: UnitSystem): string {
  return UNIT_LABELS[units][quantity];
}

/** A metric value of `quantity` in the unit `units` shows it in. */
export function toDisplay(
  quantity: Quantity,
  metric: number,
  units: UnitSystem,
  context: ConversionContext = {},
): number {
  if (units === 'metric') return metric;
  switch (quantity) {
    case 'pressure':
      return kpaToPsi(metric);
    case 'temperature':
      return celsiusToFahrenheit(metric);
    case 'displacement':
      return litresToCubicInches(metric);
    case 'injectorFlow':
      return ccMinToLbH(metric, fuelDensityGcc(context.fuel));
    case 'tyreDiameter':
      return mmToInches(metric);
    case 'speed':
      return kphToMph(metric);
  }
}

/** A value of `quantity` typed or shown in `units`, back in the API's metric unit. */
export function fromDisplay(
  quantity: Quantity,
  shown: number,
  units: UnitSystem,
  context: ConversionContext = {},
): number {
  if (units === 'metric') return shown;
  switch (quantity) {
    case 'pressure':
      return psiToKpa(shown);
    case 'temperature':
      return fahrenheitToCelsius(shown);
    case 'displacement':
      return cubicInchesToLitres(shown);
    case 'injectorFlow':
      return lbHToCcMin(shown, fuelDensityGcc(context.fuel));
    case 'tyreDiameter':
      return inchesToMm(shown);
    case 'speed':
      return mphToKph(shown);
  }
}

/**
 * Lambda as the chosen mixture display: lambda itself, or AFR = λ · AFR_st with the vehicle's
 * stoichiometric ratio. A lambda error in percent is the same in either display (both measured
 * and commanded scale by AFR_st), so error figures stay "% of lambda" and need no conversion.
 */
export function mixtureToDisplay(
  lambda: number,
  mixture: MixtureDisplay,
  stoichAfr: number,
): number {
  return mixture === 'afr' ? afrFromLambda(lambda, stoichAfr) : lambda;
}

/** A mixture typed in the chosen display, back as lambda. */
export function mixtureFromDisplay(
  shown: number,
  mixture: MixtureDisplay,
  stoichAfr: number,
): number {
  return mixture === 'afr' ? lambdaFromAfr(shown, stoichAfr) : shown;
}
