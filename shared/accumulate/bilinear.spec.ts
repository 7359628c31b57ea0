import { bilinearAt, bilinearWeights, veAtSamples } from './bilinear';

const table = {
  rpmAxis: [1000, 2000],
  mapAxisKpa: [50, 100],
  values: [
    [40, 60],
    [80, 100],
  ],
};

describe('bilinearWeights', () => {
  it('When f = (0, 0) or (1, 1), then all weight goes to one corner', () => {
    expect(bilinearWeights(0, 0)).toEqual([1, 0, 0, 0]);
    expect(bilinearWeights(1, 1)).toEqual([0, 0, 0, 1]);
  });

  it('When fractions are out of [0, 1], then it throws naming them', () => {
    expect(() => bilinearWeights(1.5, 0)).toThrow('fx');
    expect(() => bilinearWeights(0, NaN)).toThrow('fy');
  });
});

describe('bilinearAt', () => {
  it('When read at the centre, then it is the mean of the corners; outside it clamps', () => {
    expect(bilinearAt(table, 1500, 75)).toBeCloseTo(70, 14);
    expect(bilinearAt(table, 0, 0)).toBe(40);
    expect(bilinearAt(table, 5000, 500)).toBe(100);
  });

  it('When given a grid on axes, then it reads the same as the table', () => {
    const grid = { ...table, rows: 2, cols: 2, data: Float64Array.from([40, 60, 80, 100]) };
    expect(bilinearAt(grid, 1200, 90)).toBeCloseTo(bilinearAt(table, 1200, 90), 14);
  });

  it('When the position is not finite, then it throws', () => {
    expect(() => bilinearAt(table, NaN, 50)).toThrow('rpm');
  });
});

describe('veAtSamples', () => {
  it('When samples are given, then each gets the table value at its position', () => {
    const out = veAtSamples(table, Float64Array.from([1500, NaN]), Float64Array.from([75, 60]));
    expect(out[0]).toBeCloseTo(70, 14);
    expect(out[1]).toBeNaN();
  });
});
