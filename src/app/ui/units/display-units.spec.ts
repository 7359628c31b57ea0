import { FUEL_DENSITY_GCC } from '@shared/physics/injector-duty';
import {
  QUANTITIES,
  ccMinToLbH,
  celsiusToFahrenheit,
  cubicInchesToLitres,
  fahrenheitToCelsius,
  fromDisplay,
  fuelDensityGcc,
  inchesToMm,
  kphToMph,
  kpaToPsi,
  lbHToCcMin,
  litresToCubicInches,
  mixtureFromDisplay,
  mixtureToDisplay,
  mmToInches,
  mphToKph,
  psiToKpa,
  toDisplay,
  unitLabel,
} from './display-units';

/** Relative difference of two numbers. */
function relative(actual: number, expected: number): number {
  return Math.abs(actual - expected) / Math.abs(expected);
}

// Published factors: NIST Special Publication 811 (2008 ed.), "Guide for the Use of the
// International System of Units", Appendix B.8 (factors by name) and B.9 (temperature).
// [S*] values recalled from memory; each agrees with its exact definition to the 7 digits NIST
// prints, so the tolerance is 1e-6 relative.
const NIST_B8 = {
  /** pound-force per square inch (psi) → pascal. */
  paPerPsi: 6.894757e3,
  /** cubic inch → cubic metre. */
  m3PerCubicInch: 1.638706e-5,
  /** litre → cubic metre. */
  m3PerLitre: 1.0e-3,
  /** pound per hour → kilogram per second. */
  kgsPerLbH: 1.259979e-4,
  /** inch → metre. */
  mPerInch: 2.54e-2,
  /** mile per hour → kilometre per hour. */
  kphPerMph: 1.609344,
};

describe('display conversions against NIST SP 811 (2008) Appendix B', () => {
  it('When 1 psi is converted, then it is 6.894757 kPa (B.8) and back', () => {
    expect(relative(psiToKpa(1), NIST_B8.paPerPsi / 1000)).toBeLessThan(1e-6);
    expect(relative(kpaToPsi(NIST_B8.paPerPsi / 1000), 1)).toBeLessThan(1e-6);
  });

  it('When standard atmosphere (101.325 kPa, B.8 atm 1.01325E+05 Pa) is shown, then 14.696 psi(a)', () => {
    expect(relative(kpaToPsi(101.325), 101325 / NIST_B8.paPerPsi)).toBeLessThan(1e-6);
    expect(kpaToPsi(101.325)).toBeCloseTo(14.696, 3);
  });

  it.each([
    // B.9: t/°C = (t/°F − 32)/1.8
    [-40, -40],
    [0, 32],
    [25, 77],
    [100, 212],
  ])('When %p °C is shown, then it is %p °F (B.9)', (celsius, fahrenheit) => {
    expect(celsiusToFahrenheit(celsius)).toBeCloseTo(fahrenheit, 10);
    expect(fahrenheitToCelsius(fahrenheit)).toBeCloseTo(celsius, 10);
    expect(fahrenheitToCelsius(fahrenheit)).toBeCloseTo((fahrenheit - 32) / 1.8, 12);
  });

  it.each([
    [1, NIST_B8.m3PerLitre / NIST_B8.m3PerCubicInch],
    [2, (2 * NIST_B8.m3PerLitre) / NIST_B8.m3PerCubicInch],
    [5.7, (5.7 * NIST_B8.m3PerLitre) / NIST_B8.m3PerCubicInch],
  ])('When %p L is shown, then it is %p ci (B.8 in³ 1.638706E-05 m³)', (litres, cubicInches) => {
    expect(relative(litresToCubicInches(litres), cubicInches)).toBeLessThan(1e-6);
    expect(relative(cubicInchesToLitres(cubicInches), litres)).toBeLessThan(1e-6);
  });

  it('When 350 ci is typed, then it is 5.735 L', () => {
    expect(cubicInchesToLitres(350)).toBeCloseTo(5.7355, 4);
  });

  it('When 550 cc/min of gasoline is shown, then it is 54.2 lb/h (B.8 lb/h 1.259979E-04 kg/s)', () => {
    // Gasoline 0.745 g/cc: common practice, no published source (shared/physics/injector-duty).
    const density = FUEL_DENSITY_GCC.gasoline;
    const kgPerS = (550 * density) / 1000 / 60;
    const expected = kgPerS / NIST_B8.kgsPerLbH;
    expect(relative(ccMinToLbH(550, density), expected)).toBeLessThan(1e-6);
    expect(ccMinToLbH(550, density)).toBeCloseTo(54.2, 1);
    expect(relative(lbHToCcMin(expected, density), 550)).toBeLessThan(1e-6);
  });

  it.each([
    [631.9, 631.9 / 1000 / NIST_B8.mPerInch],
    [25.4, 1],
  ])('When a %p mm tyre is shown, then it is %p in (B.8 in 2.54E-02 m)', (mm, inches) => {
    expect(relative(mmToInches(mm), inches)).toBeLessThan(1e-12);
    expect(relative(inchesToMm(inches), mm)).toBeLessThan(1e-12);
  });

  it('When 100 km/h is shown, then it is 62.137 mph (B.8 mi/h 1.609344 km/h)', () => {
    expect(relative(kphToMph(100), 100 / NIST_B8.kphPerMph)).toBeLessThan(1e-12);
    expect(relative(mphToKph(60), 60 * NIST_B8.kphPerMph)).toBeLessThan(1e-12);
  });
});

