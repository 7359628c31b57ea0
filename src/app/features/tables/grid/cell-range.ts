/** A cell of the table: row = MAP breakpoint index, col = RPM breakpoint index. */
export interface CellPosition {
  /** Row (MAP breakpoint index, from 0). */
  readonly row: number;
  /** Column (RPM breakpoint index, from 0). */
  readonly col: number;
}

/**
 * A rectangular selection: the cell where it started (anchor) and the cell it was extended to
 * (focus). Either may be the top-left; `selectionBounds` normalises.
 */
export interface CellSelection {
  /** Where the selection started; stays put while it is extended. */
  readonly anchor: CellPosition;
  /** The moving end (mouse drag, shift+click, shift+arrow). */
  readonly focus: CellPosition;
}

/** A selection normalised to rows r0..r1 and columns c0..c1, all inclusive. */
export interface CellBounds {
  /** First row. */
  readonly r0: number;
  /** Last row. */
  readonly r1: number;
  /** First column. */
  readonly c0: number;
  /** Last column. */
  readonly c1: number;
}

/** A selection of one cell. */
export function collapseTo(cell: CellPosition): CellSelection {
  return { anchor: cell, focus: cell };
}

/** The selection with its focus moved to `cell`; the anchor stays. */
export function extendTo(selection: CellSelection, cell: CellPosition): CellSelection {
  return { anchor: selection.anchor, focus: cell };
}

/** Every cell of a rows × cols table, anchored top-left. */
export function selectAll(rows: number, cols: number): CellSelection {
  return { anchor: { row: 0, col: 0 }, focus: { row: rows - 1, col: cols - 1 } };
}

/** The rows and columns a selection spans. */
export function selectionBounds(selection: CellSelection): CellBounds {
  const { anchor, focus } = selection;
  return {
    r0: Math.min(anchor.row, focus.row),
    r1: Math.max(anchor.row, focus.row),
    c0: Math.min(anchor.col, focus.col),
    c1: Math.max(anchor.col, focus.col),
  };
}

/** Rows and columns spanned by `bounds`. */
export function boundsSize(bounds: CellBounds): { rows: number; cols: number } {
  return { rows: bounds.r1 - bounds.r0 + 1, cols: bounds.c1 - bounds.c0 + 1 };
}

/** Whether the cell lies inside `bounds`. */
export function isInBounds(bounds: CellBounds, row: number, col: number): boolean {
  return row >= bounds.r0 && row <= bounds.r1 && col >= bounds.c0 && col <= bounds.c1;
}

/** The cells of `bounds` as `[row, col]`, row by row. */
export function boundsCells(bounds: CellBounds): [number, number][] {
  const cells: [number, number][] = [];
  for (let r = bounds.r0; r <= bounds.r1; r++)
    for (let c = bounds.c0; c <= bounds.c1; c++) cells.push([r, c]);
  return cells;
}

/** Which outer edges of the selection a cell sits on (none when it is outside). */
export function selectionEdges(
  bounds: CellBounds,
  row: number,
  col: number,
): { top: boolean; bottom: boolean; left: boolean; right: boolean } {
  const inside = isInBounds(bounds, row, col);
  return {
    top: inside && row === bounds.r0,
    bottom: inside && row === bounds.r1,
    left: inside && col === bounds.c0,
    right: inside && col === bounds.c1,
  };
}

/** The row and column step of an arrow key, or null for any other key. */
export function arrowStep(key: string): CellPosition | null {
  switch (key) {
    case 'ArrowUp':
      return { row: -1, col: 0 };
    case 'ArrowDown':
      return { row: 1, col: 0 };
    case 'ArrowLeft':
      return { row: 0, col: -1 };
    case 'ArrowRight':
      return { row: 0, col: 1 };
    default:
      return null;
  }
}

/** `cell` moved by `step`, kept inside a rows × cols table. */
export function stepCell(
  cell: CellPosition,
  step: CellPosition,
  rows: number,
  cols: number,
): CellPosition {
  return {
    row: Math.min(rows - 1, Math.max(0, cell.row + step.row)),
    col: Math.min(cols - 1, Math.max(0, cell.col + step.col)),
  };
}

/**
 * The selection kept inside a rows × cols table (after the table was reloaded with other
 * axes), or null when the table has no cells.
 */
