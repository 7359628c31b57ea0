import { DestroyRef, Injectable, computed, inject, signal } from '@angular/core';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatSnackBar } from '@angular/material/snack-bar';
import type { LogResource } from '@shared/contracts/logs';
import type { Revision, RevisionSummary, VeTableResource } from '@shared/contracts/tables';
import type { Vehicle } from '@shared/contracts/vehicles';
import { type Observable, forkJoin, map, of, switchMap, throwError } from 'rxjs';
import type { AnalysisSummary, ApplyAnalysisRequest } from '@shared/contracts/analyses';
import { AnalysesApi, type AnalysisResource } from '../../core/api/analyses-api';
import { apiErrorMessage } from '../../core/api/api-error';
import { LogsApi } from '../../core/api/logs-api';
import { TablesApi } from '../../core/api/tables-api';
import { VehiclesApi } from '../../core/api/vehicles-api';
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
} from './cell-range';
import { type CellOperation, applyCellOperation, heldNote } from './cell-operations';
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
} from './edit-history';
import type { AnalyseRequest } from './analysis-requests';
import { cellName } from './grid-model';
import { type PreviewResult, loadGuardOf } from './proposal-preview-compute';
import { pasteText } from './table-clipboard';
import { readLocks, saveLocks } from './table-locks';
import { parseVeInput } from './ve-input';

export { locksStorageKey } from './table-locks';

/** What the workspace is waiting for, if anything. */
export type TableBusy = 'loading' | 'saving' | 'analysing' | 'applying' | null;

/** Everything loaded for one table. */
interface Loaded {
  table: VeTableResource;
  vehicle: Vehicle;
  revisions: RevisionSummary[];
  head: Revision;
  logs: LogResource[];
  analyses: AnalysisSummary[];
}

/**
 * State of the table workspace: the table, its revisions, the head revision's values being
 * edited with an undo/redo history, the vehicle's logs and the latest analysis. Provided by the
 * workspace page, so it lives and dies with it. Failures are told by snackbar.
 */
@Injectable()
export class TableStore {
  private readonly tablesApi = inject(TablesApi);
  private readonly analysesApi = inject(AnalysesApi);
  private readonly logsApi = inject(LogsApi);
  private readonly vehiclesApi = inject(VehiclesApi);
  private readonly snackBar = inject(MatSnackBar);
  private readonly destroyRef = inject(DestroyRef);

  private readonly loaded = signal<Loaded | null>(null);
  private readonly editedValues = signal<readonly (readonly number[])[]>([]);
  private readonly editHistory = signal<EditHistory>(EMPTY_HISTORY);
  private readonly latestAnalysis = signal<AnalysisResource | null>(null);
  private readonly lastAnalyseError = signal<string | null>(null);
  private readonly openedBaseValues = signal<readonly (readonly number[])[] | null>(null);
  private readonly waitingFor = signal<TableBusy>('loading');
  private readonly currentSelection = signal<CellSelection | null>(null);
  private readonly lockSet = signal<CellSet>(new Set());
  private readonly latestPreview = signal<PreviewResult | null>(null);

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
  /** The analysis shown: run in this session, or an earlier one opened again. */
  readonly analysis = this.latestAnalysis.asReadonly();
  /**
   * The VE of the analysis's base revision: the loaded head's edited-from values, or those of the
   * older revision an earlier analysis was run on (so a preview matches what the server applies).
   */
  readonly analysisBaseValues = computed(
    () => this.openedBaseValues() ?? this.loaded()?.head.values ?? [],
  );
  /**
   * The live preview of applying the analysis shown with the panel's options: what the apply
   * would write and how each cell got there (measured, filled, held). Null with no analysis, and
   * until the first preview of a newly shown analysis arrives.
   */
  readonly preview = this.latestPreview.asReadonly();
  /** The table's analyses, newest first (summaries). */
  readonly analyses = computed(() => this.loaded()?.analyses ?? []);
  /** The server's refusal of the last analysis run, null when it ran or none was run. */
  readonly analyseError = this.lastAnalyseError.asReadonly();
  /** What the workspace waits for. */
  readonly busy = this.waitingFor.asReadonly();
  /** Whether there is an edit to undo. */
  readonly canUndo = computed(() => this.editHistory().past.length > 0);
  /** Whether there is an undone edit to redo. */
  readonly canRedo = computed(() => this.editHistory().future.length > 0);
  /** What undo and redo would take back or put again ("Undo Scale +5 % (12 cells)"). */
  readonly historyLabels = computed(() => historyActionLabels(this.editHistory()));
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
  /** Whether the values differ from the loaded revision. */
  readonly isDirty = computed(() => {
    const saved = this.revision()?.values ?? [];
    return this.editedValues().some((row, r) => row.some((v, c) => v !== saved[r]?.[c]));
  });

