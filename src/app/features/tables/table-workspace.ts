import {
  ChangeDetectionStrategy,
  Component,
  DestroyRef,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  signal,
  untracked,
} from '@angular/core';
import { FormsModule } from '@angular/forms';
import { MatButtonModule } from '@angular/material/button';
import { MatButtonToggleModule } from '@angular/material/button-toggle';
import { MatDialog } from '@angular/material/dialog';
import { takeUntilDestroyed } from '@angular/core/rxjs-interop';
import { MatFormFieldModule } from '@angular/material/form-field';
import { MatIconModule } from '@angular/material/icon';
import { MatInputModule } from '@angular/material/input';
import { MatTooltipModule } from '@angular/material/tooltip';
import { RouterLink } from '@angular/router';
import { Session } from '../../core/auth/session';
import { Notifier } from '../../core/notify/notifier';
import { DisplayPreferences } from '../../core/preferences/display-preferences';
import { AnalysisHistory } from './analysis/analysis-history';
import { AnalysisPanel, type ApplyRequest } from './analysis/analysis-panel';
import { AnalysisStore } from './analysis/analysis-store';
import type { CellOperation } from './grid/cell-operations';
import { cellKey } from './grid/cell-range';
import { CellOpsBar } from './grid/cell-ops-bar';
import { ColourLegend } from './grid/colour-legend';
import { historyKeyAction } from './grid/edit-history';
import { type MapAxisDisplay, mapAxisDisplay } from './grid/grid-model';
import { LeanBanner } from './analysis/lean-banner';
import { OVERLAYS, overlayView, type OverlayKind } from './grid/overlays';
import { type CellEditRequest, TableGrid } from './grid/table-grid';
import { WorkspacePlots } from './plots/workspace-plots';
import { ProposalPreview } from './preview/proposal-preview';
import { TableStore } from './table-store';
import {
  type ApplyEditsChoice,
  type ApplyEditsData,
  ApplyEditsDialog,
} from './unsaved/apply-edits-dialog';
import type { HoldsUnsavedEdits } from './unsaved/unsaved-edits-guard';
import { warnBeforeUnload } from './unsaved/warn-before-unload';

/**
 * The table workspace: the head revision's VE in an editable grid with undo/redo, overlays of
 * the latest analysis, the lean-under-load banner, saving as a revision, and the analysis panel.
 * Tuners edit; other roles that open it (reviewers, operators) read: the grid, overlays, plots
 * and earlier analyses, with no editing, saving, running or applying. Unsaved edits are never
 * dropped silently: applying asks first, and so does leaving (route guard, `beforeunload`).
 */
@Component({
  selector: 'app-table-workspace',
  changeDetection: ChangeDetectionStrategy.OnPush,
  imports: [
    AnalysisHistory,
    AnalysisPanel,
    CellOpsBar,
    ColourLegend,
    FormsModule,
    LeanBanner,
    MatButtonModule,
    MatButtonToggleModule,
    MatFormFieldModule,
    MatIconModule,
    MatInputModule,
    MatTooltipModule,
    RouterLink,
    TableGrid,
    WorkspacePlots,
  ],
  // The analysis store reads the table store; the preview's worker ends with this page.
  providers: [TableStore, AnalysisStore, ProposalPreview],
  templateUrl: './table-workspace.html',
  styleUrl: './table-workspace.scss',
  host: { '(keydown)': 'onKeydown($event)' },
})
export class TableWorkspace implements HoldsUnsavedEdits {
  private readonly session = inject(Session);
  private readonly dialog = inject(MatDialog);
  private readonly destroyRef = inject(DestroyRef);
  private readonly notifier = inject(Notifier);
  private readonly preferences = inject(DisplayPreferences);
  /** The workspace's state: the table, its edits, the selection and the locks. */
  protected readonly store = inject(TableStore);
  /** The analysis shown, the earlier ones, and the preview of applying it. */
  protected readonly analysis = inject(AnalysisStore);

  /** The table id from the route. */
  readonly id = input.required<string>();

  /** The overlay choices. */
  protected readonly overlays = OVERLAYS;
  /** The overlay shown; back to VE whenever the analysis goes away. */
  protected readonly overlay = linkedSignal<OverlayKind>(() => {
    this.analysis.analysis();
    return 've';
  });
  /** The cell the plots detail: the selection's moving end. */
  protected readonly selectedCell = computed(() => {
    const focus = this.store.selection()?.focus;
    return focus ? { row: focus.row, col: focus.col } : null;
  });
  /** The number of the revision the analysis shown was run on (the head's, before one runs). */
  protected readonly analysisBaseNumber = computed(() => {
    const analysis = this.analysis.analysis();
    const id = analysis?.baseRevisionId ?? this.store.revision()?.id;
    return this.store.revisions().find((r) => r.id === id)?.number ?? null;
  });
  /** The MAP axis in the user's units: kPa, or psi(a) for imperial (values stay kPa inside). */
  protected readonly mapAxis = computed((): MapAxisDisplay =>
    mapAxisDisplay(this.preferences.units()),
  );
  /** Lambda or AFR, as the user prefers. */
  protected readonly mixture = computed(() => this.preferences.mixture());
  /** Metric or imperial, as the user prefers. */
  protected readonly units = computed(() => this.preferences.units());
  /** The message of the next saved revision. */
  protected readonly saveMessage = signal('');

