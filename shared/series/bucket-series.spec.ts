import { bucketSeries, seriesWindow, type BucketSeriesOptions } from './bucket-series';

// Every expected figure below is worked out by hand from the definition (equal-duration
// buckets over the window, min/max/mean of the finite values, kept share of all samples):
// common practice for chart downsampling, no published source.

const f64 = (values: number[]) => Float64Array.from(values);

/** Eight samples a second apart with a one-sample RPM spike at 3 s and a gap in MAP at 5 s. */
const TIME = f64([0, 1, 2, 3, 4, 5, 6, 7]);
const RPM = f64([1000, 1100, 900, 3000, 1200, 1250, 1300, 800]);
const MAP = f64([30, 32, 34, 36, 38, NaN, 42, 44]);
const KEEP = Uint8Array.from([1, 1, 0, 1, 0, 0, 1, 1]);

describe('bucketSeries', () => {
  it('When 8 samples go into 4 buckets, then each bucket keeps min, max and mean (the spike survives)', () => {
    // Width 7/4 = 1.75 s: [0, 1.75) holds 0 and 1 s, [1.75, 3.5) 2 and 3 s, [3.5, 5.25) 4 and
    // 5 s, [5.25, 7] 6 and 7 s. Middles 0.875, 2.625, 4.375, 6.125 s.
    const out = bucketSeries(
      { time: TIME, channels: { rpm: RPM, map: MAP }, keep: KEEP },
      { points: 4 },
    );
    expect(out.timeS).toEqual([0.875, 2.625, 4.375, 6.125]);
    expect(out.channels.rpm).toEqual({
      min: [1000, 900, 1200, 800],
      max: [1100, 3000, 1250, 1300],
      mean: [1050, 1950, 1225, 1050],
    });
    // The NaN at 5 s is left out of its bucket: 38 alone.
    expect(out.channels.map).toEqual({
      min: [30, 34, 38, 42],
      max: [32, 36, 38, 44],
      mean: [31, 35, 38, 43],
    });
    expect(out.kept).toEqual([1, 0.5, 0, 1]);
    expect(out).toMatchObject({ rangeS: [0, 7], sampleCount: 8, isExact: false });
  });

  it.each<[string, BucketSeriesOptions, { timeS: number[]; max: number[]; kept: number[] }]>([
    [
      // Window 2–6 s holds 2, 3, 4, 5, 6 s; width 2 s: [2, 4) and [4, 6].
      'a window of 5 samples in 2 buckets',
      { points: 2, fromS: 2, toS: 6 },
      { timeS: [3, 5], max: [3000, 1300], kept: [0.5, 1 / 3] },
    ],
    [
      // Clipped to the series: −10 → 0 s, 1.5 → 1.5 s; samples 0 and 1 s, one per bucket.
      'a window reaching before the series, as many samples as buckets',
      { points: 2, fromS: -10, toS: 1.5 },
      { timeS: [0, 1], max: [1000, 1100], kept: [1, 1] },
    ],
  ])('When %s, then the figures are the hand-worked ones', (_name, options, expected) => {
    const out = bucketSeries({ time: TIME, channels: { rpm: RPM }, keep: KEEP }, options);
    expect(out.timeS).toEqual(expected.timeS);
    expect(out.channels.rpm.max).toEqual(expected.max);
    expect(out.kept).toEqual(expected.kept);
  });

  it('When the window holds no more samples than points, then samples come back unchanged', () => {
    const out = bucketSeries({ time: TIME, channels: { map: MAP } }, { points: 100 });
    expect(out.isExact).toBe(true);
    expect(out.timeS).toEqual([0, 1, 2, 3, 4, 5, 6, 7]);
    expect(out.channels.map.mean).toEqual([30, 32, 34, 36, 38, null, 42, 44]);
    expect(out.channels.map.min).toEqual(out.channels.map.mean);
    expect(out.kept).toBeNull();
  });

  it('When a stretch of time has no samples, then its buckets stay, empty, so the gap shows', () => {
    // 0, 1, 2 then 9, 10 s, nothing in between.
    const time = f64([0, 1, 2, 9, 10]);
    const out = bucketSeries(
      { time, channels: { v: f64([1, 2, 3, 4, 5]) }, keep: Uint8Array.from([1, 0, 1, 1, 1]) },
      { points: 4 },
    );
    // 4 buckets of 2.5 s: [0, 2.5) 0 1 2 | [2.5, 5) – | [5, 7.5) – | [7.5, 10] 9 10.
    expect(out.timeS).toEqual([1.25, 3.75, 6.25, 8.75]);
    expect(out.channels.v.mean).toEqual([2, null, null, 4.5]);
    expect(out.kept).toEqual([2 / 3, null, null, 1]);
  });

  it('When every sample has the same time, then they share one bucket', () => {
    const out = bucketSeries(
      { time: f64([5, 5, 5]), channels: { v: f64([1, 2, 6]) } },
      { points: 2 },
    );
    expect(out.timeS).toEqual([5]);
    expect(out.channels.v).toEqual({ min: [1], max: [6], mean: [3] });
  });

  it('When it runs, then the input is not changed', () => {
    const time = f64([0, 1, 2, 3]);
    const v = f64([4, 3, 2, 1]);
    bucketSeries({ time, channels: { v } }, { points: 2 });
    expect(Array.from(time)).toEqual([0, 1, 2, 3]);
    expect(Array.from(v)).toEqual([4, 3, 2, 1]);
  });

  it.each<[string, () => unknown, string]>([
    [
      'points not whole',
      () => bucketSeries({ time: TIME, channels: {} }, { points: 1.5 }),
      'points must be a whole number',
    ],
    [
      'a channel of another length',
      () => bucketSeries({ time: TIME, channels: { v: f64([1]) } }, { points: 2 }),
      'channel "v"',
    ],
    [
      'a keep mask of another length',
      () => bucketSeries({ time: TIME, channels: {}, keep: new Uint8Array(2) }, { points: 2 }),
      'keep has 2 samples',
    ],
    [
      'toS not after fromS',
      () => bucketSeries({ time: TIME, channels: {} }, { points: 2, fromS: 3, toS: 3 }),
      'toS must be later than fromS',
    ],
    [
      'a window after the series',
      () => bucketSeries({ time: TIME, channels: {} }, { points: 2, fromS: 8 }),
      'does not overlap',
    ],
    [
      'no samples',
      () => bucketSeries({ time: new Float64Array(0), channels: {} }, { points: 2 }),
      'has no samples',
    ],
  ])('When given %s, then it throws naming it', (_name, call, message) => {
    expect(call).toThrow(message);
  });
});

describe('seriesWindow', () => {
  it.each<[number | undefined, number | undefined, [number, number, number, number] | null]>([
    [undefined, undefined, [0, 8, 0, 7]],
    [2.5, 4, [3, 5, 2.5, 4]],
    [-1, 0, [0, 1, 0, 0]],
    [7, 9, [7, 8, 7, 7]],
    // Between two samples: a window with none.
    [2.2, 2.8, [3, 3, 2.2, 2.8]],
    [7.5, 9, null],
    [-5, -1, null],
  ])(
    'When the window is %p–%p s, then it is %p (first, end, start, end)',
    (fromS, toS, expected) => {
      const window = seriesWindow(TIME, fromS, toS);
      expect(window && [window.first, window.end, window.startS, window.endS]).toEqual(expected);
    },
  );
});
