import {
  CSP_NONCE,
  ChangeDetectionStrategy,
  Component,
  ElementRef,
  ViewEncapsulation,
  computed,
  effect,
  inject,
  input,
  linkedSignal,
  output,
  untracked,
} from '@angular/core';
import { AgGridAngular } from 'ag-grid-angular';
import {
  ColumnApiModule,
  RenderApiModule,
  type CellFocusedEvent,
  type CellKeyDownEvent,
  type CellMouseDownEvent,
  type CellMouseOverEvent,
  type FullWidthCellKeyDownEvent,
  type GetRowIdParams,
  type GridApi,
  type GridReadyEvent,
  type NavigateToNextCellParams,
  type CellPosition as GridCellPosition,
} from 'ag-grid-community';
import {
  type CellPosition,
  type CellSelection,
  type CellSet,
  arrowStep,
  boundsGrid,
  gridTarget,
  pressSelection,
  cellKey,
  collapseTo,
  extendTo,
  isInBounds,
  selectAll,
  selectionBounds,
  selectionLabel,
  stepCell,
} from './cell-range';
import {
  type CellEditRequest,
  KPA_AXIS,
  type MapAxisDisplay,
  gridColumns,
  gridRows,
  type GridRow,
} from './grid-model';
import { GRID_MODULES, GRID_THEME } from './grid-theme';
import type { CellView } from './overlays';
import { formatTsv } from './table-clipboard';

export type { CellEditRequest } from './grid-model';

/** The grid's modules plus the two small APIs the selection uses (refresh, column lookup). */
const SELECTION_MODULES = [...GRID_MODULES, RenderApiModule, ColumnApiModule];

/**
 * The VE grid: MAP breakpoints down a pinned first column, RPM breakpoints across, each cell
 * painted from its view. Edits, selections and pastes are reported, never applied here: the store
 * decides, and the new views flow back in. The grid is ag-grid Community, which has no range
 * selection or clipboard of its own: the selection is built on its cell mouse and key events
 * (drag, shift+click, shift+arrows, Escape, Ctrl/⌘+A) and copy/paste on the page's clipboard
 * events while a grid cell has focus.
 */
@Component({
  selector: 'app-table-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Cell classes live inside the grid's own DOM, out of reach of emulated encapsulation.
  encapsulation: ViewEncapsulation.None,
  imports: [AgGridAngular],
  host: {
    '(document:beforecopy)': 'onBeforeCopy($event)',
    '(document:copy)': 'onCopy($event)',
    '(document:paste)': 'onPaste($event)',
    '(document:mouseup)': 'endDrag()',
  },
  template: `
    <ag-grid-angular
      class="grid"
      [modules]="modules"
      [theme]="theme"
      [styleNonce]="nonce"
      [columnDefs]="columns()"
      [rowData]="rows()"
      [getRowId]="rowId"
      [singleClickEdit]="false"
      [stopEditingWhenCellsLoseFocus]="true"
      [suppressMovableColumns]="true"
      [enterNavigatesVerticallyAfterEdit]="true"
      [navigateToNextCell]="navigate"
      [enableBrowserTooltips]="true"
      domLayout="autoHeight"
      [attr.aria-label]="label()"
      (gridReady)="onGridReady($event)"
      (rowDataUpdated)="onRowDataUpdated()"
      (cellMouseDown)="onCellMouseDown($event)"
      (cellMouseOver)="onCellMouseOver($event)"
      (cellFocused)="onCellFocused($event)"
      (cellKeyDown)="onCellKeyDown($event)"
    />
    <p class="cs-selection-size" aria-live="polite" data-testid="selection-size">
      {{ selectionText() }}
    </p>
  `,
  styleUrl: './table-grid.scss',
})
export class TableGrid {
  private readonly host = inject<ElementRef<HTMLElement>>(ElementRef);