  /** Whether the user may edit, save and analyse (tuners). */
  protected readonly canEdit = computed(() => !!this.session.user()?.roles.includes('tuner'));
  /** Cells and legend of the overlay shown. */
  protected readonly view = computed(() =>
    overlayView({
      kind: this.overlay(),
      values: this.store.values(),
      baseValues: this.analysis.baseValues(),
      analysis: this.analysis.analysis(),
      preview: this.analysis.preview(),
    }),
  );
  /** Whether values can be changed now: a tuner, looking at the VE, with no save under way. */
  protected readonly canChangeValues = computed(
    () => this.canEdit() && this.overlay() === 've' && this.store.acceptsEdits(),
  );
  /**
   * Why the cell operations are unavailable beyond "nothing selected" (which the grid's own
   * line says; a hint appearing on the first click would shift the grid under the pointer).
   */
  protected readonly opsHint = computed(() =>
    this.overlay() === 've' ? '' : 'Switch to the VE view to change cells.',
  );
  /** The name of the overlay shown, for the grid's accessible name. */
  protected readonly overlayLabel = computed(
    () => OVERLAYS.find((o) => o.kind === this.overlay())?.label ?? '',
  );

  constructor() {
    // Load again when the route moves to another table (the component is reused).
    effect(() => {
      const id = this.id();
      untracked(() => this.store.load(id));
    });
    // Closing the tab or reloading with unsaved edits asks the browser's own question.
    warnBeforeUnload(this.store.isDirty);
  }

  /** How many cells hold unsaved edits (the route guard asks before leaving when any do). */
  unsavedCellCount(): number {
    return this.store.unsavedCells().length;
  }

  /** Checks and applies a typed value; a refusal is told and the cell keeps its value. */
  protected onCellEdit(request: CellEditRequest): void {
    this.tell(this.store.edit(request.row, request.col, request.raw));
  }

  /** Pastes into the selection, or says why not. */
  protected onPaste(text: string): void {
    if (!this.canChangeValues()) {
      const reason = this.canEdit()
        ? 'Switch to the VE view to paste values.'
        : 'Only tuners can paste values.';
      this.tell(reason);
      return;
    }
    this.tell(this.store.paste(text));
  }

  /**
   * Runs a cell operation on the selection, smooth and fill gaps under the guard of the analysis
   * shown; a refusal or the cells the guard held are told.
   */
  protected onOperate(op: CellOperation): void {
    this.tell(this.store.operate(op, this.analysis.operationGuard()));
  }

  /** Locks or unlocks the selected cells. */
  protected onLock(isLocked: boolean): void {
    this.tell(this.store.setLocked(isLocked));
  }

  /** Ctrl+Z / Ctrl+Y outside text fields (a cell editor keeps its own text undo). */
  protected onKeydown(event: KeyboardEvent): void {
    const target = event.target as HTMLElement | null;
    if (target?.closest('input, textarea, [contenteditable="true"]')) return;
    const action = historyKeyAction(event);
    if (!action || !this.canEdit()) return;
    event.preventDefault();
    if (action === 'undo') this.store.undo();
    else this.store.redo();
  }

  private tell(message: string | null): void {
    if (message) this.notifier.news(message);
  }

  /** Saves the grid as a new revision. */
  protected save(): void {
    this.store.save(this.saveMessage().trim());
    this.saveMessage.set('');
  }

  /**
   * Applies the analysis shown as a draft revision with the panel's whole body. With unsaved
   * edits it asks first: save them and apply on top, discard them and apply to the analysed
   * revision, or cancel.
   */
  protected apply(request: ApplyRequest): void {
    const edited = this.store.unsavedCells();
    if (edited.length === 0) {
      this.analysis.apply(request.body);
      return;
    }
    const locked = this.store.locked();
    const data: ApplyEditsData = {
      editedCells: edited.length,
      lockedEdited: edited.filter(([r, c]) => locked.has(cellKey(r, c))).length,
      baseNumber: this.analysisBaseNumber(),
    };
    this.dialog
      .open<ApplyEditsDialog, ApplyEditsData, ApplyEditsChoice | null>(ApplyEditsDialog, {
        data,
        autoFocus: 'dialog',
      })
      .afterClosed()
      .pipe(takeUntilDestroyed(this.destroyRef))
      .subscribe((choice) => {
        if (choice === 'save-first') this.analysis.applyOnEdits(request.body);
        else if (choice === 'discard') this.analysis.apply(request.body);
      });
  }

  /** A cell picked in a plot becomes the grid's selection, so both show the same cell. */
  protected pickCell(cell: { row: number; col: number }): void {
    this.store.select({ anchor: cell, focus: cell });
  }
}

export default TableWorkspace;
