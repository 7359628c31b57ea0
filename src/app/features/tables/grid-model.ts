import type { CellView } from './overlays';

/** One grid row: a MAP breakpoint and the views of its cells, one per RPM breakpoint. */
export interface GridRow {
  /** Stable row id (`r<index>`), so the grid updates rows in place. */
  readonly id: string;
  /** Row index in the table (MAP breakpoint index). */
  readonly row: number;
  /** The MAP breakpoint, kPa. */
  readonly mapKpa: number;
  /** The cells of the row, by column. */
  readonly cells: readonly CellView[];
}

/** The rows the grid shows: table orientation, MAP ascending from the top. */
export function gridRows(
  mapAxisKpa: readonly number[],
  cells: readonly (readonly CellView[])[],
): GridRow[] {
  return mapAxisKpa.map((mapKpa, row) => ({ id: `r${row}`, row, mapKpa, cells: cells[row] ?? [] }));
}

/** CSS classes of a cell: the lean-under-load outline and the unsaved-edit mark. */
export function cellClasses(view: CellView | undefined): string[] {
  if (!view) return [];
  const classes: string[] = [];
  if (view.isLeanFlag) classes.push('cs-lean-flag');
  if (view.isEdited) classes.push('cs-edited');
  return classes;
}

/** Inline colours of a cell (set by the grid through the CSSOM, which the CSP allows). */
export function cellColours(view: CellView | undefined): Record<string, string> {
  if (!view?.background || !view.foreground) return {};
  return { backgroundColor: view.background, color: view.foreground };
}

/** A breakpoint for a header: whole numbers plain, others with one decimal. */
export function breakpointLabel(value: number): string {
  return Number.isInteger(value) ? String(value) : value.toFixed(1);
}
