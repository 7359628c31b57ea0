import { interpolateAtTime } from './interpolate-at-time';

// Linear interpolation by definition (reference.md §8 lookup, without clamping) [C].
describe('interpolateAtTime', () => {
  const time = Float64Array.from([0, 0.1, 0.25, 0.25, 0.4]);
  const values = Float64Array.from([1, 2, 5, 7, NaN]);

  it.each<[number, number]>([
    [0, 1],
    [0.05, 1.5],
    [0.1, 2],
    [0.175, 3.5],
    [0.25, 7], // repeated timestamp: the later sample
  ])('When t = %f, then the value is %f', (t, expected) => {
    expect(interpolateAtTime(time, values, t)).toBeCloseTo(expected, 12);
  });

  it.each([-0.01, 0.41, NaN])('When t = %f is outside the log, then NaN', (t) => {
    expect(Number.isNaN(interpolateAtTime(time, values, t))).toBe(true);
  });

  it('When a neighbour is NaN, then NaN', () => {
    expect(Number.isNaN(interpolateAtTime(time, values, 0.3))).toBe(true);
  });
});
