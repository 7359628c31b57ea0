import { readFileSync } from 'node:fs';
import { join } from 'node:path';
import { polynomialFitWeights, savitzkyGolayCoefficients } from './savitzky-golay';
import { savitzkyGolaySeries } from './savitzky-golay-series';

interface SeriesFixture {
  time: number[];
  values: number[];
  cases: { windowLength: number; polyOrder: number; derivative: number; output: number[] }[];
}

// Golden output of scipy.signal.savgol_filter(mode='interp'), written by
// tests/fixtures/savgol/generate.py with Debian's python3-scipy [C].
const series = JSON.parse(
  readFileSync(join(__dirname, '../../tests/fixtures/savgol/series.json'), 'utf8'),
) as SeriesFixture;

/** Largest |a − b| relative to the largest |b| (1 when b is all zeros). */
function relativeError(a: ArrayLike<number>, b: ArrayLike<number>): number {
  let worst = 0;
  let scale = 0;
  for (let i = 0; i < b.length; i++) {
    worst = Math.max(worst, Math.abs(a[i] - b[i]));
    scale = Math.max(scale, Math.abs(b[i]));
  }
  return worst / (scale || 1);
}

describe('savitzkyGolaySeries on an even grid', () => {
  it.each(series.cases.map((c) => [c.windowLength, c.polyOrder, c.derivative, c.output] as const))(
    'When window %i, order %i, derivative %i, then it equals scipy savgol_filter mode=interp',
    (windowLength, polyOrder, derivative, expected) => {
      // Source: scipy.signal.savgol_filter golden fixture (tests/fixtures/savgol) [C]
      const out = savitzkyGolaySeries(
        Float64Array.from(series.time),
        Float64Array.from(series.values),
        { windowLength, polyOrder, derivative },
      );
      expect(relativeError(out, expected)).toBeLessThan(1e-9);
    },
  );
});

describe('savitzkyGolaySeries on an uneven grid', () => {
  // Irregular steps between 10 and 70 ms, as a polled logger produces.
  const time = Float64Array.from({ length: 40 }, (_, i) => 0.04 * i + 0.03 * Math.sin(i * 1.7));
  const quadratic = (t: number) => 12 - 3 * t + 5 * t * t;

  it('When the signal is a quadratic, then smoothing and the rate are exact', () => {
    // computed from the formulas: a least-squares quadratic reproduces any quadratic [C]
    const values = time.map(quadratic);
    const smooth = savitzkyGolaySeries(time, values, { windowLength: 7, polyOrder: 2 });
    const rate = savitzkyGolaySeries(time, values, { windowLength: 7, derivative: 1 });
    expect(relativeError(smooth, values)).toBeLessThan(1e-12);
    expect(
      relativeError(
        rate,
        time.map((t) => -3 + 10 * t),
      ),
    ).toBeLessThan(1e-10);
  });

  it('When samples are NaN, then the fits skip them and stay exact elsewhere', () => {
    // computed from the formulas (as above) [C]
    const values = time.map(quadratic);
    values[10] = NaN;
    values[11] = NaN;
    const rate = savitzkyGolaySeries(time, values, { windowLength: 7, derivative: 1 });
    for (let i = 0; i < time.length; i++) expect(rate[i]).toBeCloseTo(-3 + 10 * time[i], 9);
  });

  it('When a window holds fewer usable points than the polynomial needs, then the value is NaN', () => {
    const values = time.map(quadratic);
    values.fill(NaN, 5, 20);
    const out = savitzkyGolaySeries(time, values, { windowLength: 5, polyOrder: 2 });
    expect(Number.isNaN(out[12])).toBe(true);
    expect(Number.isNaN(out[2])).toBe(false);
  });

  it('When the input is passed, then it is not changed', () => {
    const values = time.map(quadratic);
    const copy = Float64Array.from(values);
    savitzkyGolaySeries(time, values, { derivative: 1 });
    expect(values).toEqual(copy);
  });
});

describe('argument checks', () => {
  it.each([
    [() => savitzkyGolayCoefficients(0, 0), /windowLength/],
    [() => savitzkyGolayCoefficients(5, 5), /polyOrder/],
    [() => savitzkyGolayCoefficients(5, 2, { delta: 0 }), /delta/],
    [() => savitzkyGolayCoefficients(5, 2, { position: 5 }), /position/],
    [() => savitzkyGolayCoefficients(5, 2, { derivative: -1 }), /derivative/],
    [() => savitzkyGolaySeries(new Float64Array(3), new Float64Array(4)), /time has 3/],
    [
      () => savitzkyGolaySeries(new Float64Array(9), new Float64Array(9), { windowLength: 6 }),
      /odd/,
    ],
    [() => polynomialFitWeights([1, 1, 1], 2), /distinct/],
  ])('When given bad arguments (%#), then it throws naming them', (call, message) => {
    expect(call).toThrow(message);
  });

  it('When the derivative exceeds the order, then the weights are zero', () => {
    expect(Array.from(savitzkyGolayCoefficients(5, 1, { derivative: 2 }))).toEqual([0, 0, 0, 0, 0]);
  });
});
