import { normaliseUnit, parseUnitText } from './parse-unit-text';

describe('parseUnitText', () => {
  it.each([
    ['rpm', 'rpm', null],
    ['kPa', 'kPa', null],
    ['kPa abs', 'kPa', 'absolute'],
    ['psi', 'psi', null],
    ['psig', 'psi', 'gauge'],
    ['(psia)', 'psi', 'absolute'],
    ['bar', 'bar', null],
    ['inHg', 'inHg', null],
    ['°F', 'F', null],
    ['F', 'F', null],
    ['deg C', 'C', null],
    ['°C', 'C', null],
    ['K', 'K', null],
    ['%', '%', null],
    ['ms', 'ms', null],
    ['s', 's', null],
    ['AFR', 'afr', null],
    ['λ', 'lambda', null],
    ['lambda', 'lambda', null],
    ['phi', 'phi', null],
    ['φ', 'phi', null],
    ['mph', 'mph', null],
    ['km/h', 'kph', null],
    ['[CL=1]', 'flag', null],
    ['1=on', 'flag', null],
    ['°', 'deg', null],
  ])('When the text is %s, then the unit is %s (reference %s)', (text, unit, reference) => {
    expect(parseUnitText(text)).toEqual({ unit, reference });
  });

  it.each(['', 'V', 'mg/stroke', 'foo'])('When the text is "%s", then no unit is read', (text) => {
    expect(parseUnitText(text)).toBeNull();
  });
});

describe('normaliseUnit', () => {
  it.each([
    ['[ °F ]', '° f'],
    ['(kPa)', 'kpa'],
    ['Deg  C', 'deg c'],
  ])('%s → %s', (text, expected) => {
    expect(normaliseUnit(text)).toBe(expected);
  });
});
