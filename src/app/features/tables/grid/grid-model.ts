import type { UnitSystem } from '@shared/contracts/preferences';
import type { ColDef, ValueSetterParams } from 'ag-grid-community';
import { unitLabel } from '../../../ui/units/display-units';
import { formatQuantity } from '../../../ui/units/format-quantity';
import { type CellBounds, isInBounds, selectionEdges } from './cell-range';
import type { CellView } from './overlays';

/** What marks a cell beyond its overlay view: the selection and its lock. */
export interface CellDecor {
  /** The selection, if any. */
  readonly selection: CellBounds | null;
  /** Whether the cell is locked. */
  readonly isLocked: boolean;
}

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

/**
 * CSS classes of a cell: the lean-under-load outline (or the quieter "watch" mark), the
 * unsaved-edit mark, the held-under-load mark, the filled mark of the proposal and change
 * overlays, the lock, and for a selected cell `cs-selected` plus one class per outer edge of the
 * selection it sits on (so the whole range gets one outline, not a box per cell).
 */
export function cellClasses(
  view: CellView | undefined,
  row = -1,
  col = -1,
  decor: CellDecor = { selection: null, isLocked: false },
): string[] {
  if (!view) return [];
  const classes: string[] = [];
  if (view.isLeanFlag) classes.push('cs-lean-flag');
  else if (view.isLeanWatch) classes.push('cs-lean-watch');
  if (view.isEdited) classes.push('cs-edited');
  if (view.isHeld) classes.push('cs-held');
  else if (view.origin === 'filled') classes.push('cs-filled');
  else if (view.origin === 'measured') classes.push('cs-measured');
  if (decor.isLocked) classes.push('cs-locked');
  if (decor.selection) {
    if (isInBounds(decor.selection, row, col)) classes.push('cs-selected');
    const edges = selectionEdges(decor.selection, row, col);
    for (const edge of ['top', 'bottom', 'left', 'right'] as const)
      if (edges[edge]) classes.push(`cs-sel-${edge}`);
  }
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

/** A cell named by its breakpoints for messages: "cell at 3000 rpm, 100 kPa". */
export function cellName(
  rpmAxis: readonly number[],
  mapAxisKpa: readonly number[],
  row: number,
  col: number,
): string {
  const rpm = breakpointLabel(rpmAxis[col] ?? col + 1);
  const map = breakpointLabel(mapAxisKpa[row] ?? row + 1);
  return `cell at ${rpm} rpm, ${map} kPa`;
}

/** A value typed into a cell, before it is checked. */
export interface CellEditRequest {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index). */
  readonly col: number;
  /** What the editor gave. */
  readonly raw: unknown;
}

/** How the MAP axis reads: its unit for the corner header and each breakpoint's text. */
export interface MapAxisDisplay {
  /** The unit, e.g. "kPa" or "psi(a)". */
  readonly unit: string;
  /** A breakpoint (kPa absolute) as shown. */
  readonly label: (kpa: number) => string;
}

/** The MAP axis in kPa, as stored. */
export const KPA_AXIS: MapAxisDisplay = { unit: 'kPa', label: (kpa) => breakpointLabel(kpa) };

/** The MAP axis in the user's units: kPa as stored, or psi(a) for imperial (values stay kPa). */
export function mapAxisDisplay(units: UnitSystem): MapAxisDisplay {
  if (units === 'metric') return KPA_AXIS;
  return {
    unit: unitLabel('pressure', units),
    label: (kpa) => formatQuantity('pressure', kpa, units, { unit: false }),
  };
}

/** What the value columns ask of the grid component. */
export interface ColumnHooks {
  /** How the MAP axis reads; default kPa. */
  readonly mapAxis?: MapAxisDisplay;
  /** Whether cells can be edited now. */
  readonly isEditable: () => boolean;
  /** The selection and lock marks of a cell now. */
  readonly decor: (row: number, col: number) => CellDecor;
  /** Reports a typed value (the store decides; accepted values come back as new views). */
  readonly edit: (request: CellEditRequest) => void;
}

/** The grid's columns: the pinned MAP column, then one column per RPM breakpoint. */
export function gridColumns(rpmAxis: readonly number[], hooks: ColumnHooks): ColDef<GridRow>[] {
  const reportEdit = (p: ValueSetterParams<GridRow>, col: number): boolean => {
    if (p.data) hooks.edit({ row: p.data.row, col, raw: p.newValue });
    // Never taken here: the store checks it, and accepted values come back through the rows.
    return false;
  };
  return [
    {
      colId: 'map',
      headerName: `${(hooks.mapAxis ?? KPA_AXIS).unit} \\ rpm`,
      pinned: 'left',
      width: 72,
      editable: false,
      sortable: false,
      resizable: false,
      valueGetter: (p) => p.data?.mapKpa,
      valueFormatter: (p) => (hooks.mapAxis ?? KPA_AXIS).label(Number(p.value)),
      cellClass: 'cs-axis-cell',
    },
    ...rpmAxis.map((rpm, col): ColDef<GridRow> => ({
      colId: `c${col}`,
      headerName: breakpointLabel(rpm),
      minWidth: 56,
      flex: 1,
      sortable: false,
      resizable: false,
      editable: () => hooks.isEditable(),
      cellEditor: 'agTextCellEditor',
      valueGetter: (p) => p.data?.cells[col]?.value ?? null,
      valueFormatter: (p) => p.data?.cells[col]?.text ?? '',
      valueSetter: (p) => reportEdit(p, col),
      cellStyle: (p) => cellColours(p.data?.cells[col]),
      // The browser's own tooltip (a title attribute): the cell's marks in words.
      tooltipValueGetter: (p) => p.data?.cells[col]?.title ?? null,
      cellClass: (p) => {
        const row = p.data?.row ?? -1;
        return [
          'cs-value-cell',
          ...cellClasses(p.data?.cells[col], row, col, hooks.decor(row, col)),
        ];
      },
    })),
  ];
}
