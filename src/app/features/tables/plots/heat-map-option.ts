import { type LegendView, ORIGIN_LABEL } from '../grid/overlays';
import type { CellOrigin, PreviewResult } from '../preview/proposal-preview-compute';
/**
 * The table as an ECharts heat map: RPM across, MAP up, every cell coloured on our OKLab scales
 * (sequential for VE and proposal, diverging around zero for change and lambda error) and
 * labelled with its figure, the picked cell outlined. Pure: data in, option object out.
 */
import type { HeatmapSeriesOption } from 'echarts/charts';
import type {
  GridComponentOption,
  TooltipComponentOption,
  VisualMapComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';
import type { UnitSystem } from '@shared/contracts/preferences';
import type { AnalysisResource } from '../../../core/api/analyses-api';
import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  colourAt,
  gradientCss,
  readableTextColour,
} from '../../../ui/parts/colour-scale';
import type { ChartTheme } from './chart-theme';
import {
  type CellRef,
  DIVERGING_LIMIT_PCT,
  MINUS,
  NO_FIGURE,
  lambdaErrorText,
  mapScale,
  sampleStops,
  signed,
} from './plot-format';

/** An ECharts option of the heat map. */
export type HeatMapOption = ComposeOption<
  HeatmapSeriesOption | GridComponentOption | TooltipComponentOption | VisualMapComponentOption
>;

/** What the heat map colours. */
export type HeatLayer = 've' | 'proposal' | 'change' | 'lambdaError';

/** One choice of the layer switch. */
export interface HeatLayerOption {
  /** The layer. */
  readonly layer: HeatLayer;
  /** Its label. */
  readonly label: string;
  /** Whether it needs an analysis. */
  readonly needsAnalysis: boolean;
}

/** The layers in the order of the switch. */
export const HEAT_LAYERS: readonly HeatLayerOption[] = [
  { layer: 've', label: 'VE', needsAnalysis: false },
  { layer: 'proposal', label: 'Proposal', needsAnalysis: true },
  { layer: 'change', label: 'Change %', needsAnalysis: true },
  { layer: 'lambdaError', label: 'Lambda error %', needsAnalysis: true },
];

/** The data of the heat map. */
export interface HeatMapInput {
  /** RPM breakpoints (columns), ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa (rows), ascending. */
  readonly mapAxisKpa: readonly number[];
  /** VE now, `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /** VE of the revision the analysis ran on, `[row][col]`: what the change is measured from. */
  readonly baseValues: readonly (readonly number[])[];
  /** The analysis, if any. */
  readonly analysis: AnalysisResource | null;
  /**
   * The live preview of applying the analysis: the proposal and change layers show what the
   * apply would write, and nothing until it arrives (as the grid's overlays).
   */
  readonly preview: PreviewResult | null;
  /** The layer shown. */
  readonly layer: HeatLayer;
  /** The cell to outline. */
  readonly selectedCell: CellRef | null;
  /** The frame's colours. */
  readonly theme: ChartTheme;
  /** The user's units: the MAP axis and tooltips in kPa, or psi(a) for imperial (default metric). */
  readonly units?: UnitSystem;
}

/** The legend under a plot: the grid's own legend shape (gradient, labelled ends, a note). */
export type PlotLegend = LegendView;

/** A heat map cell as ECharts data: `[col, row, colour position 0–1, figure]`. */
type HeatDatum = [number, number, number, number];

/** The figure a layer shows in a cell, or null. */
export function layerFigure(input: HeatMapInput, row: number, col: number): number | null {
  const cell = input.analysis?.cells[row]?.[col];
  let value: number | null | undefined;
  switch (input.layer) {
    case 've':
      value = input.values[row]?.[col];
      break;
    case 'proposal':
      value = input.analysis ? input.preview?.values[row]?.[col] : null;
      break;
    case 'change': {
      const proposed = input.analysis ? input.preview?.values[row]?.[col] : undefined;
      const base = input.baseValues[row]?.[col];
      value =
        proposed === undefined || base === undefined || base === 0
          ? null
          : (proposed / base - 1) * 100;
      break;
    }
    case 'lambdaError':
      value = cell?.lambdaErrorPct;
      break;
  }
  return value === null || value === undefined || !Number.isFinite(value) ? null : value;
}

/** The lowest and highest of the finite figures (0–1 when none). */
function extent(figures: readonly (number | null)[]): [number, number] {
  const finite = figures.filter((v): v is number => v !== null);
  return finite.length ? [Math.min(...finite), Math.max(...finite)] : [0, 1];
}

