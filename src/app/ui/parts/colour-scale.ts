/**
 * Cellsmith's own colour scales for cell grids, interpolated in OKLab so equal steps of value
 * look like equal steps of colour, and a text colour chosen for contrast against each cell.
 *
 * Sequential (coverage, VE): deep blue → blue → teal → pale, lightness rising throughout.
 * Diverging (lambda error, change): blue below zero, a pale neutral at zero, orange above —
 * a pair that readers with red–green colour blindness still tell apart. Colour is never the
 * only cue: callers also print the sign in the cell text.
 */

/** An sRGB colour, channels 0–255. */
export type Rgb = readonly [number, number, number];

/** A colour stop of a scale: a position 0–1 and an sRGB hex colour. */
export interface ColourStop {
  /** Position along the scale, 0–1, ascending between stops. */
  readonly at: number;
  /** `#rrggbb`. */
  readonly hex: string;
}

/** Low → high: deep blue, blue, teal, pale. */
export const SEQUENTIAL_STOPS: readonly ColourStop[] = [
  { at: 0, hex: '#1b2f63' },
  { at: 0.35, hex: '#2b6c9e' },
  { at: 0.7, hex: '#4fae9f' },
  { at: 1, hex: '#eef6e6' },
];

/** −1 → +1 mapped to 0 → 1: blue (negative), pale neutral (zero), orange (positive). */
export const DIVERGING_STOPS: readonly ColourStop[] = [
  { at: 0, hex: '#23509b' },
  { at: 0.5, hex: '#efeeea' },
  { at: 1, hex: '#c25a0c' },
];

/**
 * Text on light cells. Pure black: with white as the other choice, every background then gets
 * at least 4.58:1 (the worst case is a mid-grey), above WCAG's 4.5:1 for small text.
 */
export const TEXT_ON_LIGHT = '#000000';
/** Light text for dark cells. */
export const TEXT_ON_DARK = '#ffffff';

/** `#rrggbb` (or `#rgb`) as channels; throws naming the argument on anything else. */
export function hexToRgb(hex: string): Rgb {
  const match = /^#?([0-9a-f]{3}|[0-9a-f]{6})$/i.exec(hex.trim());
  if (!match) throw new Error(`hexToRgb: "${hex}" is not a #rrggbb colour`);
  const digits = match[1].length === 3 ? [...match[1]].map((d) => d + d).join('') : match[1];
  return [0, 2, 4].map((i) => parseInt(digits.slice(i, i + 2), 16)) as unknown as Rgb;
}

/** Channels (clamped, rounded) as `#rrggbb`. */
export function rgbToHex(rgb: Rgb): string {
  return (
    '#' +
    rgb
      .map((v) =>
        Math.round(Math.min(255, Math.max(0, v)))
          .toString(16)
          .padStart(2, '0'),
      )
      .join('')
  );
}

function toLinear(channel: number): number {
  const c = channel / 255;
  return c <= 0.04045 ? c / 12.92 : ((c + 0.055) / 1.055) ** 2.4;
}

function fromLinear(linear: number): number {
  const c = linear <= 0.0031308 ? 12.92 * linear : 1.055 * linear ** (1 / 2.4) - 0.055;
  return c * 255;
}

/** sRGB → OKLab `[L, a, b]` (Björn Ottosson's published matrices, 2020) [S*]. */
export function rgbToOklab(rgb: Rgb): [number, number, number] {
  const [r, g, b] = rgb.map(toLinear);
  const l = Math.cbrt(0.4122214708 * r + 0.5363325363 * g + 0.0514459929 * b);
  const m = Math.cbrt(0.2119034982 * r + 0.6806995451 * g + 0.1073969566 * b);
  const s = Math.cbrt(0.0883024619 * r + 0.2817188376 * g + 0.6299787005 * b);
  return [
    0.2104542553 * l + 0.793617785 * m - 0.0040720468 * s,
    1.9779984951 * l - 2.428592205 * m + 0.4505937099 * s,
    0.0259040371 * l + 0.7827717662 * m - 0.808675766 * s,
  ];
}

/** OKLab → sRGB channels (unclamped; `rgbToHex` clamps). */
export function oklabToRgb([L, a, b]: readonly [number, number, number]): Rgb {
  const l = (L + 0.3963377774 * a + 0.2158037573 * b) ** 3;
  const m = (L - 0.1055613458 * a - 0.0638541728 * b) ** 3;
  const s = (L - 0.0894841775 * a - 1.291485548 * b) ** 3;
  return [
    fromLinear(4.0767416621 * l - 3.3077115913 * m + 0.2309699292 * s),
    fromLinear(-1.2684380046 * l + 2.6097574011 * m - 0.3413193965 * s),
    fromLinear(-0.0041960863 * l - 0.7034186147 * m + 1.707614701 * s),
  ];
}

/** The colour at `t` (clamped to 0–1) along `stops`, interpolated in OKLab. */
export function colourAt(stops: readonly ColourStop[], t: number): string {
  if (stops.length < 2) throw new Error('colourAt: stops needs at least 2 entries');
  const x = Number.isFinite(t) ? Math.min(1, Math.max(0, t)) : 0;
  let i = 0;
  while (i < stops.length - 2 && x > stops[i + 1].at) i++;
  const lo = stops[i];
  const hi = stops[i + 1];
  const f = hi.at === lo.at ? 0 : (x - lo.at) / (hi.at - lo.at);
  const a = rgbToOklab(hexToRgb(lo.hex));
  const b = rgbToOklab(hexToRgb(hi.hex));
  return rgbToHex(
    oklabToRgb([0, 1, 2].map((k) => a[k] + (b[k] - a[k]) * f) as [number, number, number]),
  );
}

/** The sequential colour of `value` between `min` and `max` (a flat range gives the middle). */
export function sequentialColour(value: number, min: number, max: number): string {
  const t = max > min ? (value - min) / (max - min) : 0.5;
  return colourAt(SEQUENTIAL_STOPS, t);
}

/** The diverging colour of `value`, `limit` (> 0) and beyond being the full hue. */
export function divergingColour(value: number, limit: number): string {
  if (!(limit > 0)) throw new Error(`divergingColour: limit must be > 0, got ${limit}`);
  return colourAt(DIVERGING_STOPS, 0.5 + value / (2 * limit));
}

/** WCAG 2 relative luminance of a hex colour, 0 (black) – 1 (white). */
export function relativeLuminance(hex: string): number {
  const [r, g, b] = hexToRgb(hex).map(toLinear);
  return 0.2126 * r + 0.7152 * g + 0.0722 * b;
}

/** WCAG 2 contrast ratio of two hex colours, 1–21. */
export function contrastRatio(a: string, b: string): number {
  const [hi, lo] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x);
  return (hi + 0.05) / (lo + 0.05);
}

/** The text colour (dark or light) with the higher contrast against `background`. */
export function readableTextColour(background: string): string {
  return contrastRatio(background, TEXT_ON_LIGHT) >= contrastRatio(background, TEXT_ON_DARK)
    ? TEXT_ON_LIGHT
    : TEXT_ON_DARK;
}

/** A CSS `linear-gradient` (left → right) sampling `stops` in OKLab, for legends. */
export function gradientCss(stops: readonly ColourStop[], samples = 9): string {
  const parts = Array.from({ length: samples }, (_, i) => {
    const t = i / (samples - 1);
    return `${colourAt(stops, t)} ${Math.round(t * 100)}%`;
  });
  return `linear-gradient(to right, ${parts.join(', ')})`;
}