  /** RPM breakpoints (columns). */
  readonly rpmAxis = input.required<readonly number[]>();
  /** MAP breakpoints in kPa (rows). */
  readonly mapAxisKpa = input.required<readonly number[]>();
  /** How the MAP axis reads (kPa, or psi(a) for imperial users). */
  readonly mapAxis = input<MapAxisDisplay>(KPA_AXIS);
  /** What each cell shows, `[row][col]`. */
  readonly cells = input.required<readonly (readonly CellView[])[]>();
  /** Whether cells can be edited (only while VE is shown). */
  readonly editable = input(false);
  /** Accessible name of the grid. */
  readonly label = input('VE table');
  /** The selected range, null for none. */
  readonly selection = input<CellSelection | null>(null);
  /** Locked cells (hatched, with a lock mark). Held cells come with their views. */
  readonly locked = input<CellSet>(new Set());
  /** A value typed into a cell. */
  readonly cellEdit = output<CellEditRequest>();
  /** The user changed the selection. */
  readonly selectionChange = output<CellSelection | null>();
  /** Text pasted while a grid cell had focus. */
  readonly pasteText = output<string>();

  /** The grid modules (Community only). */
  protected readonly modules = SELECTION_MODULES;
  /** The grid theme in our colours. */
  protected readonly theme = GRID_THEME;
  /** The page's CSP nonce, put on the style elements the grid adds. */
  protected readonly nonce =
    inject(CSP_NONCE, { optional: true }) ??
    document.querySelector('app-root')?.getAttribute('ngCspNonce') ??
    undefined;

  /** Rows keep their id across updates, so the grid refreshes them in place. */
  protected readonly rowId = (params: GetRowIdParams<GridRow>): string => params.data.id;

  /** Grid rows from the axes and views. */
  protected readonly rows = computed(() => gridRows(this.mapAxisKpa(), this.cells()));

  /**
   * The selection as this grid last set it: grid events can follow each other before the
   * parent's new input arrives, so they read and write this, and the input resets it.
   */
  private readonly current = linkedSignal(() => this.selection());
  private readonly bounds = computed(() => {
    const selection = this.current();
    return selection ? selectionBounds(selection) : null;
  });
  private api: GridApi<GridRow> | null = null;
  private isDragging = false;

  /** "3 × 4 cells selected", or a hint when nothing is. */
  protected readonly selectionText = computed(() => {
    const bounds = this.bounds();
    return bounds ? selectionLabel(bounds) : 'Click or drag to select cells.';
  });

  /** The MAP column, then one column per RPM breakpoint. */
  protected readonly columns = computed(() =>
    gridColumns(this.rpmAxis(), {
      mapAxis: this.mapAxis(),
      isEditable: () => this.editable(),
      decor: (row, col) => ({
        selection: this.bounds(),
        isLocked: this.locked().has(cellKey(row, col)),
      }),
      edit: (request) => this.cellEdit.emit(request),
    }),
  );

  constructor() {
    // Selection and lock marks are cell classes: repaint the cells when either changes.
    effect(() => {
      this.bounds();
      this.locked();
      untracked(() => this.api?.refreshCells({ force: true }));
    });
  }

  /**
   * Arrow keys: plain ones move a one-cell selection; with shift the selection's moving end
   * steps and the grid's focus follows it. Steps onto the MAP column are refused.
   */
  protected readonly navigate = (
    params: NavigateToNextCellParams<GridRow>,
  ): GridCellPosition | null => {
    const step = arrowStep(params.key);
    const next = params.nextCellPosition;
    const current = this.current();
    if (!step || !next || next.rowIndex < 0) return next;
    if (params.event?.shiftKey && current) {
      const focus = stepCell(current.focus, step, this.rowCount(), this.colCount());
      this.change(extendTo(current, focus));
      return this.gridPosition(focus) ?? params.previousCellPosition;
    }
    const cell = this.cellAt(next.rowIndex, next.column.getColId());
    if (!cell) return params.previousCellPosition;
    this.change(collapseTo(cell));
    return next;
  };

  /** Keeps the grid API for refreshes and focus lookups. */
  protected onGridReady(event: GridReadyEvent<GridRow>): void {
    this.api = event.api;
  }

  /**
   * New views can change a cell's marks and title without changing its value (a held mark, a
   * lean flag), and the grid repaints only the cells whose value changed: repaint them all.
   */
  protected onRowDataUpdated(): void {
    this.api?.refreshCells({ force: true });
  }

  /** A left press starts a selection (shift: extends it); on the MAP column, the whole row. */
  protected onCellMouseDown(event: CellMouseDownEvent<GridRow>): void {
    const mouse = event.event as MouseEvent | null;
    const target = gridTarget(event.rowIndex, event.column.getColId());
    if (!mouse || mouse.button !== 0 || !target) return;
    this.isDragging = true;
    this.change(pressSelection(this.current(), target, mouse.shiftKey, this.colCount()));
  }

