import type { LogSeries, SeriesEnvelope } from '@shared/contracts/logs';
import type { MixtureDisplay, UnitSystem } from '@shared/contracts/preferences';
import { mixtureToDisplay, toDisplay, unitLabel } from '../../ui/units/display-units';

/**
 * Pure helpers of the log chart: the stretches the filter keeps, a zoomed-in window spliced into
 * the overview, the zoom window in seconds, colours with transparency and the tooltip's text.
 */

/** At or above this share of kept samples a stretch of the chart is shaded as kept. */
export const KEPT_SHADE_FRACTION = 0.5;

/** A zoom covering at least this share of the log counts as the whole log (no detail fetch). */
const WHOLE_LOG_SHARE = 0.98;

/** A stretch of time, seconds. */
export type TimeSpan = readonly [startS: number, endS: number];

/**
 * The stretches where at least `threshold` of the samples are kept, merged where consecutive.
 * Each point owns the time halfway to its neighbours; the first and last start and end at their
 * own time. A point without samples (null) breaks a stretch.
 */
export function keptSpans(
  timeS: readonly number[],
  kept: readonly (number | null)[],
  threshold = KEPT_SHADE_FRACTION,
): TimeSpan[] {
  const spans: TimeSpan[] = [];
  const last = timeS.length - 1;
  let start: number | null = null;
  for (let k = 0; k <= last; k++) {
    const isKept = (kept[k] ?? -1) >= threshold;
    const before = k === 0 ? timeS[0] : (timeS[k - 1] + timeS[k]) / 2;
    const after = k === last ? timeS[last] : (timeS[k] + timeS[k + 1]) / 2;
    if (isKept && start === null) start = before;
    if (!isKept && start !== null) {
      spans.push([start, before]);
      start = null;
    }
    if (isKept && k === last && start !== null) spans.push([start, after]);
  }
  return spans;
}

/** The window of a zoom given in percent of the whole log, in seconds; null for the whole log. */
export function zoomWindow(
  rangeS: readonly [number, number],
  startPct: number,
  endPct: number,
): { fromS: number; toS: number } | null {
  const [first, last] = rangeS;
  const span = last - first;
  const start = Math.max(0, Math.min(100, startPct)) / 100;
  const end = Math.max(0, Math.min(100, endPct)) / 100;
  if (!(span > 0) || end - start >= WHOLE_LOG_SHARE || !(end > start)) return null;
  return { fromS: first + start * span, toS: first + end * span };
}

function spliceEnvelope(
  outer: SeriesEnvelope,
  inner: SeriesEnvelope,
  before: number,
  after: number,
): SeriesEnvelope {
  const join = (a: (number | null)[], b: (number | null)[]) => [
    ...a.slice(0, before),
    ...b,
    ...a.slice(after),
  ];
  return {
    min: join(outer.min, inner.min),
    max: join(outer.max, inner.max),
    mean: join(outer.mean, inner.mean),
  };
}

/**
 * The overview with a zoomed-in window's finer points in place of its own inside that window,
 * so the chart shows full detail where the user looks and stays whole when they pan away. The
 * funnel and delay are the overview's (they are the whole log's either way).
 */
export function mergeWindow(overview: LogSeries, detail: LogSeries | null): LogSeries {
  if (detail === null) return overview;
  const [fromS, toS] = detail.rangeS;
  const before = overview.timeS.findIndex((t) => t >= fromS);
  const cut = before < 0 ? overview.timeS.length : before;
  const afterIndex = overview.timeS.findIndex((t) => t > toS);
  const after = afterIndex < 0 ? overview.timeS.length : afterIndex;
  const o = overview.channels;
  const d = detail.channels;
  const throttle =
    o.throttlePct && d.throttlePct
      ? spliceEnvelope(o.throttlePct, d.throttlePct, cut, after)
      : null;
  return {
    ...overview,
    timeS: [...overview.timeS.slice(0, cut), ...detail.timeS, ...overview.timeS.slice(after)],
    channels: {
      rpm: spliceEnvelope(o.rpm, d.rpm, cut, after),
      mapKpa: spliceEnvelope(o.mapKpa, d.mapKpa, cut, after),
      lambda: spliceEnvelope(o.lambda, d.lambda, cut, after),
      lambdaTarget: spliceEnvelope(o.lambdaTarget, d.lambdaTarget, cut, after),
      throttlePct: throttle,
    },
    kept:
      overview.kept && detail.kept
        ? [...overview.kept.slice(0, cut), ...detail.kept, ...overview.kept.slice(after)]
        : overview.kept,
  };
}

/**
 * A CSS colour (`rgb(…)`, `rgba(…)` or `#rrggbb`, as getComputedStyle and our palettes give
 * them) with its opacity set to `alpha`; any other text comes back unchanged.
 */
