/** One cell edit: where, and the value before and after. */
export interface CellEdit {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index). */
  readonly col: number;
  /** The value before the edit. */
  readonly before: number;
  /** The value after the edit. */
  readonly after: number;
}

/** A new value for one cell, before it is recorded. */
export interface CellChange {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index). */
  readonly col: number;
  /** The new value. */
  readonly value: number;
}

/**
 * What one undo or redo takes back or puts again: a typed value (a batch of one), a paste or a
 * cell operation on a selection.
 */
export interface EditBatch {
  /** What was done, for the undo/redo buttons ("Scale +5 %"). */
  readonly label: string;
  /** The cells it changed. */
  readonly cells: readonly CellEdit[];
}

/** Undo and redo stacks of batches; the newest is last in each. */
export interface EditHistory {
  /** Batches that can be undone, oldest first. */
  readonly past: readonly EditBatch[];
  /** Batches undone that can be redone, the next to redo last. */
  readonly future: readonly EditBatch[];
}

/** A history with nothing to undo or redo. */
export const EMPTY_HISTORY: EditHistory = { past: [], future: [] };

/** How many batches are kept for undo; older ones fall off. */
export const HISTORY_LIMIT = 200;

/** A grid and its history after an operation. */
export interface HistoryStep {
  /** The values, a new array wherever something changed (inputs are never mutated). */
  readonly values: readonly (readonly number[])[];
  /** The history after the operation. */
  readonly history: EditHistory;
}

/** `values` with the given cells set (new outer array, new rows where a cell changed). */
export function withCells(
  values: readonly (readonly number[])[],
  changes: readonly CellChange[],
): number[][] {
  const out = values.map((row) => [...row]);
  for (const { row, col, value } of changes) out[row][col] = value;
  return out;
}

/** `values` with one cell set. */
export function withCell(
  values: readonly (readonly number[])[],
  row: number,
  col: number,
  value: number,
): number[][] {
  return withCells(values, [{ row, col, value }]);
}

/**
 * Applies `changes` as one undoable batch called `label`; a new batch clears what could be
 * redone. Cells whose value does not change are left out; when none changes, nothing is recorded.
 */
export function applyBatch(
  values: readonly (readonly number[])[],
  history: EditHistory,
  label: string,
  changes: readonly CellChange[],
): HistoryStep {
  const cells: CellEdit[] = [];
  for (const { row, col, value } of changes) {
    const before = values[row]?.[col];
    if (before === undefined) throw new Error(`applyBatch: cell [${row}, ${col}] is off the table`);
    if (before !== value) cells.push({ row, col, before, after: value });
  }
  if (cells.length === 0) return { values, history };
  const past = [...history.past, { label, cells }].slice(-HISTORY_LIMIT);
  const next = withCells(
    values,
    cells.map(({ row, col, after }) => ({ row, col, value: after })),
  );
  return { values: next, history: { past, future: [] } };
}

/** Applies one typed value as a batch of one, labelled with the value. */
export function applyEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
  row: number,
  col: number,
  after: number,
): HistoryStep {
  return applyBatch(values, history, `Set cell to ${after}`, [{ row, col, value: after }]);
}

/** Undoes the newest batch as a whole; unchanged when there is nothing to undo. */
export function undoEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
): HistoryStep {
  const batch = history.past.at(-1);
  if (!batch) return { values, history };
  return {
    values: withCells(
      values,
      batch.cells.map(({ row, col, before }) => ({ row, col, value: before })),
    ),
    history: { past: history.past.slice(0, -1), future: [...history.future, batch] },
  };
}

/** Redoes the batch undone last as a whole; unchanged when there is nothing to redo. */
export function redoEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
): HistoryStep {
  const batch = history.future.at(-1);
  if (!batch) return { values, history };
  return {
    values: withCells(
      values,
      batch.cells.map(({ row, col, after }) => ({ row, col, value: after })),
    ),
    history: { past: [...history.past, batch], future: history.future.slice(0, -1) },
  };
}

/** "Scale +5 % (12 cells)": a batch's label with how many cells it touches. */
export function batchLabel(batch: EditBatch): string {
  const n = batch.cells.length;
  return `${batch.label} (${n} ${n === 1 ? 'cell' : 'cells'})`;
}

/**
 * What the undo and redo buttons say: "Undo Scale +5 % (12 cells)", or why there is nothing.
 * The history covers the edits of the revision open (`revisionNumber`): a save or an apply loads
 * a new revision and starts it afresh, so an empty undo says that in words rather than a bare
 * "nothing to undo" that reads as if the apply itself were lost.
 */
export function historyActionLabels(
  history: EditHistory,
  revisionNumber?: number,
): { undo: string; redo: string } {
  const undo = history.past.at(-1);
  const redo = history.future.at(-1);
  const noEdits =
    revisionNumber === undefined
      ? 'Undo (nothing to undo)'
      : `Undo (no edits yet on revision ${revisionNumber}; earlier revisions stay saved)`;
  return {
    undo: undo ? `Undo ${batchLabel(undo)}` : noEdits,
    redo: redo ? `Redo ${batchLabel(redo)}` : 'Redo (nothing to redo)',
  };
}

/** The keys of a keyboard event that matter for undo and redo. */
export interface HistoryKey {
  /** `KeyboardEvent.key`. */
  readonly key: string;
  /** Whether Control is held. */
  readonly ctrlKey: boolean;
  /** Whether Meta (⌘) is held. */
  readonly metaKey: boolean;
  /** Whether Shift is held. */
  readonly shiftKey: boolean;
}

/** Ctrl/⌘+Z → undo; Ctrl/⌘+Y or Ctrl/⌘+Shift+Z → redo; anything else → null. */
export function historyKeyAction(event: HistoryKey): 'undo' | 'redo' | null {
  if (!event.ctrlKey && !event.metaKey) return null;
  const key = event.key.toLowerCase();
  if (key === 'z') return event.shiftKey ? 'redo' : 'undo';
  if (key === 'y' && !event.shiftKey) return 'redo';
  return null;
}
