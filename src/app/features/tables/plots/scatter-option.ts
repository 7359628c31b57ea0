/**
 * The samples an analysis kept, scattered over RPM × MAP and coloured by lambda error on our
 * diverging scale. Lean samples are upward triangles, rich ones downward, so the sign reads
 * without colour; the table's breakpoints are drawn as dashed lines so each sample's cell shows.
 * Pure: data in, option object out.
 */
import type { ScatterSeriesOption } from 'echarts/charts';
import type {
  GridComponentOption,
  LegendComponentOption,
  MarkLineComponentOption,
  TooltipComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';
import type { UnitSystem } from '@shared/contracts/preferences';
import type { AnalysisSamples } from '../../../core/api/analyses-api';
import { DIVERGING_STOPS, divergingColour, gradientCss } from '../../../ui/parts/colour-scale';
import type { ChartTheme } from './chart-theme';
import type { PlotLegend } from './heat-map-option';
import { DIVERGING_LIMIT_PCT, MINUS, grouped, lambdaErrorText, mapScale } from './plot-format';

/** An ECharts option of the samples. */
export type ScatterOption = ComposeOption<
  | ScatterSeriesOption
  | GridComponentOption
  | LegendComponentOption
  | MarkLineComponentOption
  | TooltipComponentOption
>;

/** The data of the samples plot. */
export interface ScatterInput {
  /** RPM breakpoints, ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa, ascending. */
  readonly mapAxisKpa: readonly number[];
  /** The samples, as the API returns them. */
  readonly samples: AnalysisSamples;
  /** The frame's colours. */
  readonly theme: ChartTheme;
  /** The user's units: the MAP axis in kPa, or psi(a) for imperial (default metric). */
  readonly units?: UnitSystem;
}

/**
 * A sample as ECharts data: `[rpm, MAP in the shown unit (kPa, or psi(a) for imperial), lambda
 * error %, log index]`. The MAP is converted so the value axis reads in the user's unit.
 */
export type SampleDatum = [number, number, number, number];

/** A downward triangle for the legend (ECharts path syntax). */
export const DOWN_TRIANGLE = 'path://M0,0L10,0L5,10Z';

/** A sample with its own colour, as a series data item. */
interface SampleItem {
  /** The sample. */
  value: SampleDatum;
  /** Its colour on the diverging scale. */
  itemStyle: { color: string };
}

/** Names of the two series, also their legend entries. */
export const SAMPLE_SERIES = { lean: '▲ Leaner than commanded', rich: '▼ Richer or on target' };

/**
 * The colour of a lambda error, rounded to 0.1 % first: a handful of distinct colours instead
 * of one OKLab conversion per sample, with no step a reader could see.
 */
function errorColour(errorPct: number, cache: Map<number, string>): string {
  const key = Math.round(errorPct * 10) / 10;
  let colour = cache.get(key);
  if (colour === undefined) {
    colour = divergingColour(key, DIVERGING_LIMIT_PCT);
    cache.set(key, colour);
  }
  return colour;
}

/** The lowest and highest of `values`, rounded outwards to a multiple of `step` (none if empty). */
function dataRange(values: readonly number[], step: number): number[] {
  if (values.length === 0) return [];
  let lo = Infinity;
  let hi = -Infinity;
  for (const v of values) {
    if (v < lo) lo = v;
    if (v > hi) hi = v;
  }
  return [Math.floor(lo / step) * step, Math.ceil(hi / step) * step];
}

/** The tooltip of one sample (its MAP already in the unit of `units`). */
export function sampleTooltip(datum: SampleDatum, units: UnitSystem = 'metric'): string {
  const [rpm, map, errorPct, log] = datum;
  const scale = mapScale(units);
  return (
    `${grouped(rpm)} rpm · ${map.toFixed(scale.digits)} ${scale.unit}\n` +
    `Lambda error ${lambdaErrorText(errorPct)}\nLog ${log + 1}`
  );
}

/** The samples' ECharts option. */
export function scatterOption(input: ScatterInput): ScatterOption {
  const { rpmAxis, mapAxisKpa, samples, theme, units = 'metric' } = input;
  const scale = mapScale(units);
  const mapShown = units === 'metric' ? samples.mapKpa : samples.mapKpa.map(scale.toShown);
  const breakpointsShown = mapAxisKpa.map(scale.toShown);
  const cache = new Map<number, string>();
  const lean: SampleItem[] = [];
  const rich: SampleItem[] = [];
  for (let i = 0; i < samples.returned; i++) {
    const datum: SampleDatum = [
      samples.rpm[i],
      mapShown[i],
      samples.lambdaErrorPct[i],
      samples.logIndex[i],
    ];
    const item = { value: datum, itemStyle: { color: errorColour(datum[2], cache) } };
    (datum[2] > 0 ? lean : rich).push(item);
  }
  const breakpoints: MarkLineComponentOption = {
    silent: true,
    symbol: 'none',
    animation: false,
    label: { show: false },
    lineStyle: { color: theme.gridLine, type: 'dashed', width: 1 },
    data: [
      ...rpmAxis.map((rpm) => ({ xAxis: rpm })),
      ...breakpointsShown.map((map) => ({ yAxis: map })),
    ],
  };
  const common: ScatterSeriesOption = {
    type: 'scatter',
    symbolSize: 6,
    // On a light page a thin outline keeps pale near-zero samples visible; a dark page needs none.
    itemStyle: theme.isDark
      ? { opacity: 0.9 }
      : { borderColor: theme.line, borderWidth: 0.4, opacity: 0.9 },
    emphasis: { scale: 1.8 },
  };
  // Samples beyond the table's ends count for its edge cells; the axes reach out to show them.
  const rpmRange = dataRange(samples.rpm, 100);
  const mapRange = dataRange(mapShown, scale.step);
  const axisLabel = { color: theme.text, fontSize: 11 };
  const nameTextStyle = { color: theme.mutedText };
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { color: theme.text },
    grid: { left: 56, right: 16, top: 40, bottom: 48 },
    legend: {
      top: 4,
      // The legend draws symbols unrotated: the rich one gets a downward triangle of its own.
      data: [
        { name: SAMPLE_SERIES.lean, icon: 'triangle' },
        { name: SAMPLE_SERIES.rich, icon: DOWN_TRIANGLE },
      ],
      textStyle: { color: theme.text },
      inactiveColor: theme.gridLine,
    },
    tooltip: {
      // Drawn on the canvas: an HTML tooltip carries inline styles the CSP refuses.
      renderMode: 'richText',
      trigger: 'item',
      backgroundColor: theme.surface,
      borderColor: theme.gridLine,
      textStyle: { color: theme.text },
      formatter: (params) => {
        const value = (params as { value?: unknown }).value as SampleDatum | undefined;
        return value ? sampleTooltip(value, units) : '';
      },
    },
    xAxis: {
      type: 'value',
      name: 'RPM',
      nameLocation: 'middle',
      nameGap: 28,
      nameTextStyle,
      min: Math.min(rpmAxis[0], ...rpmRange),
      max: Math.max(rpmAxis[rpmAxis.length - 1], ...rpmRange),
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
      splitLine: { show: false },
    },
    yAxis: {
      type: 'value',
      name: `MAP ${scale.unit}`,
      nameLocation: 'middle',
      nameGap: 40,
      nameTextStyle,
      min: Math.min(breakpointsShown[0], ...mapRange),
      max: Math.max(breakpointsShown[breakpointsShown.length - 1], ...mapRange),
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
      splitLine: { show: false },
    },
    series: [
      {
        ...common,
        name: SAMPLE_SERIES.lean,
        // The legend's swatch: a clearly lean colour (each sample carries its own).
        color: divergingColour(0.7 * DIVERGING_LIMIT_PCT, DIVERGING_LIMIT_PCT),
        symbol: 'triangle',
        data: lean,
        markLine: breakpoints,
      },
      {
        ...common,
        name: SAMPLE_SERIES.rich,
        color: divergingColour(-0.7 * DIVERGING_LIMIT_PCT, DIVERGING_LIMIT_PCT),
        symbol: 'triangle',
        symbolRotate: 180,
        data: rich,
      },
    ],
  };
}

/** One sentence on what the plot shows: how many samples out of how many kept. */
export function samplesCaption(samples: AnalysisSamples): string {
  if (samples.total === 0) return 'The analysis kept no samples.';
  if (samples.returned === samples.total) {
    return `All ${grouped(samples.total)} samples the analysis kept.`;
  }
  const shown = `${grouped(samples.returned)} of ${grouped(samples.total)}`;
  return `${shown} kept samples, evenly spread over the logs.`;
}

/** The legend under the samples: the diverging scale of lambda error and the two markers. */
export function samplesLegend(): PlotLegend {
  return {
    gradient: gradientCss(DIVERGING_STOPS),
    low: `▼ ${MINUS}${DIVERGING_LIMIT_PCT} % rich`,
    mid: '0',
    high: `▲ +${DIVERGING_LIMIT_PCT} % lean`,
    note:
      'Each kept sample, measured against commanded lambda: ▲ leaner, ▼ richer or on target. ' +
      'Dashed lines are the table’s breakpoints.',
  };
}
