import type { AnalysisResource, LeanFlag } from '../../../core/api/analyses-api';
import { LEAN_SEVERITY } from '../analysis/analysis-text';
import type { CellOrigin, PreviewResult } from '../preview/proposal-preview-compute';
import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  divergingColour,
  gradientCss,
  readableTextColour,
  sequentialColour,
} from '../../../ui/parts/colour-scale';

/** What the grid's cells show. */
export type OverlayKind =
  've' | 'coverage' | 'samples' | 'spread' | 'lambdaError' | 'proposal' | 'change';

/** One choice of the overlay switch. */
export interface OverlayOption {
  /** The overlay. */
  readonly kind: OverlayKind;
  /** Its label on the switch. */
  readonly label: string;
  /** Whether it shows an analysis's results (and needs one to be run). */
  readonly needsAnalysis: boolean;
}

/** The overlays in the order of the switch. */
export const OVERLAYS: readonly OverlayOption[] = [
  { kind: 've', label: 'VE', needsAnalysis: false },
  { kind: 'coverage', label: 'Coverage', needsAnalysis: true },
  { kind: 'samples', label: 'Samples', needsAnalysis: true },
  { kind: 'spread', label: 'Spread', needsAnalysis: true },
  { kind: 'lambdaError', label: 'Lambda error %', needsAnalysis: true },
  { kind: 'proposal', label: 'Proposal', needsAnalysis: true },
  { kind: 'change', label: 'Change vs base %', needsAnalysis: true },
];

/** Lambda error and change at or beyond this many percent take the full hue. */
export const DIVERGING_LIMIT_PCT = 10;

/** What one cell shows. */
export interface CellView {
  /** The number behind the cell (null: nothing to show). */
  readonly value: number | null;
  /** The cell text, sign and glyph included where the overlay is signed. */
  readonly text: string;
  /** Background colour, null for none. */
  readonly background: string | null;
  /** Text colour chosen for contrast with the background, null with no background. */
  readonly foreground: string | null;
  /** Whether the analysis flagged the cell lean under load with enough data ("warning", "stop"). */
  readonly isLeanFlag: boolean;
  /** Whether the cell looks lean under load but rests on too little data ("watch"). */
  readonly isLeanWatch: boolean;
  /** Whether the VE differs from the loaded revision (an unsaved edit). */
  readonly isEdited: boolean;
  /**
   * How the apply would set the cell (measured, filled, held…), shown by the proposal and change
   * overlays; null elsewhere and without a preview.
   */
  readonly origin: CellOrigin | null;
  /** Whether the preview's guard holds the cell under load: it needs data (every overlay). */
  readonly isHeld: boolean;
  /** The cell's marks in words, for its title; null when it has none. */
  readonly title: string | null;
}

/** What the legend under the grid shows. */
export interface LegendView {
  /** A CSS gradient of the scale. */
  readonly gradient: string;
  /** Label of the left end. */
  readonly low: string;
  /** Label of the middle (diverging scales). */
  readonly mid: string;
  /** Label of the right end. */
  readonly high: string;
  /** One sentence on how to read it. */
  readonly note: string;
  /** How the cells' marks read (measured, filled, held), when the view has marks; else absent. */
  readonly marks?: string;
}

/** The data an overlay is computed from. */
export interface OverlayInput {
  /** The overlay. */
  readonly kind: OverlayKind;
  /** The VE being edited, `[row][col]`. */
  readonly values: readonly (readonly number[])[];
  /** The VE of the loaded revision, to mark unsaved edits. */
  readonly baseValues: readonly (readonly number[])[];
  /** The analysis, if one was run. */
  readonly analysis: AnalysisResource | null;
  /**
   * The live preview of applying the analysis (what the apply would write, and how each cell got
   * there). The proposal and change overlays show it, and nothing until it arrives: the
   * analysis's own proposal is before fill, smoothing and the guard, so it is not what applies.
   */
  readonly preview?: PreviewResult | null;
}

/** What a cell's origin means, for a grid cell's title. */
export const ORIGIN_TEXT: Readonly<Record<CellOrigin, string>> = {
  measured: 'Measured: corrected from logged data.',
  filled: 'Filled: a guess from the neighbours’ correction (no trusted data here).',
  held: 'Held under load, needs data: a guess would have made this cell leaner than the fuel-safety allowance, so it keeps its value until a log measures it.',
  locked: 'Locked: keeps its value.',
  unchanged: 'Unchanged by the apply.',
};

/** A cell's origin in a few words, for chart tooltips and the cell detail. */
export const ORIGIN_LABEL: Readonly<Record<CellOrigin, string>> = {
  measured: 'Measured by the logs',
  filled: 'Filled from the neighbours',
  held: 'Held under load: needs data (keeps its value)',
  locked: 'Locked: keeps its value',
  unchanged: 'Unchanged by the apply',
};

