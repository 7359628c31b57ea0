import { unit } from 'mathjs';
import {
  fromCelsius,
  fromKpa,
  KPA_PER_BAR,
  KPA_PER_PSI,
  kphPer,
  toCelsius,
  toKpa,
  TEMPERATURE_UNITS,
} from './units';

// Cross-checks against mathjs's unit system (a general-purpose reference library).
describe('unit factors against mathjs', () => {
  it('psi → kPa matches mathjs within 1e-9 relative (mathjs 6.89475729276)', () => {
    const mathjs = unit(1, 'psi').toNumber('kPa');
    expect(Math.abs(KPA_PER_PSI - mathjs) / mathjs).toBeLessThan(1e-9);
  });

  it('bar → kPa matches mathjs', () => {
    expect(KPA_PER_BAR).toBeCloseTo(unit(1, 'bar').toNumber('kPa'), 12);
  });

  it('°F, K → °C match mathjs', () => {
    for (const value of [-40, 0, 25, 100, 451]) {
      expect(toCelsius(value, 'F')).toBeCloseTo(unit(value, 'degF').toNumber('degC'), 9);
      expect(toCelsius(value + 300, 'K')).toBeCloseTo(unit(value + 300, 'K').toNumber('degC'), 9);
    }
  });

  it('mph → km/h matches mathjs', () => {
    expect(kphPer('mph')).toBeCloseTo(unit(1, 'mi/h').toNumber('km/h'), 12);
  });
});

describe('round trips', () => {
  it.each(['kPa', 'psi', 'bar', 'inHg'] as const)('kPa ↔ %s', (u) => {
    expect(toKpa(fromKpa(123.456, u), u)).toBeCloseTo(123.456, 10);
  });

  it.each(TEMPERATURE_UNITS)('°C ↔ %s', (u) => {
    expect(toCelsius(fromCelsius(37.5, u), u)).toBeCloseTo(37.5, 10);
  });
});
