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

/** Undo and redo stacks; the newest edit is last in each. */
export interface EditHistory {
  /** Edits that can be undone, oldest first. */
  readonly past: readonly CellEdit[];
  /** Edits undone that can be redone, the next to redo last. */
  readonly future: readonly CellEdit[];
}

/** A history with nothing to undo or redo. */
export const EMPTY_HISTORY: EditHistory = { past: [], future: [] };

/** How many edits are kept for undo; older ones fall off. */
export const HISTORY_LIMIT = 200;

/** A grid and its history after an operation. */
export interface HistoryStep {
  /** The values, a new array wherever something changed (inputs are never mutated). */
  readonly values: readonly (readonly number[])[];
  /** The history after the operation. */
  readonly history: EditHistory;
}

/** `values` with one cell set (a new outer array and a new row; other rows shared). */
export function withCell(
  values: readonly (readonly number[])[],
  row: number,
  col: number,
  value: number,
): number[][] {
  return values.map((r, i) => (i === row ? r.map((v, j) => (j === col ? value : v)) : [...r]));
}

/** Applies an edit and records it; a new edit clears what could be redone. No-ops are skipped. */
export function applyEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
  row: number,
  col: number,
  after: number,
): HistoryStep {
  const before = values[row]?.[col];
  if (before === undefined) throw new Error(`applyEdit: cell [${row}, ${col}] is off the table`);
  if (before === after) return { values, history };
  const past = [...history.past, { row, col, before, after }].slice(-HISTORY_LIMIT);
  return { values: withCell(values, row, col, after), history: { past, future: [] } };
}

/** Undoes the newest edit; unchanged when there is nothing to undo. */
export function undoEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
): HistoryStep {
  const edit = history.past.at(-1);
  if (!edit) return { values, history };
  return {
    values: withCell(values, edit.row, edit.col, edit.before),
    history: { past: history.past.slice(0, -1), future: [...history.future, edit] },
  };
}

/** Redoes the edit undone last; unchanged when there is nothing to redo. */
export function redoEdit(
  values: readonly (readonly number[])[],
  history: EditHistory,
): HistoryStep {
  const edit = history.future.at(-1);
  if (!edit) return { values, history };
  return {
    values: withCell(values, edit.row, edit.col, edit.after),
    history: { past: [...history.past, edit], future: history.future.slice(0, -1) },
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