describe('fuelDensityGcc', () => {
  it.each([
    ['gasoline', FUEL_DENSITY_GCC.gasoline],
    ['e85', FUEL_DENSITY_GCC.e85],
    ['methanol', FUEL_DENSITY_GCC.methanol],
    ['custom', FUEL_DENSITY_GCC.gasoline],
  ] as const)('When the fuel is %p, then the density is %p g/cc', (fuel, density) => {
    expect(fuelDensityGcc(fuel)).toBe(density);
  });

  it('When the same injector runs E85, then it flows more lb/h than on gasoline', () => {
    const ctx = (fuel: 'gasoline' | 'e85') => ({ fuel });
    expect(toDisplay('injectorFlow', 1000, 'imperial', ctx('e85'))).toBeGreaterThan(
      toDisplay('injectorFlow', 1000, 'imperial', ctx('gasoline')),
    );
  });
});

describe('toDisplay and fromDisplay', () => {
  it.each(QUANTITIES)('When %p is shown in metric, then the API value is unchanged', (q) => {
    expect(toDisplay(q, 123.4, 'metric')).toBe(123.4);
    expect(fromDisplay(q, 123.4, 'metric')).toBe(123.4);
  });

  it.each(QUANTITIES)('When %p goes to imperial and back, then the value returns', (q) => {
    const shown = toDisplay(q, 87.65, 'imperial', { fuel: 'e85' });
    expect(shown).not.toBeCloseTo(87.65, 3);
    expect(fromDisplay(q, shown, 'imperial', { fuel: 'e85' })).toBeCloseTo(87.65, 10);
  });

  it.each([
    ['pressure', 'kPa', 'psi(a)'],
    ['temperature', '°C', '°F'],
    ['displacement', 'L', 'ci'],
    ['injectorFlow', 'cc/min', 'lb/h'],
    ['tyreDiameter', 'mm', 'in'],
    ['speed', 'km/h', 'mph'],
  ] as const)('When %p is labelled, then metric says %p and imperial %p', (q, metric, imperial) => {
    expect(unitLabel(q, 'metric')).toBe(metric);
    expect(unitLabel(q, 'imperial')).toBe(imperial);
  });
});

describe('mixture display', () => {
  it('When lambda 0.95 is shown as AFR on 14.64, then it is 13.9 (SAE J1979 example, reference.md §3 [S])', () => {
    expect(mixtureToDisplay(0.95, 'afr', 14.64)).toBeCloseTo(13.9, 1);
    expect(mixtureToDisplay(0.95, 'lambda', 14.64)).toBe(0.95);
  });

  it('When AFR 12.495 is typed on 14.7, then it is lambda 0.85 (λ = AFR / AFR_st, Heywood §3.3 [S*])', () => {
    expect(mixtureFromDisplay(12.495, 'afr', 14.7)).toBeCloseTo(0.85, 12);
    expect(mixtureFromDisplay(0.85, 'lambda', 14.7)).toBe(0.85);
  });

  it('When the error is figured in AFR instead of lambda, then the percent is the same', () => {
    const measured = 0.9;
    const commanded = 0.85;
    const lambdaPct = (measured / commanded - 1) * 100;
    const afrPct =
      (mixtureToDisplay(measured, 'afr', 9.81) / mixtureToDisplay(commanded, 'afr', 9.81) - 1) *
      100;
    expect(afrPct).toBeCloseTo(lambdaPct, 10);
    expect(lambdaPct).toBeCloseTo(5.882, 3);
  });
});
