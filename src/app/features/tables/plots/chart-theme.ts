/**
 * The colours of a chart's frame (text, axes, grid lines) in the page's light or dark scheme.
 * The data colours come from our OKLab scales (ui/parts/colour-scale) in both schemes; only the
 * frame follows the scheme, read from the Material system tokens so charts sit on the page like
 * the grid does.
 */

/** A chart frame's colours. */
export interface ChartTheme {
  /** Whether the page shows its dark scheme. */
  readonly isDark: boolean;
  /** Axis labels, titles and tooltip text. */
  readonly text: string;
  /** Secondary text (axis names, notes). */
  readonly mutedText: string;
  /** Axis lines and breakpoint lines. */
  readonly line: string;
  /** Faint grid lines. */
  readonly gridLine: string;
  /** Tooltip and card background. */
  readonly surface: string;
}

/** The Material system tokens a chart frame is drawn with, and what each becomes. */
export const CHART_TOKENS = {
  text: '--mat-sys-on-surface',
  mutedText: '--mat-sys-on-surface-variant',
  line: '--mat-sys-outline',
  gridLine: '--mat-sys-outline-variant',
  surface: '--mat-sys-surface-container',
} as const;

/** Token values to fall back on where the theme is not loaded (tests, a stripped page). */
export const FALLBACK_CHART_THEMES: Readonly<Record<'light' | 'dark', ChartTheme>> = {
  light: {
    isDark: false,
    text: '#1b1b1f',
    mutedText: '#45464f',
    line: '#767680',
    gridLine: '#c6c5d0',
    surface: '#efedf1',
  },
  dark: {
    isDark: true,
    text: '#e4e1e6',
    mutedText: '#c6c5d0',
    line: '#90909a',
    gridLine: '#45464f',
    surface: '#1f1f23',
  },
};

/**
 * Whether a computed `color-scheme` (`light`, `dark`, `light dark`, `normal`, …) shows dark:
 * only `dark` alone is dark for sure; where both are allowed the system preference decides.
 */
export function schemeIsDark(colorScheme: string, prefersDark: boolean): boolean {
  const words = colorScheme.trim().split(/\s+/);
  const light = words.includes('light');
  const dark = words.includes('dark');
  if (dark && !light) return true;
  if (light && !dark) return false;
  return dark && prefersDark;
}

/** Splits `text` at commas that are not inside parentheses. */
function topLevelParts(text: string): string[] {
  const parts: string[] = [];
  let depth = 0;
  let start = 0;
  for (let i = 0; i < text.length; i++) {
    const ch = text[i];
    if (ch === '(') depth++;
    else if (ch === ')') depth--;
    else if (ch === ',' && depth === 0) {
      parts.push(text.slice(start, i).trim());
      start = i + 1;
    }
  }
  parts.push(text.slice(start).trim());
  return parts;
}

/**
 * A colour token's value in one scheme. The theme writes scheme-dependent tokens as
 * `light-dark(<light>, <dark>)`, which a custom property keeps unresolved, so the scheme picks
 * the half here. A plain colour is returned as it is; an empty value gives null.
 */
export function resolveToken(value: string, isDark: boolean): string | null {
  const text = value.trim();
  if (!text) return null;
  const match = /^light-dark\((.*)\)$/s.exec(text);
  if (!match) return text;
  const parts = topLevelParts(match[1] ?? '');
  if (parts.length !== 2) return null;
  return (isDark ? parts[1] : parts[0]) || null;
}

/** The chart frame's colours from token values read off the page (`read(name)`), per scheme. */
export function chartTheme(isDark: boolean, read: (token: string) => string): ChartTheme {
  const fallback = FALLBACK_CHART_THEMES[isDark ? 'dark' : 'light'];
  const pick = (key: keyof typeof CHART_TOKENS) =>
    resolveToken(read(CHART_TOKENS[key]), isDark) ?? fallback[key];
  return {
    isDark,
    text: pick('text'),
    mutedText: pick('mutedText'),
    line: pick('line'),
    gridLine: pick('gridLine'),
    surface: pick('surface'),
  };
}
