import type { LogSeries, SeriesEnvelope } from '@shared/contracts/logs';
import { keptSpans, mergeWindow, tooltipLines, withAlpha, zoomWindow } from './series-view';

/** An envelope whose min, max and mean are all `values`. */
const flat = (values: (number | null)[]): SeriesEnvelope => ({
  min: values,
  max: values,
  mean: values,
});

/** A series over `timeS` with each channel equal to `values`. */
function series(timeS: number[], values: number[], kept: number[] | null): LogSeries {
  return {
    timeS,
    channels: {
      rpm: flat(values),
      mapKpa: flat(values),
      lambda: flat(values),
      lambdaTarget: flat(values),
      throttlePct: null,
    },
    kept,
    funnel: null,
    delayUsed: null,
    revisionId: null,
    rangeS: [timeS[0] as number, timeS[timeS.length - 1] as number],
    sampleCount: timeS.length,
    isExact: true,
  };
}

describe('series view', () => {
  // Points 0, 1, 2, 3, 4 s own the time halfway to their neighbours (0–0.5, 0.5–1.5, …).
  it.each<[string, (number | null)[], [number, number][]]>([
    ['nothing kept', [0, 0.2, 0.4, 0, 0], []],
    ['all kept', [1, 1, 0.5, 1, 1], [[0, 4]]],
    ['a stretch inside', [0, 0.6, 0.9, 0, 0], [[0.5, 2.5]]],
    [
      'two stretches, the last to the end',
      [1, 0, 0, 0.7, 1],
      [
        [0, 0.5],
        [2.5, 4],
      ],
    ],
    [
      'an empty point breaks a stretch',
      [1, 1, null, 1, 1],
      [
        [0, 1.5],
        [2.5, 4],
      ],
    ],
  ])('When %s, then the shaded spans are %p', (_name, kept, spans) => {
    expect(keptSpans([0, 1, 2, 3, 4], kept)).toEqual(spans);
  });

  it.each<[number, number, { fromS: number; toS: number } | null]>([
    [0, 100, null],
    [1, 100, null],
    [25, 75, { fromS: 60, toS: 160 }],
    [-10, 10, { fromS: 10, toS: 30 }],
    [50, 50, null],
  ])('When the zoom is %p–%p %% of 10–210 s, then the window is %p', (start, end, window) => {
    expect(zoomWindow([10, 210], start, end)).toEqual(window);
  });

  it('When a window is zoomed in, then its finer points replace the overview’s inside it', () => {
    const overview = series([0, 10, 20, 30, 40], [1, 2, 3, 4, 5], [1, 0, 1, 0, 1]);
    const detail = {
      ...series([12, 14, 16, 18], [7, 7, 8, 8], [0, 0, 1, 1]),
      rangeS: [11, 19] as [number, number],
    };
    const merged = mergeWindow(overview, detail);
    expect(merged.timeS).toEqual([0, 10, 12, 14, 16, 18, 20, 30, 40]);
    expect(merged.channels.rpm.mean).toEqual([1, 2, 7, 7, 8, 8, 3, 4, 5]);
    expect(merged.kept).toEqual([1, 0, 0, 0, 1, 1, 1, 0, 1]);
    expect(merged.rangeS).toEqual(overview.rangeS);
    expect(mergeWindow(overview, null)).toBe(overview);
  });

  it.each<[string, number, string]>([
    ['rgb(12, 34, 56)', 0.5, 'rgba(12, 34, 56, 0.5)'],
    ['rgba(12, 34, 56, 0.9)', 0.2, 'rgba(12, 34, 56, 0.2)'],
    ['#0a141e', 0.3, 'rgba(10, 20, 30, 0.3)'],
    ['currentcolor', 0.3, 'currentcolor'],
  ])('When %s gets opacity %p, then it is %s', (colour, alpha, expected) => {
    expect(withAlpha(colour, alpha)).toBe(expected);
  });

  it('When a point is pointed at, then the tooltip gives mean (min–max) and the kept share', () => {
    const s = series([0, 1.5], [900, 1000], [0.25, 1]);
    const withSpread = {
      ...s,
      channels: { ...s.channels, rpm: { min: [880, 1000], max: [940, 1000], mean: [905, 1000] } },
    };
    expect(tooltipLines(withSpread, 0)).toEqual([
      '0.00 s',
      'RPM 905 (880–940)',
      'MAP 900.0 kPa',
      'Lambda measured 900.000',
      'Lambda commanded 900.000',
      'Kept by the filter 25 %',
    ]);
  });
});
