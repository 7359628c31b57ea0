import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import type { LogResource } from '@shared/contracts/logs';
import type { Revision, RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import type { Vehicle } from '@shared/contracts/vehicles';
import { type Observable, forkJoin, map, switchMap, throwError } from 'rxjs';
import type { LoadGuard } from '@shared/correct/load-guard';
import { apiErrorMessage } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { TablesApi } from '../../core/api/tables-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
import { Notifier } from '../../core/notify/notifier';
import {
  type CellSelection,
  type CellSet,
  boundsCells,
  boundsSize,
  cellKey,
  cellSetList,
  clampSelection,
  withBounds,
  selectionBounds,
} from './grid/cell-range';
import { type CellOperation, applyCellOperation, heldNote } from './grid/cell-operations';
import {
  EMPTY_HISTORY,
  type CellChange,
  type EditHistory,
  type HistoryStep,
  applyBatch,
  applyEdit,
  historyActionLabels,
  redoEdit,
  undoEdit,
} from './grid/edit-history';
import { cellName } from './grid/grid-model';
import { pasteText } from './grid/table-clipboard';
import { readLocks, saveLocks } from './grid/table-locks';
import { parseVeInput } from './grid/ve-input';

export { locksStorageKey } from './grid/table-locks';

/** What the workspace is waiting for, if anything. */
export type TableBusy = 'loading' | 'saving' | 'analysing' | 'applying' | null;

/** Why an edit is refused while a revision is being saved, applied or loaded. */
const WAIT_TEXT = 'Wait until the revision is saved and loaded, then edit.';

/** Everything loaded for one table. */
interface Loaded {
  table: VeTableResource;
  vehicle: Vehicle;
  revisions: RevisionSummary[];
  head: Revision;
  logs: LogResource[];
}

/**
 * State of the table workspace: the table, its revisions, the head revision's values being
 * edited with an undo/redo history, the selection, the locks and the vehicle's logs, and what
 * the workspace waits for. The analysis shown has its own store (`AnalysisStore`), which reads
 * this one; this one knows nothing of it. Provided by the workspace page, so it lives and dies
 * with it. News and failures are told through the `Notifier`.
 */
@Injectable()
export class TableStore {
  private readonly tablesApi = inject(TablesApi);
  private readonly logsApi = inject(LogsApi);
  private readonly vehiclesApi = inject(VehiclesApi);
  private readonly notifier = inject(Notifier);
  private readonly destroyRef = inject(DestroyRef);

  private readonly loaded = signal<Loaded | null>(null);
  private readonly editedValues = signal<readonly (readonly number[])[]>([]);
  private readonly editHistory = signal<EditHistory>(EMPTY_HISTORY);
  private readonly waitingFor = signal<TableBusy>('loading');
  private readonly currentSelection = signal<CellSelection | null>(null);
  private readonly lockSet = signal<CellSet>(new Set());

  /** The table (axes, name), null until loaded. */
  readonly table = computed(() => this.loaded()?.table ?? null);
  /** The table's vehicle, null until loaded. */
  readonly vehicle = computed(() => this.loaded()?.vehicle ?? null);
  /** The table's revisions by number ascending. */
  readonly revisions = computed(() => this.loaded()?.revisions ?? []);
  /** The revision being edited (the head), null until loaded. */
  readonly revision = computed(() => this.loaded()?.head ?? null);
  /** The VE being edited, `[row][col]`. */
  readonly values = this.editedValues.asReadonly();
  /** The vehicle's logs that are parsed and can be analysed. */
  readonly readyLogs = computed(() =>
    (this.loaded()?.logs ?? []).filter((log) => log.status === 'ready'),
  );
  /** What the workspace waits for. */
  readonly busy = this.waitingFor.asReadonly();
  /** Whether there is an edit to undo. */
  readonly canUndo = computed(() => this.editHistory().past.length > 0);
  /** Whether there is an undone edit to redo. */
  readonly canRedo = computed(() => this.editHistory().future.length > 0);
  /** What undo and redo would take back or put again ("Undo Scale +5 % (12 cells)"). */
  readonly historyLabels = computed(() =>
    historyActionLabels(this.editHistory(), this.revision()?.number),
  );
  /** The selected range, null when nothing is selected. */
  readonly selection = this.currentSelection.asReadonly();
  /** The selection normalised to rows r0..r1, columns c0..c1. */
  readonly selectionBounds = computed(() => {
    const selection = this.currentSelection();
    return selection ? selectionBounds(selection) : null;
  });
  /** The selected cells as `[row, col]`, row by row (empty when nothing is selected). */
  readonly selectedCells = computed((): [number, number][] => {
    const bounds = this.selectionBounds();
    return bounds ? boundsCells(bounds) : [];
  });
  /** The locked cells as keys (`cellKey`). */
  readonly locked = this.lockSet.asReadonly();
  /** The locked cells as `[row, col]`, row by row. */
  readonly lockedCells = computed(() => cellSetList(this.lockSet()));
  /** The cells whose value differs from the loaded revision, as `[row, col]`, row by row. */
  readonly unsavedCells = computed((): [number, number][] => {
    const saved = this.revision()?.values ?? [];
    const cells: [number, number][] = [];
    this.editedValues().forEach((row, r) =>
      row.forEach((v, c) => {
        if (v !== saved[r]?.[c]) cells.push([r, c]);
      }),
    );
    return cells;
  });
  /** Whether the values differ from the loaded revision. */
  readonly isDirty = computed(() => this.unsavedCells().length > 0);
  /**
   * Whether the values may change now: not while loading, saving or applying, whose answer loads
   * a new head revision and would drop an edit made meanwhile.
   */
  readonly acceptsEdits = computed(() => {
    const busy = this.waitingFor();
    return busy === null || busy === 'analysing';
  });

  /** Loads the table, its vehicle, revisions, the head revision's values and the logs. */
  load(tableId: string): void {
    const request = this.tablesApi.get(tableId).pipe(
      switchMap((table) => {
        if (!table.headRevisionId) return throwError(() => new Error('The table has no revision.'));
        return forkJoin({
          vehicle: this.vehiclesApi.get(table.vehicleId),
          revisions: this.tablesApi.revisions(table.id).pipe(map((list) => list.items)),
          head: this.tablesApi.revision(table.headRevisionId),
          logs: this.logsApi.listForVehicle(table.vehicleId).pipe(map((list) => list.items)),
        }).pipe(map((rest) => ({ table, ...rest })));
      }),
    );
    this.perform('loading', request, 'The table could not be loaded.', (loaded) => {
      const rows = loaded.table.mapAxisKpa.length;
      const cols = loaded.table.rpmAxis.length;
      const selection = this.currentSelection();
      const isSameTable = this.loaded()?.table.id === loaded.table.id;
      this.loaded.set(loaded);
      this.editedValues.set(loaded.head.values);
      this.editHistory.set(EMPTY_HISTORY);
      this.currentSelection.set(
        isSameTable && selection ? clampSelection(selection, rows, cols) : null,
      );
      this.lockSet.set(readLocks(tableId, rows, cols));
    });
  }

  /** Selects a range (null: nothing). */
  select(selection: CellSelection | null): void {
    this.currentSelection.set(selection);
  }

  /**
   * Sets one cell from what the user typed. Returns null when accepted, else the reason it was
   * refused (the cell keeps its value).
   */
  edit(row: number, col: number, raw: unknown): string | null {
    if (!this.acceptsEdits()) return WAIT_TEXT;
    if (this.lockSet().has(cellKey(row, col))) {
      const name = cellName(this.table()?.rpmAxis ?? [], this.table()?.mapAxisKpa ?? [], row, col);
      return `The ${name} is locked. Unlock it to edit.`;
    }
    const input = parseVeInput(raw);
    if (!input.ok) return input.message;
    this.step(applyEdit(this.editedValues(), this.editHistory(), row, col, input.value));
    return null;
  }

  /**
   * Pastes tab-separated text at the selection as one undo step. Returns what to tell the user:
   * the refusal (nothing pasted), how many locked cells were skipped, or null.
   */
  paste(text: string): string | null {
    if (!this.acceptsEdits()) return WAIT_TEXT;
    const bounds = this.selectionBounds();
    if (!bounds) return 'Select the cell to paste at first.';
    const target = { values: this.editedValues(), bounds, locked: this.lockSet() };
    const outcome = pasteText(target, text);
    if (!outcome.ok) return outcome.message;
    this.commit(outcome.label, outcome.changes);
    return outcome.note;
  }

  /**
   * Runs an operation on the selection as one undo step. Smooth and fill gaps run under `guard`:
   * the fuel-safety guard of the analysis shown (`AnalysisStore.operationGuard`), the core's
   * default guard without one. Returns what to tell the user: a refusal, the cells the guard
   * held, or null.
   */
  operate(op: CellOperation, guard?: LoadGuard): string | null {
    if (!this.acceptsEdits()) return WAIT_TEXT;
    const table = this.table();
    const bounds = this.selectionBounds();
    if (!table || !bounds) return 'Select the cells to change first.';
    const { rpmAxis, mapAxisKpa } = table;
    const values = this.editedValues();
    const result = applyCellOperation(
      { values, bounds, locked: this.lockSet(), rpmAxis, mapAxisKpa, guard },
      op,
    );
    if (!result.ok) return result.message;
    const held = heldNote(result.held, result.guard);
    if (result.changed.length === 0) return `${result.label} changed no cell. ${held ?? ''}`.trim();
    this.commit(result.label, result.changed);
    return held;
  }

  /**
   * Locks or unlocks the selected cells. Locks belong to this browser (localStorage, per table),
   * not to the revision: they guard editing here and are not part of the undo history.
   */
  setLocked(isLocked: boolean): string {
    const table = this.table();
    const bounds = this.selectionBounds();
    if (!table || !bounds) return 'Select the cells to lock first.';
    const next = withBounds(this.lockSet(), bounds, isLocked);
    this.lockSet.set(next);
    saveLocks(table.id, next);
    const { rows, cols } = boundsSize(bounds);
    const cells = rows * cols === 1 ? '1 cell' : `${rows * cols} cells`;
    return isLocked
      ? `Locked ${cells}: nothing changes them until unlocked.`
      : `Unlocked ${cells}.`;
  }

  /** Undoes the newest edit. */
  undo(): void {
    if (!this.acceptsEdits()) return;
    this.step(undoEdit(this.editedValues(), this.editHistory()));
  }

  /** Redoes the edit undone last. */
  redo(): void {
    if (!this.acceptsEdits()) return;
    this.step(redoEdit(this.editedValues(), this.editHistory()));
  }

  /** Saves the values as a new draft revision on top of the loaded one, then reloads. */
  save(message: string): void {
    const table = this.table();
    const parent = this.revision();
    if (!table || !parent || this.waitingFor()) return;
    const body = { parentId: parent.id, values: this.editedValues().map((r) => [...r]), message };
    const request = this.tablesApi.createRevision(table.id, body);
    this.perform('saving', request, 'Saving failed.', (revision) =>
      this.showNewRevision(revision, `Saved as revision ${revision.number}.`),
    );
  }

  /** Announces a revision just made (saved, or applied from an analysis) and loads it. */
  showNewRevision(revision: Revision, text: string): void {
    this.notifier.news(text);
    this.load(revision.tableId);
  }

  /**
   * Sends `request` while the workspace waits for `busy`, then calls `onSuccess` with its answer.
   * A failure is told through the `Notifier` (our own errors with their sentence, HTTP ones with the
   * server's) and handed to `onError`. Callers check `busy()` first: one thing at a time.
   */
  perform<T>(
    busy: Exclude<TableBusy, null>,
    request: Observable<T>,
    fallback: string,
    onSuccess: (value: T) => void,
    onError?: (message: string) => void,
  ): void {
    this.waitingFor.set(busy);
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (value) => {
        this.waitingFor.set(null);
        onSuccess(value);
      },
      error: (error: unknown) => {
        const text = error instanceof Error ? error.message : apiErrorMessage(error, fallback);
        this.notifier.failure(text);
        this.waitingFor.set(null);
        onError?.(text);
      },
    });
  }

  private commit(label: string, changes: readonly CellChange[]): void {
    this.step(applyBatch(this.editedValues(), this.editHistory(), label, changes));
  }

  private step(next: HistoryStep): void {
    this.editedValues.set(next.values);
    this.editHistory.set(next.history);
  }
}