/** How the origin marks read, under the proposal and change overlays. */
export const ORIGIN_MARKS =
  'Upright figures: measured by the logs. Slanted figures: filled from the neighbours. Hand mark on dots: held under load, needs data (keeps its value). Hover a cell for its words.';

/** A lean flag in words, for a cell's title. */
function flagTitle(flag: LeanFlag): string {
  const { word, action } = LEAN_SEVERITY[flag.severity];
  return flag.severity === 'watch'
    ? `Looks lean under load (${word}): ${action}.`
    : `Lean under load (${word}): ${action}.`;
}

const MINUS = '\u2212';
const NO_DATA = '–';

/** A signed figure with a glyph: "▲ +4.2", "▼ −3.1", "0.0" (rounding to zero has no sign). */
export function signedFigure(value: number, digits = 1): string {
  const rounded = Number(value.toFixed(digits));
  if (rounded === 0) return (0).toFixed(digits);
  const magnitude = Math.abs(rounded).toFixed(digits);
  return rounded > 0 ? `▲ +${magnitude}` : `▼ ${MINUS}${magnitude}`;
}

/** The number an overlay shows for a cell, or null. */
function cellNumber(input: OverlayInput, row: number, col: number): number | null {
  const cell = input.analysis?.cells[row]?.[col];
  switch (input.kind) {
    case 've':
      return input.values[row][col];
    case 'coverage':
      return cell && cell.weight > 0 ? cell.weight : null;
    case 'samples':
      return cell && cell.samples > 0 ? cell.samples : null;
    case 'spread':
      // The spread of the correction ratio, shown in percent like the other errors.
      return cell?.spread === null || cell?.spread === undefined ? null : cell.spread * 100;
    case 'lambdaError':
      return cell?.lambdaErrorPct ?? null;
    case 'proposal':
      return input.preview?.values[row]?.[col] ?? null;
    case 'change':
      return input.preview ? previewChange(input, input.preview.values, row, col) : null;
  }
}

/** Change of a preview against the loaded revision, in percent (as the analysis reports it). */
function previewChange(
  input: OverlayInput,
  preview: readonly (readonly number[])[],
  row: number,
  col: number,
): number | null {
  const proposed = preview[row]?.[col];
  const base = input.baseValues[row]?.[col];
  if (proposed === undefined || base === undefined || base === 0) return null;
  return (proposed / base - 1) * 100;
}

/** The lowest and highest finite numbers of a grid (0–1 when there are none). */
function extent(grid: readonly (readonly (number | null)[])[]): [number, number] {
  let lo = Infinity;
  let hi = -Infinity;
  for (const row of grid)
    for (const v of row) {
      if (v === null || !Number.isFinite(v)) continue;
      lo = Math.min(lo, v);
      hi = Math.max(hi, v);
    }
  return lo <= hi ? [lo, hi] : [0, 1];
}

/** The colour range of a sequential overlay: VE and proposal share one, so colours compare. */
function sequentialRange(input: OverlayInput, numbers: (number | null)[][]): [number, number] {
  if (input.kind === 'coverage' || input.kind === 'samples' || input.kind === 'spread') {
    return [0, extent(numbers)[1]];
  }
  const [lo, hi] = extent(input.values);
  if (input.kind !== 'proposal') return [lo, hi];
  const [plo, phi] = extent(numbers);
  return [Math.min(lo, plo), Math.max(hi, phi)];
}

/** Text and colour of one number under an overlay. */
function paint(kind: OverlayKind, value: number, range: [number, number]) {
  switch (kind) {
    case 'lambdaError':
      return { text: signedFigure(value), background: divergingColour(value, DIVERGING_LIMIT_PCT) };
    case 'change':
      // Colour by the fuel it adds: VE up = richer = blue, VE down = leaner = orange.
      return {
        text: signedFigure(value),
        background: divergingColour(-value, DIVERGING_LIMIT_PCT),
      };
    case 'coverage':
      return {
        text: value.toFixed(value >= 100 ? 0 : 1),
        background: sequentialColour(value, ...range),
      };
    case 'samples':
      return { text: value.toFixed(0), background: sequentialColour(value, ...range) };
    case 'spread':
      return { text: value.toFixed(1), background: sequentialColour(value, ...range) };
    default:
      return { text: value.toFixed(1), background: sequentialColour(value, ...range) };
  }
}

/** The cells and legend of an overlay. */
export interface OverlayView {
  /** Every cell's view, `[row][col]`. */
  readonly cells: CellView[][];
  /** The legend under the grid. */
  readonly legend: LegendView;
}