/**
 * Where a figure sits on its layer's scale, 0–1. VE and proposal share the range of both so
 * their colours compare; change is coloured by the fuel it adds (VE up = richer = blue), lambda
 * error by the mixture (lean = orange), both clamped at ±{@link DIVERGING_LIMIT_PCT}.
 */
function position(layer: HeatLayer, value: number, [lo, hi]: [number, number]): number {
  const signedT = (v: number) => Math.min(1, Math.max(0, 0.5 + v / (2 * DIVERGING_LIMIT_PCT)));
  if (layer === 'change') return signedT(-value);
  if (layer === 'lambdaError') return signedT(value);
  return hi > lo ? (value - lo) / (hi - lo) : 0.5;
}

/** The sequential range of VE and proposal together. */
function sequentialRange(input: HeatMapInput): [number, number] {
  const ve = input.values.flat();
  const proposal = input.analysis ? (input.preview?.values ?? []).flat() : [];
  return extent(input.layer === 'proposal' ? [...ve, ...proposal] : ve);
}

/** Whether a layer shows what the apply writes, and so tells how each cell got there. */
function showsOrigin(layer: HeatLayer): boolean {
  return layer === 'proposal' || layer === 'change';
}

/** How the apply sets a cell, from the preview; null without one. */
function originAt(input: HeatMapInput, row: number, col: number): CellOrigin | null {
  return input.analysis ? (input.preview?.origin[row]?.[col] ?? null) : null;
}

/** The text of a figure in a cell (short: the tooltip says the rest). */
function cellText(layer: HeatLayer, value: number): string {
  return layer === 'change' || layer === 'lambdaError' ? signed(value) : value.toFixed(1);
}

/**
 * The tooltip of a cell: its breakpoints (MAP in the user's units), its figure and what the
 * figure means, and how the apply sets it (the proposal and change layers; a held cell says so
 * on every layer).
 */
export function heatTooltip(
  layer: HeatLayer,
  rpm: number,
  mapKpa: number,
  value: number,
  origin: CellOrigin | null = null,
  units: UnitSystem = 'metric',
): string {
  const scale = mapScale(units);
  const where = `${rpm} rpm · ${scale.label(mapKpa)} ${scale.unit}`;
  const how =
    origin && (showsOrigin(layer) || origin === 'held') ? `\n${ORIGIN_LABEL[origin]}` : '';
  switch (layer) {
    case 've':
      return `${where}\nVE ${value.toFixed(1)} %${how}`;
    case 'proposal':
      return `${where}\nApply writes VE ${value.toFixed(1)} %${how}`;
    case 'change':
      return `${where}\nChange ${signed(value)} % (${value >= 0 ? 'more fuel' : 'less fuel'})${how}`;
    case 'lambdaError':
      return `${where}\nLambda error ${lambdaErrorText(value)}${how}`;
  }
}

