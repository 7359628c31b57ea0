import type { AnalysisSamples } from '../../../core/api/analyses-api';
import { divergingColour } from '../../../ui/parts/colour-scale';
import { FALLBACK_CHART_THEMES } from './chart-theme';
import {
  DOWN_TRIANGLE,
  SAMPLE_SERIES,
  type ScatterInput,
  sampleTooltip,
  samplesCaption,
  scatterOption,
} from './scatter-option';

const SAMPLES: AnalysisSamples = {
  rpm: [1500, 2500, 3500, 800],
  mapKpa: [50, 90, 95, 30.4],
  lambdaErrorPct: [4.04, -2, 0, 12],
  logIndex: [0, 0, 1, 1],
  total: 10,
  returned: 4,
};

const INPUT: ScatterInput = {
  rpmAxis: [1000, 2000, 3000],
  mapAxisKpa: [40, 70, 100],
  samples: SAMPLES,
  theme: FALLBACK_CHART_THEMES.dark,
};

interface Series {
  name: string;
  symbol: string;
  symbolRotate?: number;
  data: { value: number[]; itemStyle: { color: string } }[];
  markLine?: { data: object[]; lineStyle: { color: string } };
}

describe('scatter option', () => {
  const option = scatterOption(INPUT) as {
    series: Series[];
    xAxis: { min: number; max: number };
    yAxis: { min: number; max: number };
    tooltip: { formatter: (p: unknown) => string };
    legend: { data: object[] };
  };
  const [lean, rich] = option.series;

  it('When samples are split, then lean ones point up and the rest point down', () => {
    expect(lean).toMatchObject({ name: SAMPLE_SERIES.lean, symbol: 'triangle' });
    expect(rich).toMatchObject({ name: SAMPLE_SERIES.rich, symbol: 'triangle', symbolRotate: 180 });
    // The legend draws symbols unrotated, so the rich entry has a downward path of its own.
    expect(option.legend.data).toEqual([
      { name: SAMPLE_SERIES.lean, icon: 'triangle' },
      { name: SAMPLE_SERIES.rich, icon: DOWN_TRIANGLE },
    ]);
    expect(lean.data.map((d) => d.value)).toEqual([
      [1500, 50, 4.04, 0],
      [800, 30.4, 12, 1],
    ]);
    expect(rich.data.map((d) => d.value)).toEqual([
      [2500, 90, -2, 0],
      [3500, 95, 0, 1],
    ]);
  });

  it.each([
    [0, 0, 4],
    [0, 1, 10],
    [1, 0, -2],
    [1, 1, 0],
  ])(
    'When series %p item %p is coloured, then it takes our diverging colour of %p %',
    (s, i, pct) => {
      expect(option.series[s].data[i].itemStyle.color).toBe(divergingColour(pct, 10));
    },
  );

  it('When the breakpoints are drawn, then each RPM and MAP breakpoint is one dashed line', () => {
    expect(lean.markLine?.data).toEqual([
      { xAxis: 1000 },
      { xAxis: 2000 },
      { xAxis: 3000 },
      { yAxis: 40 },
      { yAxis: 70 },
      { yAxis: 100 },
    ]);
    expect(lean.markLine?.lineStyle.color).toBe(FALLBACK_CHART_THEMES.dark.gridLine);
  });

  it('When samples lie beyond the table, then the axes reach out to them', () => {
    expect(option.xAxis).toMatchObject({ min: 800, max: 3500 });
    // 30.4 kPa rounds out to the 10 kPa below.
    expect(option.yAxis).toMatchObject({ min: 30, max: 100 });
    const wide = scatterOption({
      ...INPUT,
      samples: { ...SAMPLES, rpm: [650, 3040], mapKpa: [17.5, 104] },
    }) as { xAxis: { min: number; max: number }; yAxis: { min: number; max: number } };
    expect([wide.xAxis.min, wide.xAxis.max, wide.yAxis.min, wide.yAxis.max]).toEqual([
      600, 3100, 10, 110,
    ]);
  });

  it('When a sample is pointed at, then the tooltip tells where, how lean and which log', () => {
    const text = '2,500 rpm · 90.0 kPa\nLambda error ▼ \u22122.0 % rich\nLog 1';
    expect(sampleTooltip([2500, 90, -2, 0])).toBe(text);
    expect(option.tooltip.formatter({ value: [2500, 90, -2, 0] })).toBe(text);
  });

  it('When the user prefers imperial units, then the MAP axis, breakpoints and tooltip read in psi(a)', () => {
    const imperial = scatterOption({ ...INPUT, units: 'imperial' }) as {
      series: Series[];
      yAxis: { name: string; min: number; max: number };
      tooltip: { formatter: (p: unknown) => string };
    };
    // 1 psi = 6.894757 kPa (NIST SP 811, 2008 edition, Appendix B.8) [S]: 50 kPa = 7.2519 psi,
    // 30.4 kPa = 4.4091 psi, 100 kPa = 14.5038 psi.
    const [first] = imperial.series[0].data;
    expect(first.value[1]).toBeCloseTo(7.2519, 4);
    const topLine = imperial.series[0].markLine?.data.at(-1) as { yAxis: number };
    expect(topLine.yAxis).toBeCloseTo(14.5038, 4);
    // The axis reaches out to whole psi below the samples, and up to the top breakpoint.
    expect(imperial.yAxis).toMatchObject({ name: 'MAP psi(a)', min: 4 });
    expect(imperial.yAxis.max).toBeCloseTo(14.5038, 4);
    expect(imperial.tooltip.formatter({ value: [2500, 13.05, -2, 0] })).toBe(
      '2,500 rpm · 13.05 psi(a)\nLambda error ▼ \u22122.0 % rich\nLog 1',
    );
  });

  it.each([
    ['thinned', '4 of 10 kept samples, evenly spread over the logs.', SAMPLES],
    ['all there', 'All 4 samples the analysis kept.', { ...SAMPLES, total: 4 }],
    ['none', 'The analysis kept no samples.', { ...SAMPLES, total: 0, returned: 0 }],
  ])('When the samples are %s, then the caption reads %j', (_, caption, samples) => {
    expect(samplesCaption(samples)).toBe(caption);
  });
});