  /** Loads the table, its vehicle, revisions, the head revision's values and the logs. */
  load(tableId: string): void {
    this.waitingFor.set('loading');
    const request = this.tablesApi.get(tableId).pipe(
      switchMap((table) => {
        if (!table.headRevisionId) return throwError(() => new Error('The table has no revision.'));
        return forkJoin({
          vehicle: this.vehiclesApi.get(table.vehicleId),
          revisions: this.tablesApi.revisions(table.id).pipe(map((list) => list.items)),
          head: this.tablesApi.revision(table.headRevisionId),
          logs: this.logsApi.listForVehicle(table.vehicleId).pipe(map((list) => list.items)),
          analyses: this.analysesApi.listForTable(table.id).pipe(map((list) => list.items)),
        }).pipe(map((rest) => ({ table, ...rest })));
      }),
    );
    this.run(request, 'The table could not be loaded.', (loaded) => {
      const rows = loaded.table.mapAxisKpa.length;
      const cols = loaded.table.rpmAxis.length;
      const selection = this.currentSelection();
      const isSameTable = this.loaded()?.table.id === loaded.table.id;
      this.loaded.set(loaded);
      this.editedValues.set(loaded.head.values);
      this.editHistory.set(EMPTY_HISTORY);
      this.latestAnalysis.set(null);
      this.latestPreview.set(null);
      this.lastAnalyseError.set(null);
      this.openedBaseValues.set(null);
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
    const bounds = this.selectionBounds();
    if (!bounds) return 'Select the cell to paste at first.';
    const target = { values: this.editedValues(), bounds, locked: this.lockSet() };
    const outcome = pasteText(target, text);
    if (!outcome.ok) return outcome.message;
    this.commit(outcome.label, outcome.changes);
    return outcome.note;
  }

  /**
   * Runs an operation on the selection as one undo step. Smooth and fill gaps run under the
   * fuel-safety guard of the analysis shown (the core's default guard without one). Returns what
   * to tell the user: a refusal, the cells the guard held, or null.
   */
  operate(op: CellOperation): string | null {
    const table = this.table();
    const bounds = this.selectionBounds();
    if (!table || !bounds) return 'Select the cells to change first.';
    const { rpmAxis, mapAxisKpa } = table;
    const values = this.editedValues();
    const guard = loadGuardOf(this.latestAnalysis()?.guard, true) ?? undefined;
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

  /** Takes the panel's newest preview (null: none). */
  showPreview(preview: PreviewResult | null): void {
    this.latestPreview.set(this.latestAnalysis() ? preview : null);
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
    this.step(undoEdit(this.editedValues(), this.editHistory()));
  }

  /** Redoes the edit undone last. */
  redo(): void {
    this.step(redoEdit(this.editedValues(), this.editHistory()));
  }

  /** Saves the values as a new draft revision on top of the loaded one, then reloads. */
  save(message: string): void {
    const table = this.table();
    const parent = this.revision();
    if (!table || !parent || this.waitingFor()) return;
    this.waitingFor.set('saving');
    const body = { parentId: parent.id, values: this.editedValues().map((r) => [...r]), message };
    this.run(this.tablesApi.createRevision(table.id, body), 'Saving failed.', (revision) =>
      this.announceAndReload(revision, `Saved as revision ${revision.number}.`),
    );
  }

  /** Runs an analysis of the chosen logs with the chosen settings against the loaded revision. */
  analyse(request: AnalyseRequest): void {
    const table = this.table();
    const base = this.revision();
    if (!table || !base || request.logIds.length === 0 || this.waitingFor()) return;
    this.waitingFor.set('analysing');
    this.lastAnalyseError.set(null);
    const body = {
      baseRevisionId: base.id,
      logIds: [...request.logIds],
      settings: request.settings,
    };
    this.run(
      this.analysesApi.run(table.id, body),
      'The analysis failed.',
      (analysis) => {
        this.latestAnalysis.set(analysis);
        this.latestPreview.set(null);
        this.openedBaseValues.set(null);
        this.refreshAnalyses(table.id);
      },
      (message) => this.lastAnalyseError.set(message),
    );
  }

  /** Shows an earlier analysis of this table again (its overlays, plots and apply). */
  openAnalysis(analysisId: string): void {
    if (this.waitingFor()) return;
    this.waitingFor.set('analysing');
    const head = this.revision();
    const request = this.analysesApi
      .get(analysisId)
      .pipe(
        switchMap((analysis) =>
          analysis.baseRevisionId === head?.id
            ? of({ analysis, base: head })
            : this.tablesApi
                .revision(analysis.baseRevisionId)
                .pipe(map((base) => ({ analysis, base }))),
        ),
      );
    this.run(request, 'The analysis could not be loaded.', ({ analysis, base }) => {
      this.openedBaseValues.set(base.id === head?.id ? null : base.values);
      this.latestAnalysis.set(analysis);
      this.latestPreview.set(null);
    });
  }

  /** Applies the analysis shown with the panel's options as a new draft revision, then reloads. */
  applyAnalysis(body: ApplyAnalysisRequest): void {
    const table = this.table();
    const analysis = this.latestAnalysis();
    if (!table || !analysis || this.waitingFor()) return;
    this.waitingFor.set('applying');
    this.run(this.analysesApi.apply(analysis.id, body), 'Applying failed.', (revision) =>
      this.announceAndReload(revision, `Applied as draft revision ${revision.number}.`),
    );
  }

  private refreshAnalyses(tableId: string): void {
    this.analysesApi
      .listForTable(tableId)
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe({
        next: (list) => this.loaded.update((l) => (l ? { ...l, analyses: list.items } : l)),
        // The list is a convenience beside the analysis just shown; a miss is not worth a message.
        error: () => undefined,
      });
  }

  private announceAndReload(revision: Revision, text: string): void {
    this.snackBar.open(text, 'OK', { duration: 6000 });
    this.load(revision.tableId);
  }

  private commit(label: string, changes: readonly CellChange[]): void {
    this.step(applyBatch(this.editedValues(), this.editHistory(), label, changes));
  }

  private step(next: HistoryStep): void {
    this.editedValues.set(next.values);
    this.editHistory.set(next.history);
  }

  private run<T>(
    request: Observable<T>,
    fallback: string,
    onSuccess: (value: T) => void,
    onError?: (message: string) => void,
  ): void {
    request.pipe(takeUntilDestroyed(this.destroyRef)).subscribe({
      next: (value) => {
        this.waitingFor.set(null);
        onSuccess(value);
      },
      error: (error: unknown) => {
        // Our own errors (a table without revisions) carry their sentence; HTTP ones the server's.
        const text = error instanceof Error ? error.message : apiErrorMessage(error, fallback);
        this.snackBar.open(text, 'Dismiss', { duration: 8000 });
        this.waitingFor.set(null);
        onError?.(text);
      },
    });
  }
}
