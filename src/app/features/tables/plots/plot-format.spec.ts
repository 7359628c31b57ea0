import { DIVERGING_STOPS, SEQUENTIAL_STOPS } from '../../../ui/parts/colour-scale';
import { grouped, lambdaErrorText, nearestCell, sampleStops, signed } from './plot-format';

describe('plot format', () => {
  it.each([
    [4.24, 1, '+4.2'],
    [-3.06, 1, '\u22123.1'],
    [0.04, 1, '0.0'],
    [-0.04, 1, '0.0'],
    [12.345, 2, '+12.35'],
  ])('When %p is signed with %p decimals, then it reads %j', (value, digits, text) => {
    expect(signed(value, digits)).toBe(text);
  });

  it.each([
    [4.24, '▲ +4.2 % lean'],
    [-3.06, '▼ \u22123.1 % rich'],
    [0.01, '0.0 % on target'],
  ])('When the lambda error is %p, then it reads %j', (value, text) => {
    expect(lambdaErrorText(value)).toBe(text);
  });

  it('When a count is grouped, then thousands are separated', () => {
    expect(grouped(28239)).toBe('28,239');
    expect(grouped(999.6)).toBe('1,000');
  });

  it.each([
    [2400, 60, { row: 1, col: 1 }],
    [1000, 20, { row: 0, col: 0 }],
    [9000, 250, { row: 2, col: 2 }],
    [2999, 84, { row: 1, col: 1 }],
    [3001, 86, { row: 2, col: 2 }],
  ])('When a sample sits at %p rpm and %p kPa, then its nearest cell is %j', (rpm, map, cell) => {
    expect(nearestCell([1000, 2000, 4000], [40, 70, 100], rpm, map)).toEqual(cell);
  });

  it('When a scale is sampled, then its ends are the scale’s own end colours', () => {
    const sequential = sampleStops(SEQUENTIAL_STOPS, 5);
    expect(sequential).toHaveLength(5);
    expect(sequential[0]).toBe(SEQUENTIAL_STOPS[0].hex);
    expect(sequential[4]).toBe(SEQUENTIAL_STOPS[3].hex);
    expect(sampleStops(DIVERGING_STOPS, 3)[1]).toBe(DIVERGING_STOPS[1].hex);
    expect(() => sampleStops(DIVERGING_STOPS, 1)).toThrow(/count/);
  });
});
