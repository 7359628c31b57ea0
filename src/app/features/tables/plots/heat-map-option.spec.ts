import type { AnalysisCell, AnalysisResource } from '../../../core/api/analyses-api';
import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  colourAt,
  readableTextColour,
} from '../../../ui/parts/colour-scale';
import { overlayView } from '../grid/overlays';
import type { PreviewResult } from '../preview/proposal-preview-compute';
import { FALLBACK_CHART_THEMES } from './chart-theme';
import {
  type HeatLayer,
  type HeatMapInput,
  heatLegend,
  heatMapOption,
  HEAT_ORIGIN_MARKS,
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

/**
 * What the apply would write: measured at (0, 0) and (1, 2), filled richer at (1, 1), held at
 * (1, 0). The analysis's own proposal above differs on purpose: the layers must not show it.
 */
const PREVIEW: PreviewResult = {
  values: [
    [49, 55, 60],
    [70, 90, 90],
  ],
  origin: [
    ['measured', 'unchanged', 'unchanged'],
    ['held', 'filled', 'measured'],
  ],
  heldCount: 1,
  guard: { loadLineKpa: 91.19, leanAllowance: 0.01 },
};

const VALUES = [
  [50, 55, 60],
  [70, 80, 90],
];

const INPUT: HeatMapInput = {
  rpmAxis: [1000, 2000, 3000],
  mapAxisKpa: [40, 100],
  values: VALUES,
  baseValues: VALUES,
  analysis: ANALYSIS,
  preview: PREVIEW,
  layer: 've',
  selectedCell: { row: 1, col: 2 },
  theme: FALLBACK_CHART_THEMES.light,
};

/** The data item of cell (row, col) in the option. */
function item(layer: HeatLayer, row: number, col: number) {
  const series = heatMapOption({ ...INPUT, layer }).series as { data: unknown[] }[];
  return (
    series[0].data as {
      value: number[];
      label: { color: string; fontStyle?: string };
      itemStyle: object;
    }[]
  ).find((d) => d.value[0] === col && d.value[1] === row);
}

describe('heat map option', () => {
  it('When the user prefers imperial units, then the MAP axis and the tooltips read in psi(a)', () => {
    const option = heatMapOption({ ...INPUT, units: 'imperial' }) as {
      yAxis: { data: string[]; name: string };
      tooltip: { formatter: (p: unknown) => string };
    };
    // 40 kPa = 5.80 psi, 100 kPa = 14.50 psi (1 psi = 6.894757 kPa, NIST SP 811, 2008 edition,
    // Appendix B.8) [S]; labels drop trailing zeros past the first decimal.
    expect(option.yAxis).toMatchObject({ name: 'MAP psi(a)', data: ['5.8', '14.5'] });
    expect(option.tooltip.formatter({ value: [0, 1, 0.5, 70] })).toBe(
      '1000 rpm · 14.5 psi(a)\nVE 70.0 %\nHeld under load: needs data (keeps its value)',
    );
    // The cells stay where they were: only the names of the rows change.
    const data = (input: HeatMapInput) => (heatMapOption(input).series as { data: unknown }[])[0];
    expect(data({ ...INPUT, units: 'imperial' }).data).toEqual(data(INPUT).data);
  });

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
    // Proposal (what the apply writes) shares one range with VE (49–90), so colours compare.
    ['proposal', 0, 0, [0, 0, 0, 49]],
    ['proposal', 1, 1, [1, 1, 1, 90]],
    // Lambda error: lean (+) towards orange (1), rich (−) towards blue (0), clamped at ±10 %.
    ['lambdaError', 0, 0, [0, 0, 0.75, 5]],
    ['lambdaError', 0, 2, [2, 0, 0, -20]],
    ['lambdaError', 1, 0, [0, 1, 0.5, 0]],
    ['lambdaError', 0, 1, undefined],
    // Change (the apply's, against the analysed revision): coloured by the fuel it adds, VE up
    // = richer = blue (towards 0). 90/80 = +12.5 %, clamped at +10 %; 60/60 = 0; held = 0.
    ['change', 1, 1, [1, 1, 0, 12.5]],
    ['change', 0, 2, [2, 0, 0.5, 0]],
    ['change', 1, 0, [0, 1, 0.5, 0]],
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

  it('When a cell changes by a fraction, then the change is new over base, in percent', () => {
    // 49/50 − 1 = −2 %: leaner, towards orange (0.5 + 2/20 = 0.6).
    const [, , t, figure] = item('change', 0, 0)?.value ?? [];
    expect(figure).toBeCloseTo(-2, 10);
    expect(t).toBeCloseTo(0.6, 10);
  });

  it('When the preview has not arrived, then proposal and change show nothing, not the analysis', () => {
    const waiting = { ...INPUT, preview: null };
    expect(layerFigure({ ...waiting, layer: 'proposal' }, 0, 0)).toBeNull();
    expect(layerFigure({ ...waiting, layer: 'change' }, 1, 1)).toBeNull();
    expect(heatLegend({ ...waiting, layer: 'change' }).note).toContain(
      'The figures appear once the preview is computed.',
    );
  });

  it('When cells are measured, filled or held, then their labels and outlines tell them apart', () => {
    // Filled: slanted figures where the layer shows what applies; measured stay upright.
    expect(item('change', 1, 1)?.label.fontStyle).toBe('italic');
    expect(item('proposal', 1, 1)?.label.fontStyle).toBe('italic');
    expect(item('change', 0, 0)?.label.fontStyle).toBeUndefined();
    expect(item('ve', 1, 1)?.label.fontStyle).toBeUndefined();
    // Held: a dashed outline in the cell's text colour, on every layer.
    for (const layer of ['change', 've'] as const) {
      expect(item(layer, 1, 0)?.itemStyle).toMatchObject({ borderType: 'dashed', borderWidth: 2 });
    }
    expect(item('change', 1, 1)?.itemStyle).not.toHaveProperty('borderType');
    expect(heatLegend({ ...INPUT, layer: 'change' }).marks).toBe(HEAT_ORIGIN_MARKS);
    expect(heatLegend({ ...INPUT, layer: 've' }).marks).toBeUndefined();
  });

  it('When the option’s tooltip runs on a held cell, then it says it needs data', () => {
    const option = heatMapOption({ ...INPUT, layer: 'change' }) as {
      tooltip: { formatter: (p: unknown) => string };
    };
    expect(option.tooltip.formatter({ value: [0, 1, 0.5, 0] })).toBe(
      '1000 rpm · 100 kPa\nChange 0.0 % (more fuel)\nHeld under load: needs data (keeps its value)',
    );
    expect(option.tooltip.formatter({ value: [1, 1, 0, 12.5] })).toBe(
      '2000 rpm · 100 kPa\nChange +12.5 % (more fuel)\nFilled from the neighbours',
    );
  });

  it('When there is no analysis, then its layers show no figure', () => {
    const plain = { ...INPUT, analysis: null };
    expect(layerFigure({ ...plain, layer: 'change' }, 0, 0)).toBeNull();
    expect(layerFigure({ ...plain, layer: 've' }, 0, 0)).toBe(50);
  });

  it.each<[HeatLayer, number, string]>([
    ['ve', 82.25, '2000 rpm · 100 kPa\nVE 82.3 %'],
    ['proposal', 60, '2000 rpm · 100 kPa\nApply writes VE 60.0 %'],
    ['change', -3.04, '2000 rpm · 100 kPa\nChange \u22123.0 % (less fuel)'],
    ['lambdaError', 6.44, '2000 rpm · 100 kPa\nLambda error ▲ +6.4 % lean'],
  ])('When the %s tooltip shows %p, then it reads %j', (layer, value, text) => {
    expect(heatTooltip(layer, 2000, 100, value)).toBe(text);
  });

  it.each<[HeatLayer, 'measured' | 'filled' | 'held', string]>([
    ['proposal', 'measured', '2000 rpm · 100 kPa\nApply writes VE 60.0 %\nMeasured by the logs'],
    ['ve', 'filled', '2000 rpm · 100 kPa\nVE 60.0 %'],
    ['ve', 'held', '2000 rpm · 100 kPa\nVE 60.0 %\nHeld under load: needs data (keeps its value)'],
  ])('When the %s tooltip is of a %s cell, then it reads %j', (layer, origin, text) => {
    expect(heatTooltip(layer, 2000, 100, 60, origin)).toBe(text);
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

/** The grid's change overlay and the heat map's change layer read the same preview alike. */
describe('grid and plot agree', () => {
  it('When both show the change, then every figure and every origin mark agree', () => {
    const grid = overlayView({
      kind: 'change',
      values: VALUES,
      baseValues: VALUES,
      analysis: ANALYSIS,
      preview: PREVIEW,
    });
    const series = heatMapOption({ ...INPUT, layer: 'change', selectedCell: null }).series as {
      data: { value: number[]; label: { fontStyle?: string }; itemStyle: object }[];
    }[];
    const plotted = series[0].data;
    expect(plotted).toHaveLength(6);
    for (const { value, label, itemStyle } of plotted) {
      const [col, row, , figure] = value;
      const cell = grid.cells[row][col];
      expect({ row, col, figure }).toEqual({ row, col, figure: cell.value });
      expect({ row, col, slanted: label.fontStyle === 'italic' }).toEqual({
        row,
        col,
        slanted: cell.origin === 'filled',
      });
      expect({ row, col, dashed: 'borderType' in itemStyle }).toEqual({
        row,
        col,
        dashed: cell.isHeld,
      });
    }
  });
});
