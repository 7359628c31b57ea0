import { type Grid } from '../../shared/core/table';
import {
  gaussianFilter,
  gaussianKernel,
  normalizedConvolution,
  smoothTable,
} from '../../shared/smooth';
import {
  maxRelativeDifference,
  readGridFixture,
  toFloat64,
} from '../fixtures/grid/read-grid-fixture';

describe('Gaussian kernel', () => {
  it('When an impulse is blurred with σ = 1, then centre, ±1 and ±2 are 0.398943, 0.241971, 0.053991', () => {
    // Source: computed from the formulas (reference.md §8), separable 1-D kernel [C]
    const impulse = new Float64Array(81);
    impulse[40] = 1;
    const row = gaussianFilter({ rows: 1, cols: 81, data: impulse }, 1).data;
    expect(row[40]).toBeCloseTo(0.398943, 5);
    expect(row[39]).toBeCloseTo(0.241971, 5);
    expect(row[41]).toBeCloseTo(0.241971, 5);
    expect(row[38]).toBeCloseTo(0.053991, 5);
    expect(row[42]).toBeCloseTo(0.053991, 5);
  });

  it('When σ = 1 and truncate = 4, then the kernel has radius 4 and sums to 1', () => {
    // from memory of scipy.ndimage gaussian_filter1d's source: radius int(truncate·σ + 0.5) [S*];
    // the golden fixture below confirms it
    const kernel = gaussianKernel(1, 4);
    expect(kernel).toHaveLength(9);
    expect(kernel.reduce((a, b) => a + b, 0)).toBeCloseTo(1, 15);
  });
});

describe('smoothing against scipy.ndimage.gaussian_filter', () => {
  const input = readGridFixture('in', 'smooth');
  const expected = readGridFixture('out', 'smooth')['bySigma'] as Record<string, number[]>[];
  const rows = input['rows'] as number;
  const cols = input['cols'] as number;
  const values: Grid = { rows, cols, data: toFloat64(input['values']) };
  const confidence: Grid = { rows, cols, data: toFloat64(input['confidence']) };
  const uniform: Grid = { rows, cols, data: new Float64Array(rows * cols).fill(3) };

  it.each(expected.map((e) => [e['sigma'] as unknown as number, e] as const))(
    'When σ = %s, then plain, normalized and blended smoothing match scipy',
    (sigma, e) => {
      // Source: scipy.ndimage.gaussian_filter(mode='nearest', truncate=4), generate.py [C]
      const gaussian = toFloat64(e['gaussian']);
      expect(maxRelativeDifference(gaussianFilter(values, sigma).data, gaussian)).toBeLessThan(
        1e-9,
      );
      // Uniform confidence: normalized convolution is the plain Gaussian.
      const flat = normalizedConvolution(values, uniform, sigma).data;
      expect(maxRelativeDifference(flat, gaussian)).toBeLessThan(1e-9);
      // Source: gaussian_filter(c·v)/gaussian_filter(c) (Knutsson & Westin 1993, from memory [S*]) [C]
      const normalized = normalizedConvolution(values, confidence, sigma).data;
      expect(maxRelativeDifference(normalized, toFloat64(e['normalized']))).toBeLessThan(1e-9);
      const smoothed = smoothTable(values, confidence, {
        sigmaCells: sigma,
        strength: input['strength'] as number,
        halfConfidence: input['halfConfidence'] as number,
      }).data;
      expect(maxRelativeDifference(smoothed, toFloat64(e['smoothed']))).toBeLessThan(1e-9);
    },
  );
});
