import { formatMixture, formatNumber, formatQuantity } from './format-quantity';

describe('formatNumber', () => {
  it.each([
    [634.3, { min: 0, max: 1 }, '634.3'],
    [632, { min: 0, max: 1 }, '632'],
    [2, { min: 1, max: 2 }, '2.0'],
    [1.598, { min: 1, max: 2 }, '1.6'],
    [1.984, { min: 1, max: 2 }, '1.98'],
    [10000, { min: 0, max: 1 }, '10000'],
    [100, { min: 0, max: 0 }, '100'],
    [-0.04, { min: 0, max: 1 }, '0'],
    [-0.04, { min: 1, max: 1 }, '0.0'],
    [-12.345, { min: 1, max: 2 }, '-12.35'],
    [12.495, { min: 1, max: 2 }, '12.5'],
    [0.85 * 14.7, { min: 2, max: 2 }, '12.50'],
    [Number.NaN, { min: 0, max: 1 }, '—'],
    [Number.POSITIVE_INFINITY, { min: 0, max: 1 }, '—'],
  ])('When %p is written with %p digits, then it reads %p', (value, digits, text) => {
    expect(formatNumber(value, digits)).toBe(text);
  });
});

describe('formatQuantity', () => {
  it.each([
    ['pressure', 101.325, 'metric', '101.3 kPa'],
    ['pressure', 101.325, 'imperial', '14.7 psi(a)'],
    ['pressure', 250, 'imperial', '36.26 psi(a)'],
    ['temperature', 25, 'imperial', '77 °F'],
    ['displacement', 2, 'metric', '2.0 L'],
    ['displacement', 1.6, 'imperial', '97.6 ci'],
    ['injectorFlow', 550, 'metric', '550 cc/min'],
    ['injectorFlow', 550, 'imperial', '54.2 lb/h'],
    ['tyreDiameter', 634.3, 'metric', '634.3 mm'],
    ['tyreDiameter', 631.9, 'imperial', '24.88 in'],
    ['speed', 100, 'imperial', '62.1 mph'],
  ] as const)('When %p %p is shown in %p, then it reads %p', (quantity, value, units, text) => {
    expect(formatQuantity(quantity, value, units)).toBe(text);
  });

  it('When the unit is left off or digits are given, then only the number is written', () => {
    expect(formatQuantity('pressure', 100, 'imperial', { unit: false })).toBe('14.5');
    expect(formatQuantity('pressure', 100, 'metric', { digits: { min: 1, max: 1 } })).toBe(
      '100.0 kPa',
    );
  });

  it('When the fuel is E85, then its injector flow in lb/h uses E85 density', () => {
    expect(formatQuantity('injectorFlow', 1000, 'imperial', { fuel: 'e85' })).toBe('103.5 lb/h');
    expect(formatQuantity('injectorFlow', 1000, 'imperial')).toBe('98.5 lb/h');
  });

  it.each([null, undefined, Number.NaN])('When the value is %p, then it reads a dash', (value) => {
    expect(formatQuantity('speed', value, 'imperial')).toBe('—');
  });
});

describe('formatMixture', () => {
  it.each([
    [0.85, 'lambda', 14.7, '0.85 λ'],
    [0.853, 'lambda', 14.7, '0.853 λ'],
    [0.85, 'afr', 14.7, '12.5 AFR'],
    [1, 'afr', 9.81, '9.81 AFR'],
    [null, 'afr', 14.7, '—'],
  ] as const)('When lambda %p is shown as %p on %p, then it reads %p', (lambda, mix, st, text) => {
    expect(formatMixture(lambda, mix, st)).toBe(text);
  });

  it('When the unit is left off, then only the number is written', () => {
    expect(formatMixture(0.85, 'afr', 14.7, { unit: false })).toBe('12.5');
  });
});
