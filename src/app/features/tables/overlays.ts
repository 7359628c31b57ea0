import type { AnalysisResource } from '../../core/api/analyses-api';
import {
  DIVERGING_STOPS,
  SEQUENTIAL_STOPS,
  divergingColour,
  gradientCss,
  readableTextColour,
  sequentialColour,
} from '../../shared/ui/colour-scale';

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
  /** Whether the analysis flagged the cell lean under load. */
  readonly isLeanFlag: boolean;
  /** Whether the VE differs from the loaded revision (an unsaved edit). */
  readonly isEdited: boolean;
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
   * A proposal computed elsewhere (a live preview of other settings), `[row][col]`. When given,
   * the proposal and change overlays show it instead of the analysis's own proposal.
   */
  readonly preview?: readonly (readonly number[])[] | null;
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
      return input.preview
        ? (input.preview[row]?.[col] ?? null)
        : (input.analysis?.proposal[row]?.[col] ?? null);
    case 'change':
      return input.preview
        ? previewChange(input, input.preview, row, col)
        : (cell?.changePct ?? null);
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

/** Every cell's view under the chosen overlay, and its legend. */
export function overlayView(input: OverlayInput): OverlayView {
  const flagged = new Set((input.analysis?.leanFlags ?? []).map((f) => `${f.row}:${f.col}`));
  const numbers = input.values.map((row, r) => row.map((_, c) => cellNumber(input, r, c)));
  const range = sequentialRange(input, numbers);
  const cells = numbers.map((row, r) =>
    row.map((value, c): CellView => {
      const isLeanFlag = flagged.has(`${r}:${c}`);
      const isEdited = input.values[r][c] !== input.baseValues[r]?.[c];
      if (value === null || !Number.isFinite(value)) {
        return {
          value: null,
          text: NO_DATA,
          background: null,
          foreground: null,
          isLeanFlag,
          isEdited,
        };
      }
      const { text, background } = paint(input.kind, value, range);
      const foreground = readableTextColour(background);
      return { value, text, background, foreground, isLeanFlag, isEdited };
    }),
  );
  return { cells, legend: overlayLegend(input.kind, range) };
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
    note: 'Proposed VE at the analysis’s step fraction, on the same colours as the VE view.',
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
      note: 'Proposed change of VE: ▲ + more fuel (blue), ▼ − less fuel (orange), the colours of rich and lean.',
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
