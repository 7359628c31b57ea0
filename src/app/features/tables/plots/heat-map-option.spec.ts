import type { AnalysisCell, AnalysisResource } from '../../../core/api/analyses-api';
import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  colourAt,
  readableTextColour,
} from '../../../shared/ui/colour-scale';
import { FALLBACK_CHART_THEMES } from './chart-theme';
import {
  type HeatLayer,
  type HeatMapInput,
  heatLegend,
  heatMapOption,
  heatTooltip,
  layerFigure,
} from './heat-map-option';

/** A cell with only the figures these tests read. */
function cell(lambdaErrorPct: number | null, changePct: number | null): AnalysisCell {
  return {
    samples: 10,
    weight: 8,
    ratio: 1,
    spread: 0.01,
    effectiveCount: 6,
    lambdaErrorPct,
    worstLeanPct: null,
    lambdaMeasured: 0.9,
    lambdaCommanded: 0.9,
    proposal: null,
    changePct,
    status: 'trusted',
  };
}

const ANALYSIS = {
  id: 'a1',
  cells: [
    [cell(5, -2), cell(null, null), cell(-20, 4)],
    [cell(0, 0), cell(2.5, 12), cell(null, null)],
  ],
  proposal: [
    [49, null, 62],
    [70, 90, null],
  ],
  leanFlags: [],
} as unknown as AnalysisResource;

const INPUT: HeatMapInput = {
  rpmAxis: [1000, 2000, 3000],
  mapAxisKpa: [40, 100],
  values: [
    [50, 55, 60],
    [70, 80, 90],
  ],
  analysis: ANALYSIS,
  layer: 've',
  selectedCell: { row: 1, col: 2 },
  theme: FALLBACK_CHART_THEMES.light,
};

/** The data item of cell (row, col) in the option. */
function item(layer: HeatLayer, row: number, col: number) {
  const series = heatMapOption({ ...INPUT, layer }).series as { data: unknown[] }[];
  return (
    series[0].data as { value: number[]; label: { color: string }; itemStyle: object }[]
  ).find((d) => d.value[0] === col && d.value[1] === row);
}

describe('heat map option', () => {
  it('When the option is built, then the axes carry the breakpoints and the names', () => {
    const option = heatMapOption(INPUT) as {
      xAxis: { data: string[]; name: string };
      yAxis: { data: string[]; name: string };
      visualMap: { dimension: number; inRange: { color: string[] } };
    };
    expect(option.xAxis).toMatchObject({ name: 'RPM', data: ['1000', '2000', '3000'] });
    expect(option.yAxis).toMatchObject({ name: 'MAP kPa', data: ['40', '100'] });
    // The visual map carries our sequential scale, sampled from its own stops.
    expect(option.visualMap.dimension).toBe(2);
    expect(option.visualMap.inRange.color[0]).toBe(SEQUENTIAL_STOPS[0].hex);
    expect(option.visualMap.inRange.color.at(-1)).toBe(SEQUENTIAL_STOPS[3].hex);
  });

  // value = [col, row, position on the scale 0–1, figure]
  it.each<[HeatLayer, number, number, number[] | undefined]>([
    ['ve', 0, 0, [0, 0, 0, 50]],
    ['ve', 1, 2, [2, 1, 1, 90]],
    ['ve', 0, 1, [1, 0, 0.125, 55]],
    // Proposal shares one range with VE (49–90), so their colours compare.
    ['proposal', 0, 0, [0, 0, 0, 49]],
    ['proposal', 0, 1, undefined],
    // Lambda error: lean (+) towards orange (1), rich (−) towards blue (0), clamped at ±10 %.
    ['lambdaError', 0, 0, [0, 0, 0.75, 5]],
    ['lambdaError', 0, 2, [2, 0, 0, -20]],
    ['lambdaError', 1, 0, [0, 1, 0.5, 0]],
    ['lambdaError', 0, 1, undefined],
    // Change: coloured by the fuel it adds, VE up = richer = blue (towards 0).
    ['change', 1, 1, [1, 1, 0, 12]],
    ['change', 0, 0, [0, 0, 0.6, -2]],
  ])('When the layer is %s, then cell (%p, %p) is %j', (layer, row, col, value) => {
    expect(item(layer, row, col)?.value).toEqual(value);
  });

  it('When a cell is painted, then its label takes the readable text colour of its background', () => {
    const background = colourAt(DIVERGING_STOPS, 0.75);
    expect(item('lambdaError', 0, 0)?.label.color).toBe(readableTextColour(background));
    expect(item('ve', 0, 0)?.label.color).toBe(readableTextColour(SEQUENTIAL_STOPS[0].hex));
  });

  it('When a cell is picked, then only it is outlined, in its text colour, and drawn last', () => {
    const theme = FALLBACK_CHART_THEMES.light;
    const text = readableTextColour(SEQUENTIAL_STOPS[3].hex);
    expect(item('ve', 1, 2)?.itemStyle).toEqual({ borderColor: text, borderWidth: 3 });
    expect(item('ve', 0, 0)?.itemStyle).toEqual({ borderColor: theme.surface, borderWidth: 1 });
    const series = heatMapOption(INPUT).series as { data: { value: number[] }[] }[];
    expect(series[0].data.at(-1)?.value.slice(0, 2)).toEqual([2, 1]);
  });

  it('When there is no analysis, then its layers show no figure', () => {
    const plain = { ...INPUT, analysis: null };
    expect(layerFigure({ ...plain, layer: 'change' }, 0, 0)).toBeNull();
    expect(layerFigure({ ...plain, layer: 've' }, 0, 0)).toBe(50);
  });

  it.each<[HeatLayer, number, string]>([
    ['ve', 82.25, '2000 rpm · 100 kPa\nVE 82.3 %'],
    ['proposal', 60, '2000 rpm · 100 kPa\nProposed VE 60.0 %'],
    ['change', -3.04, '2000 rpm · 100 kPa\nChange \u22123.0 % (less fuel)'],
    ['lambdaError', 6.44, '2000 rpm · 100 kPa\nLambda error ▲ +6.4 % lean'],
  ])('When the %s tooltip shows %p, then it reads %j', (layer, value, text) => {
    expect(heatTooltip(layer, 2000, 100, value)).toBe(text);
  });

  it('When the option’s own formatters run, then they give the cell’s text', () => {
    const option = heatMapOption({ ...INPUT, layer: 'lambdaError' }) as {
      tooltip: { formatter: (p: unknown) => string };
      series: { label: { formatter: (p: unknown) => string } }[];
    };
    const params = { value: [2, 0, 0, -20] };
    expect(option.tooltip.formatter(params)).toBe(
      '3000 rpm · 40 kPa\nLambda error ▼ \u221220.0 % rich',
    );
    expect(option.series[0].label.formatter(params)).toBe('\u221220.0');
  });

  it.each<[HeatLayer, string, string]>([
    ['ve', '50.0 %', '90.0 %'],
    ['proposal', '49.0 %', '90.0 %'],
    ['lambdaError', '▼ \u221210 % rich', '▲ +10 % lean'],
    ['change', '+10 % VE up', '\u221210 % VE down'],
  ])('When the layer is %s, then the legend runs from %j to %j', (layer, low, high) => {
    expect(heatLegend({ ...INPUT, layer })).toMatchObject({ low, high });
  });
});