  /** While the button is held, moving over cells drags the selection's moving end. */
  protected onCellMouseOver(event: CellMouseOverEvent<GridRow>): void {
    const mouse = event.event as MouseEvent | null;
    const target = gridTarget(event.rowIndex, event.column.getColId());
    if (!this.isDragging || !mouse || !target) return;
    // A release outside the page sends no mouseup: the buttons tell.
    this.isDragging = (mouse.buttons & 1) === 1;
    if (this.isDragging) {
      this.change(pressSelection(this.current(), target, true, this.colCount()));
    }
  }

  /** Ends a drag wherever the button is let go. */
  protected endDrag(): void {
    this.isDragging = false;
  }

  /** Focus moved by Tab, Enter or the grid itself: a cell outside the selection becomes it. */
  protected onCellFocused(event: CellFocusedEvent<GridRow>): void {
    // Mouse presses are handled by onCellMouseDown (the grid focuses before it reports them).
    if (event.sourceEvent instanceof MouseEvent || typeof event.rowIndex !== 'number') return;
    const colId = typeof event.column === 'string' ? event.column : event.column?.getColId();
    const cell = colId ? this.cellAt(event.rowIndex, colId) : null;
    const bounds = this.bounds();
    if (cell && !(bounds && isInBounds(bounds, cell.row, cell.col))) this.change(collapseTo(cell));
  }

  /** Ctrl/⌘+A selects every cell; Escape shrinks the selection to the focused cell. */
  protected onCellKeyDown(
    event: CellKeyDownEvent<GridRow> | FullWidthCellKeyDownEvent<GridRow>,
  ): void {
    const key = event.event as KeyboardEvent | null;
    if (!key || (key.target as HTMLElement | null)?.closest('input, textarea')) return;
    if ((key.ctrlKey || key.metaKey) && key.key.toLowerCase() === 'a') {
      this.change(selectAll(this.rowCount(), this.colCount()));
    } else if (key.key === 'Escape') {
      const focused = this.api?.getFocusedCell();
      const cell = focused ? this.cellAt(focused.rowIndex, focused.column.getColId()) : null;
      if (cell) this.change(collapseTo(cell));
    }
  }

  /**
   * Chromium only offers "copy" with no text selected when a `beforecopy` listener cancels the
   * event; do so while a grid cell has focus, so Ctrl/⌘+C reaches `onCopy`.
   */
  protected onBeforeCopy(event: Event): void {
    if (this.hasCellFocus() && this.bounds()) event.preventDefault();
  }

  /** Puts the selected cells on the clipboard as tab-separated numbers (what the overlay shows). */
  protected onCopy(event: ClipboardEvent): void {
    const bounds = this.bounds();
    if (!this.hasCellFocus() || !bounds || !event.clipboardData) return;
    const grid = boundsGrid(bounds, (row, col) => this.cells()[row]?.[col]?.value ?? null);
    event.clipboardData.setData('text/plain', formatTsv(grid));
    event.preventDefault();
  }

  /** Hands pasted text to the parent while a grid cell (not its editor) has focus. */
  protected onPaste(event: ClipboardEvent): void {
    if (!this.hasCellFocus()) return;
    event.preventDefault();
    this.pasteText.emit(event.clipboardData?.getData('text/plain') ?? '');
  }

  private hasCellFocus(): boolean {
    const active = document.activeElement;
    return (
      !!active && this.host.nativeElement.contains(active) && !active.closest('input, textarea')
    );
  }

  private change(selection: CellSelection | null): void {
    this.current.set(selection);
    this.selectionChange.emit(selection);
  }

  /** The value cell at a grid position, null on the MAP column. */
  private cellAt(rowIndex: number | null, colId: string): CellPosition | null {
    const target = gridTarget(rowIndex, colId);
    return target && target.col !== null ? { row: target.row, col: target.col } : null;
  }

  private gridPosition(cell: CellPosition): GridCellPosition | null {
    const column = this.api?.getColumn(`c${cell.col}`);
    return column ? { rowIndex: cell.row, column, rowPinned: null } : null;
  }

  private rowCount = () => this.mapAxisKpa().length;
  private colCount = () => this.rpmAxis().length;
}
