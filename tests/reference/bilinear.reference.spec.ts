import { accumulateCells, bilinearAt, bilinearWeights } from '../../shared/accumulate';
import {
  maxRelativeDifference,
  readGridFixture,
  toFloat64,
  toNumbers,
} from '../fixtures/grid/read-grid-fixture';

describe('bilinear interpolation', () => {
  // Wikipedia "Bilinear interpolation", Example: x = 20, 21 (RPM axis), y = 14, 15 (MAP axis).
  const table = {
    rpmAxis: [20, 21],
    mapAxisKpa: [14, 15],
    values: [
      [91, 162],
      [210, 95],
    ],
  };

  it('When read at (20.2, 14.5), then it is 146.1', () => {
    // Source: Wikipedia "Bilinear interpolation", Example (reference.md §8) [S]
    expect(bilinearAt(table, 20.2, 14.5)).toBeCloseTo(146.1, 10);
  });

  it('When read at (20, 14.5) and (21, 14.5), then it is 150.5 and 128.5', () => {
    // Source: Wikipedia "Bilinear interpolation", Example (reference.md §8) [S]
    expect(bilinearAt(table, 20, 14.5)).toBeCloseTo(150.5, 10);
    expect(bilinearAt(table, 21, 14.5)).toBeCloseTo(128.5, 10);
  });

  it('When read on the corners, then it returns the four given values', () => {
    // Source: Wikipedia "Bilinear interpolation", Example (reference.md §8) [S]
    expect([
      bilinearAt(table, 20, 14),
      bilinearAt(table, 21, 14),
      bilinearAt(table, 20, 15),
      bilinearAt(table, 21, 15),
    ]).toEqual([91, 162, 210, 95]);
  });

  it('When splatting at f = (0.25, 0.5), then the weights are 0.375, 0.125, 0.375, 0.125', () => {
    // Source: computed from the formulas (reference.md §8) [C]
    const w = bilinearWeights(0.25, 0.5);
    [0.375, 0.125, 0.375, 0.125].forEach((e, i) => expect(w[i]).toBeCloseTo(e, 15));
  });

  it('When read anywhere (also beyond the axes), then it matches scipy RegularGridInterpolator', () => {
    // Source: scipy RegularGridInterpolator on clipped points, tests/fixtures/grid/generate.py [C]
    const input = readGridFixture('in', 'bilinear-at');
    const expected = toFloat64(readGridFixture('out', 'bilinear-at')['values']);
    const rows = (input['values'] as number[][]).map((row) => [...row]);
    const source = {
      rpmAxis: toNumbers(input['rpmAxis']),
      mapAxisKpa: toNumbers(input['mapAxisKpa']),
      values: rows,
    };
    const rpm = toFloat64(input['rpm']);
    const mapKpa = toFloat64(input['mapKpa']);
    const actual = rpm.map((x, i) => bilinearAt(source, x, mapKpa[i] as number));
    expect(maxRelativeDifference(actual, expected)).toBeLessThan(1e-9);
  });
});

describe('accumulateCells against scipy', () => {
  it('When samples sit on breakpoints, then counts, weights and means match binned_statistic_2d', () => {
    // Source: scipy.stats.binned_statistic_2d (sum, count), tests/fixtures/grid/generate.py [C]
    const input = readGridFixture('in', 'accumulate-nearest');
    const expected = readGridFixture('out', 'accumulate-nearest');
    const out = accumulateCells(fixtureSamples(input));
    expect(maxRelativeDifference(out.count.data, toFloat64(expected['count']))).toBe(0);
    expect(maxRelativeDifference(out.weight.data, toFloat64(expected['weight']))).toBeLessThan(
      1e-9,
    );
    expect(maxRelativeDifference(out.ratio.data, toFloat64(expected['ratio']))).toBeLessThan(1e-9);
  });

  it('When samples fall anywhere, then every statistic matches the transposed RegularGridInterpolator', () => {
    // Source: weights = scipy RegularGridInterpolator of each unit grid at the (clipped) samples;
    // statistics by numpy two-pass formulas, tests/fixtures/grid/generate.py [C]
    const input = readGridFixture('in', 'accumulate-bilinear');
    const expected = readGridFixture('out', 'accumulate-bilinear');
    const out = accumulateCells(fixtureSamples(input));
    expect(out.samplesUsed).toBe(expected['samplesUsed']);
    const names = [
      'count',
      'weight',
      'ratio',
      'spread',
      'effectiveCount',
      'lambdaError',
      'worstLean',
      'lambdaMeasured',
      'lambdaCommanded',
    ] as const;
    for (const name of names) {
      const difference = maxRelativeDifference(out[name].data, toFloat64(expected[name]));
      expect({ name, ok: difference < 1e-9 }).toEqual({ name, ok: true });
    }
  });
});

function fixtureSamples(input: Record<string, unknown>) {
  const f = (key: string) => toFloat64(input[key] as number[]);
  return {
    rpmAxis: toNumbers(input['rpmAxis'] as number[]),
    mapAxisKpa: toNumbers(input['mapAxisKpa'] as number[]),
    rpm: f('rpm'),
    mapKpa: f('mapKpa'),
    lambda: f('lambda'),
    lambdaTarget: f('lambdaTarget'),
    stft: f('stft'),
    ltft: f('ltft'),
    sampleWeight: f('sampleWeight'),
    keep: input['keep'] === undefined ? undefined : Uint8Array.from(input['keep'] as number[]),
  };
}