export function clampSelection(
  selection: CellSelection,
  rows: number,
  cols: number,
): CellSelection | null {
  if (rows < 1 || cols < 1) return null;
  const none = { row: 0, col: 0 };
  return {
    anchor: stepCell(selection.anchor, none, rows, cols),
    focus: stepCell(selection.focus, none, rows, cols),
  };
}

/** "1 cell selected" or "3 × 4 cells selected" (rows × columns). */
export function selectionLabel(bounds: CellBounds): string {
  const { rows, cols } = boundsSize(bounds);
  return rows * cols === 1 ? '1 cell selected' : `${rows} × ${cols} cells selected`;
}

/** Locked (or otherwise marked) cells as keys from `cellKey`. */
export type CellSet = ReadonlySet<string>;

/** The key of a cell in a `CellSet`: `"row:col"`. */
export function cellKey(row: number, col: number): string {
  return `${row}:${col}`;
}

/** The cells of a `CellSet` as `[row, col]`, in row then column order. */
export function cellSetList(cells: CellSet): [number, number][] {
  return [...cells]
    .map((key) => key.split(':').map(Number) as [number, number])
    .sort((a, b) => a[0] - b[0] || a[1] - b[1]);
}

/**
 * A `CellSet` read back from its stored JSON (`[[row, col], …]`), keeping only whole-number
 * cells inside a rows × cols table: storage may hold anything, or a table since reshaped.
 */
export function parseCellSet(json: string | null, rows: number, cols: number): Set<string> {
  const cells = new Set<string>();
  if (!json) return cells;
  let parsed: unknown;
  try {
    parsed = JSON.parse(json);
  } catch {
    // Damaged storage is treated as "no cells": the locks are a convenience, not table data.
    return cells;
  }
  if (!Array.isArray(parsed)) return cells;
  for (const item of parsed) {
    if (!Array.isArray(item) || item.length !== 2) continue;
    const [row, col] = item as unknown[];
    if (!Number.isInteger(row) || !Number.isInteger(col)) continue;
    const r = row as number;
    const c = col as number;
    if (r >= 0 && r < rows && c >= 0 && c < cols) cells.add(cellKey(r, c));
  }
  return cells;
}

/** `cells` with every cell of `bounds` added (`isAdded`) or removed; a new set. */
export function withBounds(cells: CellSet, bounds: CellBounds, isAdded: boolean): Set<string> {
  const next = new Set(cells);
  for (const [row, col] of boundsCells(bounds)) {
    if (isAdded) next.add(cellKey(row, col));
    else next.delete(cellKey(row, col));
  }
  return next;
}

/** What a grid position points at: a value cell, or a whole row (`col` null: its MAP cell). */
export interface GridTarget {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index), null for the MAP column. */
  readonly col: number | null;
}

/** The target of a grid row index and column id (`c<index>` or `map`), null for anything else. */
export function gridTarget(rowIndex: number | null | undefined, colId: string): GridTarget | null {
  if (rowIndex === null || rowIndex === undefined || rowIndex < 0) return null;
  if (colId === 'map') return { row: rowIndex, col: null };
  const match = /^c(\d+)$/.exec(colId);
  return match ? { row: rowIndex, col: Number(match[1]) } : null;
}

/**
 * The selection after a press on `target`: that cell alone, or with shift the current selection
 * extended to it. A press on the MAP column selects the row across all `cols` columns.
 */
export function pressSelection(
  current: CellSelection | null,
  target: GridTarget,
  isShift: boolean,
  cols: number,
): CellSelection {
  const end = { row: target.row, col: target.col ?? cols - 1 };
  if (isShift && current) return extendTo(current, end);
  return extendTo(collapseTo({ row: target.row, col: target.col ?? 0 }), end);
}

/** The values of the cells in `bounds`, row by row, read through `valueAt`. */
export function boundsGrid<T>(bounds: CellBounds, valueAt: (row: number, col: number) => T): T[][] {
  const grid: T[][] = [];
  for (let r = bounds.r0; r <= bounds.r1; r++) {
    const row: T[] = [];
    for (let c = bounds.c0; c <= bounds.c1; c++) row.push(valueAt(r, c));
    grid.push(row);
  }
  return grid;
}