export function withAlpha(colour: string, alpha: number): string {
  const rgb = /^rgba?\(\s*([\d.]+)[\s,]+([\d.]+)[\s,]+([\d.]+)/.exec(colour.trim());
  if (rgb) return `rgba(${rgb[1]}, ${rgb[2]}, ${rgb[3]}, ${alpha})`;
  const hex = /^#([0-9a-f]{6})$/i.exec(colour.trim());
  if (hex) {
    const n = parseInt(hex[1], 16);
    return `rgba(${(n >> 16) & 255}, ${(n >> 8) & 255}, ${n & 255}, ${alpha})`;
  }
  return colour;
}

/** A number with `digits` decimals, or a dash when there is none. */
function figure(value: number | null | undefined, digits: number): string {
  return value === null || value === undefined ? '–' : value.toFixed(digits);
}

/** "mean (min–max)" of one point of an envelope, or the value alone when they agree. */
function envelopeText(env: SeriesEnvelope, k: number, digits: number): string {
  const mean = figure(env.mean[k], digits);
  const min = env.min[k];
  const max = env.max[k];
  if (min === null || max === null || min === max) return mean;
  return `${mean} (${figure(min, digits)}–${figure(max, digits)})`;
}

/** The tooltip's lines for point `k`: time, each channel as mean (min–max), kept share. */
export function tooltipLines(
  series: LogSeries,
  k: number,
  labels: SeriesLabels = METRIC_SERIES_LABELS,
): string[] {
  const c = series.channels;
  const lines = [
    `${figure(series.timeS[k], 2)} s`,
    `RPM ${envelopeText(c.rpm, k, 0)}`,
    `MAP ${envelopeText(c.mapKpa, k, labels.pressureDigits)} ${labels.pressureUnit}`,
    `${labels.mixture} measured ${envelopeText(c.lambda, k, labels.mixtureDigits)}`,
    `${labels.mixture} commanded ${envelopeText(c.lambdaTarget, k, labels.mixtureDigits)}`,
  ];
  if (c.throttlePct) lines.push(`Throttle ${envelopeText(c.throttlePct, k, 1)} %`);
  const kept = series.kept?.[k];
  if (kept !== undefined && kept !== null) {
    lines.push(`Kept by the filter ${Math.round(kept * 100)} %`);
  }
  return lines;
}

/** How the chart names and rounds the pressure and mixture it draws. */
export interface SeriesLabels {
  /** Pressure unit, e.g. "kPa" or "psi(a)". */
  readonly pressureUnit: string;
  /** Decimals of a pressure figure. */
  readonly pressureDigits: number;
  /** "Lambda" or "AFR". */
  readonly mixture: string;
  /** Decimals of a mixture figure. */
  readonly mixtureDigits: number;
}

/** The labels of a series left in the API's units (kPa, lambda). */
export const METRIC_SERIES_LABELS: SeriesLabels = {
  pressureUnit: 'kPa',
  pressureDigits: 1,
  mixture: 'Lambda',
  mixtureDigits: 3,
};

/** An envelope with every figure passed through `convert` (nulls stay null). */
function convertEnvelope(env: SeriesEnvelope, convert: (v: number) => number): SeriesEnvelope {
  const each = (values: readonly (number | null)[]) =>
    values.map((v) => (v === null ? null : convert(v)));
  return { min: each(env.min), max: each(env.max), mean: each(env.mean) };
}

/**
 * A series in the user's units: MAP in psi(a) for imperial, lambda and its target as AFR (with
 * the vehicle's stoichiometric ratio) when the user reads AFR; RPM, throttle and the kept share
 * are the same in every display. Without a stoichiometric ratio, mixture stays lambda.
 */
export function seriesInDisplayUnits(
  series: LogSeries,
  units: UnitSystem,
  mixture: MixtureDisplay,
  stoichAfr: number | null,
): { readonly series: LogSeries; readonly labels: SeriesLabels } {
  const afr = mixture === 'afr' && stoichAfr !== null;
  const toMixture = (lambda: number) =>
    afr ? mixtureToDisplay(lambda, 'afr', stoichAfr as number) : lambda;
  const c = series.channels;
  return {
    series: {
      ...series,
      channels: {
        ...c,
        mapKpa: convertEnvelope(c.mapKpa, (kpa) => toDisplay('pressure', kpa, units)),
        lambda: convertEnvelope(c.lambda, toMixture),
        lambdaTarget: convertEnvelope(c.lambdaTarget, toMixture),
      },
    },
    labels: {
      pressureUnit: unitLabel('pressure', units),
      pressureDigits: units === 'imperial' ? 2 : 1,
      mixture: afr ? 'AFR' : 'Lambda',
      mixtureDigits: afr ? 2 : 3,
    },
  };
}