/** Whether an overlay shows what the apply writes, and so marks how each cell got there. */
function showsOrigin(kind: OverlayKind): boolean {
  return kind === 'proposal' || kind === 'change';
}

/** Every cell's view under the chosen overlay, and its legend. */
export function overlayView(given: OverlayInput): OverlayView {
  // A preview belongs to the analysis shown: none, or one left over from another, marks nothing.
  const preview = given.analysis ? (given.preview ?? null) : null;
  const input: OverlayInput = { ...given, preview };
  const flags = new Map((input.analysis?.leanFlags ?? []).map((f) => [`${f.row}:${f.col}`, f]));
  const numbers = input.values.map((row, r) => row.map((_, c) => cellNumber(input, r, c)));
  const range = sequentialRange(input, numbers);
  const cells = numbers.map((row, r) =>
    row.map((value, c): CellView => {
      const flag = flags.get(`${r}:${c}`);
      const previewOrigin = preview?.origin[r]?.[c] ?? null;
      const origin = showsOrigin(input.kind) ? previewOrigin : null;
      const isHeld = previewOrigin === 'held';
      const titles: string[] = [];
      if (origin) titles.push(ORIGIN_TEXT[origin]);
      else if (isHeld) titles.push(ORIGIN_TEXT.held);
      if (flag) titles.push(flagTitle(flag));
      const marks = {
        isLeanFlag: !!flag && flag.severity !== 'watch',
        isLeanWatch: flag?.severity === 'watch',
        isEdited: input.values[r][c] !== input.baseValues[r]?.[c],
        origin,
        isHeld,
        title: titles.length > 0 ? titles.join('\n') : null,
      };
      if (value === null || !Number.isFinite(value)) {
        return { value: null, text: NO_DATA, background: null, foreground: null, ...marks };
      }
      const { text, background } = paint(input.kind, value, range);
      const foreground = readableTextColour(background);
      return { value, text, background, foreground, ...marks };
    }),
  );
  const legend = overlayLegend(input.kind, range);
  if (!showsOrigin(input.kind)) return { cells, legend };
  return {
    cells,
    legend: preview
      ? { ...legend, marks: ORIGIN_MARKS }
      : { ...legend, note: `${legend.note} The figures appear once the preview is computed.` },
  };
}

/** Unit, decimals of the end labels and reading note of each sequential overlay. */
const SEQUENTIAL_LEGENDS: Record<
  Exclude<OverlayKind, 'lambdaError' | 'change'>,
  { unit: string; digits: number; note: string }
> = {
  ve: {
    unit: 'VE %',
    digits: 1,
    note: 'VE in percent. Type a value to edit a cell; drag or shift+click to select cells; Ctrl+Z undoes, Ctrl+Y redoes.',
  },
  coverage: {
    unit: 'weight',
    digits: 0,
    note: 'How much logged data each cell received (bilinear weight); – means none.',
  },
  samples: {
    unit: 'samples',
    digits: 0,
    note: 'How many kept samples touched each cell; – means none.',
  },
  spread: {
    unit: '% spread',
    digits: 1,
    note: 'How much the samples of a cell disagree (weighted spread of the correction, %): high spread asks for steadier data.',
  },
  proposal: {
    unit: 'VE %',
    digits: 1,
    note: 'VE the apply would write with the options in the analysis panel, on the same colours as the VE view.',
  },
};

/** The legend of an overlay, sequential ones labelled with the ends of their colour range. */
function overlayLegend(kind: OverlayKind, [lo, hi]: [number, number]): LegendView {
  const limit = `${DIVERGING_LIMIT_PCT}`;
  if (kind === 'lambdaError') {
    return {
      gradient: gradientCss(DIVERGING_STOPS),
      low: `▼ ${MINUS}${limit} % richer`,
      mid: '0',
      high: `▲ +${limit} % leaner`,
      note: 'Measured against commanded lambda: ▲ + leaner (orange), ▼ − richer (blue). Beyond ±10 % takes the full colour.',
    };
  }
  if (kind === 'change') {
    return {
      gradient: gradientCss(DIVERGING_STOPS),
      low: `▲ +${limit} % VE up`,
      mid: '0',
      high: `▼ ${MINUS}${limit} % VE down`,
      note: 'Change of VE the apply would write with the panel’s options, against the analysed revision: ▲ + more fuel (blue), ▼ − less fuel (orange), the colours of rich and lean.',
    };
  }
  const scale = SEQUENTIAL_LEGENDS[kind];
  return {
    gradient: gradientCss(SEQUENTIAL_STOPS),
    low: `${lo.toFixed(scale.digits)} ${scale.unit}`,
    mid: '',
    high: `${hi.toFixed(scale.digits)} ${scale.unit}`,
    note: scale.note,
  };
}
