import type { LogSeries, SeriesEnvelope } from '@shared/contracts/logs';
import type { LineSeriesOption } from 'echarts/charts';
import {
  chartHeightPx,
  chartPanels,
  seriesChartOption,
  type ChartColours,
} from './series-chart-option';
import { seriesInDisplayUnits } from './series-view';

const COLOURS: ChartColours = {
  text: 'rgb(60, 60, 60)',
  axis: 'rgb(120, 120, 120)',
  grid: 'rgb(220, 220, 220)',
  rpm: 'rgb(0, 80, 160)',
  map: 'rgb(120, 60, 0)',
  lambda: 'rgb(0, 80, 160)',
  target: 'rgb(20, 20, 20)',
  throttle: 'rgb(80, 80, 120)',
  kept: 'rgb(0, 80, 160)',
  tooltipBackground: 'rgb(250, 250, 250)',
  tooltipText: 'rgb(20, 20, 20)',
};

const env = (min: number[], max: number[]): SeriesEnvelope => ({
  min,
  max,
  mean: min.map((v, k) => (v + (max[k] as number)) / 2),
});

const SERIES: LogSeries = {
  timeS: [0, 1, 2, 3],
  channels: {
    rpm: env([900, 1000, 2000, 2100], [950, 1400, 2100, 2100]),
    mapKpa: env([30, 35, 60, 90], [32, 40, 70, 95]),
    lambda: env([1, 0.98, 0.9, 0.85], [1.02, 1, 0.95, 0.86]),
    lambdaTarget: env([1, 1, 0.9, 0.85], [1, 1, 0.9, 0.85]),
    throttlePct: env([3, 5, 30, 60], [3, 8, 35, 60]),
  },
  kept: [0, 0.2, 0.8, 1],
  funnel: [],
  delayUsed: { tau0S: 0.1, kGrams: 1, source: 'settings' },
  revisionId: 'r1',
  rangeS: [0, 3],
  sampleCount: 40,
  isExact: false,
};

/** The option's line series. */
function linesOf(series: LogSeries): LineSeriesOption[] {
  return seriesChartOption(series, [0, 10], COLOURS, { start: 20, end: 60 })
    .series as LineSeriesOption[];
}

describe('series chart option', () => {
  it.each<[string, LogSeries, string[]]>([
    ['throttle and a filter', SERIES, ['rpm', 'map', 'lambda', 'throttle', 'kept']],
    [
      'no throttle, no table',
      { ...SERIES, channels: { ...SERIES.channels, throttlePct: null }, kept: null },
      ['rpm', 'map', 'lambda'],
    ],
  ])('When the log has %s, then the panels are %p', (_name, series, panels) => {
    expect(chartPanels(series).map((p) => p.id)).toEqual(panels);
    const option = seriesChartOption(series, [0, 10], COLOURS, { start: 0, end: 100 });
    expect(option.grid).toHaveLength(panels.length);
    expect(chartHeightPx(series)).toBeGreaterThan(panels.length * 30);
  });

  it('When drawn, then each band is lowest plus spread, stacked, and kept stretches are shaded', () => {
    const lines = linesOf(SERIES);
    const byId = new Map(lines.map((s) => [s.id, s]));
    expect(byId.get('rpm-low')?.data?.[1]).toEqual([1, 1000]);
    expect(byId.get('rpm-spread')?.data?.[1]).toEqual([1, 400]);
    expect(byId.get('rpm-spread')?.stack).toBe(byId.get('rpm-low')?.stack);
    // Kept ≥ 0.5 from the point at 2 s on: from 1.5 s (halfway) to the end, 3 s.
    expect(byId.get('rpm-mean')?.markArea?.data).toEqual([[{ xAxis: 1.5 }, { xAxis: 3 }]]);
    expect(byId.get('lambdaTarget-mean')?.lineStyle?.type).toBe('dashed');
    expect(byId.get('kept-share')?.data).toEqual([
      [0, 0],
      [1, 20],
      [2, 80],
      [3, 100],
    ]);
  });

  it('When zoomed, then the zoom is kept and the time axis spans the whole log', () => {
    const option = seriesChartOption(SERIES, [0, 10], COLOURS, { start: 20, end: 60 });
    expect(option.dataZoom).toEqual([
      expect.objectContaining({ type: 'inside', start: 20, end: 60 }),
      expect.objectContaining({ type: 'slider', start: 20, end: 60 }),
    ]);
    expect(option.xAxis).toEqual(
      expect.arrayContaining([expect.objectContaining({ min: 0, max: 10 })]),
    );
  });
});

describe('series chart in the user units', () => {
  it('When the user reads imperial and AFR, then the MAP axis is in psi(a) and lambda reads AFR', () => {
    const display = seriesInDisplayUnits(SERIES, 'imperial', 'afr', 14.7);
    const option = seriesChartOption(
      display.series,
      [0, 3],
      COLOURS,
      { start: 0, end: 100 },
      display.labels,
    );
    const yAxes = option.yAxis as { name?: string }[];
    expect(yAxes.map((axis) => axis.name)).toEqual([
      'RPM',
      'MAP, psi(a)',
      'AFR',
      'Throttle, %',
      'Kept, %',
    ]);
    const map = linesOf(display.series).find((s) => s.id === 'map-mean');
    // 31 kPa is 4.496 psi (1 psi = 6.894757 kPa, NIST SP 811 App. B.8 [S*], as reference.md §4).
    expect((map?.data as number[][])[0]?.[1]).toBeCloseTo(31 / 6.894757293, 6);
    const lambda = linesOf(display.series).find((s) => s.id === 'lambda-mean');
    expect((lambda?.data as number[][])[0]?.[1]).toBeCloseTo(1.01 * 14.7, 9);
  });

  it('When the user reads metric and lambda, then nothing changes', () => {
    const display = seriesInDisplayUnits(SERIES, 'metric', 'lambda', 14.7);
    expect(display.series.channels.mapKpa).toEqual(SERIES.channels.mapKpa);
    expect(display.labels.pressureUnit).toBe('kPa');
    expect(display.labels.mixture).toBe('Lambda');
  });
});
