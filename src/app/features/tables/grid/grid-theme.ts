import {
  CellStyleModule,
  ClientSideRowModelModule,
  TextEditorModule,
  TooltipModule,
  themeQuartz,
  type Module,
} from 'ag-grid-community';

/**
 * The only grid modules the workspace uses (Community): client-side rows, the text editor we
 * parse ourselves, per-cell style and class callbacks, and tooltips (as the browser's own title
 * attribute: the cells' marks in words). Registering all of them would add about 100 kB gzip.
 */
export const GRID_MODULES: Module[] = [
  ClientSideRowModelModule,
  TextEditorModule,
  CellStyleModule,
  TooltipModule,
];

/** The grid in Cellsmith's colours: every colour is a Material system token of our theme. */
export const GRID_THEME = themeQuartz.withParams({
  // Inherit the page's light or dark scheme, so the Material tokens' light-dark() follow it.
  browserColorScheme: 'inherit',
  chromeBackgroundColor: 'var(--mat-sys-surface-container-high)',
  backgroundColor: 'var(--mat-sys-surface)',
  foregroundColor: 'var(--mat-sys-on-surface)',
  headerBackgroundColor: 'var(--mat-sys-surface-container-high)',
  headerTextColor: 'var(--mat-sys-on-surface)',
  borderColor: 'var(--mat-sys-outline-variant)',
  accentColor: 'var(--mat-sys-primary)',
  rangeSelectionBorderColor: 'var(--mat-sys-on-surface)',
  rowHoverColor: 'transparent',
  fontFamily: 'inherit',
  fontSize: 12,
  headerFontSize: 12,
  headerFontWeight: 600,
  rowHeight: 30,
  headerHeight: 32,
  cellHorizontalPadding: 4,
  wrapperBorderRadius: 8,
});