/** The heat map's ECharts option. */
export function heatMapOption(input: HeatMapInput): HeatMapOption {
  const { rpmAxis, mapAxisKpa, theme, layer, units = 'metric' } = input;
  const scale = mapScale(units);
  const figures = mapAxisKpa.map((_, r) => rpmAxis.map((_, c) => layerFigure(input, r, c)));
  const range = sequentialRange(input);
  const diverging = layer === 'change' || layer === 'lambdaError';
  const data: NonNullable<HeatmapSeriesOption['data']> = [];
  let picked: (typeof data)[number] | null = null;
  figures.forEach((row, r) =>
    row.forEach((value, c) => {
      if (value === null) return;
      const t = position(layer, value, range);
      const background = colourAt(diverging ? DIVERGING_STOPS : SEQUENTIAL_STOPS, t);
      const text = readableTextColour(background);
      const datum: HeatDatum = [c, r, t, value];
      const origin = originAt(input, r, c);
      // Filled cells have slanted figures where the layer shows what the apply writes (as in
      // the grid); held ones a dashed outline in their text colour on every layer.
      const label =
        origin === 'filled' && showsOrigin(layer)
          ? { color: text, fontStyle: 'italic' as const }
          : { color: text };
      if (input.selectedCell?.row === r && input.selectedCell?.col === c) {
        // Outlined in its own text colour, which contrasts with the cell in either scheme.
        picked = {
          value: datum,
          label,
          itemStyle: {
            borderColor: text,
            borderWidth: 3,
            ...(origin === 'held' ? { borderType: 'dashed' as const } : {}),
          },
        };
        return;
      }
      data.push({
        value: datum,
        label,
        itemStyle:
          origin === 'held'
            ? { borderColor: text, borderWidth: 2, borderType: 'dashed' }
            : { borderColor: theme.surface, borderWidth: 1 },
      });
    }),
  );
  // Drawn last, so no neighbour's border covers the outline.
  if (picked) data.push(picked);
  const axisLabel = { color: theme.text, fontSize: 11 };
  const nameTextStyle = { color: theme.mutedText };
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { color: theme.text },
    grid: { left: 64, right: 16, top: 16, bottom: 48 },
    tooltip: {
      // Drawn on the canvas: an HTML tooltip carries inline styles the CSP refuses.
      renderMode: 'richText',
      backgroundColor: theme.surface,
      borderColor: theme.gridLine,
      textStyle: { color: theme.text },
      formatter: (params) => {
        const value = (params as { value?: unknown }).value as HeatDatum | undefined;
        if (!value) return '';
        const origin = originAt(input, value[1], value[0]);
        const [col, row, , figure] = value;
        return heatTooltip(layer, rpmAxis[col], mapAxisKpa[row], figure, origin, units);
      },
    },
    xAxis: {
      type: 'category',
      name: 'RPM',
      nameLocation: 'middle',
      nameGap: 28,
      nameTextStyle,
      data: rpmAxis.map(String),
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
      splitArea: { show: false },
    },
    yAxis: {
      type: 'category',
      name: `MAP ${scale.unit}`,
      nameLocation: 'middle',
      nameGap: 44,
      nameTextStyle,
      data: mapAxisKpa.map(scale.label),
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
    },
    // ECharts colours a heat map through a visual map: it gets our scale, sampled in OKLab.
    visualMap: {
      show: false,
      type: 'continuous',
      dimension: 2,
      min: 0,
      max: 1,
      seriesIndex: 0,
      inRange: { color: sampleStops(diverging ? DIVERGING_STOPS : SEQUENTIAL_STOPS) },
    },
    series: [
      {
        type: 'heatmap',
        name: HEAT_LAYERS.find((l) => l.layer === layer)?.label ?? layer,
        data,
        label: {
          show: true,
          fontSize: 10,
          formatter: (params) => {
            const value = (params as { value?: unknown }).value as HeatDatum | undefined;
            return value ? cellText(layer, value[3]) : NO_FIGURE;
          },
        },
        emphasis: { itemStyle: { borderColor: theme.text, borderWidth: 2 } },
      },
    ],
  };
}

/** How the origin marks read on the heat map. */
export const HEAT_ORIGIN_MARKS =
  'Upright figures: measured by the logs. Slanted figures: filled from the neighbours. Dashed outline: held under load, needs data (keeps its value). Hover a cell for its words.';

/**
 * The legend of a layer, sequential ones labelled with the ends of their colour range; the
 * proposal and change layers add how their marks read, or say they wait for the preview.
 */
export function heatLegend(input: HeatMapInput): PlotLegend {
  const legend = layerLegend(input);
  if (!showsOrigin(input.layer)) return legend;
  return input.preview
    ? { ...legend, marks: HEAT_ORIGIN_MARKS }
    : { ...legend, note: `${legend.note} The figures appear once the preview is computed.` };
}

function layerLegend(input: HeatMapInput): PlotLegend {
  const limit = DIVERGING_LIMIT_PCT;
  if (input.layer === 'lambdaError') {
    return {
      gradient: gradientCss(DIVERGING_STOPS),
      low: `▼ ${MINUS}${limit} % rich`,
      mid: '0',
      high: `▲ +${limit} % lean`,
      note: 'Measured against commanded lambda. Beyond ±10 % takes the full colour.',
    };
  }
  if (input.layer === 'change') {
    return {
      gradient: gradientCss(DIVERGING_STOPS),
      low: `+${limit} % VE up`,
      mid: '0',
      high: `${MINUS}${limit} % VE down`,
      note: 'Change of VE the apply would write with the panel’s options, in the colours of the fuel it adds: more fuel blue, less orange.',
    };
  }
  const [lo, hi] = sequentialRange(input);
  return {
    gradient: gradientCss(SEQUENTIAL_STOPS),
    low: `${lo.toFixed(1)} %`,
    mid: '',
    high: `${hi.toFixed(1)} %`,
    note:
      input.layer === 've'
        ? 'VE now, in percent; MAP rises upwards.'
        : 'VE the apply would write with the panel’s options, on the same colours as VE now.',
  };
}
