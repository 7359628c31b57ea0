import {
  CSP_NONCE,
  ChangeDetectionStrategy,
  Component,
  ViewEncapsulation,
  computed,
  inject,
  input,
  output,
} from '@angular/core';
import { AgGridAngular } from 'ag-grid-angular';
import type { ColDef, GetRowIdParams, ValueSetterParams } from 'ag-grid-community';
import { breakpointLabel, cellClasses, cellColours, gridRows, type GridRow } from './grid-model';
import { GRID_MODULES, GRID_THEME } from './grid-theme';
import type { CellView } from './overlays';

/** A value typed into a cell, before it is checked. */
export interface CellEditRequest {
  /** Row (MAP breakpoint index). */
  readonly row: number;
  /** Column (RPM breakpoint index). */
  readonly col: number;
  /** What the editor gave. */
  readonly raw: unknown;
}

/**
 * The VE grid: MAP breakpoints down a pinned first column, RPM breakpoints across, each cell
 * painted from its view. Edits are reported, never applied here: the store checks them, and the
 * new views flow back in.
 */
@Component({
  selector: 'app-table-grid',
  changeDetection: ChangeDetectionStrategy.OnPush,
  // Cell classes live inside the grid's own DOM, out of reach of emulated encapsulation.
  encapsulation: ViewEncapsulation.None,
  imports: [AgGridAngular],
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
      domLayout="autoHeight"
      [attr.aria-label]="label()"
    />
  `,
  styleUrl: './table-grid.scss',
})
export class TableGrid {
  /** RPM breakpoints (columns). */
  readonly rpmAxis = input.required<readonly number[]>();
  /** MAP breakpoints in kPa (rows). */
  readonly mapAxisKpa = input.required<readonly number[]>();
  /** What each cell shows, `[row][col]`. */
  readonly cells = input.required<readonly (readonly CellView[])[]>();
  /** Whether cells can be edited (only while VE is shown). */
  readonly editable = input(false);
  /** Accessible name of the grid. */
  readonly label = input('VE table');
  /** A value typed into a cell. */
  readonly cellEdit = output<CellEditRequest>();

  /** The grid modules (Community only). */
  protected readonly modules = GRID_MODULES;
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

  /** The MAP column, then one column per RPM breakpoint. */
  protected readonly columns = computed((): ColDef<GridRow>[] => [
    {
      colId: 'map',
      headerName: 'kPa \\ rpm',
      pinned: 'left',
      width: 72,
      editable: false,
      sortable: false,
      resizable: false,
      valueGetter: (p) => p.data?.mapKpa,
      valueFormatter: (p) => breakpointLabel(Number(p.value)),
      cellClass: 'cs-axis-cell',
    },
    ...this.rpmAxis().map((rpm, col): ColDef<GridRow> => ({
      colId: `c${col}`,
      headerName: breakpointLabel(rpm),
      minWidth: 56,
      flex: 1,
      sortable: false,
      resizable: false,
      editable: () => this.editable(),
      cellEditor: 'agTextCellEditor',
      valueGetter: (p) => p.data?.cells[col]?.value ?? null,
      valueFormatter: (p) => p.data?.cells[col]?.text ?? '',
      valueSetter: (p: ValueSetterParams<GridRow>) => this.reportEdit(p, col),
      cellStyle: (p) => cellColours(p.data?.cells[col]),
      cellClass: (p) => ['cs-value-cell', ...cellClasses(p.data?.cells[col])],
    })),
  ]);

  private reportEdit(params: ValueSetterParams<GridRow>, col: number): boolean {
    if (params.data) this.cellEdit.emit({ row: params.data.row, col, raw: params.newValue });
    // The store decides; accepted values come back through `cells`.
    return false;
  }
}
