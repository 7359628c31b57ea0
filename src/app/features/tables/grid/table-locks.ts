import { type CellSet, cellSetList, parseCellSet } from './cell-range';

/** The localStorage key of a table's locked cells (kept per browser, see `TableStore.setLocked`). */
export function locksStorageKey(tableId: string): string {
  return `cellsmith.locks.${tableId}`;
}

/** Runs `use` on localStorage; with storage switched off or full, gives `fallback`. */
function withStorage<T>(use: (storage: Storage) => T, fallback: T): T {
  try {
    return use(localStorage);
  } catch {
    // Locks are a convenience of this browser: without storage they last for this visit only.
    return fallback;
  }
}

/** The locked cells this browser keeps for a rows × cols table (none when storage fails). */
export function readLocks(tableId: string, rows: number, cols: number): CellSet {
  const stored = withStorage((st) => st.getItem(locksStorageKey(tableId)), null);
  return parseCellSet(stored, rows, cols);
}

/** Keeps a table's locked cells in this browser (silently skipped when storage fails). */
export function saveLocks(tableId: string, locks: CellSet): void {
  const json = JSON.stringify(cellSetList(locks));
  withStorage((st) => st.setItem(locksStorageKey(tableId), json), undefined);
}
