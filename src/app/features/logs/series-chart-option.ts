import type { LogSeries, SeriesEnvelope } from '@shared/contracts/logs';
import type { LineSeriesOption } from 'echarts/charts';
import type {
  AxisPointerComponentOption,
  DataZoomComponentOption,
  GridComponentOption,
  TooltipComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';
import {
  keptSpans,
  METRIC_SERIES_LABELS,
  tooltipLines,
  withAlpha,
  type SeriesLabels,
} from './series-view';

/** The chart's option, typed with the parts of ECharts it uses. */
export type SeriesChartOption = ComposeOption<
  | LineSeriesOption
  | GridComponentOption
  | DataZoomComponentOption
  | TooltipComponentOption
  | AxisPointerComponentOption
>;

/** The colours the chart draws with, read from the Material theme's CSS custom properties. */
export interface ChartColours {
  /** Axis labels and names. */
  readonly text: string;
  /** Axis lines. */
  readonly axis: string;
  /** Split lines. */
  readonly grid: string;
  /** Engine speed. */
  readonly rpm: string;
  /** Manifold pressure. */
  readonly map: string;
  /** Measured lambda. */
  readonly lambda: string;
  /** Commanded lambda (drawn dashed as well). */
  readonly target: string;
  /** Throttle. */
  readonly throttle: string;
  /** Kept samples: shading and the strip. */
  readonly kept: string;
  /** Tooltip background. */
  readonly tooltipBackground: string;
  /** Tooltip text. */
  readonly tooltipText: string;
}

/** The zoom, in percent of the whole log. */
export interface ZoomPercent {
  /** Start, 0–100. */
  readonly start: number;
  /** End, 0–100. */
  readonly end: number;
}

/** One stacked panel: what it shows and how tall it is. */
interface Panel {
  readonly id: string;
  readonly name: string;
  readonly heightPx: number;
  readonly isStrip?: boolean;
}

const LEFT_PX = 64;
const RIGHT_PX = 24;
const TOP_PX = 28;
const PANEL_PX = 116;
const STRIP_PX = 36;
const GAP_PX = 30;
const SLIDER_PX = 28;

/** The panels a series needs: throttle only when logged, the kept strip only with a filter. */
export function chartPanels(
  series: LogSeries,
  labels: SeriesLabels = METRIC_SERIES_LABELS,
): Panel[] {
  const panels: Panel[] = [
    { id: 'rpm', name: 'RPM', heightPx: PANEL_PX },
    { id: 'map', name: `MAP, ${labels.pressureUnit}`, heightPx: PANEL_PX },
    { id: 'lambda', name: labels.mixture, heightPx: PANEL_PX },
  ];
  if (series.channels.throttlePct) {
    panels.push({ id: 'throttle', name: 'Throttle, %', heightPx: PANEL_PX });
  }
  if (series.kept) panels.push({ id: 'kept', name: 'Kept, %', heightPx: STRIP_PX, isStrip: true });
  return panels;
}

/** The chart's height in pixels for its panels, slider included. */
export function chartHeightPx(series: LogSeries): number {
  const panels = chartPanels(series);
  const body = panels.reduce((sum, p) => sum + p.heightPx, 0) + GAP_PX * (panels.length - 1);
  return TOP_PX + body + GAP_PX + SLIDER_PX + 12;
}

/** `[time, value]` pairs of one list (null values keep their place as gaps). */
function pairs(timeS: readonly number[], values: readonly (number | null)[]): (number | null)[][] {
  return timeS.map((t, k) => [t, values[k] ?? null]);
}

/** The top and height of an envelope band: lowest, and highest minus lowest, per point. */
function bandSeries(
  id: string,
  panel: number,
  timeS: readonly number[],
  env: SeriesEnvelope,
  colour: string,
): LineSeriesOption[] {
  const spread = env.max.map((max, k) => {
    const min = env.min[k];
    return max === null || min === null ? null : max - min;
  });
  const common: LineSeriesOption = {
    type: 'line',
    xAxisIndex: panel,
    yAxisIndex: panel,
    stack: `${id}-band`,
    showSymbol: false,
    silent: true,
    lineStyle: { opacity: 0 },
    z: 1,
  };
  return [
    { ...common, id: `${id}-low`, data: pairs(timeS, env.min) },
    {
      ...common,
      id: `${id}-spread`,
      data: pairs(timeS, spread),
      areaStyle: { color: withAlpha(colour, 0.22) },
    },
  ];
}

/** The mean line of one channel, shaded where the filter keeps most samples. */
function meanSeries(
  id: string,
  panel: number,
  timeS: readonly number[],
  env: SeriesEnvelope,
  colour: string,
  shade: { spans: readonly (readonly [number, number])[]; colour: string } | null,
  dashed = false,
): LineSeriesOption {
  return {
    type: 'line',
    id: `${id}-mean`,
    name: id,
    xAxisIndex: panel,
    yAxisIndex: panel,
    showSymbol: false,
    data: pairs(timeS, env.mean),
    lineStyle: { color: colour, width: 1.5, type: dashed ? 'dashed' : 'solid' },
    itemStyle: { color: colour },
    z: 3,
    ...(shade && {
      markArea: {
        silent: true,
        itemStyle: { color: shade.colour },
        data: shade.spans.map(([startS, endS]) => [{ xAxis: startS }, { xAxis: endS }]),
      },
    }),
  };
}

/**
 * The ECharts option of a log's stacked panels sharing one time axis: RPM, MAP, measured and
 * commanded lambda, throttle when logged, each as a min–max band around its mean line; stretches
 * where the filter keeps at least half of the samples are shaded in every panel, and a strip at
 * the bottom shows the kept share itself, so the highlight never rests on colour alone. The time
 * axis spans the whole log (`rangeS`) whatever window `series` holds in detail, so the zoom's
 * percentages always mean the same seconds.
 */
export function seriesChartOption(
  series: LogSeries,
  rangeS: readonly [number, number],
  colours: ChartColours,
  zoom: ZoomPercent,
  labels: SeriesLabels = METRIC_SERIES_LABELS,
): SeriesChartOption {
  const panels = chartPanels(series, labels);
  const { timeS, channels } = series;
  const spans = series.kept ? keptSpans(timeS, series.kept) : [];
  const shade = series.kept ? { spans, colour: withAlpha(colours.kept, 0.1) } : null;
  let top = TOP_PX;
  const grids: GridComponentOption[] = panels.map((panel) => {
    const grid = { left: LEFT_PX, right: RIGHT_PX, top, height: panel.heightPx };
    top += panel.heightPx + GAP_PX;
    return grid;
  });
  const lastPanel = panels.length - 1;
  const axisText = { color: colours.text, fontSize: 11 };
  const xAxes = panels.map((_, i) => ({
    type: 'value' as const,
    gridIndex: i,
    min: rangeS[0],
    max: rangeS[1],
    axisLabel: {
      show: i === lastPanel,
      ...axisText,
      hideOverlap: true,
      formatter: (value: number) => `${Number(value.toFixed(1))} s`,
    },
    axisLine: { lineStyle: { color: colours.axis } },
    axisTick: { show: i === lastPanel },
    splitLine: { lineStyle: { color: colours.grid } },
  }));
  const yAxes = panels.map((panel, i) => ({
    type: 'value' as const,
    gridIndex: i,
    name: panel.name,
    nameLocation: 'end' as const,
    nameGap: 8,
    nameTextStyle: { ...axisText, align: 'left' as const, padding: [0, 0, 0, -LEFT_PX + 8] },
    scale: !panel.isStrip,
    ...(panel.isStrip && { min: 0, max: 100, interval: 50 }),
    axisLabel: axisText,
    axisLine: { show: true, lineStyle: { color: colours.axis } },
    splitLine: { lineStyle: { color: colours.grid } },
  }));
  const indexOf = (id: string) => panels.findIndex((p) => p.id === id);
  const lineSeries: LineSeriesOption[] = [
    ...bandSeries('rpm', 0, timeS, channels.rpm, colours.rpm),
    meanSeries('rpm', 0, timeS, channels.rpm, colours.rpm, shade),
    ...bandSeries('map', 1, timeS, channels.mapKpa, colours.map),
    meanSeries('map', 1, timeS, channels.mapKpa, colours.map, shade),
    ...bandSeries('lambda', 2, timeS, channels.lambda, colours.lambda),
    meanSeries('lambda', 2, timeS, channels.lambda, colours.lambda, shade),
    meanSeries('lambdaTarget', 2, timeS, channels.lambdaTarget, colours.target, null, true),
  ];
  if (channels.throttlePct) {
    const panel = indexOf('throttle');
    lineSeries.push(
      ...bandSeries('throttle', panel, timeS, channels.throttlePct, colours.throttle),
      meanSeries('throttle', panel, timeS, channels.throttlePct, colours.throttle, shade),
    );
  }
  if (series.kept) {
    const panel = indexOf('kept');
    lineSeries.push({
      type: 'line',
      id: 'kept-share',
      xAxisIndex: panel,
      yAxisIndex: panel,
      step: 'middle',
      showSymbol: false,
      data: pairs(
        timeS,
        series.kept.map((k) => (k === null ? null : Math.round(k * 1000) / 10)),
      ),
      lineStyle: { color: colours.kept, width: 1 },
      areaStyle: { color: withAlpha(colours.kept, 0.35) },
    });
  }
  const allAxes = panels.map((_, i) => i);
  return {
    animation: false,
    grid: grids,
    xAxis: xAxes,
    yAxis: yAxes,
    axisPointer: { link: [{ xAxisIndex: 'all' }] },
    tooltip: {
      trigger: 'axis',
      // Drawn on the canvas: an HTML tooltip would carry inline styles the CSP refuses.
      renderMode: 'richText',
      backgroundColor: colours.tooltipBackground,
      borderColor: colours.axis,
      textStyle: { color: colours.tooltipText, fontSize: 12 },
      formatter: (params) => {
        const first = Array.isArray(params) ? params[0] : params;
        return first ? tooltipLines(series, first.dataIndex, labels).join('\n') : '';
      },
    },
    dataZoom: [
      { type: 'inside', xAxisIndex: allAxes, filterMode: 'none', ...zoom },
      {
        type: 'slider',
        xAxisIndex: allAxes,
        filterMode: 'none',
        bottom: 8,
        height: SLIDER_PX - 8,
        textStyle: axisText,
        borderColor: colours.axis,
        fillerColor: withAlpha(colours.kept, 0.15),
        ...zoom,
      },
    ],
    series: lineSeries,
  };
}
