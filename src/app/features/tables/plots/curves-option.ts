/**
 * The table as curves: VE against RPM, one line per MAP breakpoint, coloured along our
 * sequential scale from low to high MAP. Easier to read than a 3-D surface: a kink or a step
 * between neighbours shows at once. The picked cell's line is drawn bold with what the apply
 * would write (the live preview) dashed beside it. Pure: data in, option object out.
 */
import type { LineSeriesOption, ScatterSeriesOption } from 'echarts/charts';
import type {
  GridComponentOption,
  LegendComponentOption,
  TooltipComponentOption,
} from 'echarts/components';
import type { ComposeOption } from 'echarts/core';
import type { UnitSystem } from '@shared/contracts/preferences';
import { SEQUENTIAL_STOPS, colourAt } from '../../../ui/parts/colour-scale';
import type { ChartTheme } from './chart-theme';
import { type CellRef, mapScale } from './plot-format';

/** An ECharts option of the curves. */
export type CurvesOption = ComposeOption<
  | LineSeriesOption
  | ScatterSeriesOption
  | GridComponentOption
  | LegendComponentOption
  | TooltipComponentOption
>;

/** The data of the curves. */
export interface CurvesInput {
  /** RPM breakpoints, ascending. */
  readonly rpmAxis: readonly number[];
  /** MAP breakpoints in kPa, ascending. */
  readonly mapAxisKpa: readonly number[];
  /** VE now, `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /**
   * What applying the analysis would write (the live preview), `[row][col]`: the picked row's
   * dashed line; null draws none.
   */
  readonly proposal: readonly (readonly number[])[] | null;
  /** The picked cell: its row is drawn bold. */
  readonly selectedCell: CellRef | null;
  /** The frame's colours. */
  readonly theme: ChartTheme;
  /** The user's units: each line named in kPa, or psi(a) for imperial (default metric). */
  readonly units?: UnitSystem;
}

/**
 * The colour of MAP row `row` of `rows`. The palest end of the sequential scale vanishes on a
 * light page and the darkest on a dark one, so each scheme uses the three quarters that read.
 */
export function rowColour(row: number, rows: number, isDark: boolean): string {
  const t = rows > 1 ? row / (rows - 1) : 0.5;
  const [from, to] = isDark ? [0.25, 1] : [0, 0.75];
  return colourAt(SEQUENTIAL_STOPS, from + t * (to - from));
}

/** The name of a MAP row's line, in the user's units ("100 kPa", "14.5 psi(a)"). */
export function rowName(mapKpa: number, units: UnitSystem = 'metric'): string {
  const scale = mapScale(units);
  return `${scale.label(mapKpa)} ${scale.unit}`;
}

/** The curves' ECharts option. */
export function curvesOption(input: CurvesInput): CurvesOption {
  const { rpmAxis, mapAxisKpa, values, theme, selectedCell, units = 'metric' } = input;
  const rows = mapAxisKpa.length;
  const series: (LineSeriesOption | ScatterSeriesOption)[] = mapAxisKpa.map((mapKpa, r) => {
    const isPicked = selectedCell?.row === r;
    const colour = rowColour(r, rows, theme.isDark);
    return {
      type: 'line',
      name: rowName(mapKpa, units),
      data: rpmAxis.map((rpm, c) => [rpm, values[r]?.[c] ?? null]),
      color: colour,
      symbol: 'circle',
      symbolSize: isPicked ? 7 : 4,
      lineStyle: { width: isPicked ? 3.5 : 1.5 },
      z: isPicked ? 3 : 2,
      emphasis: { focus: 'series' },
    };
  });
  if (selectedCell) {
    const r = selectedCell.row;
    const colour = rowColour(r, rows, theme.isDark);
    const proposal = input.proposal?.[r];
    if (proposal) {
      series.push({
        type: 'line',
        name: `${rowName(mapAxisKpa[r], units)} proposal`,
        data: rpmAxis.map((rpm, c) => [rpm, proposal[c] ?? null]),
        color: colour,
        symbol: 'emptyCircle',
        symbolSize: 6,
        lineStyle: { width: 2, type: 'dashed' },
        z: 3,
      });
    }
    const ve = values[r]?.[selectedCell.col];
    if (ve !== undefined) {
      series.push({
        type: 'scatter',
        name: 'Picked cell',
        data: [[rpmAxis[selectedCell.col], ve]],
        symbol: 'circle',
        symbolSize: 14,
        itemStyle: { color: 'transparent', borderColor: theme.text, borderWidth: 2 },
        z: 4,
        tooltip: { show: false },
      });
    }
  }
  const axisLabel = { color: theme.text, fontSize: 11 };
  const nameTextStyle = { color: theme.mutedText };
  return {
    backgroundColor: 'transparent',
    animation: false,
    textStyle: { color: theme.text },
    grid: { left: 56, right: 120, top: 16, bottom: 48 },
    legend: {
      type: 'scroll',
      orient: 'vertical',
      right: 0,
      top: 8,
      bottom: 8,
      textStyle: { color: theme.text, fontSize: 11 },
      pageTextStyle: { color: theme.text },
      pageIconColor: theme.text,
      pageIconInactiveColor: theme.gridLine,
      inactiveColor: theme.gridLine,
    },
    tooltip: {
      // Drawn on the canvas: an HTML tooltip carries inline styles the CSP refuses.
      renderMode: 'richText',
      trigger: 'axis',
      backgroundColor: theme.surface,
      borderColor: theme.gridLine,
      textStyle: { color: theme.text },
      valueFormatter: (value) => (typeof value === 'number' ? `${value.toFixed(1)} %` : '–'),
    },
    xAxis: {
      type: 'value',
      name: 'RPM',
      nameLocation: 'middle',
      nameGap: 28,
      nameTextStyle,
      min: rpmAxis[0],
      max: rpmAxis[rpmAxis.length - 1],
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
      splitLine: { lineStyle: { color: theme.gridLine, type: 'dashed' } },
    },
    yAxis: {
      type: 'value',
      name: 'VE %',
      nameLocation: 'middle',
      nameGap: 40,
      nameTextStyle,
      scale: true,
      axisLabel,
      axisLine: { lineStyle: { color: theme.line } },
      splitLine: { lineStyle: { color: theme.gridLine, type: 'dashed' } },
    },
    series,
  };
}
